// Exchange with a long cruise: 50,000 observations and 1,000,000 track points (the invented demo
// cruise repeated with new ids and later times).
//   export: log file text (encode + write) vs JSON.stringify of the same records   target <= 1.5x
//   import: read + schema + rules + merge plan + one-transaction apply into an empty store,
//           vs a bare bulkPut of the same records (same batches) into an empty store  target <= 2x
// Both in Node; the store is fake-indexeddb, as in the database tests. Peak memory is printed.
// FLOE_BENCH_SCALE (e.g. 0.1) shrinks the data for a quick try; FLOE_BENCH_PART=export skips the
// (slow, fake-indexeddb) import half.
import 'fake-indexeddb/auto';
import { closeFloeDb, countTrackPoints, getDb, openFloeDb, selectDatabase } from '../../../src/db';
import { chunksOf } from '../../../src/db/trackChunk';
import { applyMergePlan, loadMergeTarget } from '../../../src/db/importPlan';
import { exportLogJson } from '../../../src/format/encode';
import { planMerge } from '../../../src/format/merge';
import { readLogText } from '../../../src/format/read';
import { bigCruise } from '../bigCruise';
import { absoluteRow, median, ratioRow, type BenchRow, type BenchSuite } from '../bench-kit';

const SCALE = Number(process.env.FLOE_BENCH_SCALE ?? '1');
const OBSERVATIONS = Math.round(50_000 * SCALE);
const TRACK_POINTS = Math.round(1_000_000 * SCALE);

let dbCounter = 0;
async function freshDb() {
  closeFloeDb();
  selectDatabase(`floe-bench-${process.pid}-${++dbCounter}`);
  await openFloeDb();
  return getDb();
}

async function dropDb() {
  const name = getDb().name;
  closeFloeDb();
  await new Promise<void>((ok) => {
    const req = indexedDB.deleteDatabase(name);
    req.onsuccess = req.onerror = req.onblocked = () => ok();
  });
}

function time<T>(fn: () => T): { ms: number; value: T } {
  const t = performance.now();
  const value = fn();
  return { ms: performance.now() - t, value };
}

export const suite: BenchSuite = {
  name: `exchange (${OBSERVATIONS} observations, ${TRACK_POINTS} track points)`,
  async run() {
    const rows: BenchRow[] = [];
    const bundle = bigCruise(OBSERVATIONS, TRACK_POINTS);

    // Export, interleaved A B A B so machine noise hits both alike.
    const exp: number[] = [];
    const raw: number[] = [];
    let text = '';
    for (let i = 0; i < 4; i++) {
      // The parts are what the app hands to a Blob (and the CLI to a file): no joined copy.
      const a = time(() => exportLogJson(bundle));
      const b = time(() => JSON.stringify({ cruise: bundle.cruise, observations: bundle.observations, track: bundle.track }));
      if (i > 0) {
        exp.push(a.ms);
        raw.push(b.ms);
      }
      if (i === 0) text = a.value.join('');
    }
    rows.push(ratioRow('export log file vs JSON.stringify of the records (median)', median(exp), median(raw), 'ms', 1.5));
    rows.push(absoluteRow('log file size', text.length / 1e6, 'MB', 512));

    if (process.env.FLOE_BENCH_PART === 'export') return rows;
    // Import vs a bare bulkPut, each into an empty store, twice, alternating.
    const imp: number[] = [];
    const put: number[] = [];
    // One round at full size: fake-indexeddb needs minutes for a million rows.
    const rounds = SCALE >= 0.5 ? 1 : 2;
    for (let i = 0; i < rounds; i++) {
      let db = await freshDb();
      let t = performance.now();
      const r = readLogText(text);
      if (!r.ok) throw new Error(`the benchmark log was rejected: ${r.problems.listed[0]?.message}`);
      const plan = planMerge(await loadMergeTarget(r.bundle.cruise.id), r.bundle);
      await applyMergePlan(plan, { source: 'bench.json' });
      imp.push(performance.now() - t);
      if ((await countTrackPoints(bundle.cruise.id)) !== TRACK_POINTS) throw new Error('import lost track points');
      await dropDb();

      db = await freshDb();
      t = performance.now();
      await db.transaction('rw', [db.cruises, db.observations, db.trackChunks], async () => {
        await db.cruises.put(bundle.cruise);
        await db.observations.bulkPut(bundle.observations);
        // The same rows as the import writes: the track as hour chunks.
        await db.trackChunks.bulkPut(chunksOf(bundle.track));
      });
      put.push(performance.now() - t);
      await dropDb();
    }
    rows.push(ratioRow('import (validate, rules, merge, apply) vs bare bulkPut (median)', median(imp), median(put), 'ms', 2));
    const peakMb = process.resourceUsage().maxRSS / 1024;
    console.log(`exchange bench: peak resident memory ${peakMb.toFixed(0)} MB`);
    rows.push(absoluteRow('peak resident memory of the process', peakMb, 'MB', 4096));
    return rows;
  },
};
