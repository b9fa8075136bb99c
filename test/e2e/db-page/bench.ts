// Benchmarks timed inside Chromium, against its real IndexedDB; the numbers go back to Node.
import type { Observation, TrackPoint } from '../../../src/domain/model';
import { CRUISE_INPUT } from '../../db/fixtures/demo-cruise';
import { addTrackPoints, createCruise, DEFAULT_TRACK_CHUNK, getDb, saveObservation, type ObservationInput, type TrackChunkRow } from '../../../src/db';
import { chunksOf, toTimed } from '../../../src/db/trackChunk';
import { mergeTrackPointsInTransaction } from '../../../src/db/trackPoints';
import { applyMergePlan, loadMergeTarget } from '../../../src/db/importPlan';
import { countTrackPoints, exportLogPieces, readCruiseExport } from '../../../src/db';
import { piecesToBlob } from '../../../src/features/exchange/exportFiles';
import { exportLogJson } from '../../../src/format/encode';
import { planMerge } from '../../../src/format/merge';
import { readLogText } from '../../../src/format/read';
import type { ImportWorkerResult } from './import-worker';

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

async function benchCruise(): Promise<string> {
  const c = await createCruise({ ...CRUISE_INPUT, name: 'Bench cruise' });
  return c.id;
}

function observation(cruiseId: string, i: number): ObservationInput {
  return {
    id: crypto.randomUUID(),
    cruiseId,
    time: new Date(Date.UTC(2026, 1, 1) + i * 3_600_000).toISOString().replace('.000Z', 'Z'),
    position: { lat: -70.5, lon: -12.3, source: 'gps-serial' },
    observerId: 'obs-ak',
    totalConcentration: 8,
    categories: [
      { partialConcentration: 5, stage: 'thin-first-year', thicknessCm: 45, floeSize: 'medium-floe' },
      { partialConcentration: 3, stage: 'grey-white', thicknessCm: 20, floeSize: 'small-floe' },
    ],
    notes: 'bench',
    photoIds: [],
  };
}

/**
 * Median ms of an edit through saveObservation (checks, conflict test, revision row, one
 * strict transaction) against a bare Dexie transaction doing the same read and two writes (the
 * current row, then the revision row and the new row), interleaved; a bare strict put of the
 * same record is kept as context.
 */
export async function benchSave(rounds: number): Promise<{ subject: number; baseline: number; put: number }> {
  const cruiseId = await benchCruise();
  const db = getDb();
  let current: Observation = (await saveObservation(observation(cruiseId, 0))).observation;
  let bare: Observation = { ...current, id: crypto.randomUUID() };
  await db.observations.put(bare);
  const lone = { ...current, id: crypto.randomUUID() };
  const a: number[] = [];
  const b: number[] = [];
  const c: number[] = [];
  for (let i = 0; i < rounds + 3; i++) {
    let t0 = performance.now();
    current = (await saveObservation({ ...current, notes: `edit ${i}` }, { expectedRevision: current.revision })).observation;
    const ta = performance.now() - t0;
    t0 = performance.now();
    await db.transaction('rw', [db.observations, db.revisions], async () => {
      const stored = (await db.observations.get(bare.id)) as Observation;
      const next = { ...bare, notes: `edit ${i}`, revision: stored.revision + 1 };
      await db.revisions.add({ observationId: stored.id, revision: stored.revision, supersededAt: new Date().toISOString(), observation: stored });
      await db.observations.put(next);
      bare = next;
    });
    const tb = performance.now() - t0;
    t0 = performance.now();
    await db.observations.put({ ...lone, notes: `edit ${i}`, revision: i + 2 });
    const tc = performance.now() - t0;
    if (i >= 3) {
      a.push(ta);
      b.push(tb);
      c.push(tc);
    }
  }
  return { subject: median(a), baseline: median(b), put: median(c) };
}

function points(cruiseId: string, n: number): TrackPoint[] {
  const t0 = Date.UTC(2026, 1, 1);
  const out: TrackPoint[] = new Array<TrackPoint>(n);
  for (let i = 0; i < n; i++)
    out[i] = { cruiseId, time: new Date(t0 + i * 1000).toISOString().replace('.000Z', 'Z'), lat: -70 + i * 1e-6, lon: -12 + i * 1e-6, source: 'gps-serial', sogKn: 6 };
  return out;
}

/**
 * Ms for `n` points (a fix a second) through addTrackPoints (checks, hour grouping, merge with
 * stored chunks, batches) against one bare bulkPut of the same chunk rows built beforehand.
 */
