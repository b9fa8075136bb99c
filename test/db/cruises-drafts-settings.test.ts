import { describe, expect, it } from 'vitest';
import {
  clearDraft,
  createCruise,
  deviceId,
  getActiveCruise,
  getCruise,
  getSetting,
  InvalidRecordError,
  listCruises,
  listDrafts,
  loadDraft,
  RecordNotFoundError,
  saveDraft,
  selectDatabase,
  setActiveCruise,
  setSetting,
  updateCruise,
  WriteFailedError,
} from '../../src/db';
import { CRUISE_INPUT, freshDatabasePerTest, makeCruise } from './helpers';

const db = freshDatabasePerTest();

describe('cruises', () => {
  it('creates a cruise with an id and UTC timestamps, and reads it back', async () => {
    const c = await makeCruise();
    expect(c.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(c.createdAt).toBe(c.updatedAt);
    expect(c.createdAt).toMatch(/Z$/);
    expect(await getCruise(c.id)).toEqual(c);
  });

  it('keeps a given id and refuses a second cruise with the same id', async () => {
    await createCruise({ ...CRUISE_INPUT, id: 'wmt-2026' });
    const err = await createCruise({ ...CRUISE_INPUT, id: 'wmt-2026', name: 'other' }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(WriteFailedError);
    expect((await getCruise('wmt-2026'))?.name).toBe(CRUISE_INPUT.name);
  });

  it('edits a cruise, keeping id and createdAt', async () => {
    const c = await makeCruise();
    await new Promise((r) => setTimeout(r, 5));
    const edited = await updateCruise(c.id, { iceClass: 'IA-Super', observers: [...c.observers, { id: 'obs-lt', name: 'Lin Tao', initials: 'LT' }] });
    expect(edited.iceClass).toBe('IA-Super');
    expect(edited.observers).toHaveLength(3);
    expect(edited.createdAt).toBe(c.createdAt);
    expect(edited.updatedAt > c.updatedAt).toBe(true);
    expect(await getCruise(c.id)).toEqual(edited);
    await expect(updateCruise('nope', { name: 'x' })).rejects.toBeInstanceOf(RecordNotFoundError);
  });

  it('stores a cruise end time, refuses one that is no UTC time, and reopens the cruise', async () => {
    const c = await makeCruise();
    const ended = await updateCruise(c.id, { endTime: '2026-12-02T18:57:00Z' });
    expect((await getCruise(c.id))?.endTime).toBe('2026-12-02T18:57:00Z');
    await expect(updateCruise(c.id, { endTime: 'yesterday' })).rejects.toThrow(/endTime/);
    expect(await getCruise(c.id)).toEqual(ended);
    await updateCruise(c.id, { endTime: undefined });
    expect(Object.keys((await getCruise(c.id)) ?? {})).not.toContain('endTime');
  });

  it('refuses invalid cruises, naming the field, and changes nothing', async () => {
    const c = await makeCruise();
    const cases: [Record<string, unknown>, string][] = [
      [{ name: ' ' }, 'name'],
      [{ iceClass: 'PC9' }, 'iceClass'],
      [{ intervalMinutes: 0 }, 'intervalMinutes'],
      [{ displayTimeZone: 'Mars/Olympus' }, 'displayTimeZone'],
      [{ observers: [CRUISE_INPUT.observers[0], CRUISE_INPUT.observers[0]] }, 'observers.1.id'],
    ];
    for (const [patch, path] of cases) {
      const err = await updateCruise(c.id, patch).catch((e: unknown) => e);
      expect(err, path).toBeInstanceOf(InvalidRecordError);
      expect((err as InvalidRecordError).path).toBe(path);
      await expect(createCruise({ ...CRUISE_INPUT, ...patch })).rejects.toBeInstanceOf(InvalidRecordError);
    }
    expect(await listCruises()).toEqual([c]);
  });

  it('lists newest first and keeps the active cruise in settings', async () => {
    const a = await makeCruise({ name: 'A' });
    await new Promise((r) => setTimeout(r, 5));
    const b = await makeCruise({ name: 'B' });
    expect((await listCruises()).map((c) => c.name)).toEqual(['B', 'A']);
    expect(await getActiveCruise()).toBeUndefined();
    await setActiveCruise(a.id);
    expect(await getActiveCruise()).toEqual(a);
    expect(await getSetting('activeCruiseId')).toBe(a.id);
    await expect(setActiveCruise('missing')).rejects.toBeInstanceOf(RecordNotFoundError);
    expect((await getActiveCruise())?.id).toBe(a.id);
    await setActiveCruise(null);
    expect(await getActiveCruise()).toBeUndefined();
    expect(b.name).toBe('B');
  });
});

describe('drafts', () => {
  it('saves, replaces, loads and clears a draft per cruise and form', async () => {
    const data = { totalConcentration: 7, notes: 'half typed' };
    const saved = await saveDraft('c1', 'observation', data);
    expect(saved.savedAt).toMatch(/Z$/);
    expect((await loadDraft<typeof data>('c1', 'observation'))?.data).toEqual(data);
    await saveDraft('c1', 'observation', { ...data, notes: 'more typed' });
    await saveDraft('c1', 'observation:abc', { notes: 'edit of abc' });
    await saveDraft('c2', 'observation', { notes: 'other cruise' });
    expect((await loadDraft<typeof data>('c1', 'observation'))?.data.notes).toBe('more typed');
    expect((await listDrafts('c1')).map((d) => d.form).sort()).toEqual(['observation', 'observation:abc']);
    await clearDraft('c1', 'observation');
    expect(await loadDraft('c1', 'observation')).toBeUndefined();
    expect((await loadDraft<{ notes: string }>('c2', 'observation'))?.data.notes).toBe('other cruise');
  });
});

describe('settings and device id', () => {
  it('reads back typed settings; unknown is undefined', async () => {
    expect(await getSetting('currentObserverId')).toBeUndefined();
    await setSetting('currentObserverId', 'obs-rm');
    await setSetting('reminderLeadMinutes', 5);
    expect(await getSetting('currentObserverId')).toBe('obs-rm');
    expect(await getSetting('reminderLeadMinutes')).toBe(5);
  });

  it('creates the device id once per profile, also when asked concurrently', async () => {
    const ids = await Promise.all([deviceId(), deviceId(), deviceId()]);
    expect(new Set(ids).size).toBe(1);
    expect(ids[0]).toMatch(/^[0-9a-f-]{36}$/);
    // A new connection to the same database (a reload) finds the same id.
    selectDatabase(db.name());
    expect(await deviceId()).toBe(ids[0]);
  });
});
