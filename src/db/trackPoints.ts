// The ship's track: many points (a fix a second for weeks is millions), stored as one chunk per
// cruise and UTC hour (trackChunk.ts). The point-level functions keep the shapes they had when
// every point was a row; the chunk-level ones let exports and maps walk the track an hour at a
// time without building a million objects.
import { Dexie } from 'dexie';
import type { IsoUtc, TrackPoint } from '../domain/model';
import { getDb, writableDb } from './connection';
import type { FloeDatabase } from './database';
import { BulkWriteInterruptedError, mapWriteError } from './errors';
import { decodeChunk, groupByHour, HOUR_MS, hourOf, instantOf, parseTrackTime, toTimed, lowerBound, mergeIntoChunk, timeTextAt, upperBound, type TimedPoint, type TrackChunkRow } from './trackChunk';
import { checkTrackPoint } from './validate';

export const DEFAULT_TRACK_CHUNK = 100_000;

export interface AddTrackPointsOptions {
  /** Points per transaction. Each batch is stored entirely or not at all. */
  chunkSize?: number;
  /** Called after each committed batch with the points stored so far and the total. */
  onProgress?: (committed: number, total: number) => void;
}

export interface AddTrackPointsResult {
  written: number;
  batches: number;
}

/** Parses and checks every point before anything is written; names the first bad one. */
function timed(points: readonly TrackPoint[]): TimedPoint[] {
  const out = new Array<TimedPoint>(points.length);
  for (let i = 0; i < points.length; i++) {
    const p = points[i] as TrackPoint;
    const fast = typeof p.time === 'string' ? parseTrackTime(p.time) : NaN;
    checkTrackPoint(p, i, fast === fast);
    out[i] = toTimed(p);
  }
  return out;
}

/**
 * Merges points into their hour chunks inside the caller's read-write transaction on
 * `trackChunks`: one read of the touched chunks, one write of the merged ones.
 */
export async function mergeTrackPointsInTransaction(db: FloeDatabase, pts: readonly TimedPoint[]): Promise<void> {
  const byCruise = new Map<string, TimedPoint[]>();
  for (const x of pts) {
    let l = byCruise.get(x.p.cruiseId);
    if (!l) byCruise.set(x.p.cruiseId, (l = []));
    l.push(x);
  }
  const keys: [string, IsoUtc][] = [];
  const groups: TimedPoint[][] = [];
  for (const [cruiseId, list] of byCruise)
    for (const [hour, g] of groupByHour(list)) {
      keys.push([cruiseId, hour]);
      groups.push(g);
    }
  const stored = await db.trackChunks.bulkGet(keys);
  const rows = keys.map(([cruiseId, hour], i) => mergeIntoChunk(cruiseId, hour, stored[i], groups[i] as TimedPoint[]));
  await db.trackChunks.bulkPut(rows);
}

/**
 * Adds track points in batches of `chunkSize`, one transaction each, in the order given. The
 * whole list is checked before the first batch, so bad input writes nothing. A point with the
 * same cruise and time as a stored one replaces it (a re-imported track is not duplicated).
 * If a batch fails (full disk, tab closing), the batches before it stay stored and the error
 * (BulkWriteInterruptedError) says how many points they hold. A single live fix is one
 * transaction: a read and a write of its hour's chunk.
 */
export async function addTrackPoints(points: readonly TrackPoint[], opts: AddTrackPointsOptions = {}): Promise<AddTrackPointsResult> {
  const chunk = Math.max(1, Math.floor(opts.chunkSize ?? DEFAULT_TRACK_CHUNK));
  const all = timed(points);
  const db = await writableDb();
  let committed = 0;
  let batches = 0;
  while (committed < all.length) {
    const batch = all.slice(committed, committed + chunk);
    try {
      await db.transaction('rw', db.trackChunks, () => mergeTrackPointsInTransaction(db, batch));
    } catch (err) {
      throw new BulkWriteInterruptedError(committed, all.length, mapWriteError(err, `track points ${committed + 1}-${committed + batch.length}`));
    }
    committed += batch.length;
    batches++;
    opts.onProgress?.(committed, all.length);
  }
  return { written: committed, batches };
}

export interface TrackRange {
  /** Inclusive bounds, compared as instants (then as text, for two texts of one instant). */
  from?: IsoUtc;
  to?: IsoUtc;
}

function hourBounds(cruiseId: string, q: TrackRange): [[string, unknown], [string, unknown]] {
  const fromMs = q.from === undefined ? NaN : Date.parse(q.from);
  const toMs = q.to === undefined ? NaN : Date.parse(q.to);
  return [
    [cruiseId, Number.isNaN(fromMs) ? Dexie.minKey : hourOf(fromMs)],
    [cruiseId, Number.isNaN(toMs) ? Dexie.maxKey : hourOf(toMs)],
  ];
}

/**
 * The chunks of a cruise that hold points within the range, in time order (whole chunks: the
 * first and last may reach outside it). For readers that work on columns (maps, exports).
 */
export function listTrackChunks(cruiseId: string, q: TrackRange & { limit?: number } = {}): Promise<TrackChunkRow[]> {
  const [lo, hi] = hourBounds(cruiseId, q);
  const c = getDb().trackChunks.where('[cruiseId+hour]').between(lo, hi, true, true);
  return (q.limit === undefined ? c : c.limit(q.limit)).toArray();
}

