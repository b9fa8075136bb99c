// The exchange format against the store: export, wipe, import gives the same log back; hostile
// files change nothing; the same file twice adds nothing; a stale preview or a full disk writes
// nothing.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { getDb, saveObservation, selectDatabase } from '../../src/db';
import { applyMergePlan, listConflicts, loadMergeTarget, StaleImportError } from '../../src/db/importPlan';
import { readCruiseExport } from '../../src/db/exportBundle';
import { writeArchive } from '../../src/format/archive';
import { readArchive } from '../../src/format/archiveRead';
import { exportLogJson } from '../../src/format/encode';
import { canonicalJson, planMerge } from '../../src/format/merge';
import { readLogText } from '../../src/format/read';
import type { LogBundle } from '../../src/format/types';
import { arbBundle, sampleBundle } from '../format/arbitraries';
import { hostileCases } from '../format/hostile';
import { dumpAll, freshDatabasePerTest, quotaFailure } from './helpers';

freshDatabasePerTest();

async function importText(text: string, source = 'test.json', rules: null | undefined = undefined) {
  const r = readLogText(text, { rules });
  if (!r.ok) return { ok: false as const, problems: r.problems };
  const plan = planMerge(await loadMergeTarget(r.bundle.cruise.id), r.bundle);
  const applied = await applyMergePlan(plan, { source });
  return { ok: true as const, plan, applied };
}

const textOf = (b: LogBundle) => exportLogJson(b, { exportedAt: '2026-04-01T00:00:00Z' }).join('');

/** Order-free comparable form of a bundle (the store lists by its own keys). */
function comparable(b: LogBundle) {
  const sorted = (xs: unknown[]) => xs.map(canonicalJson).sort();
  return {
    cruise: canonicalJson(b.cruise),
    observations: sorted(b.observations),
    history: sorted(b.history),
    conflicts: sorted(b.conflicts),
    track: sorted(b.track),
    photos: sorted(b.photos.map((p) => ({ ...p, addedAt: undefined }))),
  };
}

async function wipe() {
  const db = getDb();
  await db.transaction('rw', db.tables, async () => {
    for (const t of db.tables) await t.clear();
  });
}

describe('exchange with the store', { timeout: 120_000 }, () => {
  it('round trip: import a random log, export, wipe, import the export: the same log (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(arbBundle, async (b) => {
        await wipe();
        const first = await importText(textOf(b), 'random.json', null);
        expect(first.ok).toBe(true);
        const exported = await readCruiseExport(b.cruise.id);
        // Photos without bytes (a plain JSON log) are not stored; compare the rest.
        expect(comparable({ ...exported.bundle, photos: [] })).toEqual(comparable({ ...b, photos: [] }));
        const text = textOf(exported.bundle);
        await wipe();
        expect((await importText(text, 'export.json', null)).ok).toBe(true);
        const again = await readCruiseExport(b.cruise.id);
        expect(comparable(again.bundle)).toEqual(comparable(exported.bundle));
      }),
      { numRuns: 40 },
    );
  });

  it('round trip of an archive keeps the photos byte for byte', async () => {
    const b = sampleBundle();
    const bytes = new Uint8Array([0xff, 0xd8, 1, 2]);
    const r = readArchive(writeArchive(b, new Map([['ph-1', bytes]])));
    if (!r.ok) throw new Error('archive rejected');
    const plan = planMerge(await loadMergeTarget(b.cruise.id), r.bundle);
    const applied = await applyMergePlan(plan, { source: 'a.zip', photos: r.photos });
    expect(applied.photos).toBe(1);
    const out = await readCruiseExport(b.cruise.id, { photoBytes: true });
    expect([...(out.photos.get('ph-1') ?? [])]).toEqual([...bytes]);
    expect(out.bundle.photos[0]).toMatchObject({ id: 'ph-1', fileName: 'floe.jpg', mediaType: 'image/jpeg', byteLength: 4, takenAt: '2026-03-02T10:00:30Z' });
  });

  it('importing the same file twice adds nothing', async () => {
    const text = textOf(sampleBundle());
    await importText(text);
    const before = await dumpAll();
    const second = await importText(text);
    expect(second.ok && second.plan.counts).toMatchObject({ new: 0, identical: 2, newer: 0, older: 0, conflict: 0, versionsWritten: 0, trackNew: 0 });
    expect(await dumpAll()).toEqual(before);
  });

  it('a conflicting copy is kept beside the stored version and flagged, once', async () => {
    const b = sampleBundle();
    await importText(textOf(b));
    const other = sampleBundle();
    other.observations[0] = { ...(other.observations[0] as LogBundle['observations'][number]), notes: 'edited elsewhere', deviceId: 'dev-9' };
    const r = await importText(textOf(other), 'other-laptop.json');
    expect(r.ok && r.plan.counts.conflict).toBe(1);
    const conflicts = await listConflicts(b.cruise.id);
    expect(conflicts).toHaveLength(1);
    expect(conflicts[0]).toMatchObject({ observationId: 'o-1', revision: 2, source: 'other-laptop.json' });
    expect((await getDb().observations.get('o-1'))?.notes).toBe(b.observations[0]?.notes);
    const again = await importText(textOf(other), 'other-laptop.json');
    expect(again.ok && again.plan.counts.versionsWritten).toBe(0);
    expect(await listConflicts(b.cruise.id)).toHaveLength(1);
  });

  it('refuses a plan made before the store changed, writing nothing', async () => {
    const b = sampleBundle();
    await importText(textOf(b));
    const incoming = sampleBundle();
    incoming.observations[1] = { ...(incoming.observations[1] as LogBundle['observations'][number]), revision: 2, notes: 'rev 2 from file' };
    const r = readLogText(textOf(incoming));
    if (!r.ok) throw new Error('rejected');
    const plan = planMerge(await loadMergeTarget(b.cruise.id), r.bundle);
    // Meanwhile an observer edits o-2 in another tab.
    const stored = await getDb().observations.get('o-2');
    await saveObservation({ ...(stored as LogBundle['observations'][number]), notes: 'edited meanwhile' }, { expectedRevision: 1 });
    const before = await dumpAll();
    await expect(applyMergePlan(plan, { source: 'x.json' })).rejects.toBeInstanceOf(StaleImportError);
    expect(await dumpAll()).toEqual(before);
  });

  it('a full disk in the middle of an import writes nothing', async () => {
    const b = sampleBundle();
    const r = readLogText(textOf(b));
    if (!r.ok) throw new Error('rejected');
    const plan = planMerge(await loadMergeTarget(b.cruise.id), r.bundle);
    const before = await dumpAll();
    const name = getDb().name;
    selectDatabase(name).use(quotaFailure((table) => table === 'trackChunks'));
    await expect(applyMergePlan(plan, { source: 'x.json' })).rejects.toMatchObject({ kind: 'storage-full' });
    selectDatabase(name);
    expect(await dumpAll()).toEqual(before);
  });

  it('rejects 1,000+ hostile files with the database unchanged and Object.prototype untouched', async () => {
    await importText(textOf(sampleBundle()));
    const before = await dumpAll();
    const protoKeys = Object.getOwnPropertyNames(Object.prototype).sort();
    const cases = hostileCases();
    expect(cases.length).toBeGreaterThanOrEqual(1000);
    const accepted: string[] = [];
    for (const c of cases) {
      const r = await importText(c.text, c.name);
      if (r.ok) accepted.push(c.name);
    }
    expect(accepted).toEqual([]);
    expect(await dumpAll()).toEqual(before);
    expect(Object.getOwnPropertyNames(Object.prototype).sort()).toEqual(protoKeys);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  }, 120_000);
});
