// Reads one cruise out of the store as a LogBundle for the exchange format (src/format): the
// current observations (deleted ones included: deletes are soft and travel with the log), their
// earlier revisions, conflict copies, the track and the photos. One read transaction, so the
// export is a consistent snapshot even while an observer saves.
import type { LogBundle, PhotoBytes, PhotoMeta as FilePhotoMeta } from '../format/types';
import { getDb } from './connection';
import { RecordNotFoundError } from './errors';
import type { PhotoRecord } from './rows';
import { decodeChunk } from './trackChunk';
import { allTrackChunksIn, countTrackPointsIn } from './trackPoints';
import { cruiseObservations } from './cruiseObservations';

export interface CruiseExport {
  bundle: LogBundle;
  /** Photo bytes by photo id; empty unless asked for. */
  photos: PhotoBytes;
}

export function photoMetaOf(p: PhotoRecord): FilePhotoMeta {
  const out: FilePhotoMeta = {
    id: p.id,
    observationId: p.observationId,
    // The format keeps names to 255 characters; a longer one is cut, never the photo.
    fileName: p.fileName.slice(0, 255),
    mediaType: /^image\/[a-z0-9.+-]+$/.test(p.mimeType) ? p.mimeType : 'application/octet-stream',
    byteLength: p.sizeBytes,
    addedAt: p.addedAt,
  };
  if (p.takenAt !== undefined) out.takenAt = p.takenAt;
  return out;
}

export async function readCruiseExport(cruiseId: string, opts: { photoBytes?: boolean } = {}): Promise<CruiseExport> {
  const db = getDb();
  const { bundle, blobs } = await db.transaction('r', [db.cruises, db.observations, db.revisions, db.conflicts, db.trackChunks, db.photos], async () => {
    const cruise = await db.cruises.get(cruiseId);
    if (!cruise) throw new RecordNotFoundError('cruise', cruiseId);
    const observations = await cruiseObservations(db, cruiseId).toArray();
    const ids = observations.map((o) => o.id);
    const revisions = ids.length === 0 ? [] : await db.revisions.where('observationId').anyOf(ids).toArray();
    const conflicts = await db.conflicts.where('cruiseId').equals(cruiseId).toArray();
    const track = (await allTrackChunksIn(db, cruiseId)).flatMap(decodeChunk);
    const photoRows = await db.photos.where('cruiseId').equals(cruiseId).toArray();
    const b: LogBundle = {
      cruise,
      observations,
      history: revisions.map((r) => r.observation),
      conflicts: conflicts.map((c) => c.observation),
      track,
      photos: photoRows.map(photoMetaOf),
    };
    return { bundle: b, blobs: opts.photoBytes ? photoRows.map((p) => [p.id, p.blob] as const) : [] };
  });
  // Blob reads are not IndexedDB requests: they must run after the transaction.
  const photos: PhotoBytes = new Map();
  for (const [id, blob] of blobs) photos.set(id, new Uint8Array(await blob.arrayBuffer()));
  return { bundle, photos };
}

/**
 * A value that changes whenever anything of the cruise that a backup holds changes: an edit
 * adds a revision row, a save or an import adds observations, conflicts or track points.
 * Cheap (counts only), for live queries that trigger the automatic backup.
 */
export async function cruiseChangeStamp(cruiseId: string): Promise<string> {
  const db = getDb();
  return db.transaction('r', [db.cruises, db.observations, db.revisions, db.conflicts, db.trackChunks, db.photos], async () => {
    const cruise = await db.cruises.get(cruiseId);
    const obs = await cruiseObservations(db, cruiseId).count();
    const revs = await db.revisions.count();
    const conflicts = await db.conflicts.where('cruiseId').equals(cruiseId).count();
    const track = await countTrackPointsIn(db, cruiseId);
    const photos = await db.photos.where('cruiseId').equals(cruiseId).count();
    return [cruise?.updatedAt ?? '', obs, revs, conflicts, track, photos].join('|');
  });
}
