// The ship's track as stored: one row per cruise and UTC hour, the points of that hour in
// columns of typed arrays. A season at a fix a second is about 9,000 rows instead of millions,
// so storing, reading and syncing the track costs per hour, not per point. This module is pure
// (no Dexie): it turns points into chunk rows and back, and merges new points into a chunk.
import type { IsoUtc, TrackPoint } from '../domain/model';

export const HOUR_MS = 3_600_000;

/**
 * One hour of one cruise's track. The key is `[cruiseId+hour]`; the CouchDB sync makes one
 * document per row, so this shape is shared with it (change it only with a schema version).
 */
export interface TrackChunkRow {
  cruiseId: string;
  /** Start of the UTC hour, `YYYY-MM-DDTHH:00:00Z`. */
  hour: IsoUtc;
  /** Points in the chunk (the length of every column); indexed so a count reads keys only. */
  count: number;
  /** Epoch milliseconds of each point, ascending; equal instants are ordered by their text. */
  time: Float64Array;
  /** WGS 84 decimal degrees. */
  lat: Float64Array;
  lon: Float64Array;
  /** Speed over ground (kn), course over ground and heading (degrees true); NaN where not known. */
  speed: Float64Array;
  course: Float64Array;
  heading: Float64Array;
  /** Index into `sources` per point. */
  source: Uint8Array;
  /** The position sources used in this chunk (model keys), so the column needs no global table. */
  sources: string[];
  /**
   * The time text of points whose text is not the canonical rendering of their instant (a
   * fraction of a second written with other digits, say): `[index, text]`, ascending. Empty for
   * whole-second fixes, as the GPS layer writes them. Keeps the stored text exact.
   */
  timeText: [number, string][];
}

/** The hour a time falls in, as the chunk key's `hour`. */
export function hourOf(ms: number): IsoUtc {
  return new Date(Math.floor(ms / HOUR_MS) * HOUR_MS).toISOString().slice(0, 13) + ':00:00Z';
}

const pad2 = (n: number) => (n < 10 ? '0' : '') + n;

/** Whole seconds as `…:SSZ`, otherwise milliseconds as `…:SS.sssZ`, within a known hour. */
function canonicalIn(hourPrefix: string, hourMs: number, ms: number): string {
  const off = ms - hourMs;
  const m = Math.floor(off / 60_000);
  const s = Math.floor((off % 60_000) / 1000);
  const frac = off % 1000;
  const base = `${hourPrefix}${pad2(m)}:${pad2(s)}`;
  return frac === 0 ? `${base}Z` : `${base}.${String(frac).padStart(3, '0')}Z`;
}

export function canonicalTime(ms: number): string {
  const hourMs = Math.floor(ms / HOUR_MS) * HOUR_MS;
  return canonicalIn(new Date(hourMs).toISOString().slice(0, 14), hourMs, ms);
}

/** A point with its instant parsed once. */
export interface TimedPoint {
  ms: number;
  p: TrackPoint;
  /** True when `p.time` is known to be the canonical text of `ms` (saves building it to compare). */
  canon?: boolean;
}

const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/**
 * Epoch milliseconds of a time written `YYYY-MM-DDTHH:MM:SS[.fraction]Z` with every field in its
 * calendar range (years 1970-9999), read digit by digit: a million fixes are parsed on every
 * bulk import, and Date.parse with the format check costs several times more. NaN for any other
 * text; the caller then asks Date.parse, which decides as before.
 */
