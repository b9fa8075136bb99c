// Distance of one leg between two fixes, fast enough for a whole cruise in one go.
//
// GeographicLib's inverse solution (src/domain/geodesy.ts) costs a few microseconds per leg: for
// 50,000 hourly legs that alone would use most of the review's time budget. Hourly legs are short
// (a ship makes at most a few tens of km in an hour), and over short legs the WGS 84 geodesic is
// matched to well under a millimetre per kilometre by the great-circle angle between the fixes
// scaled by the ellipsoid's local metric at the mid-latitude:
//
//   d = sigma * sqrt((M^2 dphi^2 + N^2 cos^2(phi_m) dlambda^2) / (dphi^2 + cos^2(phi_m) dlambda^2))
//
// with sigma the haversine central angle, M and N the meridional and prime-vertical radii of
// curvature at the mid-latitude. The spherical angle keeps the convergence of meridians near the
// pole and the antimeridian right; the metric restores the ellipsoid's flattening to first order.
// test/domain/stats-distance.test.ts checks it against GeographicLib on random legs at every
// latitude (worst relative difference below 1e-6 up to SHORT_LEG_LIMIT_M). Longer legs go to
// GeographicLib itself.
import { geodesicDistanceM } from '../geodesy.ts';

/** WGS 84 semi-major axis (m) and flattening. */
const A = 6378137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);
const RAD = Math.PI / 180;

/** Legs estimated longer than this use GeographicLib directly. */
export const SHORT_LEG_LIMIT_M = 50_000;

/** Geodesic distance in metres between two fixes on WGS 84, fast for short legs. */
export function legDistanceM(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const p1 = lat1 * RAD;
  const p2 = lat2 * RAD;
  let dLonDeg = lon2 - lon1;
  dLonDeg -= 360 * Math.round(dLonDeg / 360);
  const dl = dLonDeg * RAD;
  const dp = p2 - p1;
  if (dp === 0 && dl === 0) return 0;
  const sinHalfP = Math.sin(dp / 2);
  const sinHalfL = Math.sin(dl / 2);
  const h = sinHalfP * sinHalfP + Math.cos(p1) * Math.cos(p2) * sinHalfL * sinHalfL;
  const sigma = 2 * Math.atan2(Math.sqrt(h), Math.sqrt(1 - h));
  // A quick upper bound on the length (a sphere of the semi-major axis) decides the method.
  if (sigma * A > SHORT_LEG_LIMIT_M) return geodesicDistanceM({ lat: lat1, lon: lon1 }, { lat: lat2, lon: lon2 });
  const pm = (p1 + p2) / 2;
  const sm = Math.sin(pm);
  const w2 = 1 - E2 * sm * sm;
  const w = Math.sqrt(w2);
  const n = A / w;
  const m = (A * (1 - E2)) / (w2 * w);
  const cm = Math.cos(pm);
  const u = dp * dp;
  const v = cm * cm * dl * dl;
  if (u + v === 0) return 0;
  return sigma * Math.sqrt((m * m * u + n * n * v) / (u + v));
}
