// Choosing the initial view: which projection suits the cruise, and a camera that frames it.
// On the globe the apparent zoom depends on latitude (MapLibre scales the globe by 1/cos(lat)
// so the centre keeps the Mercator scale), so the camera is computed on the sphere, not from a
// Mercator bounding box.

export type LonLat = readonly [number, number];

const RAD = Math.PI / 180;

/** Globe by default when the cruise is poleward of 60 degrees (at least half its positions). */
export const POLAR_LATITUDE = 60;

export function isPolarCruise(points: readonly LonLat[]): boolean {
  if (points.length === 0) return false;
  const polar = points.filter((p) => Math.abs(p[1]) >= POLAR_LATITUDE).length;
  return polar * 2 >= points.length;
}

function toVec(p: LonLat): [number, number, number] {
  const lon = p[0] * RAD;
  const lat = p[1] * RAD;
  return [Math.cos(lat) * Math.cos(lon), Math.cos(lat) * Math.sin(lon), Math.sin(lat)];
}

/** The centre of the points on the sphere (their mean direction); the first point if they cancel out. */
export function sphericalCentre(points: readonly LonLat[]): LonLat {
  let x = 0;
  let y = 0;
  let z = 0;
  for (const p of points) {
    const v = toVec(p);
    x += v[0];
    y += v[1];
    z += v[2];
  }
  const r = Math.hypot(x, y, z);
  if (points.length === 0) return [0, 0];
  if (r < 1e-9 * points.length) return points[0] as LonLat;
  return [Math.atan2(y, x) / RAD, Math.asin(Math.max(-1, Math.min(1, z / r))) / RAD];
}

/** Great-circle angle between two positions, degrees. */
export function angleBetween(a: LonLat, b: LonLat): number {
  const va = toVec(a);
  const vb = toVec(b);
  const dot = va[0] * vb[0] + va[1] * vb[1] + va[2] * vb[2];
  const cross = Math.hypot(va[1] * vb[2] - va[2] * vb[1], va[2] * vb[0] - va[0] * vb[2], va[0] * vb[1] - va[1] * vb[0]);
  return Math.atan2(cross, dot) / RAD;
}

/** At most `max` points spread evenly through the list (always the first and the last). */
export function sample<T>(points: readonly T[], max: number): T[] {
  if (points.length <= max) return [...points];
  const out: T[] = [];
  const step = (points.length - 1) / (max - 1);
  for (let i = 0; i < max; i++) out.push(points[Math.round(i * step)] as T);
  return out;
}

/** The Web Mercator latitude limit, which MapLibre also keeps the globe's centre within. */
export const MAX_CENTRE_LAT = 85.051129;

export interface Camera {
  center: LonLat;
  zoom: number;
}

/**
 * A globe camera that shows every point: centred on their spherical centre, zoomed so that the
 * farthest point (angular radius r) lies within `fill` of half the smaller viewport side. On the
 * globe, a point at angle r from the centre appears R sin r from it (R the globe's radius in
 * pixels), and MapLibre's R = 512 * 2^zoom / (2 pi cos(lat)).
 */
export function globeCamera(points: readonly LonLat[], viewport: { width: number; height: number }, fill = 0.8): Camera {
  const c = sphericalCentre(points);
  // MapLibre keeps the map centre within the Mercator latitude limit, also on the globe; the
  // points are measured from the centre the map will really have.
  const lat = Math.max(-MAX_CENTRE_LAT, Math.min(MAX_CENTRE_LAT, c[1]));
  const center: LonLat = [c[0], lat];
  const r = Math.max(0.05, ...points.map((p) => angleBetween(center, p)));
  const halfSide = (Math.min(viewport.width, viewport.height) / 2) * fill;
  const radiusPx = halfSide / Math.sin(Math.min(90, r) * RAD);
  const zoom = Math.log2((radiusPx * 2 * Math.PI * Math.cos(lat * RAD)) / 512);
  return { center, zoom: Math.max(-2, Math.min(18, zoom)) };
}

/**
 * West, south, east, north of the points, with the longitudes taken across the largest empty
 * gap so a cruise across the antimeridian gets a narrow box (east may then exceed 180).
 */
export function lonLatBounds(points: readonly LonLat[]): [number, number, number, number] | null {
  if (points.length === 0) return null;
  const lons = [...new Set(points.map((p) => p[0]))].sort((a, b) => a - b);
  let gap = 360 - ((lons[lons.length - 1] as number) - (lons[0] as number));
  let west = lons[0] as number;
  let east = lons[lons.length - 1] as number;
  for (let i = 1; i < lons.length; i++) {
    const g = (lons[i] as number) - (lons[i - 1] as number);
    if (g > gap) {
      gap = g;
      west = lons[i] as number;
      east = (lons[i - 1] as number) + 360;
    }
  }
  const lats = points.map((p) => p[1]);
  return [west, Math.min(...lats), east, Math.max(...lats)];
}
