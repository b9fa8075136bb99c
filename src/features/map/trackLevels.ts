// The heavy track work, on typed arrays so it can run in a Web Worker (trackWorker.ts): the
// antimeridian split, a Douglas-Peucker simplification per zoom level, and the marginal ice
// zone stretches. Pure, so it is unit-tested in Node as well.
import type { Feature, FeatureCollection, MultiLineString, Position } from 'geojson';

/** Zoom bands of the track: the worker simplifies the track to each band's tolerance. */
export const TRACK_LEVELS: readonly { minZoom: number; maxZoom: number }[] = [
  { minZoom: 0, maxZoom: 4 },
  { minZoom: 4, maxZoom: 7 },
  { minZoom: 7, maxZoom: 10 },
  { minZoom: 10, maxZoom: 24 },
];

/**
 * The latitude where Web Mercator ends. MapLibre draws its sources in Mercator tiles, on the
 * globe too, so anything poleward of this would be pinned to the tile edge: such parts are
 * drawn by the polar overlay instead (polarOverlay.ts).
 */
export const MERCATOR_LIMIT_LAT = 85.051129;

export function beyondMercator(lat: number): boolean {
  return Math.abs(lat) > MERCATOR_LIMIT_LAT;
}

/** A line cut where it crosses the Mercator limit, the crossings interpolated, into the parts inside and beyond. */
export function clipAtMercatorLimit(line: readonly Position[]): { inside: Position[][]; beyond: Position[][] } {
  const inside: Position[][] = [];
  const beyond: Position[][] = [];
  let current: Position[] = [];
  let out: boolean | null = null;
  for (let i = 0; i < line.length; i++) {
    const p = line[i] as Position;
    const b = beyondMercator(p[1] as number);
    if (out !== null && b !== out) {
      const q = line[i - 1] as Position;
      const edge = Math.sign((b ? p[1] : q[1]) as number) * MERCATOR_LIMIT_LAT;
      const f = (edge - (q[1] as number)) / ((p[1] as number) - (q[1] as number));
      const cross: Position = [(q[0] as number) + f * ((p[0] as number) - (q[0] as number)), edge];
      current.push(cross);
      if (current.length >= 2) (out ? beyond : inside).push(current);
      current = [cross];
    }
    current.push([p[0] as number, p[1] as number]);
    out = b;
  }
  if (current.length >= 2 && out !== null) (out ? beyond : inside).push(current);
  return { inside, beyond };
}

function clipAll(lines: Position[][]): { inside: Position[][]; beyond: Position[][] } {
  const inside: Position[][] = [];
  const beyond: Position[][] = [];
  for (const l of lines) {
    const c = clipAtMercatorLimit(l);
    inside.push(...c.inside);
    beyond.push(...c.beyond);
  }
  return { inside, beyond };
}

/** The parts of the track and zone stretches poleward of the Mercator limit, for the overlay. */
export interface PolarParts {
  track: Position[][];
  miz: Position[][];
}

/** The overlay's track detail: the level drawn between these zooms is fine enough for it. */
const POLAR_LEVEL = 2;

export interface TrackArrays {
  /** Milliseconds since 1970, ascending. */
  t: Float64Array;
  lon: Float64Array;
  lat: Float64Array;
}

/** Web Mercator in units of the world's width (0..1), the space the renderer tiles in. */
function mercX(lon: number): number {
  return (lon + 180) / 360;
}

function mercY(lat: number): number {
  const clamped = Math.max(-85.0511, Math.min(85.0511, lat));
  const s = Math.sin((clamped * Math.PI) / 180);
  return 0.5 - Math.log((1 + s) / (1 - s)) / (4 * Math.PI);
}

/**
 * Douglas-Peucker on one line (iterative, so a million points cannot overflow the stack).
 * Returns the indexes kept, first and last always included. `tolerance` in world widths.
 */
export function simplifyIndexes(xs: ArrayLike<number>, ys: ArrayLike<number>, from: number, to: number, tolerance: number): number[] {
  if (to - from < 2) return to > from ? [from, to] : [from];
  const keep = new Uint8Array(to - from + 1);
  keep[0] = 1;
  keep[to - from] = 1;
  const tol2 = tolerance * tolerance;
  const stack: number[] = [from, to];
  while (stack.length > 0) {
    const b = stack.pop() as number;
    const a = stack.pop() as number;
    const ax = xs[a] as number;
    const ay = ys[a] as number;
    const dx = (xs[b] as number) - ax;
    const dy = (ys[b] as number) - ay;
    const len2 = dx * dx + dy * dy;
    let maxD = -1;
    let maxI = -1;
    for (let i = a + 1; i < b; i++) {
      const px = (xs[i] as number) - ax;
      const py = (ys[i] as number) - ay;
      let d2: number;
      if (len2 === 0) d2 = px * px + py * py;
      else {
        const u = Math.max(0, Math.min(1, (px * dx + py * dy) / len2));
        const ex = px - u * dx;
        const ey = py - u * dy;
        d2 = ex * ex + ey * ey;
      }
      if (d2 > maxD) {
        maxD = d2;
        maxI = i;
      }
    }
    if (maxD > tol2 && maxI > 0) {
      keep[maxI - from] = 1;
      stack.push(a, maxI, maxI, b);
    }
  }
  const out: number[] = [];
  for (let i = 0; i < keep.length; i++) if (keep[i]) out.push(from + i);
  return out;
}

/** Half a pixel at `zoom` (512-pixel world), in world widths. */
export function toleranceAtZoom(zoom: number): number {
  return 0.5 / (512 * 2 ** zoom);
}

/**
 * The finest level keeps detail to half a pixel at this zoom: near 80 N a pixel there is under
 * 2 m, finer than a ship's GPS fix.
 */
