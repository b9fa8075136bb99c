// What the replication layer (src/sync) keeps in the store: which documents a ship server
// database holds (marks), and per server database the pull checkpoint and the refused
// documents. The log itself is written only through applyMergePlan, as an import is.
import { Dexie } from 'dexie';
import type { Cruise, Observation } from '../domain/model';
import type { PhotoMeta } from '../format/types';
import { getDb, writableDb } from './connection';
import { mapWriteError } from './errors';
import { photoMetaOf } from './exportBundle';
import type { SyncMark, SyncStateRow } from './rows';
import { cruiseObservations } from './cruiseObservations';

/** Marks documents as held by the server database `server`; marks already there are kept. */
export async function markOnServer(marks: readonly SyncMark[]): Promise<void> {
  if (marks.length === 0) return;
  const db = await writableDb();
  try {
    await db.syncMarks.bulkPut([...marks]);
  } catch (err) {
    throw mapWriteError(err, 'the sync marks');
  }
}

/** Which of the given documents the server database `server` is marked as holding. */
export async function heldOnServer(server: string, docIds: readonly string[]): Promise<Set<string>> {
  if (docIds.length === 0) return new Set();
  const rows = await getDb().syncMarks.bulkGet(docIds.map((id) => [server, id] as [string, string]));
  return new Set(rows.flatMap((r) => (r ? [r.docId] : [])));
}

/** The marks of a cruise's documents in one server database. */
export function serverMarks(server: string, cruiseId: string): Promise<SyncMark[]> {
  return getDb().syncMarks.where('[server+cruiseId]').equals([server, cruiseId]).toArray();
}

/** For each observation, the highest revision the server database holds. */
export async function revisionsOnServer(server: string, cruiseId: string): Promise<Map<string, number>> {
  const out = new Map<string, number>();
  await getDb()
    .syncMarks.where('[server+cruiseId]')
    .equals([server, cruiseId])
    .each((m) => {
      if (m.observationId !== '' && m.revision > (out.get(m.observationId) ?? 0)) out.set(m.observationId, m.revision);
    });
  return out;
}

export async function getSyncState(key: string): Promise<SyncStateRow | undefined> {
  return getDb().syncState.get(key);
}

export async function putSyncState(row: SyncStateRow): Promise<void> {
  const db = await writableDb();
  try {
    await db.syncState.put(row);
  } catch (err) {
    throw mapWriteError(err, 'the sync checkpoint');
  }
}

/** Forgets what a server database holds and where its pull stood (a server was replaced). */
export async function forgetServer(server: string): Promise<void> {
  const db = await writableDb();
  try {
    await db.transaction('rw', db.syncMarks, db.syncState, async () => {
      await db.syncMarks.where('[server+docId]').between([server, Dexie.minKey], [server, Dexie.maxKey], true, true).delete();
      await db.syncState.delete(server);
    });
  } catch (err) {
    throw mapWriteError(err, 'the sync marks');
  }
}

export interface SyncSource {
  cruise: Cruise | null;
  /** Every saved version: current, earlier revisions and conflict copies. */
  versions: Observation[];
  /** Track points per UTC hour (`2026-03-04T05`). */
  trackHours: Map<string, number>;
  /** Descriptions of the cruise's photos, as the log file writes them (the bytes stay in the store). */
  photos: PhotoMeta[];
}

/** What a push needs to know, in one read transaction: no track rows, only their keys. */
export async function readSyncSource(cruiseId: string): Promise<SyncSource> {
  const db = getDb();
  return db.transaction('r', [db.cruises, db.observations, db.revisions, db.conflicts, db.trackChunks, db.photos], async () => {
    const cruise = (await db.cruises.get(cruiseId)) ?? null;
    const current = await cruiseObservations(db, cruiseId).toArray();
    const ids = current.map((o) => o.id);
    const revisions = ids.length === 0 ? [] : await db.revisions.where('observationId').anyOf(ids).toArray();
    const conflicts = await db.conflicts.where('cruiseId').equals(cruiseId).toArray();
    // The chunk's count is in its index key, so no track arrays are read. [cruiseId] sorts before
    // every longer key of the cruise, [cruiseId, maxKey] after them (as countTrackPointsIn does).
    const keys = (await db.trackChunks
      .where('[cruiseId+hour+count]')
      .between([cruiseId], [cruiseId, Dexie.maxKey], true, true)
      .keys()) as unknown as [string, string, number][];
    const trackHours = new Map<string, number>();
    for (const [, hour, count] of keys) trackHours.set(hour.slice(0, 13), count);
    // A row's Blob is a handle: reading the rows does not read the images.
    const photos = (await db.photos.where('cruiseId').equals(cruiseId).toArray()).map(photoMetaOf);
    return { cruise, versions: [...current, ...revisions.map((r) => r.observation), ...conflicts.map((c) => c.observation)], trackHours, photos };
  });
}
