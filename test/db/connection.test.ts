import { describe, expect, it } from 'vitest';
import {
  ConnectionClosedError,
  DatabaseTooNewError,
  deviceId,
  FloeDatabase,
  getObservation,
  listObservations,
  loadDraft,
  onDatabaseEvent,
  openFloeDb,
  SCHEMA_VERSIONS,
  saveDraft,
  saveObservation,
  selectDatabase,
  StorageFullError,
  StorageUnavailableError,
  writeBlockReason,
  type DatabaseEvent,
  type SchemaVersion,
} from '../../src/db';
import { dumpAll, freshDatabasePerTest, makeCruise, makeObservation, quotaFailure } from './helpers';

const db = freshDatabasePerTest();

/** A later version as a future release might add it: one new index, no row changes. */
const FUTURE: SchemaVersion = {
  version: (SCHEMA_VERSIONS[SCHEMA_VERSIONS.length - 1]?.version ?? 0) + 1,
  note: 'test only',
  stores: { ...SCHEMA_VERSIONS[SCHEMA_VERSIONS.length - 1]?.stores, photos: 'id, observationId, cruiseId, addedAt' },
};

describe('opening', () => {
  it('without IndexedDB, opening fails with a clear typed error, and so does every write', async () => {
    selectDatabase(`${db.name()}-none`, { indexedDB: null });
    const err = await openFloeDb().catch((e: unknown) => e);
    expect(err).toBeInstanceOf(StorageUnavailableError);
    expect((err as Error).message).toMatch(/does not let Floe Ledger store data/);
    await expect(saveDraft('c', 'f', {})).rejects.toBeInstanceOf(StorageUnavailableError);
  });

  it('code older than the database reads but refuses to write, and says why', async () => {
    await makeCruise();
    // A newer release upgrades the database...
    selectDatabase(db.name(), { versions: [...SCHEMA_VERSIONS, FUTURE] });
    const cruise = await makeCruise({ name: 'made by newer code' });
    await saveObservation(makeObservation(cruise.id));
    // ...then this (older) code opens it.
    const events: DatabaseEvent[] = [];
    const off = onDatabaseEvent((e) => events.push(e));
    selectDatabase(db.name());
    await openFloeDb();
    off();
    const reason = writeBlockReason();
    expect(reason).toBeInstanceOf(DatabaseTooNewError);
    expect((reason as DatabaseTooNewError).installedVersion).toBe(FUTURE.version);
    expect(reason?.message).toContain(`database version ${FUTURE.version}`);
    expect(events).toEqual([{ type: 'too-new', installedVersion: FUTURE.version, codeVersion: FUTURE.version - 1 }]);
    expect(await listObservations(cruise.id)).toHaveLength(1);
    const before = await dumpAll();
    await expect(saveObservation(makeObservation(cruise.id))).rejects.toBeInstanceOf(DatabaseTooNewError);
    await expect(saveDraft(cruise.id, 'observation', { a: 1 })).rejects.toBeInstanceOf(DatabaseTooNewError);
    expect(await dumpAll()).toEqual(before);
  });

  it('when another tab upgrades, this tab closes, raises "versionchange" and refuses writes; drafts stay', async () => {
    const cruise = await makeCruise();
    await saveDraft(cruise.id, 'observation', { notes: 'typed before the upgrade' });
    const events: DatabaseEvent[] = [];
    const off = onDatabaseEvent((e) => events.push(e));
    const otherTab = new FloeDatabase(db.name(), { versions: [...SCHEMA_VERSIONS, FUTURE] });
    await otherTab.open(); // would hang if this tab did not close its connection
    off();
    expect(events).toEqual([{ type: 'versionchange', newVersion: FUTURE.version * 10 }]);
    const err = await saveObservation(makeObservation(cruise.id)).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ConnectionClosedError);
    expect((err as Error).message).toMatch(/updated in another tab.*Reload/);
    // After the reload (new code), the draft is there.
    otherTab.close();
    selectDatabase(db.name(), { versions: [...SCHEMA_VERSIONS, FUTURE] });
    expect((await loadDraft<{ notes: string }>(cruise.id, 'observation'))?.data.notes).toBe('typed before the upgrade');
  });
});

describe('failed writes leave the database unchanged', () => {
  it('a full disk while writing the revision: typed error, neither the edit nor the revision stored', async () => {
    const cruise = await makeCruise();
    const first = (await saveObservation(makeObservation(cruise.id))).observation;
    await saveDraft(cruise.id, 'observation', { notes: 'draft of the edit' });
    const before = await dumpAll();
    // Reconnect with revisions failing: the observation row is written first in the same
    // transaction, so this proves the rollback.
    selectDatabase(db.name()).use(quotaFailure((table) => table === 'revisions'));
    const err = await saveObservation({ ...first, notes: 'edit' }, { expectedRevision: 1 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(StorageFullError);
    expect((err as Error).message).toMatch(/Storage is full.*drafts included, is kept/);
    selectDatabase(db.name());
    expect(await dumpAll()).toEqual(before);
    expect((await getObservation(first.id))?.notes).toBe('Snow cover patchy.');
  });

  it('a full disk on a new observation stores nothing', async () => {
    const cruise = await makeCruise();
    selectDatabase(db.name()).use(quotaFailure((table) => table === 'observations'));
    await deviceId(); // created on first use, before any save; not part of the failed write
    const before = await dumpAll();
    await expect(saveObservation(makeObservation(cruise.id))).rejects.toBeInstanceOf(StorageFullError);
    expect(await dumpAll()).toEqual(before);
  });
});
