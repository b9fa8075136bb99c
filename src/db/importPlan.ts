// Applies an import's merge plan (src/format/merge.ts) to the store in ONE transaction: the
// cruise, current observations, history rows, conflict copies, track points and photos are
// written together or not at all. Before writing it checks that nothing the plan was made
// against has changed since (another tab saved an edit while the preview was open).
import type { Observation } from '../domain/model';
import { canonicalJson, type MergePlan, type MergeTarget, type StoredVersions } from '../format/merge';
import type { PhotoBytes } from '../format/types';
import { getDb, writableDb } from './connection';
import type { FloeDatabase } from './database';
import { FloeDbError, mapWriteError } from './errors';
import type { ConflictRecord, ObservationRevision, PhotoRecord } from './rows';
import { allTrackChunksIn, mergeTrackPointsInTransaction, storedTrackTimes } from './trackPoints';
import { toTimed } from './trackChunk';
import { nowIso } from './validate';
import { cruiseObservations } from './cruiseObservations';

/** The store changed between the preview and the apply; nothing was written. */
export class StaleImportError extends FloeDbError {
  readonly kind = 'conflict' as const;
  constructor(observationId: string) {
    super(`Observation ${observationId} changed since the preview was made. Nothing was imported; open the file again for a fresh preview.`);
    this.name = 'StaleImportError';
  }
}

/** A short stable hash (two 32-bit FNV-1a lanes) of a copy's content, for its conflict id. */
export function contentHash(text: string): string {
  let a = 0x811c9dc5;
  let b = 0x01000193 ^ text.length;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    a = Math.imul(a ^ c, 0x01000193);
    b = Math.imul(b ^ c, 0x5bd1e995) ^ (b >>> 15);
  }
  return (a >>> 0).toString(16).padStart(8, '0') + (b >>> 0).toString(16).padStart(8, '0');
}

export function conflictId(o: Observation): string {
  return `${o.id}:${o.revision}:${contentHash(canonicalJson(o))}`;
}

/** What is stored for a cruise, in the form the merge planner asks for. */
export async function loadMergeTarget(cruiseId: string): Promise<MergeTarget> {
  const db = getDb();
  return db.transaction('r', [db.cruises, db.observations, db.revisions, db.conflicts, db.trackChunks, db.photos], async () => {
    const cruise = (await db.cruises.get(cruiseId)) ?? null;
    const observations = await cruiseObservations(db, cruiseId).toArray();
    const ids = observations.map((o) => o.id);
    const revisions = ids.length === 0 ? [] : await db.revisions.where('observationId').anyOf(ids).toArray();
    const conflicts = await db.conflicts.where('cruiseId').equals(cruiseId).toArray();
    const hasTrackTime = storedTrackTimes(await allTrackChunksIn(db, cruiseId));
    const photoIds = await db.photos.where('cruiseId').equals(cruiseId).primaryKeys();
    const others = new Map<string, Observation[]>();
    for (const v of [...revisions.map((r) => r.observation), ...conflicts.map((c) => c.observation)]) {
      const l = others.get(v.id);
      if (l) l.push(v);
      else others.set(v.id, [v]);
    }
    const current = new Map(observations.map((o) => [o.id, o]));
    const photos = new Set(photoIds);
    return {
      cruise,
      versions: (id: string): StoredVersions | undefined => {
        const c = current.get(id);
        return c ? { current: c, others: others.get(id) ?? [] } : undefined;
      },
      hasTrackTime,
      hasPhoto: (id: string) => photos.has(id),
    };
  });
}

export interface ApplyOptions {
  /** Photo bytes from an archive, by photo id. Photos without bytes are not stored. */
  photos?: PhotoBytes;
  /** The file name, recorded with conflict copies. */
  source: string;
}

export interface ApplyResult {
  observations: number;
  history: number;
  conflicts: number;
  trackPoints: number;
  photos: number;
  /** Photos the file lists but does not contain (a plain JSON log): not stored. */
  photosWithoutBytes: number;
}

/** The rows a plan writes, built before its transaction (no await between them and the writes). */
export interface PlanRows {
  photos: PhotoRecord[];
  revisions: ObservationRevision[];
  conflicts: ConflictRecord[];
  photosWithoutBytes: number;
}