const FINEST_DETAIL_ZOOM = 14;

/**
 * Pieces of the line between antimeridian crossings: [start, end] index pairs, inclusive. A
 * crossing is a step of more than 180 degrees of longitude.
 */
export function seamPieces(lon: ArrayLike<number>): [number, number][] {
  const pieces: [number, number][] = [];
  let start = 0;
  for (let i = 1; i < lon.length; i++) {
    if (Math.abs((lon[i] as number) - (lon[i - 1] as number)) > 180) {
      pieces.push([start, i - 1]);
      start = i;
    }
  }
  if (lon.length > 0) pieces.push([start, lon.length - 1]);
  return pieces;
}

function crossingLat(lon0: number, lat0: number, lon1: number, lat1: number): { edge: number; lat: number } {
  const x1 = lon1 + (lon1 - lon0 > 0 ? -360 : 360);
  const edge = x1 > lon0 ? 180 : -180;
  return { edge, lat: lat0 + ((edge - lon0) / (x1 - lon0)) * (lat1 - lat0) };
}

/** Coordinates of the kept indexes of one piece, with the seam crossings added at its ends. */
export function pieceCoords(a: Pick<TrackArrays, 'lon' | 'lat'>, piece: [number, number], kept: number[]): Position[] {
  const [s, e] = piece;
  const coords: Position[] = [];
  if (s > 0) {
    const c = crossingLat(a.lon[s - 1] as number, a.lat[s - 1] as number, a.lon[s] as number, a.lat[s] as number);
    coords.push([-c.edge, c.lat]);
  }
  for (const i of kept) coords.push([a.lon[i] as number, a.lat[i] as number]);
  if (e < a.lon.length - 1) {
    const c = crossingLat(a.lon[e] as number, a.lat[e] as number, a.lon[e + 1] as number, a.lat[e + 1] as number);
    coords.push([c.edge, c.lat]);
  }
  return coords;
}

/**
 * The track at every level of TRACK_LEVELS, one feature per level with its `level` index, cut
 * at the Mercator limit; the parts beyond it (at one level of detail) go to `polar`.
 */
export function trackLevels(a: TrackArrays, polar?: PolarParts): FeatureCollection<MultiLineString, { level: number }> {
  const n = a.lon.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = mercX(a.lon[i] as number);
    ys[i] = mercY(a.lat[i] as number);
  }
  const pieces = seamPieces(a.lon);
  const features: Feature<MultiLineString, { level: number }>[] = TRACK_LEVELS.map((l, level) => {
    const tol = toleranceAtZoom(Math.min(l.maxZoom, FINEST_DETAIL_ZOOM));
    const lines = pieces
      .map((p) => pieceCoords(a, p, simplifyIndexes(xs, ys, p[0], p[1], tol)))
      .filter((c) => c.length >= 2);
    const clipped = clipAll(lines);
    if (polar && level === POLAR_LEVEL) polar.track.push(...clipped.beyond);
    return { type: 'Feature', properties: { level }, geometry: { type: 'MultiLineString', coordinates: clipped.inside } };
  });
  return { type: 'FeatureCollection', features };
}

/**
 * Stretches of the track in the marginal ice zone: each point takes the state of the
 * observation nearest in time (the later one on a tie) if it lies within `maxGapMs`.
 * `obsT` ascending; `obsMiz[i]` is 1 where observation i is in the zone.
 */
export function mizStretchIndexes(t: Float64Array, obsT: Float64Array, obsMiz: Uint8Array, maxGapMs: number): [number, number][] {
  const runs: [number, number][] = [];
  let start = -1;
  let j = 0;
  for (let i = 0; i < t.length; i++) {
    const ti = t[i] as number;
    while (j + 1 < obsT.length && Math.abs((obsT[j + 1] as number) - ti) <= Math.abs((obsT[j] as number) - ti)) j++;
    const inZone = obsT.length > 0 && Math.abs((obsT[j] as number) - ti) <= maxGapMs && obsMiz[j] === 1;
    if (inZone && start < 0) start = i;
    if (!inZone && start >= 0) {
      runs.push([start, i - 1]);
      start = -1;
    }
  }
  if (start >= 0) runs.push([start, t.length - 1]);
  return runs.filter(([s, e]) => e > s);
}

export function mizFeatures(a: TrackArrays, obsT: Float64Array, obsMiz: Uint8Array, maxGapMs: number, tolerance = 0, polar?: PolarParts): FeatureCollection<MultiLineString> {
  const xs = new Float64Array(a.lon.length);
  const ys = new Float64Array(a.lon.length);
  for (let i = 0; i < a.lon.length; i++) {
    xs[i] = mercX(a.lon[i] as number);
    ys[i] = mercY(a.lat[i] as number);
  }
  const features: Feature<MultiLineString>[] = mizStretchIndexes(a.t, obsT, obsMiz, maxGapMs).map(([s, e]) => {
    const sub = { lon: a.lon.subarray(s, e + 1), lat: a.lat.subarray(s, e + 1) };
    const lines = seamPieces(sub.lon)
      .map((p) => {
        const kept = tolerance > 0 ? simplifyIndexes(xs.subarray(s, e + 1), ys.subarray(s, e + 1), p[0], p[1], tolerance) : range(p[0], p[1]);
        return pieceCoords(sub, p, kept);
      })
      .filter((c) => c.length >= 2);
    const clipped = clipAll(lines);
    polar?.miz.push(...clipped.beyond);
    return { type: 'Feature', properties: {}, geometry: { type: 'MultiLineString', coordinates: clipped.inside } };
  });
  return { type: 'FeatureCollection', features };
}

export function range(a: number, b: number): number[] {
  const out: number[] = [];
  for (let i = a; i <= b; i++) out.push(i);
  return out;
}
