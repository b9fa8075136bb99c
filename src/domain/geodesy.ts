// Geodesics on the WGS 84 ellipsoid with GeographicLib (Karney 2013): distances between fixes,
// distance along a track, and the position at a time between two fixes. Interpolating along the
// geodesic rather than in latitude/longitude keeps it right across the antimeridian (179°E to
// 179°W is 2° apart, not 358°) and near the poles, where lines of longitude converge.

import geographiclib from 'geographiclib-geodesic';
import type { IsoUtc } from './model.ts';
import type { LatLon } from './position.ts';

const { Geodesic } = geographiclib;
const WGS84 = Geodesic.WGS84;

/** Metres in one international nautical mile. */
export const METRES_PER_NM = 1852;

export interface InverseResult {
  distanceM: number;
  /** Initial and final bearing, degrees true 0..360. */
  initialBearingDeg: number;
  finalBearingDeg: number;
}

const to360 = (deg: number): number => ((deg % 360) + 360) % 360;

/** Longitude into [-180, 180). */
export function normaliseLon(lon: number): number {
  const l = ((((lon + 180) % 360) + 360) % 360) - 180;
  return l === -180 && lon > 0 ? 180 : l;
}

/** Distance and bearings between two points (WGS 84 geodesic). */
export function geodesicInverse(a: LatLon, b: LatLon): InverseResult {
  const r = WGS84.Inverse(a.lat, a.lon, b.lat, b.lon, Geodesic.DISTANCE | Geodesic.AZIMUTH);
  return {
    distanceM: r.s12 ?? 0,
    initialBearingDeg: to360(r.azi1 ?? 0),
    finalBearingDeg: to360(r.azi2 ?? 0),
  };
}

/** Geodesic distance in metres between two points on WGS 84. */
export function geodesicDistanceM(a: LatLon, b: LatLon): number {
  return geodesicInverse(a, b).distanceM;
}

/** The point reached from `a` going `distanceM` along the geodesic that starts on `bearingDeg`. */
export function destination(a: LatLon, bearingDeg: number, distanceM: number): LatLon {
  const r = WGS84.Direct(a.lat, a.lon, bearingDeg, distanceM, Geodesic.LATITUDE | Geodesic.LONGITUDE);
  return { lat: r.lat2 ?? a.lat, lon: normaliseLon(r.lon2 ?? a.lon) };
}

/** Running distance along a track: element i is the distance in metres from point 0 to point i. */
export function cumulativeDistancesM(points: readonly LatLon[]): number[] {
  const out: number[] = [];
  let sum = 0;
  points.forEach((p, i) => {
    const prev = points[i - 1];
    if (prev) sum += geodesicDistanceM(prev, p);
    out.push(sum);
  });
  return out;
}

/** Total distance in metres along a track (sum of geodesic legs). */
export function alongTrackDistanceM(points: readonly LatLon[]): number {
  return cumulativeDistancesM(points).at(-1) ?? 0;
}

/** Speed in knots over a distance in metres and a duration in seconds. */
export function speedKn(distanceM: number, seconds: number): number {
  return distanceM / METRES_PER_NM / (seconds / 3600);
}

/** The point a fraction 0..1 of the way from `a` to `b` along their geodesic. */
export function pointAlongGeodesic(a: LatLon, b: LatLon, fraction: number): LatLon {
  const line = WGS84.InverseLine(a.lat, a.lon, b.lat, b.lon, Geodesic.STANDARD | Geodesic.DISTANCE_IN);
  const p = line.Position(line.s13 * fraction, Geodesic.LATITUDE | Geodesic.LONGITUDE);
  return { lat: p.lat2 ?? a.lat, lon: normaliseLon(p.lon2 ?? a.lon) };
}

export interface TimedPoint extends LatLon {
  time: IsoUtc;
}

/** Milliseconds since the epoch for an ISO time, or NaN if it does not parse. */
export function timeMs(time: IsoUtc | number): number {
  return typeof time === 'number' ? time : Date.parse(time);
}

/**
 * Position at `time` on a track sorted by time, interpolated along the geodesic between the fixes
 * either side (constant speed along the leg). Null outside the track's time span or for an
 * empty track; an exact fix time returns that fix.
 */
export function interpolatePosition(track: readonly TimedPoint[], time: IsoUtc | number): LatLon | null {
  const t = timeMs(time);
  if (!Number.isFinite(t) || track.length === 0) return null;
  const first = track[0];
  const last = track[track.length - 1];
  if (!first || !last || t < timeMs(first.time) || t > timeMs(last.time)) return null;
  // Binary search for the last fix at or before t.
  let lo = 0;
  let hi = track.length - 1;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (timeMs((track[mid] as TimedPoint).time) <= t) lo = mid;
    else hi = mid - 1;
  }
  const a = track[lo] as TimedPoint;
  const b = track[lo + 1];
  const ta = timeMs(a.time);
  if (t === ta || !b) return { lat: a.lat, lon: a.lon };
  const tb = timeMs(b.time);
  if (tb <= ta) return { lat: a.lat, lon: a.lon };
  return pointAlongGeodesic(a, b, (t - ta) / (tb - ta));
}
