// The import in pieces (src/db/importStream.ts) against the import read whole (readLogText,
// planMerge, applyMergePlan), which is the reference: the same store after the same files,
// the same preview counts; and a failure at any point of the apply leaves the store unchanged.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { getDb, saveObservation, selectDatabase } from '../../src/db';
import { applyMergePlan, loadMergeTarget, StaleImportError } from '../../src/db/importPlan';
import { applyImport, ImportFileChangedError, previewImport, type OpenPieces } from '../../src/db/importStream';
import { exportLogJson } from '../../src/format/encode';
import { planMerge } from '../../src/format/merge';
import { readLogText } from '../../src/format/read';
import { openLog, stringSource } from '../../src/format/readStream';
import type { LogBundle } from '../../src/format/types';
import { arbBundle, sampleBundle } from '../format/arbitraries';
import { dumpAll, freshDatabasePerTest, quotaFailure } from './helpers';

const db = freshDatabasePerTest();

const textOf = (b: LogBundle) => exportLogJson(b, { exportedAt: '2026-04-01T00:00:00Z' }).join('');

/** Pieces of `text`, small, so that every list is cut several times. */
function opener(text: () => string): OpenPieces {
  return (route, checkedHash) =>
    openLog({ pieces: () => stringSource(text(), 501), whole: () => ({ text: text(), byteLength: text().length }) }, { route, rules: null, observationBatch: 3, trackBatch: 7, ...(checkedHash === undefined ? {} : { checkedHash }) });
}

/** An opener the apply must not call: the preview kept every piece. */
const noSecondReading: OpenPieces = () => {
  throw new Error('the file was read a second time');
};

async function importInPieces(text: string, keepPieces = false) {
  const preview = await previewImport(opener(() => text), { keepPieces });
  if (!preview.ok) throw new Error(JSON.stringify(preview.problems));
  expect(preview.pieces !== undefined).toBe(keepPieces);
  const applied = await applyImport(keepPieces ? noSecondReading : opener(() => text), preview, { source: 'pieces.json' });
  return { preview, applied };
}

async function importWhole(text: string) {
  const r = readLogText(text, { rules: null });
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  const plan = planMerge(await loadMergeTarget(r.bundle.cruise.id), r.bundle);
  return { plan, applied: await applyMergePlan(plan, { source: 'whole.json' }) };
}

async function wipe() {
  const d = getDb();
  await d.transaction('rw', d.tables, async () => {
    for (const t of d.tables) await t.clear();
  });
}

/** The store without the times the import stamps (supersededAt, detectedAt) and the source name. */
async function storeContent() {
  const all = await dumpAll();
  const strip = (rows: unknown[]) => rows.map((r) => JSON.stringify({ ...(r as object), supersededAt: undefined, detectedAt: undefined, source: undefined })).sort();
  return Object.fromEntries(Object.entries(all).map(([k, v]) => [k, strip(v)]));
}

/** A second file of the same cruise: some observations edited (revision + 1), some new, the track extended. */
function laterFile(b: LogBundle, seed: number): LogBundle {
  const edited = b.observations.map((o, i) => (i % 3 === seed % 3 ? { ...o, revision: o.revision + 1, notes: `${o.notes} (edited)` } : o));
  const history = [...b.history, ...b.observations.filter((_, i) => i % 3 === seed % 3)];
  return { ...b, observations: edited, history };
}