export async function benchTrackVsBulkPut(n: number, rounds: number, chunkSize = DEFAULT_TRACK_CHUNK): Promise<{ subject: number; baseline: number }> {
  const a: number[] = [];
  const b: number[] = [];
  const db = getDb();
  for (let r = 0; r < rounds; r++) {
    // Alternate which goes first, so a warmer store does not favour one side.
    const order = r % 2 === 0 ? (['a', 'b'] as const) : (['b', 'a'] as const);
    for (const side of order) {
      const rows = points(`bench-${side}-${r}`, n);
      const chunks = side === 'b' ? chunksOf(rows) : [];
      const t0 = performance.now();
      if (side === 'a') await addTrackPoints(rows, { chunkSize });
      else await db.transaction('rw', db.trackChunks, () => db.trackChunks.bulkPut(chunks));
      (side === 'a' ? a : b).push(performance.now() - t0);
      await db.trackChunks.clear();
    }
  }
  return { subject: median(a), baseline: median(b) };
}

/**
 * A live fix appended to an hour that already holds 3,599 fixes (the largest chunk at a fix a
 * second): addTrackPoints([fix]) against a bare put of the chunk row it writes, interleaved.
 */
export async function benchLiveFix(rounds: number): Promise<{ subject: number; baseline: number }> {
  const db = getDb();
  const hour = points('bench-live', 3_600);
  await addTrackPoints(hour.slice(0, 3_599));
  const [full] = chunksOf(hour);
  const a: number[] = [];
  const b: number[] = [];
  for (let i = 0; i < rounds + 3; i++) {
    let t0 = performance.now();
    await addTrackPoints([{ ...(hour[3_599] as TrackPoint), lat: -60 - i * 1e-6 }]);
    const ta = performance.now() - t0;
    t0 = performance.now();
    await db.trackChunks.put({ ...(full as TrackChunkRow), cruiseId: 'bench-live-bare' });
    const tb = performance.now() - t0;
    if (i >= 3) {
      a.push(ta);
      b.push(tb);
    }
  }
  await db.trackChunks.clear();
  return { subject: median(a), baseline: median(b) };
}

/**
 * A log file fetched from the test server and imported the way the Exchange screen did before
 * the import in pieces: the file's text, read whole (size, scan, parse, schema, checks, rules),
 * merge plan, one-transaction apply. The baseline of benchImportInPieces.
 */
export async function benchImport(url: string): Promise<{ subject: number; baseline: number; bytes: number; cruiseId: string; stages: Record<string, number>; points: number }> {
  let t0 = performance.now();
  const file = { text: await (await fetch(url)).text() };
  const fetched = performance.now() - t0;
  const bytes = file.text.length;
  t0 = performance.now();
  const r = readLogText(file.text);
  // Let go of the text before the apply, as the screen does once it has the bundle.
  file.text = '';
  const read = performance.now() - t0;
  if (!r.ok) throw new Error(`the benchmark log was rejected: ${r.problems.listed[0]?.message}`);
  const t1 = performance.now();
  const plan = planMerge(await loadMergeTarget(r.bundle.cruise.id), r.bundle);
  const merge = performance.now() - t1;
  const t2 = performance.now();
  await applyMergePlan(plan, { source: 'bench.json' });
  const apply = performance.now() - t2;
  const subject = performance.now() - t0;
  const points = await countTrackPoints(r.bundle.cruise.id);
  return { subject, baseline: NaN, bytes, cruiseId: r.bundle.cruise.id, stages: { fetched, read, merge, apply }, points };
}

/**
 * The import as the Exchange screen makes it now: in the page's import worker, the file read in
 * pieces for the preview, whose pieces the one-transaction apply writes; `readTwice`: as a file
 * over the size whose pieces are kept, read again for the apply.
 */
export function benchImportInPieces(url: string, readTwice = false): Promise<ImportWorkerResult> {
  return new Promise((resolve, reject) => {
    const w = new Worker(new URL('./import-worker.js', location.href), { type: 'module' });
    w.onmessage = (ev: MessageEvent<{ ok: true; result: ImportWorkerResult } | { ok: false; message: string }>) => {
      w.terminate();
      if (ev.data.ok) resolve(ev.data.result);
      else reject(new Error(ev.data.message));
    };
    w.onerror = (ev) => {
      w.terminate();
      reject(new Error(ev.message || 'the import worker failed'));
    };
    w.postMessage({ url: new URL(url, location.href).href, readTwice });
  });
}

/**
 * The floor of any import into an empty store: one bare Dexie bulkPut of the file's 50,000
 * current observations (read whole beforehand, not timed), in one transaction.
 */
