// Natural Earth land (through world-atlas) made safe to draw across the antimeridian and poles.
//
// world-atlas keeps every longitude inside -180..180, so a ring that crosses the antimeridian
// jumps by 360 degrees between two neighbouring points and a ring round a pole (Antarctica) is
// left open across the seam. Drawn as they are, those rings give horizontal stripes across
// Mercator, false rings of land round the North Pole on the globe and an ocean hole at the South
// Pole. The fix, in order: make each ring's longitudes continuous, close a ring that goes round a
// pole through +-90 degrees latitude, then shift each ring back into -180..180 by whole turns (a
// hole follows its outer ring, so the Caspian stays inside Eurasia). Coastlines are built as a
// separate line set that leaves out the seam and pole edges, because a polygon's outline would
// draw a false line along the seam.
import type { FeatureCollection, MultiLineString, MultiPolygon, Polygon, Position } from 'geojson';
import { feature } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';

const SEAM_EPS = 1e-9;
/** Edges with both ends this close to a pole are construction lines, not coast. */
const POLE_EDGE_LAT = 89.9;

/** Longitudes made continuous: each step between neighbours is at most 180 degrees. */
export function unwrapRing(ring: readonly Position[]): Position[] {
  const out: Position[] = [];
  let offset = 0;
  let prev: number | undefined;
  for (const p of ring) {
    const lon = p[0] as number;
    if (prev !== undefined) {
      const d = lon + offset - prev;
      if (d > 180) offset -= 360 * Math.round(d / 360);
      else if (d < -180) offset += 360 * Math.round(-d / 360);
    }
    const x = lon + offset;
    out.push([x, p[1] as number]);
    prev = x;
  }
  return out;
}

/**
 * How many times a closed, unwrapped ring winds round a pole: the net change of longitude from
 * its first to its last point in whole turns (0 for an ordinary ring).
 */
export function poleTurns(unwrapped: readonly Position[]): number {
  const first = unwrapped[0];
  const last = unwrapped[unwrapped.length - 1];
  if (!first || !last) return 0;
  return Math.round(((last[0] as number) - (first[0] as number)) / 360);
}

/**
 * Closes a ring that goes round a pole by running from its last point to the pole, along the
 * pole to the first point's longitude and back up. The pole is the one on the ring's side of the
 * equator (land rings round a pole never straddle it).
 */
export function closeRoundPole(unwrapped: readonly Position[]): Position[] {
  const first = unwrapped[0];
  const last = unwrapped[unwrapped.length - 1];
  if (!first || !last) return [...unwrapped];
  const meanLat = unwrapped.reduce((s, p) => s + (p[1] as number), 0) / unwrapped.length;
  const poleLat = meanLat < 0 ? -90 : 90;
  return [...unwrapped, [last[0] as number, poleLat], [first[0] as number, poleLat], [first[0] as number, first[1] as number]];
}

function lonExtent(ring: readonly Position[]): [number, number] {
  let min = Infinity;
  let max = -Infinity;
  for (const p of ring) {
    const x = p[0] as number;
    if (x < min) min = x;
    if (x > max) max = x;
  }
  return [min, max];
}

function shiftRing(ring: readonly Position[], turns: number): Position[] {
  if (turns === 0) return [...ring];
  return ring.map((p) => [(p[0] as number) + turns * 360, p[1] as number]);
}

/** Whole turns that bring a ring's middle longitude into -180..180. */
export function turnsIntoWorld(ring: readonly Position[]): number {
  const [min, max] = lonExtent(ring);
  const mid = (min + max) / 2;
  return -Math.floor((mid + 180) / 360) || 0;
}

/** Twice the signed planar area in lon/lat (positive: counter-clockwise). */
export function signedArea2(ring: readonly Position[]): number {
  let a = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const p = ring[i] as Position;
    const q = ring[j] as Position;
    a += ((q[0] as number) - (p[0] as number)) * ((q[1] as number) + (p[1] as number));
  }
  return a;
}

