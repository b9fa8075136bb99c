// Domain data (observations, track points) turned into the GeoJSON the map draws. Pure: no
// MapLibre, no DOM, so every rule here is unit-tested in Node.
import type { Feature, FeatureCollection, LineString, MultiLineString, Point, Position } from 'geojson';
import type { Observation, Observer, TrackPoint } from '../../domain/model';
import { BANDS, bandOfObservation, hexColour, inMarginalIceZone, type BandKey } from './concentrationBands';
import { beyondMercator, mizFeatures, pieceCoords, range, seamPieces, type TrackArrays } from './trackLevels';

export interface ObservationProps {
  /** The observation id, promoted to the feature id for feature state (selection). */
  id: string;
  band: BandKey;
  colour: string;
  /** Milliseconds since 1970, for time filters. */
  t: number;
  observerId: string;
  initials: string;
  /** Egg code image key, or empty when there is no egg code to draw. */
  egg: string;
  /** Poleward of the Mercator limit: drawn by the polar overlay, not by the map's layers. */
  polar: boolean;
}

function timeMs(iso: string): number {
  return Date.parse(iso);
}

export interface BuildOptions {
  observers?: readonly Observer[];
}

/**
 * Observations with a position as columns: what the map worker needs to write their GeoJSON,
 * built in one light loop on the page and handed over as buffers.
 */
export interface ObservationColumns {
  ids: string[];
  lon: Float64Array;
  lat: Float64Array;
  /** ms since 1970. */
  t: Float64Array;
  /** Index into BANDS. */
  band: Uint8Array;
  /** Index into observerIds / initials. */
  observer: Uint16Array;
  observerIds: string[];
  initials: string[];
}

/** Bands from the lowest to the highest concentration: a group of observations takes the highest one's colour. */
export const BAND_RANK: readonly BandKey[] = ['not-judged', 'ice-free', 'open-water', 'c1-3', 'c4-6', 'c7-8', 'c9-10', 'fast-ice'];

/** Observations with a position as columns; deleted ones are left out. */
export function packObservations(observations: readonly Observation[], observers: readonly Observer[] = []): ObservationColumns {
  const initialsOf = new Map(observers.map((o) => [o.id, o.initials]));
  const observerIndex = new Map<string, number>();
  const observerIds: string[] = [];
  const initials: string[] = [];
  const bandIndex = new Map(BANDS.map((b, i) => [b.key, i]));
  const kept = observations.filter((o) => !o.deleted && o.position);
  const n = kept.length;
  const c: ObservationColumns = {
    ids: new Array<string>(n), lon: new Float64Array(n), lat: new Float64Array(n), t: new Float64Array(n),
    band: new Uint8Array(n), observer: new Uint16Array(n), observerIds, initials,
  };
  for (let i = 0; i < n; i++) {
    const o = kept[i] as Observation;
    const pos = o.position as NonNullable<Observation['position']>;
    let k = observerIndex.get(o.observerId);
    if (k === undefined) {
      k = observerIds.length;
      observerIndex.set(o.observerId, k);
      observerIds.push(o.observerId);
      initials.push(initialsOf.get(o.observerId) ?? '');
    }
    c.ids[i] = o.id;
    c.lon[i] = pos.lon;
    c.lat[i] = pos.lat;
    c.t[i] = timeMs(o.time);
    c.band[i] = bandIndex.get(bandOfObservation(o)) as number;
    c.observer[i] = k;
  }
  return c;
}

/** The observation points from their columns; `rank` orders the bands for grouped symbols. */
export function observationFeaturesFromColumns(c: ObservationColumns): FeatureCollection<Point, ObservationProps & { rank: number }> {
  const colours = BANDS.map((b) => hexColour(b.rgb));
  const ranks = BANDS.map((b) => BAND_RANK.indexOf(b.key));
  const features: Feature<Point, ObservationProps & { rank: number }>[] = new Array(c.ids.length);
  for (let i = 0; i < c.ids.length; i++) {
    const b = c.band[i] as number;
    const k = c.observer[i] as number;
    const id = c.ids[i] as string;
    const lat = c.lat[i] as number;
    features[i] = {
      type: 'Feature',
      geometry: { type: 'Point', coordinates: [c.lon[i] as number, lat] },
      properties: {
        id, band: (BANDS[b] as (typeof BANDS)[number]).key, colour: colours[b] as string, rank: ranks[b] as number, t: c.t[i] as number,
        observerId: c.observerIds[k] as string, initials: c.initials[k] as string, egg: `egg:${id}`, polar: beyondMercator(lat),
      },
    };
  }
  return { type: 'FeatureCollection', features };
}

/** Observations with a position, as points; deleted ones are left out. */
export function observationFeatures(observations: readonly Observation[], opts: BuildOptions = {}): FeatureCollection<Point, ObservationProps> {
  return observationFeaturesFromColumns(packObservations(observations, opts.observers));
}

/** Track points sorted by time (the store keeps them so; imports may not). */
export function sortedTrack(track: readonly TrackPoint[]): TrackPoint[] {
  const sorted = [...track];
  if (sorted.some((p, i) => i > 0 && timeMs((sorted[i - 1] as TrackPoint).time) > timeMs(p.time))) {
    sorted.sort((a, b) => timeMs(a.time) - timeMs(b.time));
  }
  return sorted;
}

