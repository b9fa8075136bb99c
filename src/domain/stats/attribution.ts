// How an observation is attributed to time.
//
// Each observation stands for the conditions from its own time until the next observation, but
// for at most ATTRIBUTION_CAP_FACTOR times the cruise's observation interval (1.5 h for hourly
// observations). Time beyond the cap is a gap: nobody saw the ice then, so it counts as
// unobserved and never as ice hours. The last observation stands for one interval. Hours in ice,
// hours in each POLARIS outcome and distance in ice all follow this rule.
//
// The factor 1.5 is our own choice (no published source): it tolerates an observation made half
// an interval late without calling it a gap, and gives a missed hour no ice time.

/** The cap on the time an observation stands for, in cruise intervals. */
export const ATTRIBUTION_CAP_FACTOR = 1.5;

export interface Attribution {
  /** Milliseconds each observation stands for, in the order of the input times. */
  durationsMs: Float64Array;
  /** True where the time to the next observation exceeds the cap (a gap follows). */
  gapAfter: Uint8Array;
  capMs: number;
}

/** Attribution for observation times (ms, sorted ascending) at a nominal interval (minutes). */
export function attributeTime(timesMs: ArrayLike<number>, intervalMinutes: number): Attribution {
  const n = timesMs.length;
  const intervalMs = Math.max(1, intervalMinutes) * 60_000;
  const capMs = ATTRIBUTION_CAP_FACTOR * intervalMs;
  const durationsMs = new Float64Array(n);
  const gapAfter = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (i === n - 1) {
      durationsMs[i] = intervalMs;
      break;
    }
    const dt = (timesMs[i + 1] as number) - (timesMs[i] as number);
    if (dt > capMs) {
      durationsMs[i] = capMs;
      gapAfter[i] = 1;
    } else {
      durationsMs[i] = Math.max(0, dt);
    }
  }
  return { durationsMs, gapAfter, capMs };
}

/** A stretch longer than the cap between two consecutive observations. */
export interface ObservationGap {
  /** Observation before and after the gap. */
  beforeId: string;
  afterId: string;
  fromMs: number;
  toMs: number;
  /** Observations that would have been made in the gap at the nominal interval. */
  missedObservations: number;
  /** Time no observation stands for, in hours (gap length less the cap). */
  unobservedHours: number;
}
