// Positions from a track: the observation's position interpolated at its time from an imported
// (or recorded) track, and the recorder that writes a connected source's fix to the track once
// per interval.
import { interpolatePosition, timeMs } from '../domain/geodesy';
import type { IsoUtc, Position, PositionSource, TrackPoint } from '../domain/model';
import { isoUtc } from './trackImport';

export interface TrackPositionOptions {
  /** Longest span between the fixes either side that is still trusted (default 30 min). */
  maxBracketMinutes?: number;
}

export type TrackPositionResult =
  | { ok: true; position: Position; /** Minutes between the fixes either side (0 on an exact fix). */ bracketMinutes: number }
  | { ok: false; reason: string };

/** Index of the last point at or before t (track sorted by time), or -1. */
function lastAtOrBefore(track: readonly TrackPoint[], t: number): number {
  let lo = 0;
  let hi = track.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (timeMs((track[mid] as TrackPoint).time) <= t) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

/**
 * The position at `time` on a track sorted by time, along the geodesic between the fixes either
 * side (the domain's interpolatePosition). Refuses, with the reason, outside the track or across
 * a gap longer than `maxBracketMinutes`, where the ship may have turned.
 */
export function positionFromTrack(track: readonly TrackPoint[], time: IsoUtc, opts: TrackPositionOptions = {}): TrackPositionResult {
  const t = timeMs(time);
  if (!Number.isFinite(t)) return { ok: false, reason: `time "${time}" is not an ISO 8601 time` };
  if (track.length === 0) return { ok: false, reason: 'no track imported for this cruise' };
  const first = track[0] as TrackPoint;
  const last = track[track.length - 1] as TrackPoint;
  if (t < timeMs(first.time)) return { ok: false, reason: `${time} is before the track starts (${first.time})` };
  if (t > timeMs(last.time)) return { ok: false, reason: `${time} is after the track ends (${last.time})` };
  const i = lastAtOrBefore(track, t);
  const a = track[i] as TrackPoint;
  const b = track[i + 1];
  const bracketMinutes = !b || timeMs(a.time) === t ? 0 : (timeMs(b.time) - timeMs(a.time)) / 60_000;
  const limit = opts.maxBracketMinutes ?? 30;
  if (bracketMinutes > limit) {
    return { ok: false, reason: `the track has a gap of ${Math.round(bracketMinutes)} min around ${time} (${a.time} to ${b?.time}); more than ${limit} min is not interpolated` };
  }
  const p = interpolatePosition(track, t);
  if (!p) return { ok: false, reason: `no position on the track at ${time}` };
  return { ok: true, position: { lat: p.lat, lon: p.lon, source: 'track-interpolated' }, bracketMinutes };
}

/** What a live source hands the recorder: a GpsFix or a GeoFix both fit. */
export interface LiveFix {
  time: IsoUtc | null;
  lat: number;
  lon: number;
  sogKn?: number | null;
  cogDeg?: number | null;
  headingDeg?: number | null;
  ageMs: number;
}

export interface TrackRecorderOptions {
  cruiseId: string;
  source: PositionSource;
  /** One point per this many ms (default one a minute). */
  intervalMs?: number;
  /** Fixes older than this are not recorded (default 10 s). */
  maxAgeMs?: number;
}

/** Writes at most one point per interval, the first fresh fix of each interval. */
export class TrackRecorder {
  private lastSlot = Number.NEGATIVE_INFINITY;
  private readonly intervalMs: number;
  private readonly maxAgeMs: number;

  constructor(private readonly opts: TrackRecorderOptions) {
    this.intervalMs = Math.max(1000, opts.intervalMs ?? 60_000);
    this.maxAgeMs = opts.maxAgeMs ?? 10_000;
  }

  /** The point to store, or null when this interval already has one or the fix is stale. */
  offer(fix: LiveFix, nowMs: number): TrackPoint | null {
    if (fix.ageMs > this.maxAgeMs) return null;
    const t = fix.time === null ? nowMs - fix.ageMs : timeMs(fix.time);
    if (!Number.isFinite(t)) return null;
    const slot = Math.floor(t / this.intervalMs);
    if (slot <= this.lastSlot) return null;
    this.lastSlot = slot;
    const p: TrackPoint = { cruiseId: this.opts.cruiseId, time: isoUtc(t), lat: fix.lat, lon: fix.lon, source: this.opts.source };
    if (fix.sogKn != null) p.sogKn = fix.sogKn;
    if (fix.cogDeg != null) p.cogDeg = fix.cogDeg;
    if (fix.headingDeg != null) p.headingDeg = fix.headingDeg;
    return p;
  }
}
