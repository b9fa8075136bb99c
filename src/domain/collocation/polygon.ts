// Point in polygon for chart polygons, in the chart's own plane. Rings are flat [x0, y0, x1, y1,
// ...] arrays (closed or not); the even-odd rule over all rings makes holes work. A point exactly
// on an edge counts as inside (a chart's polygons share edges; either neighbour is fair).
//
// Geographic charts: a ring that crosses the antimeridian may be written with longitudes past
// 180 (170..190) or jump from 179 to -179. Rings are unwrapped to be continuous, and the point's
// longitude is tried shifted by whole turns to fall in the ring's span.

/** Even-odd test of one flat ring; 1 inside, 0 outside, 2 on the boundary. */
function ringTest(ring: readonly number[], x: number, y: number): 0 | 1 | 2 {
  const n = ring.length >> 1;
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const xi = ring[2 * i] as number;
    const yi = ring[2 * i + 1] as number;
    const xj = ring[2 * j] as number;
    const yj = ring[2 * j + 1] as number;
    // On the segment: collinear and within its box.
    const cross = (xj - xi) * (y - yi) - (yj - yi) * (x - xi);
    if (Math.abs(cross) <= 1e-12 * (Math.abs(xj - xi) + Math.abs(yj - yi) + 1) && x >= Math.min(xi, xj) && x <= Math.max(xi, xj) && y >= Math.min(yi, yj) && y <= Math.max(yi, yj)) return 2;
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside ? 1 : 0;
}

/** Whether (x, y) lies in the polygon made of `rings` (outer first, holes after). */
export function pointInRings(rings: readonly (readonly number[])[], x: number, y: number): boolean {
  let inside = false;
  for (const ring of rings) {
    const t = ringTest(ring, x, y);
    if (t === 2) return true;
    if (t === 1) inside = !inside;
  }
  return inside;
}

/** The ring with longitudes made continuous (no jump over 180 degrees between neighbours). */
export function unwrapLongitudes(ring: readonly number[]): number[] {
  const out = ring.slice();
  for (let i = 2; i < out.length; i += 2) {
    let lon = out[i] as number;
    const prev = out[i - 2] as number;
    while (lon - prev > 180) lon -= 360;
    while (lon - prev < -180) lon += 360;
    out[i] = lon;
  }
  return out;
}

export function ringBbox(ring: readonly number[]): [number, number, number, number] {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let i = 0; i < ring.length; i += 2) {
    const x = ring[i] as number;
    const y = ring[i + 1] as number;
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return [minX, minY, maxX, maxY];
}

/**
 * Whether a point lies in a polygon whose bbox is given. For geographic polygons `x` is a
 * longitude: the point is tried at x, x - 360 and x + 360 so it meets an unwrapped ring.
 */
export function pointInPolygon(rings: readonly (readonly number[])[], bbox: readonly number[], x: number, y: number, geographic: boolean): boolean {
  const [minX, minY, maxX, maxY] = bbox as [number, number, number, number];
  if (y < minY || y > maxY) return false;
  if (x >= minX && x <= maxX && pointInRings(rings, x, y)) return true;
  if (!geographic) return false;
  if (x - 360 >= minX && x - 360 <= maxX && pointInRings(rings, x - 360, y)) return true;
  return x + 360 >= minX && x + 360 <= maxX && pointInRings(rings, x + 360, y);
}
