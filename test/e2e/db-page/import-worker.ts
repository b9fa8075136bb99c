// A worker of the db test page that imports a log the way the Exchange screen's import worker
// does (src/features/exchange/importSession.ts: preview in pieces, then the apply in one
// transaction), timing each pass. Built beside the page (test/e2e/harness/db-page.ts).
import { countTrackPoints } from '../../../src/db';
import { ImportSession } from '../../../src/features/exchange/importSession';

export interface ImportWorkerResult {
  ms: number;
  stages: Record<string, number>;
  points: number;
  cruiseId: string;
  route: string;
  bytes: number;
}

self.onmessage = async (ev: MessageEvent<{ url: string; readTwice?: boolean }>) => {
  try {
    let t0 = performance.now();
    // A Blob: Chromium keeps a large one out of the page's memory, as it does a picked file.
    const blob = await (await fetch(ev.data.url)).blob();
    const fetched = performance.now() - t0;
    t0 = performance.now();
    const session = new ImportSession(blob, 'bench.json');
    // As a file over the size whose pieces are kept: read for the preview and again for the apply.
    if (ev.data.readTwice === true) session.keepPiecesUpTo = 0;
    const zero = () => ({ read: 0, plan: 0, planTrack: 0, write: 0 });
    session.timing = { preview: zero(), apply: zero() };
    const preview = await session.start(() => {});
    if (!preview.ok) throw new Error(`the benchmark log was rejected: ${preview.problems.listed[0]?.message}`);
    const previewMs = performance.now() - t0;
    const t1 = performance.now();
    await session.apply(() => {});
    const apply = performance.now() - t1;
    const ms = performance.now() - t0;
    const cruiseId = preview.summary.cruise.value.id;
    const result: ImportWorkerResult = { ms, stages: { fetched, preview: previewMs, apply, ...Object.fromEntries(Object.entries(session.timing.preview).map(([k, v]) => [`preview.${k}`, v])), ...Object.fromEntries(Object.entries(session.timing.apply).map(([k, v]) => [`apply.${k}`, v])) }, points: await countTrackPoints(cruiseId), cruiseId, route: preview.summary.route, bytes: blob.size };
    self.postMessage({ ok: true, result });
  } catch (err) {
    self.postMessage({ ok: false, message: err instanceof Error ? `${err.name}: ${err.message}` : String(err) });
  }
};
