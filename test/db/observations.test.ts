import { describe, expect, it } from 'vitest';
import {
  countObservations,
  deviceId,
  getDb,
  getObservation,
  InvalidRecordError,
  listObservations,
  RecordNotFoundError,
  observationHistory,
  ObservationConflictError,
  restoreObservation,
  saveObservation,
  softDeleteObservation,
} from '../../src/db';
import { dumpAll, freshDatabasePerTest, makeCruise, makeObservation } from './helpers';

freshDatabasePerTest();

describe('saveObservation', () => {
  it('stores a new observation as revision 1, stamped with time, saver and this device', async () => {
    const cruise = await makeCruise();
    const input = makeObservation(cruise.id);
    const before = Date.now();
    const { observation, changed } = await saveObservation(input, { savedBy: 'obs-ak' });
    expect(changed).toBe(true);
    expect(observation.revision).toBe(1);
    expect(observation.deleted).toBe(false);
    expect(observation.savedBy).toBe('obs-ak');
    expect(observation.deviceId).toBe(await deviceId());
    expect(Date.parse(observation.savedAt)).toBeGreaterThanOrEqual(before - 1);
    expect(observation.savedAt).toMatch(/Z$/);
    expect(await getObservation(input.id)).toEqual(observation);
    expect(await getDb().revisions.count()).toBe(0);
  });

  it('an edit keeps the old version in revisions and raises the revision by one', async () => {
    const cruise = await makeCruise();
    const first = (await saveObservation(makeObservation(cruise.id))).observation;
    const edited = (await saveObservation({ ...first, totalConcentration: 9, notes: 'Ridges more frequent.' }, { expectedRevision: 1, savedBy: 'obs-rm' }))
      .observation;
    expect(edited.revision).toBe(2);
    expect(edited.totalConcentration).toBe(9);
    expect(edited.savedBy).toBe('obs-rm');
    const revs = await getDb().revisions.toArray();
    expect(revs).toHaveLength(1);
    expect(revs[0]?.revision).toBe(1);
    expect(revs[0]?.observation).toEqual(first);
    const third = (await saveObservation({ ...edited, notes: 'third' }, { expectedRevision: 2 })).observation;
    expect(third.revision).toBe(3);
    expect((await observationHistory(first.id)).map((o) => [o.revision, o.notes])).toEqual([
      [1, 'Snow cover patchy.'],
      [2, 'Ridges more frequent.'],
      [3, 'third'],
    ]);
  });

  it('saving unchanged content writes nothing and keeps the revision', async () => {
    const cruise = await makeCruise();
    const first = (await saveObservation(makeObservation(cruise.id))).observation;
    const again = await saveObservation({ ...first }, { expectedRevision: 1 });
    expect(again.changed).toBe(false);
    expect(again.observation).toEqual(first);
    expect(await getDb().revisions.count()).toBe(0);
  });

  it('refuses an edit over a revision that changed elsewhere, carrying both versions', async () => {
    const cruise = await makeCruise();
    const first = (await saveObservation(makeObservation(cruise.id))).observation;
    // "Another tab" saves revision 2 first.
    const theirs = (await saveObservation({ ...first, notes: 'from the other tab' }, { expectedRevision: 1 })).observation;
    const before = await dumpAll();
    const mine = { ...first, notes: 'from this tab' };
    const err = await saveObservation(mine, { expectedRevision: 1 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ObservationConflictError);
    const conflict = err as ObservationConflictError;
    expect(conflict.kind).toBe('conflict');
    expect(conflict.mine.notes).toBe('from this tab');
    expect(conflict.theirs).toEqual(theirs);
    expect(conflict.expectedRevision).toBe(1);
    expect(conflict.message).toContain('revision 2');
    expect(await dumpAll()).toEqual(before);
  });

  it('refuses a new observation whose id exists, instead of overwriting it', async () => {
    const cruise = await makeCruise();
    const first = (await saveObservation(makeObservation(cruise.id))).observation;
    await expect(saveObservation({ ...first, notes: 'dup' })).rejects.toBeInstanceOf(ObservationConflictError);
    expect((await getObservation(first.id))?.notes).toBe('Snow cover patchy.');
  });

  it('an edit of an observation that is not stored is a not-found error', async () => {
    const cruise = await makeCruise();
    await expect(saveObservation(makeObservation(cruise.id), { expectedRevision: 3 })).rejects.toBeInstanceOf(RecordNotFoundError);
  });

  it('rejects an invalid record with the field named, and stores nothing', async () => {
    const cruise = await makeCruise();
    await saveObservation(makeObservation(cruise.id));
    const before = await dumpAll();
    const cases: [Partial<ReturnType<typeof makeObservation>>, string][] = [
      [{ time: '2026-02-10 06:00' }, 'time'],
      [{ time: '2026-02-10T06:00:00+01:00' }, 'time'],
      [{ totalConcentration: 11 }, 'totalConcentration'],
      [{ position: { lat: 95, lon: 0, source: 'manual' } }, 'position.lat'],
      [{ cruiseId: 'no-such-cruise' }, 'cruiseId'],
      [{ id: '' }, 'id'],
    ];
    for (const [bad, path] of cases) {
      const err = await saveObservation({ ...makeObservation(cruise.id), ...bad }).catch((e: unknown) => e);
      expect(err, path).toBeInstanceOf(InvalidRecordError);
      expect((err as InvalidRecordError).path).toBe(path);
      expect((err as Error).message).toContain(path);
    }
    expect(await dumpAll()).toEqual(before);
  });
});

describe('soft delete and restore', () => {
  it('deleting is a new revision; the row stays and is hidden from lists until restored', async () => {
    const cruise = await makeCruise();
    const obs = (await saveObservation(makeObservation(cruise.id))).observation;
    const deleted = await softDeleteObservation(obs.id, { savedBy: 'obs-rm', expectedRevision: 1 });
    expect(deleted.deleted).toBe(true);
    expect(deleted.revision).toBe(2);
    expect(await listObservations(cruise.id)).toEqual([]);
    expect(await listObservations(cruise.id, { includeDeleted: true })).toEqual([deleted]);
    expect(await countObservations(cruise.id)).toBe(0);
    const restored = await restoreObservation(obs.id, { savedBy: 'obs-ak' });
    expect(restored.deleted).toBe(false);
    expect(restored.revision).toBe(3);
    expect((await observationHistory(obs.id)).map((o) => o.deleted)).toEqual([false, true, false]);
    expect(await listObservations(cruise.id)).toEqual([restored]);
  });

  it('deleting twice does not add a revision; deleting a changed revision is a conflict', async () => {
    const cruise = await makeCruise();
    const obs = (await saveObservation(makeObservation(cruise.id))).observation;
    await softDeleteObservation(obs.id, { savedBy: 'obs-ak' });
    const again = await softDeleteObservation(obs.id, { savedBy: 'obs-ak' });
    expect(again.revision).toBe(2);
    await expect(restoreObservation(obs.id, { savedBy: 'obs-ak', expectedRevision: 1 })).rejects.toBeInstanceOf(ObservationConflictError);
    await expect(softDeleteObservation('missing', { savedBy: 'obs-ak' })).rejects.toBeInstanceOf(RecordNotFoundError);
  });

  it('an edit keeps the deleted flag of the stored row', async () => {
    const cruise = await makeCruise();
    const obs = (await saveObservation(makeObservation(cruise.id))).observation;
    const del = await softDeleteObservation(obs.id, { savedBy: 'obs-ak' });
    const edited = (await saveObservation({ ...obs, notes: 'late fix', deleted: false }, { expectedRevision: del.revision })).observation;
    expect(edited.deleted).toBe(true);
  });
});

describe('listing', () => {
  it('lists by cruise in time order, within inclusive bounds, by observer', async () => {
    const a = await makeCruise();
    const b = await makeCruise({ name: 'Second leg' });
    const times = ['2026-02-10T08:00:00Z', '2026-02-10T06:00:00Z', '2026-02-10T07:00:00Z', '2026-02-11T00:00:00Z'];
    for (const [i, time] of times.entries()) await saveObservation(makeObservation(a.id, { time, observerId: i % 2 ? 'obs-rm' : 'obs-ak' }));
    await saveObservation(makeObservation(b.id, { time: '2026-02-10T07:30:00Z' }));
    expect((await listObservations(a.id)).map((o) => o.time)).toEqual([
      '2026-02-10T06:00:00Z',
      '2026-02-10T07:00:00Z',
      '2026-02-10T08:00:00Z',
      '2026-02-11T00:00:00Z',
    ]);
    expect((await listObservations(a.id, { from: '2026-02-10T07:00:00Z', to: '2026-02-10T08:00:00Z' })).map((o) => o.time)).toEqual([
      '2026-02-10T07:00:00Z',
      '2026-02-10T08:00:00Z',
    ]);
    expect((await listObservations(a.id, { observerId: 'obs-rm' })).map((o) => o.time)).toEqual(['2026-02-10T06:00:00Z', '2026-02-11T00:00:00Z']);
    expect(await listObservations(b.id)).toHaveLength(1);
    expect(await countObservations(a.id)).toBe(4);
  });
});
