// The observation watch: when the next observation is due, whether it is due or overdue, and
// which observation slots were missed. Pure functions of the clock, the interval and the times
// of the observations already made, so the log screen, the review and the CLI agree.
//
// Slots are multiples of the interval counted from 1970-01-01T00:00Z: with the usual 60 minutes
// (or any interval that divides a day) they fall on the full hour, as hourly bridge
// observations are customarily made (common practice; the terms observed are those of
// WMO-No. 259, which sets no observing interval). An observation counts for the slot nearest to its time, so one made at 12:25
// or 11:40 covers the 12:00 slot. A slot is missed when its window (half an interval either
// side) has closed with no observation in it.
import type { IsoUtc } from './model';

/** `ended`: the cruise's end time has passed; nothing is due and nothing more is missed. */
export type WatchState = 'waiting' | 'due' | 'overdue' | 'ended';

export interface WatchOptions {
  intervalMinutes: number;
  /** The due state starts this long before the slot time (default 5 minutes). */
  dueBeforeMinutes?: number;
  /** The overdue state starts this long after the slot time (default 10 minutes). */
  graceMinutes?: number;
  /** Missed slots are looked for this far back from now (default 24 hours). */
  lookbackHours?: number;
  /** The cruise's end (Cruise.endTime): from then on the watch is off. */
  endTime?: IsoUtc;
}

export interface WatchStatus {
  /** The slot the next observation is for. */
  nextDue: IsoUtc;
  /** Milliseconds from now to `nextDue`; negative once it has passed. */
  msToDue: number;
  state: WatchState;
  /**
   * Slots in the look-back window (after the first observation) with no observation, oldest
   * first; empty when no observation was made within the window (the watch is not running).
   */
  missed: IsoUtc[];
  /** The latest observation time at or before now, if any. */
  lastObservation: IsoUtc | null;
}

/** A run of consecutive missed slots, for showing a gap as one line. */
export interface MissedRun {
  from: IsoUtc;
  to: IsoUtc;
  count: number;
}

const MINUTE_MS = 60_000;

export function toIsoUtc(ms: number): IsoUtc {
  return new Date(ms).toISOString().replace(/\.\d{3}Z$/, 'Z');
}

function intervalMs(intervalMinutes: number): number {
  if (!Number.isFinite(intervalMinutes) || intervalMinutes <= 0) {
    throw new RangeError(`observation interval must be a positive number of minutes, got ${intervalMinutes}`);
  }
  return intervalMinutes * MINUTE_MS;
}

/** The slot (epoch ms) an observation at `timeMs` counts for: the nearest multiple of the interval. */
export function slotOf(timeMs: number, intervalMinutes: number): number {
  const step = intervalMs(intervalMinutes);
  return Math.round(timeMs / step) * step;
}

function parseTimes(times: readonly IsoUtc[]): number[] {
  const out: number[] = [];
  for (const t of times) {
    const ms = Date.parse(t);
    if (Number.isFinite(ms)) out.push(ms);
  }
  return out;
}

/**
 * Slots from `fromMs` up to (not including) `toMs` that have no observation, as epoch ms.
 * Only slots whose whole window lies before `toMs` are candidates, so the slot in progress is
 * never reported as missed.
 */
export function missedSlotsBetween(
  times: readonly IsoUtc[],
  intervalMinutes: number,
  fromMs: number,
  toMs: number,
): number[] {
  const step = intervalMs(intervalMinutes);
  const covered = new Set(parseTimes(times).map((t) => slotOf(t, intervalMinutes)));
  const out: number[] = [];
  for (let s = Math.ceil(fromMs / step) * step; s + step / 2 <= toMs; s += step) {
    if (!covered.has(s)) out.push(s);
  }
  return out;
}

