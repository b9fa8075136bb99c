// GeoJSON (RFC 7946) for GIS: each observation a Point feature with the flat properties (a
// null geometry where no position was recorded, as RFC 7946 section 3.2 allows), and the ship
// track one feature: a LineString, or a MultiLineString cut at the antimeridian as RFC 7946
// section 3.1.9 asks, so no line is drawn the long way round the globe.
import type { Feature, FeatureCollection, Geometry, LineString, MultiLineString, Position } from 'geojson';
import type { TrackPoint } from '../domain/model';
import { exportedObservations, flatContext, flatRecord, type FlatOptions } from './flat';
import type { LogBundle } from './types';

/**
 * Splits a track where it crosses the antimeridian. The crossing latitude is interpolated
 * linearly in longitude (good to well under a metre for fixes seconds apart).
 */
export function splitAtAntimeridian(points: readonly { lat: number; lon: number }[]): Position[][] {
  const lines: Position[][] = [];
  let line: Position[] = [];
  let prev: { lat: number; lon: number } | undefined;
  for (const p of points) {
    if (prev && Math.abs(p.lon - prev.lon) > 180) {
      const east = prev.lon > 0; // crossing from the east side (+180) to the west side (-180)
      const lonUnwrapped = east ? p.lon + 360 : p.lon - 360;
      const edge = east ? 180 : -180;
      const t = (edge - prev.lon) / (lonUnwrapped - prev.lon);
      const lat = prev.lat + t * (p.lat - prev.lat);
      line.push([edge, lat]);
      lines.push(line);
      line = [[-edge, lat]];
    }
    line.push([p.lon, p.lat]);
    prev = p;
  }
  if (line.length > 0) lines.push(line);
  return lines.filter((l) => l.length >= 2);
}

export function trackGeometry(track: readonly TrackPoint[]): LineString | MultiLineString | null {
  const lines = splitAtAntimeridian(track);
  if (lines.length === 0) return null;
  if (lines.length === 1) return { type: 'LineString', coordinates: lines[0] as Position[] };
  return { type: 'MultiLineString', coordinates: lines };
}

export function toGeoJson(bundle: LogBundle, opts: FlatOptions = {}): FeatureCollection<Geometry | null> {
  const ctx = flatContext(bundle.cruise, opts.collocation);
  const features: Feature<Geometry | null>[] = exportedObservations(bundle.observations, opts).map((o) => ({
    type: 'Feature',
    id: o.id,
    geometry: o.position ? { type: 'Point', coordinates: [o.position.lon, o.position.lat] } : null,
    properties: { feature_kind: 'observation', ...flatRecord(o, ctx) },
  }));
  const track = [...bundle.track].sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
  const geometry = trackGeometry(track);
  if (geometry) {
    features.push({
      type: 'Feature',
      id: `track-${bundle.cruise.id}`,
      geometry,
      properties: {
        feature_kind: 'track',
        cruise_id: bundle.cruise.id,
        vessel_name: bundle.cruise.vesselName,
        start_utc: (track[0] as TrackPoint).time,
        end_utc: (track[track.length - 1] as TrackPoint).time,
        point_count: track.length,
      },
    });
  }
  return { type: 'FeatureCollection', features };
}

/** The GeoJSON text in parts: one feature per line. */
export function writeGeoJson(bundle: LogBundle, opts: FlatOptions = {}): string[] {
  const fc = toGeoJson(bundle, opts);
  const parts = ['{"type":"FeatureCollection","features":[\n'];
  fc.features.forEach((f, i) => parts.push(JSON.stringify(f) + (i < fc.features.length - 1 ? ',\n' : '\n')));
  parts.push(']}\n');
  return parts;
}