/**
 * A line of positions cut where it crosses the antimeridian, with the crossing point
 * interpolated on both sides, so every piece stays inside -180..180 however often the ship
 * crosses 180 degrees or circles a pole.
 */
export function splitAtAntimeridian(points: readonly Position[]): Position[][] {
  const line = { lon: Float64Array.from(points, (p) => p[0] as number), lat: Float64Array.from(points, (p) => p[1] as number) };
  return seamPieces(line.lon)
    .map((p) => pieceCoords(line, p, range(p[0], p[1])))
    .filter((c) => c.length >= 2);
}

export function trackFeature(track: readonly TrackPoint[]): Feature<MultiLineString> {
  const coords = sortedTrack(track).map((p) => [p.lon, p.lat]);
  return { type: 'Feature', properties: {}, geometry: { type: 'MultiLineString', coordinates: splitAtAntimeridian(coords) } };
}

/** The track as typed arrays in time order, as the track worker takes it. */
export function trackArrays(track: readonly TrackPoint[]): TrackArrays {
  const sorted = sortedTrack(track);
  return {
    t: Float64Array.from(sorted, (p) => timeMs(p.time)),
    lon: Float64Array.from(sorted, (p) => p.lon),
    lat: Float64Array.from(sorted, (p) => p.lat),
  };
}

/** Observation times (ascending) and whether each is in the marginal ice zone. */
export function observationZones(observations: readonly Observation[]): { t: Float64Array; miz: Uint8Array } {
  const obs = observations
    .filter((o) => !o.deleted)
    .map((o) => ({ t: timeMs(o.time), miz: inMarginalIceZone(o.totalConcentration) ? 1 : 0 }))
    .sort((a, b) => a.t - b.t);
  return { t: Float64Array.from(obs, (o) => o.t), miz: Uint8Array.from(obs, (o) => o.miz) };
}

/**
 * Stretches of the track in the marginal ice zone. Each track point takes the state of the
 * observation nearest to it in time, if one lies within `maxGapMs` (else the ice there is
 * unknown and no stretch is drawn); runs of points in the zone become the stretches.
 */
export function marginalIceZoneStretches(
  track: readonly TrackPoint[],
  observations: readonly Observation[],
  maxGapMs: number,
): FeatureCollection<MultiLineString> {
  const zones = observationZones(observations);
  return mizFeatures(trackArrays(track), zones.t, zones.miz, maxGapMs);
}

/** Initial bearing from one position to another, degrees true (spherical, good to a fraction of a degree over a few km). */
export function initialBearing(from: Position, to: Position): number {
  const rad = Math.PI / 180;
  const f1 = (from[1] as number) * rad;
  const f2 = (to[1] as number) * rad;
  const dl = ((to[0] as number) - (from[0] as number)) * rad;
  const y = Math.sin(dl) * Math.cos(f2);
  const x = Math.cos(f1) * Math.sin(f2) - Math.sin(f1) * Math.cos(f2) * Math.cos(dl);
  return ((Math.atan2(y, x) / rad) % 360 + 360) % 360;
}

export interface ShipProps {
  /** Heading (or course over ground) in degrees true; -1 when unknown. */
  heading: number;
  t: number;
}

/**
 * The ship's latest position: the later of the last track point and the last observation with
 * a position. Heading from the fix's heading, else its course over ground, else the bearing
 * from the previous track point. The track comes in time order (as the store keeps it), so
 * only its last two points are read: the track may hold a million.
 */
export function shipFeature(track: readonly TrackPoint[], observations: readonly Observation[]): Feature<Point, ShipProps> | null {
  const last = track[track.length - 1];
  let lastObs: Observation | undefined;
  let lastObsT = -Infinity;
  for (const o of observations) {
    if (o.deleted || !o.position) continue;
    const t = timeMs(o.time);
    if (t > lastObsT) {
      lastObs = o;
      lastObsT = t;
    }
  }
  if (last && (!lastObs || timeMs(last.time) >= lastObsT)) {
    const prev = track[track.length - 2];
    const heading = last.headingDeg ?? last.cogDeg ?? (prev ? initialBearing([prev.lon, prev.lat], [last.lon, last.lat]) : -1);
    return { type: 'Feature', geometry: { type: 'Point', coordinates: [last.lon, last.lat] }, properties: { heading, t: timeMs(last.time) } };
  }
  if (lastObs?.position) {
    return { type: 'Feature', geometry: { type: 'Point', coordinates: [lastObs.position.lon, lastObs.position.lat] }, properties: { heading: -1, t: lastObsT } };
  }
  return null;
}

export function featureCollection<G extends LineString | MultiLineString | Point, P>(features: (Feature<G, P> | null)[]): FeatureCollection<G, P> {
  return { type: 'FeatureCollection', features: features.filter((f): f is Feature<G, P> => f !== null) };
}

/**
 * The map source's points: those within the Mercator limit (the polar overlay draws the others,
 * and a group of points must never take one in), with `rank` for the grouped symbols.
 */
export function mapObservationFeatures(c: ObservationColumns): FeatureCollection<Point, ObservationProps & { rank: number }> {
  const fc = observationFeaturesFromColumns(c);
  return { type: 'FeatureCollection', features: fc.features.filter((f) => !f.properties.polar) };
}
