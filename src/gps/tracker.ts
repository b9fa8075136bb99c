// Combines NMEA sentences into one current fix, the way a bridge display does: position and
// fix quality from GGA/RMC, speed and course from RMC/VTG, heading from HDT (or HDG with
// variation). Counts good, bad and ignored sentences so the user can see a noisy line.
import type { IsoUtc } from '../domain/model';
import { parseNmea, type NmeaError, type NmeaSentence, type ParseOptions, type ParseResult, type SecondsOfDay, type SentenceType, type UtcDate } from './nmea';

export interface GpsFix {
  /** UTC time of the fix as the receiver reported it, or null when it gave none. */
  time: IsoUtc | null;
  lat: number;
  lon: number;
  /** GGA fix quality (0 invalid, 1 GPS, 2 DGPS, ...); null when only RMC was heard. */
  fixQuality: number | null;
  satellites: number | null;
  hdop: number | null;
  sogKn: number | null;
  cogDeg: number | null;
  headingDeg: number | null;
  /** Milliseconds since the position was last received. */
  ageMs: number;
}

export interface GpsCounts {
  good: number;
  bad: number;
  /** Well-formed sentences of types we do not use (GSV, GSA, ZDA...). */
  ignored: number;
  byType: Record<SentenceType, number>;
}

const DAY_MS = 86_400_000;

/**
 * Epoch milliseconds of a time of day. With a date from RMC that date is used; without one, the
 * day is taken from the reference time, choosing the day that puts the fix nearest to it (so a
 * fix at 23:59:59 heard just after midnight lands on the previous day).
 */
export function fixEpochMs(timeOfDay: SecondsOfDay, date: UtcDate | null, referenceMs: number): number {
  if (date) return Date.UTC(date.year, date.month - 1, date.day) + Math.round(timeOfDay * 1000);
  const midnight = Math.floor(referenceMs / DAY_MS) * DAY_MS;
  let t = midnight + Math.round(timeOfDay * 1000);
  if (t - referenceMs > DAY_MS / 2) t -= DAY_MS;
  else if (referenceMs - t > DAY_MS / 2) t += DAY_MS;
  return t;
}

export function isoFromMs(ms: number): IsoUtc {
  const s = new Date(ms).toISOString();
  return s.endsWith('.000Z') ? s.replace('.000Z', 'Z') : s;
}

export interface TrackerOptions extends ParseOptions {
  /** How many recent errors to keep for display. */
  keepErrors?: number;
}

export class GpsTracker {
  readonly counts: GpsCounts = { good: 0, bad: 0, ignored: 0, byType: { GGA: 0, RMC: 0, VTG: 0, HDT: 0, HDG: 0 } };
  readonly recentErrors: NmeaError[] = [];
  private readonly opts: TrackerOptions;
  private pos: { lat: number; lon: number; receivedAtMs: number; timeMs: number | null } | null = null;
  private fixQuality: number | null = null;
  private satellites: number | null = null;
  private hdop: number | null = null;
  private sogKn: number | null = null;
  private cogDeg: number | null = null;
  private headingDeg: number | null = null;
  private headingFromHdt = false;
  private lastDate: UtcDate | null = null;

  constructor(opts: TrackerOptions = {}) {
    this.opts = opts;
  }

  /** Parse and apply one line; the result says what happened (bad lines are counted, never thrown). */
  acceptLine(line: string, receivedAtMs: number): ParseResult {
    const r = parseNmea(line, this.opts);
    if (r.ok) {
      this.accept(r.value, receivedAtMs);
    } else if (r.error.kind === 'unsupported') {
      this.counts.ignored++;
    } else {
      this.counts.bad++;
      this.recentErrors.push(r.error);
      if (this.recentErrors.length > (this.opts.keepErrors ?? 20)) this.recentErrors.shift();
    }
    return r;
  }

  /** Apply a parsed sentence. Returns true when it moved the position. */
  accept(s: NmeaSentence, receivedAtMs: number): boolean {
    this.counts.good++;
    this.counts.byType[s.type]++;
    switch (s.type) {
      case 'GGA':
        this.fixQuality = s.fixQuality;
        this.satellites = s.satellites;
        this.hdop = s.hdop;
        if (s.fixQuality > 0 && s.lat !== null && s.lon !== null) return this.setPosition(s.lat, s.lon, s.timeOfDay, receivedAtMs);
        return false;
      case 'RMC':
        if (s.date) this.lastDate = s.date;
        if (s.status !== 'A' || s.mode === 'N') return false;
        if (s.sogKn !== null) this.sogKn = s.sogKn;
        if (s.cogDeg !== null) this.cogDeg = s.cogDeg;
        if (s.lat !== null && s.lon !== null) return this.setPosition(s.lat, s.lon, s.timeOfDay, receivedAtMs);
        return false;
      case 'VTG':
        if (s.mode === 'N') return false;
        if (s.sogKn !== null) this.sogKn = s.sogKn;
        else if (s.sogKmh !== null) this.sogKn = s.sogKmh / 1.852;
        if (s.cogTrueDeg !== null) this.cogDeg = s.cogTrueDeg;
        return false;
      case 'HDT':
        if (s.headingTrueDeg !== null) {
          this.headingDeg = s.headingTrueDeg;
          this.headingFromHdt = true;
        }
        return false;
      case 'HDG':
        // A gyro's true heading beats a compass corrected by a variation figure.
        if (s.headingTrueDeg !== null && !this.headingFromHdt) this.headingDeg = s.headingTrueDeg;
        return false;
    }
  }

  private setPosition(lat: number, lon: number, timeOfDay: SecondsOfDay | null, receivedAtMs: number): boolean {
    const timeMs = timeOfDay === null ? null : fixEpochMs(timeOfDay, this.lastDate, receivedAtMs);
    this.pos = { lat, lon, receivedAtMs, timeMs };
    return true;
  }

  /** The current fix, or null before the first valid position. */
  fix(nowMs: number): GpsFix | null {
    if (!this.pos) return null;
    return {
      time: this.pos.timeMs === null ? null : isoFromMs(this.pos.timeMs),
      lat: this.pos.lat, lon: this.pos.lon,
      fixQuality: this.fixQuality, satellites: this.satellites, hdop: this.hdop,
      sogKn: this.sogKn, cogDeg: this.cogDeg, headingDeg: this.headingDeg,
      ageMs: Math.max(0, nowMs - this.pos.receivedAtMs),
    };
  }

  /**
   * A hint when the stream looks wrong as a whole rather than a sentence at a time: garbage
   * only (almost always the wrong baud rate), or sentences but never a position.
   */
  diagnosis(): string | null {
    const { good, bad, ignored } = this.counts;
    if (good === 0 && ignored === 0 && bad >= 10) {
      return 'Nothing readable from the port: check the baud rate (NMEA 0183 is 4800 baud; high-speed NMEA and AIS feeds 38400).';
    }
    if (good + ignored >= 50 && this.counts.byType.GGA + this.counts.byType.RMC === 0) {
      return 'The device sends NMEA but no position (GGA or RMC): is this the GPS, or a gyro or echo sounder on the same line?';
    }
    if (good >= 20 && !this.pos) return 'The GPS reports no fix yet (fix quality 0 or status V): it may still be acquiring satellites.';
    return null;
  }

  /** Epoch ms of the current fix as the receiver stated it (null without a time). */
  fixTimeMs(): number | null {
    return this.pos?.timeMs ?? null;
  }
}