export function parseTrackTime(s: string): number {
  const n = s.length;
  if (n < 20 || n > 30 || s.charCodeAt(n - 1) !== 90 /* Z */) return NaN;
  if (s.charCodeAt(4) !== 45 || s.charCodeAt(7) !== 45 || s.charCodeAt(10) !== 84 || s.charCodeAt(13) !== 58 || s.charCodeAt(16) !== 58) return NaN;
  // Each digit minus '0'; a non-digit gives a value outside 0-9, caught by `bad` below.
  const y0 = s.charCodeAt(0) - 48, y1 = s.charCodeAt(1) - 48, y2 = s.charCodeAt(2) - 48, y3 = s.charCodeAt(3) - 48;
  const mo0 = s.charCodeAt(5) - 48, mo1 = s.charCodeAt(6) - 48, d0 = s.charCodeAt(8) - 48, d1 = s.charCodeAt(9) - 48;
  const h0 = s.charCodeAt(11) - 48, h1 = s.charCodeAt(12) - 48, mi0 = s.charCodeAt(14) - 48, mi1 = s.charCodeAt(15) - 48;
  const s0 = s.charCodeAt(17) - 48, s1 = s.charCodeAt(18) - 48;
  if (((y0 | y1 | y2 | y3 | mo0 | mo1 | d0 | d1 | h0 | h1 | mi0 | mi1 | s0 | s1) & ~15) !== 0) return NaN;
  if (y0 > 9 || y1 > 9 || y2 > 9 || y3 > 9 || mo1 > 9 || d1 > 9 || h1 > 9 || mi1 > 9 || s1 > 9) return NaN;
  const year = y0 * 1000 + y1 * 100 + y2 * 10 + y3;
  const month = mo0 * 10 + mo1;
  const day = d0 * 10 + d1;
  const hour = h0 * 10 + h1;
  const minute = mi0 * 10 + mi1;
  const second = s0 * 10 + s1;
  let ms = 0;
  if (n > 20) {
    if (s.charCodeAt(19) !== 46 /* . */ || n === 21) return NaN;
    // Date.parse keeps milliseconds and drops finer digits; so does this.
    for (let i = 20; i < n - 1; i++) {
      const c = s.charCodeAt(i) - 48;
      if (c < 0 || c > 9) return NaN;
      if (i === 20) ms += c * 100;
      else if (i === 21) ms += c * 10;
      else if (i === 22) ms += c;
    }
  } else if (s.charCodeAt(19) !== 90) return NaN;
  if (year < 1970 || month < 1 || month > 12 || day < 1 || hour > 23 || minute > 59 || second > 59) return NaN;
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  if (day > (month === 2 ? (leap ? 29 : 28) : (DAYS_IN_MONTH[month - 1] as number))) return NaN;
  // Days since 1970-01-01 of a proleptic Gregorian date (the civil-from-days method in reverse).
  const yy = month <= 2 ? year - 1 : year;
  const era = Math.floor(yy / 400);
  const yoe = yy - era * 400;
  const doy = Math.floor((153 * (month + (month > 2 ? -3 : 9)) + 2) / 5) + day - 1;
  const days = era * 146_097 + yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy - 719_468;
  return days * 86_400_000 + hour * 3_600_000 + minute * 60_000 + second * 1000 + ms;
}

/** The instant of a time text: the fast reader first, Date.parse for any other text. */
export function instantOf(text: string): number {
  const fast = parseTrackTime(text);
  return fast === fast ? fast : Date.parse(text);
}

/** A point with its instant: the fast reader first, Date.parse for any other text. */
export function toTimed(p: TrackPoint): TimedPoint {
  const fast = parseTrackTime(p.time);
  return fast === fast ? { ms: fast, p, canon: isCanonicalText(p.time, fast) } : { ms: Date.parse(p.time), p };
}

/** Whether a text that parseTrackTime read is the canonical text of its instant. */
export function isCanonicalText(text: string, ms: number): boolean {
  return text.length === 20 || (text.length === 24 && ms % 1000 !== 0);
}

/** Track order: the instant, then the text (two texts of one instant are two stored points). */
export function compareTimed(a: TimedPoint, b: TimedPoint): number {
  return a.ms - b.ms || (a.p.time < b.p.time ? -1 : a.p.time > b.p.time ? 1 : 0);
}