export async function benchBareObservationPut(url: string): Promise<number> {
  const r = readLogText(await (await fetch(url)).text(), { rules: null });
  if (!r.ok) throw new Error('rejected');
  const observations = r.bundle.observations;
  const db = getDb();
  const t0 = performance.now();
  await db.transaction('rw', db.observations, () => db.observations.bulkPut(observations));
  return performance.now() - t0;
}

/**
 * Below the floor: the same 50,000 observations put straight into a raw IndexedDB store with a
 * primary key only (no Dexie, no index), in one strict transaction: what the browser's own
 * storage costs for these values on this machine.
 */
export async function benchRawObservationPut(url: string): Promise<number> {
  const r = readLogText(await (await fetch(url)).text(), { rules: null });
  if (!r.ok) throw new Error('rejected');
  const observations = r.bundle.observations;
  const name = `floe-bench-raw-${Date.now()}`;
  const db = await new Promise<IDBDatabase>((resolve, reject) => {
    const open = indexedDB.open(name, 1);
    open.onupgradeneeded = () => open.result.createObjectStore('observations', { keyPath: 'id' });
    open.onsuccess = () => resolve(open.result);
    open.onerror = () => reject(open.error ?? new Error('the raw store did not open'));
  });
  try {
    const t0 = performance.now();
    await new Promise<void>((resolve, reject) => {
      const tx = db.transaction('observations', 'readwrite', { durability: 'strict' });
      const store = tx.objectStore('observations');
      for (const o of observations) store.put(o);
      tx.oncomplete = () => resolve();
      tx.onabort = () => reject(tx.error ?? new Error('the raw write was aborted'));
    });
    return performance.now() - t0;
  } finally {
    db.close();
    indexedDB.deleteDatabase(name);
  }
}

/** JSON.parse of the fetched text: the least any reader of the file must do. */
export async function benchParseOnly(url: string): Promise<number> {
  const text = await (await fetch(url)).text();
  const t0 = performance.now();
  JSON.parse(text);
  return performance.now() - t0;
}

/** The full-log export as the Export button makes it now: streamed out of the store into a Blob. */
export async function benchStreamExport(cruiseId: string): Promise<{ ms: number; bytes: number }> {
  const t0 = performance.now();
  const blob = await piecesToBlob(exportLogPieces(cruiseId), 'application/json');
  return { ms: performance.now() - t0, bytes: blob.size };
}

/** The same export read whole (one bundle, one parts list), as it was before. */
export async function benchWholeExport(cruiseId: string): Promise<{ ms: number; bytes: number }> {
  const t0 = performance.now();
  const { bundle } = await readCruiseExport(cruiseId);
  const blob = new Blob(exportLogJson(bundle), { type: 'application/json' });
  return { ms: performance.now() - t0, bytes: blob.size };
}

/** Where the time of storing `n` points goes: reading times, building chunks, the writes. */
export async function benchTrackStages(n: number): Promise<Record<string, number>> {
  const rows = points('bench-stages', n);
  let t0 = performance.now();
  const timed = rows.map(toTimed);
  const read = performance.now() - t0;
  t0 = performance.now();
  const chunks = chunksOf(rows);
  const build = performance.now() - t0;
  const db = getDb();
  t0 = performance.now();
  await db.transaction('rw', db.trackChunks, () => db.trackChunks.bulkPut(chunks));
  const write = performance.now() - t0;
  await db.trackChunks.clear();
  t0 = performance.now();
  await addTrackPoints(rows);
  const whole = performance.now() - t0;
  await db.trackChunks.clear();
  return { read, build, write, whole, points: timed.length };
}

/** Where an import's apply spends its time: the observations' write and the track's, apart. */
export async function benchApplyParts(url: string): Promise<Record<string, number>> {
  const r = readLogText(await (await fetch(url)).text());
  if (!r.ok) throw new Error('rejected');
  const plan = planMerge(await loadMergeTarget(r.bundle.cruise.id), r.bundle);
  const db = getDb();
  let t0 = performance.now();
  await db.transaction('rw', db.observations, () => db.observations.bulkPut(plan.putCurrent));
  const observations = performance.now() - t0;
  t0 = performance.now();
  const timed = plan.addTrack.map(toTimed);
  const times = performance.now() - t0;
  t0 = performance.now();
  await db.transaction('rw', db.trackChunks, () => mergeTrackPointsInTransaction(db, timed));
  const track = performance.now() - t0;
  await db.observations.clear();
  await db.trackChunks.clear();
  t0 = performance.now();
  await applyMergePlan(plan, { source: 'bench.json' });
  const apply = performance.now() - t0;
  return { observations, times, track, apply };
}
