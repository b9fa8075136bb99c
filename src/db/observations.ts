// Observations: save (new or edited) with the earlier version kept, soft delete and restore,
// list by cruise and time, and the history of one observation. Each write is one transaction.
import { Dexie } from 'dexie';
import type { IsoUtc, Observation } from '../domain/model';
import { getDb, writableDb } from './connection';
import { InvalidRecordError, mapWriteError, RecordNotFoundError, ObservationConflictError } from './errors';
import { replaceObservation } from './revisions';
import type { ObservationInput } from './rows';
import { deviceId } from './settings';
import { checkObservation, nowIso } from './validate';

export interface SaveObservationOptions {
  /**
   * The revision the edit started from; leave out (or 0) for a new observation. When the stored
   * revision differs, the save is refused with ObservationConflictError.
   */
  expectedRevision?: number;
  /** Who saves: an observer id, `review` or `import`. Defaults to the observation's observer. */
  savedBy?: string;
}

export interface SaveResult {
  observation: Observation;
  /** False when the content equalled the stored revision, so nothing was written. */
  changed: boolean;
}

const BOOKKEEPING = new Set(['revision', 'savedAt', 'savedBy', 'deviceId', 'deleted']);

/** Deep equality of two records, ignoring the fields the store stamps and undefined members. */
function sameContent(a: unknown, b: unknown, top = true): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => sameContent(x, b[i], false));
  const ra = a as Record<string, unknown>;
  const rb = b as Record<string, unknown>;
  const keys = new Set([...Object.keys(ra), ...Object.keys(rb)]);
  for (const k of keys) {
    if (top && BOOKKEEPING.has(k)) continue;
    if (ra[k] === undefined && rb[k] === undefined) continue;
    if (!sameContent(ra[k], rb[k], false)) return false;
  }
  return true;
}

function stripUndefined<T extends object>(x: T): T {
  // IndexedDB keeps `undefined` members; dropping them keeps stored rows and exports tidy.
  return JSON.parse(JSON.stringify(x)) as T;
}

const cruisesSeen = new WeakMap<object, Set<string>>();
function knownCruises(db: object): Set<string> {
  let set = cruisesSeen.get(db);
  if (!set) cruisesSeen.set(db, (set = new Set()));
  return set;
}

/**
 * Saves a new observation (revision 1) or an edit (revision + 1, the old version kept in
 * revisions), in one strict-durability transaction. Resolves only after the commit.
 */
export async function saveObservation(input: ObservationInput, opts: SaveObservationOptions = {}): Promise<SaveResult> {
  checkObservation(input);
  const db = await writableDb();
  const device = await deviceId();
  const expected = opts.expectedRevision ?? 0;
  const savedBy = opts.savedBy ?? input.observerId;
  try {
    // Cruises are never deleted, so one this tab has seen stored needs no second look; the
    // transaction then spans two tables instead of three.
    const known = knownCruises(db);
    const cruiseKnown = known.has(input.cruiseId);
    const tables = cruiseKnown ? [db.observations, db.revisions] : [db.observations, db.revisions, db.cruises];
    return await db.transaction('rw', tables, async () => {
      // Both reads go out at once: one round trip instead of two.
      const [cruiseFound, old] = await Promise.all([cruiseKnown || db.cruises.get(input.cruiseId).then((c) => c !== undefined), db.observations.get(input.id)]);
      if (!cruiseFound) throw new InvalidRecordError('observation', 'cruiseId', `names no known cruise (${input.cruiseId})`);
      known.add(input.cruiseId);
      const at = nowIso();
      if (!old) {
        if (expected !== 0) throw new RecordNotFoundError('observation', input.id);
        const first = stripUndefined<Observation>({ ...input, revision: 1, savedAt: at, savedBy, deviceId: device, deleted: false });
        await db.observations.add(first);
        return { observation: first, changed: true };
      }
      if (old.revision !== expected) throw new ObservationConflictError(input, old, expected);
      if (sameContent(input, old)) return { observation: old, changed: false };
      const next = stripUndefined<Observation>({
        ...input,
        revision: old.revision + 1,
        savedAt: at,
        savedBy,
        deviceId: device,
        // Deleting and restoring have their own functions; an edit keeps the flag.
        deleted: old.deleted,
      });
      await replaceObservation(db, old, next, at);
      return { observation: next, changed: true };
    });
  } catch (err) {
    throw mapWriteError(err, 'the observation');
  }
}

export interface DeleteOptions {
  savedBy: string;
  /** As for saveObservation: refuse when the observation changed since it was shown. */
  expectedRevision?: number;
}

async function setDeleted(id: string, deleted: boolean, opts: DeleteOptions): Promise<Observation> {
  const db = await writableDb();
  const device = await deviceId();
  try {
    return await db.transaction('rw', [db.observations, db.revisions], async () => {
      const old = await db.observations.get(id);
      if (!old) throw new RecordNotFoundError('observation', id);
      if (opts.expectedRevision !== undefined && old.revision !== opts.expectedRevision)
        throw new ObservationConflictError({ ...old, deleted }, old, opts.expectedRevision);
      if (old.deleted === deleted) return old;
      const at = nowIso();
      const next: Observation = { ...old, deleted, revision: old.revision + 1, savedAt: at, savedBy: opts.savedBy, deviceId: device };
      await replaceObservation(db, old, next, at);
      return next;
    });
  } catch (err) {
    throw mapWriteError(err, deleted ? 'deleting the observation' : 'restoring the observation');
  }
}

/** Marks an observation deleted (a new revision); it stays in the store and can be restored. */
export function softDeleteObservation(id: string, opts: DeleteOptions): Promise<Observation> {
  return setDeleted(id, true, opts);
}

export function restoreObservation(id: string, opts: DeleteOptions): Promise<Observation> {
  return setDeleted(id, false, opts);
}

export function getObservation(id: string): Promise<Observation | undefined> {
  return getDb().observations.get(id);
}

export interface ListObservationsQuery {
  /** Inclusive bounds on `time` (ISO 8601 UTC). */
  from?: IsoUtc;
  to?: IsoUtc;
  observerId?: string;
  includeDeleted?: boolean;
}

/** Observations of a cruise in time order. A typed query function, usable in useLiveQuery. */
export function listObservations(cruiseId: string, q: ListObservationsQuery = {}): Promise<Observation[]> {
  return getDb()
    .observations.where('[cruiseId+time]')
    .between([cruiseId, q.from ?? Dexie.minKey], [cruiseId, q.to ?? Dexie.maxKey], true, true)
    .filter((o) => (q.includeDeleted === true || !o.deleted) && (q.observerId === undefined || o.observerId === q.observerId))
    .toArray();
}

/** Number of (not deleted) observations of a cruise. */
export function countObservations(cruiseId: string): Promise<number> {
  return getDb()
    .observations.where('[cruiseId+time]')
    .between([cruiseId, Dexie.minKey], [cruiseId, Dexie.maxKey], true, true)
    .filter((o) => !o.deleted)
    .count();
}

/** Every version of an observation, oldest first; the last one is the current version. */
export async function observationHistory(id: string): Promise<Observation[]> {
  const db = getDb();
  return db.transaction('r', [db.observations, db.revisions], async () => {
    const earlier = await db.revisions
      .where('[observationId+revision]')
      .between([id, Dexie.minKey], [id, Dexie.maxKey], true, true)
      .toArray();
    const now = await db.observations.get(id);
    const all = earlier.map((r) => r.observation);
    if (now) all.push(now);
    return all;
  });
}
