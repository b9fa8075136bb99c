// The one way a stored observation is replaced: the old version goes to the append-only
// revisions table in the same transaction. Callers run this inside their own read-write
// transaction.
import type { IsoUtc, Observation } from '../domain/model';
import type { FloeDatabase } from './database';

export async function replaceObservation(db: FloeDatabase, old: Observation, next: Observation, at: IsoUtc): Promise<void> {
  // add, not put: an existing revision row is never replaced.
  // Both requests are queued in the caller's transaction together; if either fails, the
  // transaction aborts and neither is stored.
  await Promise.all([db.revisions.add({ observationId: old.id, revision: old.revision, supersededAt: at, observation: old }), db.observations.put(next)]);
}