/** Index range `[start, end)` of a chunk's points inside the range. */
function slice(c: TrackChunkRow, q: TrackRange): [number, number] {
  const start = q.from === undefined ? 0 : lowerBound(c, Date.parse(q.from), q.from);
  const end = q.to === undefined ? c.count : upperBound(c, Date.parse(q.to), q.to);
  return [start, Math.max(start, end)];
}

/** Every chunk of a cruise, in time order, inside the caller's transaction. */
export function allTrackChunksIn(db: FloeDatabase, cruiseId: string): Promise<TrackChunkRow[]> {
  return db.trackChunks.where('[cruiseId+hour]').between([cruiseId, Dexie.minKey], [cruiseId, Dexie.maxKey], true, true).toArray();
}

/**
 * A test of "is this exact time stored", built from the time columns only, for the merge
 * planner (it asks once per incoming point).
 */
export function storedTrackTimes(chunks: readonly TrackChunkRow[]): (time: string) => boolean {
  // Keyed by hour number, so a million questions build no hour texts.
  const byHour = new Map<number, Pick<TrackChunkRow, 'count' | 'time' | 'timeText'>>();
  for (const c of chunks) byHour.set(Date.parse(c.hour) / HOUR_MS, { count: c.count, time: c.time, timeText: c.timeText });
  return (time) => {
    if (byHour.size === 0) return false;
    const ms = instantOf(time);
    if (Number.isNaN(ms)) return false;
    const c = byHour.get(Math.floor(ms / HOUR_MS));
    if (!c) return false;
    const i = lowerBound(c, ms, time);
    return i < c.count && c.time[i] === ms && timeTextAt(c, i) === time;
  };
}

/** Track points of a cruise in time order, optionally within inclusive time bounds. */
/** The points of one UTC hour (`YYYY-MM-DDTHH`), the unit of a sync document: one chunk read. */
export async function trackPointsOfHour(cruiseId: string, hour: string): Promise<TrackPoint[]> {
  const chunk = await getDb().trackChunks.get([cruiseId, `${hour}:00:00Z`]);
  return chunk ? decodeChunk(chunk) : [];
}

export async function listTrackPoints(cruiseId: string, q: TrackRange & { limit?: number } = {}): Promise<TrackPoint[]> {
  if ((q.from !== undefined && Number.isNaN(Date.parse(q.from))) || (q.to !== undefined && Number.isNaN(Date.parse(q.to)))) return [];
  const limit = q.limit ?? Number.POSITIVE_INFINITY;
  const out: TrackPoint[] = [];
  // With a small limit, a few chunks at a time: most callers want the next fix or two.
  const page = q.limit === undefined ? undefined : 4;
  let range: TrackRange = q;
  for (;;) {
    const chunks = await listTrackChunks(cruiseId, page === undefined ? range : { ...range, limit: page });
    for (const c of chunks) {
      const [start, end] = slice(c, q);
      if (start === end) continue;
      const pts = decodeChunk(c);
      for (let i = start; i < end && out.length < limit; i++) out.push(pts[i] as TrackPoint);
      if (out.length >= limit) return out;
    }
    const last = chunks[chunks.length - 1];
    if (page === undefined || chunks.length < page || !last) return out;
    // Continue after the last chunk read: its hour's end is the next lower bound.
    range = { ...range, from: new Date(Date.parse(last.hour) + 3_600_000).toISOString() };
  }
}

/** Points stored for a cruise; reads the count index only. */
export function countTrackPoints(cruiseId: string): Promise<number> {
  return countTrackPointsIn(getDb(), cruiseId);
}

/** The same, for a caller that holds a transaction including `trackChunks`. */
export async function countTrackPointsIn(db: FloeDatabase, cruiseId: string): Promise<number> {
  const keys = await db
    .trackChunks.where('[cruiseId+hour+count]')
        // [cruiseId] sorts before every longer key of the cruise, [cruiseId, maxKey] after them (one
    // key may not hold the same maxKey object twice).
    .between([cruiseId], [cruiseId, Dexie.maxKey], true, true)
    .keys();
  let n = 0;
  for (const k of keys) n += (k as unknown as [string, string, number])[2];
  return n;
}

/** The last fix at or before `time` (e.g. to fill an observation's position from the track). */
export async function trackPointAtOrBefore(cruiseId: string, time: IsoUtc): Promise<TrackPoint | undefined> {
  const ms = Date.parse(time);
  if (Number.isNaN(ms)) return undefined;
  let hi: unknown = hourOf(ms);
  for (;;) {
    const chunks = await getDb().trackChunks.where('[cruiseId+hour]').between([cruiseId, Dexie.minKey], [cruiseId, hi], true, true).reverse().limit(2).toArray();
    for (const c of chunks) {
      const end = upperBound(c, ms, time);
      if (end > 0) return decodeChunk(c)[end - 1];
    }
    const oldest = chunks[chunks.length - 1];
    if (chunks.length < 2 || !oldest) return undefined;
    hi = new Date(Date.parse(oldest.hour) - 3_600_000).toISOString().slice(0, 13) + ':00:00Z';
  }
}
