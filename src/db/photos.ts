// Photos of an observation: the bytes (a Blob) and what the export needs to name them.
import type { IsoUtc, Observation } from '../domain/model';
import { getDb, writableDb } from './connection';
import { InvalidRecordError, mapWriteError, ObservationConflictError, RecordNotFoundError } from './errors';
import { replaceObservation } from './revisions';
import type { PhotoMeta, PhotoRecord } from './rows';
import { deviceId } from './settings';
import { isIsoUtc, nowIso } from './validate';

export interface AttachPhotoInput {
  observationId: string;
  cruiseId: string;
  blob: Blob;
  fileName: string;
  takenAt?: IsoUtc;
}

/**
 * When given, the stored observation is edited in the same transaction: the photo id is added
 * to (or removed from) `photoIds` as a new revision. Without it only the photo is stored, for
 * an observation still being typed (its form saves `photoIds` itself).
 */
export interface PhotoEdit {
  expectedRevision: number;
  savedBy: string;
}

function meta(p: PhotoRecord): PhotoMeta {
  const { blob: _blob, ...rest } = p;
  return rest;
}

export async function attachPhoto(input: AttachPhotoInput, edit?: PhotoEdit): Promise<PhotoMeta> {
  if (!(input.blob instanceof Blob)) throw new InvalidRecordError('photo', 'blob', 'must be a file or Blob');
  if (input.blob.size === 0) throw new InvalidRecordError('photo', 'blob', 'is an empty file');
  if (input.takenAt !== undefined && !isIsoUtc(input.takenAt)) throw new InvalidRecordError('photo', 'takenAt', 'must be an ISO 8601 UTC time');
  const db = await writableDb();
  const device = edit ? await deviceId() : '';
  const row: PhotoRecord = {
    id: crypto.randomUUID(),
    observationId: input.observationId,
    cruiseId: input.cruiseId,
    fileName: input.fileName.trim() || 'photo',
    mimeType: input.blob.type || 'application/octet-stream',
    sizeBytes: input.blob.size,
    addedAt: nowIso(),
    ...(input.takenAt === undefined ? {} : { takenAt: input.takenAt }),
    blob: input.blob,
  };
  try {
    await db.transaction('rw', [db.photos, db.observations, db.revisions], async () => {
      await db.photos.add(row);
      if (edit) await editPhotoIds(input.observationId, edit, device, (ids) => [...ids, row.id]);
    });
  } catch (err) {
    throw mapWriteError(err, `the photo "${row.fileName}"`);
  }
  return meta(row);
}

async function editPhotoIds(observationId: string, edit: PhotoEdit, device: string, change: (ids: string[]) => string[]): Promise<void> {
  const db = getDb();
  const old = await db.observations.get(observationId);
  if (!old) throw new RecordNotFoundError('observation', observationId);
  const at = nowIso();
  const next: Observation = { ...old, photoIds: change(old.photoIds), revision: old.revision + 1, savedAt: at, savedBy: edit.savedBy, deviceId: device };
  if (old.revision !== edit.expectedRevision) throw new ObservationConflictError(next, old, edit.expectedRevision);
  await replaceObservation(db, old, next, at);
}

export interface RemovePhotoResult {
  /** True when the bytes were deleted: no saved version of the observation refers to them. */
  deletedBytes: boolean;
  /** The observation after the edit, when one was made. */
  observation?: Observation;
}

/**
 * Removes a photo. With `edit`, the id leaves the observation's `photoIds` (a new revision).
 * The bytes are deleted only when no saved version, current or earlier, still refers to the
 * photo: history keeps its pictures.
 */
export async function removePhoto(photoId: string, edit?: PhotoEdit): Promise<RemovePhotoResult> {
  const db = await writableDb();
  const device = edit ? await deviceId() : '';
  try {
    return await db.transaction('rw', [db.photos, db.observations, db.revisions], async () => {
      const photo = await db.photos.get(photoId);
      if (!photo) throw new RecordNotFoundError('photo', photoId);
      if (edit) await editPhotoIds(photo.observationId, edit, device, (ids) => ids.filter((id) => id !== photoId));
      const current = await db.observations.get(photo.observationId);
      const earlier = await db.revisions.where('observationId').equals(photo.observationId).toArray();
      const referenced = [current, ...earlier.map((r) => r.observation)].some((o) => o?.photoIds.includes(photoId));
      if (!referenced) await db.photos.delete(photoId);
      return { deletedBytes: !referenced, ...(edit && current ? { observation: current } : {}) };
    });
  } catch (err) {
    throw mapWriteError(err, 'removing the photo');
  }
}

export function getPhoto(photoId: string): Promise<PhotoRecord | undefined> {
  return getDb().photos.get(photoId);
}

/** Photos stored for an observation, without their bytes, oldest first. */
export async function listPhotos(observationId: string): Promise<PhotoMeta[]> {
  const rows = await getDb().photos.where('observationId').equals(observationId).toArray();
  return rows.map(meta).sort((a, b) => (a.addedAt < b.addedAt ? -1 : a.addedAt > b.addedAt ? 1 : 0));
}
