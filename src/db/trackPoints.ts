// The ship's track: many points (a fix a second for weeks is millions), written in batches.
import { Dexie } from 'dexie';
import type { IsoUtc, TrackPoint } from '../domain/model';
import { getDb, writableDb } from './connection';
import { BulkWriteInterruptedError, mapWriteError } from './errors';
import { checkTrackPoint } from './validate';

export const DEFAULT_TRACK_CHUNK = 20_000;

export interface AddTrackPointsOptions {
  /** Rows per transaction. Each batch is stored entirely or not at all. */
  chunkSize?: number;
  /** Called after each committed batch with the rows stored so far and the total. */
  onProgress?: (committed: number, total: number) => void;
}

export interface AddTrackPointsResult {
  written: number;
  batches: number;
}

/**
 * Adds track points in batches of `chunkSize`, one transaction each, in the order given. The
 * whole list is checked before the first batch, so bad input writes nothing. A point with the
 * same cruise and time as a stored one replaces it (a re-imported track is not duplicated).
 * If a batch fails (full disk, tab closing), the batches before it stay stored and the error
 * (BulkWriteInterruptedError) says how many rows they hold.
 */
export async function addTrackPoints(points: readonly TrackPoint[], opts: AddTrackPointsOptions = {}): Promise<AddTrackPointsResult> {
  const chunk = Math.max(1, Math.floor(opts.chunkSize ?? DEFAULT_TRACK_CHUNK));
  for (let i = 0; i < points.length; i++) checkTrackPoint(points[i] as TrackPoint, i);
  const db = await writableDb();
  let committed = 0;
  let batches = 0;
  while (committed < points.length) {
    const batch = points.slice(committed, committed + chunk);
    try {
      await db.transaction('rw', db.trackPoints, () => db.trackPoints.bulkPut(batch));
    } catch (err) {
      throw new BulkWriteInterruptedError(committed, points.length, mapWriteError(err, `track points ${committed + 1}-${committed + batch.length}`));
    }
    committed += batch.length;
    batches++;
    opts.onProgress?.(committed, points.length);
  }
  return { written: committed, batches };
}

/** Track points of a cruise in time order, optionally within inclusive time bounds. */
export function listTrackPoints(cruiseId: string, q: { from?: IsoUtc; to?: IsoUtc; limit?: number } = {}): Promise<TrackPoint[]> {
  const c = getDb().trackPoints.where('[cruiseId+time]').between([cruiseId, q.from ?? Dexie.minKey], [cruiseId, q.to ?? Dexie.maxKey], true, true);
  return (q.limit === undefined ? c : c.limit(q.limit)).toArray();
}

export function countTrackPoints(cruiseId: string): Promise<number> {
  return getDb().trackPoints.where('[cruiseId+time]').between([cruiseId, Dexie.minKey], [cruiseId, Dexie.maxKey], true, true).count();
}

/** The last fix at or before `time` (e.g. to fill an observation's position from the track). */
export async function trackPointAtOrBefore(cruiseId: string, time: IsoUtc): Promise<TrackPoint | undefined> {
  return getDb().trackPoints.where('[cruiseId+time]').between([cruiseId, Dexie.minKey], [cruiseId, time], true, true).last();
}