function wind(ring: Position[], counterClockwise: boolean): Position[] {
  const ccw = signedArea2(ring) > 0;
  return ccw === counterClockwise ? ring : [...ring].reverse();
}

/** One ring made continuous and closed round its pole if it goes round one. */
export function continuousRing(ring: readonly Position[]): Position[] {
  const unwrapped = unwrapRing(ring);
  return poleTurns(unwrapped) !== 0 ? closeRoundPole(unwrapped) : unwrapped;
}

/**
 * A polygon made drawable: rings continuous, polar rings closed, the outer ring shifted into
 * -180..180 and each hole shifted to lie within its outer ring's longitudes. Outer rings wind
 * counter-clockwise and holes clockwise (RFC 7946), so every renderer classifies them alike.
 */
export function fixPolygon(rings: readonly (readonly Position[])[]): Position[][] {
  const [outerRaw, ...holesRaw] = rings;
  if (!outerRaw) return [];
  const outer0 = continuousRing(outerRaw);
  const outer = shiftRing(outer0, turnsIntoWorld(outer0));
  const [omin, omax] = lonExtent(outer);
  const holes = holesRaw.map((h) => {
    const ring = continuousRing(h);
    const [hmin, hmax] = lonExtent(ring);
    const mid = (hmin + hmax) / 2;
    // The turn that puts the hole's middle inside the outer ring's span, if there is one.
    let turns = turnsIntoWorld(ring);
    for (const t of [0, -1, 1, -2, 2]) {
      const m = mid + t * 360;
      if (m >= omin && m <= omax) {
        turns = t;
        break;
      }
    }
    return wind(shiftRing(ring, turns), false);
  });
  return [wind(outer, true), ...holes];
}

export function fixLand(geometry: MultiPolygon | Polygon): MultiPolygon {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return { type: 'MultiPolygon', coordinates: polygons.map(fixPolygon).filter((p) => p.length > 0) };
}

function onSeam(p: Position): boolean {
  return Math.abs(Math.abs(p[0] as number) - 180) < SEAM_EPS;
}

function nearPole(p: Position): boolean {
  return Math.abs(p[1] as number) >= POLE_EDGE_LAT;
}

/**
 * Coastlines from the land rings: each ring cut into lines wherever an edge runs along the
 * antimeridian seam or along a pole, each line made continuous and shifted into -180..180.
 */
export function coastlines(geometry: MultiPolygon | Polygon): MultiLineString {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  const lines: Position[][] = [];
  for (const polygon of polygons) {
    for (const ring of polygon) {
      let current: Position[] = [];
      const flush = () => {
        if (current.length >= 2) {
          const line = unwrapRing(current);
          lines.push(shiftRing(line, turnsIntoWorld(line)));
        }
        current = [];
      };
      for (let i = 0; i < ring.length; i++) {
        const p = ring[i] as Position;
        const prev = ring[i - 1];
        const artificial = prev !== undefined && ((onSeam(prev) && onSeam(p)) || (nearPole(prev) && nearPole(p)));
        if (artificial) flush();
        current.push(p);
      }
      flush();
    }
  }
  return { type: 'MultiLineString', coordinates: lines };
}

/** The world-atlas land topology as the fill and line collections the map draws. */
export function landFromTopology(topology: Topology): { land: FeatureCollection<MultiPolygon>; coast: FeatureCollection<MultiLineString> } {
  const object = topology.objects.land as GeometryCollection | undefined;
  if (!object) throw new Error('world-atlas topology has no "land" object');
  // A GeometryCollection object always comes back as a FeatureCollection.
  const fc: FeatureCollection = feature(topology, object);
  const geometries = fc.features
    .map((f) => f.geometry)
    .filter((g): g is MultiPolygon | Polygon => g !== null && (g.type === 'MultiPolygon' || g.type === 'Polygon'));
  return {
    land: { type: 'FeatureCollection', features: geometries.map((g) => ({ type: 'Feature', properties: {}, geometry: fixLand(g) })) },
    coast: { type: 'FeatureCollection', features: geometries.map((g) => ({ type: 'Feature', properties: {}, geometry: coastlines(g) })) },
  };
}