export function watchStatus(now: Date | number, times: readonly IsoUtc[], opts: WatchOptions): WatchStatus {
  const nowMs = typeof now === 'number' ? now : now.getTime();
  const step = intervalMs(opts.intervalMinutes);
  const dueBefore = (opts.dueBeforeMinutes ?? 5) * MINUTE_MS;
  const grace = (opts.graceMinutes ?? 10) * MINUTE_MS;
  const lookback = (opts.lookbackHours ?? 24) * 60 * MINUTE_MS;

  const ms = parseTimes(times);
  const covered = new Set(ms.map((t) => slotOf(t, opts.intervalMinutes)));
  // The earliest slot whose window is still open.
  let next = (Math.floor((nowMs - step / 2) / step) + 1) * step;
  while (covered.has(next)) next += step;

  const endMs = opts.endTime === undefined ? Infinity : Date.parse(opts.endTime);
  const msToDue = next - nowMs;
  const state: WatchState = nowMs >= endMs ? 'ended' : nowMs < next - dueBefore ? 'waiting' : nowMs <= next + grace ? 'due' : 'overdue';
  // Slots whose window closes after the end were never owed.
  const until = Math.min(nowMs, endMs);

  const past = ms.filter((t) => t <= nowMs);
  const first = past.length > 0 ? Math.min(...past) : null;
  const last = past.length > 0 ? Math.max(...past) : null;
  // A watch whose last observation is older than the look-back window is not running (a
  // finished cruise, a stay in port): listing a day of missed hours would only be noise.
  const missed =
    first === null || last === null || last < nowMs - lookback
      ? []
      : missedSlotsBetween(times, opts.intervalMinutes, Math.max(first, nowMs - lookback), until).map(toIsoUtc);

  return {
    nextDue: toIsoUtc(next),
    msToDue,
    state,
    missed,
    lastObservation: last === null ? null : toIsoUtc(last),
  };
}

/** Groups missed slots (epoch ms, ascending) into runs of consecutive slots. */
export function groupMissed(slotsMs: readonly number[], intervalMinutes: number): MissedRun[] {
  const step = intervalMs(intervalMinutes);
  const runs: MissedRun[] = [];
  let start: number | null = null;
  let prev = 0;
  let count = 0;
  for (const s of slotsMs) {
    if (start !== null && s === prev + step) {
      prev = s;
      count += 1;
      continue;
    }
    if (start !== null) runs.push({ from: toIsoUtc(start), to: toIsoUtc(prev), count });
    start = s;
    prev = s;
    count = 1;
  }
  if (start !== null) runs.push({ from: toIsoUtc(start), to: toIsoUtc(prev), count });
  return runs;
}

/** "in 12 min 05 s", "due now", "overdue by 1 h 03 min": for the countdown on screen. */
export function formatCountdown(msToDue: number): string {
  const abs = Math.abs(msToDue);
  const totalS = Math.floor(abs / 1000);
  const h = Math.floor(totalS / 3600);
  const m = Math.floor((totalS % 3600) / 60);
  const s = totalS % 60;
  const text = h > 0 ? `${h} h ${String(m).padStart(2, '0')} min` : `${m} min ${String(s).padStart(2, '0')} s`;
  return msToDue >= 0 ? `in ${text}` : `${text} ago`;
}

/**
 * A run of missed slots in words, UTC: "19:00 UTC on 2026-12-01", "19:00-21:00 UTC on
 * 2026-12-01 (3 observations)", and across midnight both dates: "19:00 on 2026-12-01 to 17:00 on
 * 2026-12-02 UTC (23 observations)".
 */
export function missedRunText(run: MissedRun): string {
  const [fromDay, toDay] = [run.from.slice(0, 10), run.to.slice(0, 10)];
  const [fromHm, toHm] = [run.from.slice(11, 16), run.to.slice(11, 16)];
  if (run.count === 1) return `${fromHm} UTC on ${fromDay}`;
  if (fromDay === toDay) return `${fromHm}–${toHm} UTC on ${fromDay} (${run.count} observations)`;
  return `${fromHm} on ${fromDay} to ${toHm} on ${toDay} UTC (${run.count} observations)`;
}

/**
 * A cruise end typed as UTC, "YYYY-MM-DD HH:MM" (a T and a trailing Z are accepted too), read
 * to ISO 8601; the message names the value when it is not a real time.
 */
export function readUtcMinute(text: string): { ok: true; value: IsoUtc } | { ok: false; error: string } {
  const m = /^(\d{4})-(\d{2})-(\d{2})[ T](\d{2}):(\d{2})(?::00)?Z?$/.exec(text.trim());
  const bad = { ok: false as const, error: `"${text}" is not a UTC time written as YYYY-MM-DD HH:MM` };
  if (!m) return bad;
  const [y, mo, d, h, mi] = m.slice(1).map(Number) as [number, number, number, number, number];
  const ms = Date.UTC(y, mo - 1, d, h, mi);
  const iso = toIsoUtc(ms);
  // Date.UTC rolls 2026-02-30 over into March: a time that does not read back is not real.
  if (iso.slice(0, 16) !== `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}`) return bad;
  return { ok: true, value: iso };
}
