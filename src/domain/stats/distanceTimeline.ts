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
  const times = new Float64Array(fixes.length);
  const cum = new Float64Array(fixes.length);
  let n = 0;
  let sum = 0;
  let prev: TimedFix | undefined;
  for (const f of fixes) {
    if (!Number.isFinite(f.timeMs) || !Number.isFinite(f.lat) || !Number.isFinite(f.lon)) continue;
    if (prev) {
      if (f.timeMs <= prev.timeMs) continue;
      sum += legDistanceM(prev.lat, prev.lon, f.lat, f.lon);
    }
    times[n] = f.timeMs;
    cum[n] = sum;
    n++;
    prev = f;
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