describe('import in pieces', { timeout: 300_000 }, () => {
  it('leaves the store as the whole-file import does, file after file, with the same preview counts (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(arbBundle, fc.integer({ min: 0, max: 2 }), async (b, seed) => {
        const files = [textOf(b), textOf(b), textOf(laterFile(b, seed))];
        await wipe();
        const wholeCounts = [];
        for (const f of files) wholeCounts.push((await importWhole(f)).plan.counts);
        const afterWhole = await storeContent();
        // Read twice (a large file), then read once with the preview's pieces kept (a file that fits).
        for (const keep of [false, true]) {
          await wipe();
          const pieceCounts = [];
          for (const f of files) pieceCounts.push((await importInPieces(f, keep)).preview.summary.counts);
          expect(await storeContent()).toEqual(afterWhole);
          expect(pieceCounts).toEqual(wholeCounts);
        }
      }),
      { numRuns: 25 },
    );
  });

  it('a file that fails part way through the apply leaves the store untouched', async () => {
    const b = sampleBundle();
    await importInPieces(textOf(b));
    const good = textOf(laterFile(b, 1));
    const preview = await previewImport(opener(() => good));
    expect(preview.ok).toBe(true);
    if (!preview.ok) return;
    const before = await storeContent();
    // The same file, changed on disk after the preview: its last track row is broken.
    const broken = good.replace(/\]\n {4}\]\n {2}\},/, ', "x"]\n    ]\n  },');
    expect(broken).not.toBe(good);
    await expect(applyImport(opener(() => broken), preview, { source: 'changed.json' })).rejects.toBeInstanceOf(ImportFileChangedError);
    expect(await storeContent()).toEqual(before);
    // Still a valid log, of the same observations and revisions, but one note changed: the
    // apply (which does not run the schema and rules again) sees another text and stops.
    const other = good.replace('(edited)', '(edited again)');
    expect(other).not.toBe(good);
    expect(readLogText(other, { rules: null }).ok).toBe(true);
    await expect(applyImport(opener(() => other), preview, { source: 'other.json' })).rejects.toBeInstanceOf(ImportFileChangedError);
    expect(await storeContent()).toEqual(before);
    // Truncated half-way through the observations.
    const cut = good.slice(0, Math.floor(good.indexOf('"track"') / 2));
    await expect(applyImport(opener(() => cut), preview, { source: 'cut.json' })).rejects.toBeInstanceOf(ImportFileChangedError);
    expect(await storeContent()).toEqual(before);
  });

  for (const keepPieces of [false, true]) {
    const how = keepPieces ? 'the preview\'s pieces kept' : 'the file read again';
    it(`an edit saved between preview and apply makes the apply write nothing (stale preview; ${how})`, async () => {
      const b = sampleBundle();
      await importInPieces(textOf(b));
      const text = textOf(laterFile(b, 0));
      const preview = await previewImport(opener(() => text), { keepPieces });
      if (!preview.ok) throw new Error('rejected');
      const target = b.observations[b.observations.length - 1] as LogBundle['observations'][number];
      await saveObservation({ ...target, notes: 'edited meanwhile' }, { expectedRevision: target.revision, savedBy: target.observerId });
      const before = await storeContent();
      await expect(applyImport(keepPieces ? noSecondReading : opener(() => text), preview, { source: 'stale.json' })).rejects.toBeInstanceOf(StaleImportError);
      expect(await storeContent()).toEqual(before);
    });

    it(`a full disk at the last write leaves the store untouched (${how})`, async () => {
      const b = sampleBundle();
      const text = textOf(b);
      const preview = await previewImport(opener(() => text), { keepPieces });
      if (!preview.ok) throw new Error('rejected');
      const before = await storeContent();
      selectDatabase(db.name()).use(quotaFailure((table) => table === 'trackChunks'));
      await expect(applyImport(keepPieces ? noSecondReading : opener(() => text), preview, { source: 'full.json' })).rejects.toMatchObject({ kind: 'storage-full' });
      selectDatabase(db.name());
      expect(await storeContent()).toEqual(before);
      // Room again: the same preview applies, the kept pieces gone with the first try, so the
      // file is read again; the store is then the one a fresh import gives.
      await applyImport(opener(() => text), preview, { source: 'full.json' });
      const afterRetry = await storeContent();
      await wipe();
      await importInPieces(text);
      expect(afterRetry).toEqual(await storeContent());
    });
  }

  it('a rejected file gives the whole reader\'s report and writes nothing', async () => {
    const text = textOf(sampleBundle()).replace('"totalConcentration":', '"totalConcentration":11,"x":');
    expect(text).not.toBe(textOf(sampleBundle()));
    const preview = await previewImport(opener(() => text));
    const whole = readLogText(text, { rules: null });
    expect(preview.ok).toBe(false);
    expect(whole.ok).toBe(false);
    if (!preview.ok && !whole.ok) expect(preview.problems).toEqual(whole.problems);
    expect(Object.values(await dumpAll()).every((rows) => rows.length === 0)).toBe(true);
  });
});
