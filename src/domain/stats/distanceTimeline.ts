// Distance sailed as a function of time: the running along-track distance at each fix, and
// linear interpolation in time between fixes (constant speed along a leg). The distance sailed
// between any two instants is then D(t2) - D(t1), which lets the review give each observation
// the distance sailed during the time it stands for (see attribution.ts).
import { legDistanceM } from './legDistance.ts';

export type DistanceSource = 'track' | 'observations' | 'none';

export interface DistanceTimeline {
  source: DistanceSource;
  /** Fix times (ms since the epoch), increasing. */
  timesMs: Float64Array;
  /** Running distance in metres at each fix. */
  cumulativeM: Float64Array;
  /** Distance sailed over the whole timeline, in metres. */
  totalM: number;
}

export interface TimedFix {
  timeMs: number;
  lat: number;
  lon: number;
}

/** Builds the timeline from fixes sorted by time; fixes at the same time as the previous are skipped. */
export function buildDistanceTimeline(fixes: readonly TimedFix[], source: Exclude<DistanceSource, 'none'>): DistanceTimeline {
  const n = fixes.length;
  const t = new Float64Array(n);
  const lat = new Float64Array(n);
  const lon = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const f = fixes[i] as TimedFix;
    t[i] = f.timeMs;
    lat[i] = f.lat;
    lon[i] = f.lon;
  }
  return buildDistanceTimelineFromColumns(t, lat, lon, n, source);
}

/** The same from parallel columns (no object per fix: a cruise has tens of thousands). */
export function buildDistanceTimelineFromColumns(
  timeMs: ArrayLike<number>, lat: ArrayLike<number>, lon: ArrayLike<number>, count: number, source: Exclude<DistanceSource, 'none'>,
): DistanceTimeline {
  const times = new Float64Array(count);
  const cum = new Float64Array(count);
  let n = 0;
  let sum = 0;
  let pt = Number.NEGATIVE_INFINITY;
  let plat = 0;
  let plon = 0;
  for (let i = 0; i < count; i++) {
    const ti = timeMs[i] as number;
    const la = lat[i] as number;
    const lo = lon[i] as number;
    if (!Number.isFinite(ti) || !Number.isFinite(la) || !Number.isFinite(lo)) continue;
    if (n > 0) {
      if (ti <= pt) continue;
      sum += legDistanceM(plat, plon, la, lo);
    }
    times[n] = ti;
    cum[n] = sum;
    n++;
    pt = ti;
    plat = la;
    plon = lo;
  }
  return { source: n >= 2 ? source : 'none', timesMs: times.subarray(0, n), cumulativeM: cum.subarray(0, n), totalM: sum };
}

export const EMPTY_TIMELINE: DistanceTimeline = {
  source: 'none', timesMs: new Float64Array(0), cumulativeM: new Float64Array(0), totalM: 0,
};

/** Running distance at time t, held at the ends outside the timeline's span. */
export function distanceAt(tl: DistanceTimeline, t: number): number {
  const ts = tl.timesMs;
  const n = ts.length;
  if (n === 0) return 0;
  if (t <= (ts[0] as number)) return 0;
  if (t >= (ts[n - 1] as number)) return tl.totalM;
  let lo = 0;
  let hi = n - 1;
  // Invariant: ts[lo] <= t < ts[hi].
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if ((ts[mid] as number) <= t) lo = mid;
    else hi = mid;
  }
  const t0 = ts[lo] as number;
  const t1 = ts[hi] as number;
  const d0 = tl.cumulativeM[lo] as number;
  const d1 = tl.cumulativeM[hi] as number;
  return d0 + ((d1 - d0) * (t - t0)) / (t1 - t0);
}

/** Distance sailed between two instants, in metres. */
export function distanceBetween(tl: DistanceTimeline, fromMs: number, toMs: number): number {
  return toMs <= fromMs ? 0 : distanceAt(tl, toMs) - distanceAt(tl, fromMs);
}