/** Builds a chunk from points of one cruise and hour, already sorted by `compareTimed`, no duplicates. */
export function encodeChunk(cruiseId: string, hour: IsoUtc, pts: readonly TimedPoint[]): TrackChunkRow {
  const n = pts.length;
  const row: TrackChunkRow = {
    cruiseId,
    hour,
    count: n,
    time: new Float64Array(n),
    lat: new Float64Array(n),
    lon: new Float64Array(n),
    speed: new Float64Array(n),
    course: new Float64Array(n),
    heading: new Float64Array(n),
    source: new Uint8Array(n),
    sources: [],
    timeText: [],
  };
  const hourMs = Date.parse(hour);
  const prefix = hour.slice(0, 14);
  let lastSource = '';
  let lastIndex = 0;
  for (let i = 0; i < n; i++) {
    const { ms, p } = pts[i] as TimedPoint;
    row.time[i] = ms;
    row.lat[i] = p.lat;
    row.lon[i] = p.lon;
    row.speed[i] = p.sogKn ?? NaN;
    row.course[i] = p.cogDeg ?? NaN;
    row.heading[i] = p.headingDeg ?? NaN;
    if (p.source !== lastSource) {
      lastSource = p.source;
      lastIndex = row.sources.indexOf(p.source);
      if (lastIndex < 0) lastIndex = row.sources.push(p.source) - 1;
    }
    row.source[i] = lastIndex;
    if (!(pts[i] as TimedPoint).canon && p.time !== canonicalIn(prefix, hourMs, ms)) row.timeText.push([i, p.time]);
  }
  return row;
}

/** The point at `i` of a chunk, as the model writes it (optional values absent when not known). */
export function pointAt(c: TrackChunkRow, i: number, prefix = c.hour.slice(0, 14), hourMs = Date.parse(c.hour)): TrackPoint {
  const p: TrackPoint = {
    cruiseId: c.cruiseId,
    time: canonicalIn(prefix, hourMs, c.time[i] as number),
    lat: c.lat[i] as number,
    lon: c.lon[i] as number,
    source: c.sources[c.source[i] as number] as TrackPoint['source'],
  };
  const sog = c.speed[i] as number;
  const cog = c.course[i] as number;
  const hdg = c.heading[i] as number;
  if (sog === sog) p.sogKn = sog;
  if (cog === cog) p.cogDeg = cog;
  if (hdg === hdg) p.headingDeg = hdg;
  return p;
}

/** Every point of a chunk, in order. */
export function decodeChunk(c: TrackChunkRow): TrackPoint[] {
  const prefix = c.hour.slice(0, 14);
  const hourMs = Date.parse(c.hour);
  const out = new Array<TrackPoint>(c.count);
  for (let i = 0; i < c.count; i++) out[i] = pointAt(c, i, prefix, hourMs);
  for (const [i, text] of c.timeText) (out[i] as TrackPoint).time = text;
  return out;
}

/** The chunk's points with their instants, for merging. */
export function timedPoints(c: TrackChunkRow): TimedPoint[] {
  const exact = new Set(c.timeText.map(([i]) => i));
  return decodeChunk(c).map((p, i) => ({ ms: c.time[i] as number, p, canon: !exact.has(i) }));
}

/**
 * Sorts points into time order and drops earlier copies of the same time text (the later one in
 * the list wins, as a put of the same key would).
 */
export function sortUnique(pts: TimedPoint[]): TimedPoint[] {
  // Strictly increasing instants (a live track) can hold no two copies of one time text.
  let increasing = true;
  for (let i = 1; i < pts.length && increasing; i++) if ((pts[i] as TimedPoint).ms <= (pts[i - 1] as TimedPoint).ms) increasing = false;
  if (increasing) return pts.slice();
  const seen = new Map<string, number>();
  let dup = false;
  for (let i = 0; i < pts.length; i++) {
    const t = (pts[i] as TimedPoint).p.time;
    if (seen.has(t)) dup = true;
    seen.set(t, i);
  }
  const kept = dup ? pts.filter((x, i) => seen.get(x.p.time) === i) : pts.slice();
  let sorted = true;
  for (let i = 1; i < kept.length && sorted; i++) if (compareTimed(kept[i - 1] as TimedPoint, kept[i] as TimedPoint) >= 0) sorted = false;
  return sorted ? kept : kept.sort(compareTimed);
}