export function planRows(plan: MergePlan, opts: ApplyOptions, at: string): PlanRows {
  const cruiseId = plan.cruise.value.id;
  const photos: PhotoRecord[] = [];
  let photosWithoutBytes = 0;
  for (const p of plan.addPhotos) {
    const bytes = opts.photos?.get(p.id);
    if (!bytes) {
      photosWithoutBytes++;
      continue;
    }
    const row: PhotoRecord = {
      id: p.id,
      observationId: p.observationId,
      cruiseId,
      fileName: p.fileName,
      mimeType: p.mediaType,
      sizeBytes: p.byteLength,
      addedAt: p.addedAt ?? at,
      blob: new Blob([bytes as Uint8Array<ArrayBuffer>], { type: p.mediaType }),
    };
    if (p.takenAt !== undefined) row.takenAt = p.takenAt;
    photos.push(row);
  }
  const revisions: ObservationRevision[] = plan.addHistory.map((o) => ({ observationId: o.id, revision: o.revision, supersededAt: at, observation: o }));
  const conflicts: ConflictRecord[] = plan.addConflicts.map((o) => ({
    id: conflictId(o),
    observationId: o.id,
    cruiseId,
    revision: o.revision,
    detectedAt: at,
    source: opts.source.slice(0, 200),
    observation: o,
  }));
  return { photos, revisions, conflicts, photosWithoutBytes };
}

/**
 * Writes a plan's observations, history rows, conflict copies, track points and photos inside
 * the caller's read-write transaction (the cruise is the caller's: a plan in pieces writes it once).
 */
export async function writePlanInTransaction(db: FloeDatabase, plan: MergePlan, rows: PlanRows): Promise<void> {
  if (plan.putCurrent.length > 0) await db.observations.bulkPut(plan.putCurrent);
  // bulkAdd: an existing history row is never replaced; a clash aborts the whole import.
  if (rows.revisions.length > 0) await db.revisions.bulkAdd(rows.revisions);
  if (rows.conflicts.length > 0) await db.conflicts.bulkPut(rows.conflicts);
  if (plan.addTrack.length > 0) await mergeTrackPointsInTransaction(db, plan.addTrack.map(toTimed));
  if (rows.photos.length > 0) await db.photos.bulkAdd(rows.photos);
}

export async function applyMergePlan(plan: MergePlan, opts: ApplyOptions): Promise<ApplyResult> {
  const db = await writableDb();
  const rows = planRows(plan, opts, nowIso());
  try {
    await db.transaction('rw', [db.cruises, db.observations, db.revisions, db.conflicts, db.trackChunks, db.photos], async () => {
      const expected = new Map(plan.items.map((i) => [i.id, i.storedRevision]));
      const ids = [...expected.keys()];
      const now = await db.observations.bulkGet(ids);
      now.forEach((o, k) => {
        const id = ids[k] as string;
        if ((o?.revision ?? null) !== expected.get(id)) throw new StaleImportError(id);
      });
      if (plan.cruise.action !== 'unchanged') await db.cruises.put(plan.cruise.value);
      await writePlanInTransaction(db, plan, rows);
    });
  } catch (err) {
    if (err instanceof StaleImportError) throw err;
    throw mapWriteError(err, 'the import');
  }
  return {
    observations: plan.putCurrent.length,
    history: rows.revisions.length,
    conflicts: rows.conflicts.length,
    trackPoints: plan.addTrack.length,
    photos: rows.photos.length,
    photosWithoutBytes: rows.photosWithoutBytes,
  };
}

/** Conflict copies of a cruise, open ones first. */
export async function listConflicts(cruiseId: string): Promise<ConflictRecord[]> {
  const rows = await getDb().conflicts.where('cruiseId').equals(cruiseId).toArray();
  return rows.sort((a, b) => Number(a.resolution !== undefined) - Number(b.resolution !== undefined) || (a.observation.time < b.observation.time ? -1 : 1));
}

/** Records a reviewer's decision. The copy stays stored either way; nothing is lost. */
export async function markConflictResolved(id: string, kept: 'stored' | 'copy', by: string): Promise<void> {
  const db = await writableDb();
  try {
    await db.transaction('rw', db.conflicts, async () => {
      const row = await db.conflicts.get(id);
      if (!row) return;
      await db.conflicts.put({ ...row, resolution: { at: nowIso(), by, kept } });
    });
  } catch (err) {
    throw mapWriteError(err, 'the conflict decision');
  }
}