/** The chunk with `incoming` points merged in; a point with a stored time text replaces it. */
export function mergeIntoChunk(cruiseId: string, hour: IsoUtc, stored: TrackChunkRow | undefined, incoming: TimedPoint[]): TrackChunkRow {
  if (!stored || stored.count === 0) return encodeChunk(cruiseId, hour, sortUnique(incoming));
  const fresh = sortUnique(incoming);
  const first = fresh[0];
  // The live case: every new fix comes after the stored ones; the columns grow without decoding.
  if (first && first.ms > (stored.time[stored.count - 1] as number)) return appendToChunk(stored, encodeChunk(cruiseId, hour, fresh));
  return encodeChunk(cruiseId, hour, sortUnique([...timedPoints(stored), ...incoming]));
}

/** `b`'s points after `a`'s (all of them later), as one chunk. */
function appendToChunk(a: TrackChunkRow, b: TrackChunkRow): TrackChunkRow {
  const n = a.count + b.count;
  const join = <T extends Float64Array | Uint8Array>(x: T, y: T, make: (n: number) => T): T => {
    const out = make(n);
    out.set(x.subarray(0, a.count));
    out.set(y.subarray(0, b.count), a.count);
    return out;
  };
  const f64 = (len: number) => new Float64Array(len);
  const sources = [...a.sources];
  const remap = b.sources.map((name) => {
    const k = sources.indexOf(name);
    return k >= 0 ? k : sources.push(name) - 1;
  });
  const source = new Uint8Array(n);
  source.set(a.source.subarray(0, a.count));
  for (let i = 0; i < b.count; i++) source[a.count + i] = remap[b.source[i] as number] as number;
  return {
    cruiseId: a.cruiseId,
    hour: a.hour,
    count: n,
    time: join(a.time, b.time, f64),
    lat: join(a.lat, b.lat, f64),
    lon: join(a.lon, b.lon, f64),
    speed: join(a.speed, b.speed, f64),
    course: join(a.course, b.course, f64),
    heading: join(a.heading, b.heading, f64),
    source,
    sources,
    timeText: [...a.timeText, ...b.timeText.map(([i, t]): [number, string] => [a.count + i, t])],
  };
}

/** Groups points by UTC hour, keeping the list order within each hour. */
export function groupByHour(pts: readonly TimedPoint[]): Map<IsoUtc, TimedPoint[]> {
  const out = new Map<IsoUtc, TimedPoint[]>();
  let lastHourMs = NaN;
  let last: TimedPoint[] = [];
  for (const x of pts) {
    const h = Math.floor(x.ms / HOUR_MS) * HOUR_MS;
    if (h !== lastHourMs) {
      const key = hourOf(h);
      lastHourMs = h;
      let list = out.get(key);
      if (!list) out.set(key, (list = []));
      last = list;
    }
    last.push(x);
  }
  return out;
}

/** The parts of a chunk that place a time. */
export type ChunkTimes = Pick<TrackChunkRow, 'count' | 'time' | 'timeText'>;

/** Index of the first point of the chunk at or after `(ms, text)` in track order. */
export function lowerBound(c: ChunkTimes, ms: number, text?: string): number {
  let lo = 0;
  let hi = c.count;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    const t = c.time[mid] as number;
    if (t < ms || (t === ms && text !== undefined && timeTextAt(c, mid) < text)) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Index just past the last point at or before `(ms, text)`. */
export function upperBound(c: ChunkTimes, ms: number, text?: string): number {
  let lo = 0;
  let hi = c.count;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    const t = c.time[mid] as number;
    if (t < ms || (t === ms && (text === undefined || timeTextAt(c, mid) <= text))) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The stored time text of point `i`. */
export function timeTextAt(c: ChunkTimes, i: number): string {
  for (const [k, text] of c.timeText) if (k === i) return text;
  return canonicalTime(c.time[i] as number);
}

/** The chunk rows that hold `points` (any order, any cruises), as the store would write them. */
export function chunksOf(points: readonly TrackPoint[]): TrackChunkRow[] {
  const byCruise = new Map<string, TimedPoint[]>();
  for (const p of points) {
    let l = byCruise.get(p.cruiseId);
    if (!l) byCruise.set(p.cruiseId, (l = []));
    l.push(toTimed(p));
  }
  const out: TrackChunkRow[] = [];
  for (const [cruiseId, list] of byCruise) for (const [hour, g] of groupByHour(list)) out.push(encodeChunk(cruiseId, hour, sortUnique(g)));
  return out;
}
