// The full-size log (50,000 observations, 1,000,000 track points; the invented demo cruise
// repeated) in Chromium on its real IndexedDB:
//   import: in pieces in the page's import worker, as the Exchange screen does it (preview,
//           then the apply in one transaction, writing the pieces the preview kept), against
//           the whole-file import of before (the text read whole, merge plan, apply) on an
//           empty store of its own; beside it, the same import of a file too large to keep its
//           pieces (read a second time for the apply)                           target < 20 s
//   export: the full log streamed out of the store into a Blob, against the same export read
//           whole (one bundle) as before                                           target 1.5x
//   peak memory: the renderer's peak resident size (VmHWM), each operation in a freshly
//           started browser on the same profile, so one operation's peak is not another's
//                                                                                   target < 1 GB
// FLOE_BENCH_SCALE (e.g. 0.1) shrinks the data for a quick try.
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { exportLogJson } from '../../../src/format/encode';
import { launchChromium, type Browser } from '../../e2e/harness/browser';
import { DB_PAGE_DIR, gotoDbPage, serveDbPage, type DbPageApi } from '../../e2e/harness/db-page';
import { bigCruise } from '../bigCruise';
import { absoluteRow, contextRow, ratioRow, type BenchRow, type BenchSuite } from '../bench-kit';

type W = Window & { floeDbPage: DbPageApi };

const SCALE = Number(process.env.FLOE_BENCH_SCALE ?? '1');
const OBSERVATIONS = Math.round(50_000 * SCALE);
const TRACK_POINTS = Math.round(1_000_000 * SCALE);

/** Peak resident memory (MB) of the browser's renderer processes so far. */
async function rendererPeakMb(b: Browser): Promise<number> {
  const br = b.context.browser();
  if (!br) return NaN;
  const cdp = await br.newBrowserCDPSession();
  const { processInfo } = (await cdp.send('SystemInfo.getProcessInfo')) as { processInfo: { type: string; id: number }[] };
  await cdp.detach();
  let peak = 0;
  for (const p of processInfo.filter((x) => x.type === 'renderer')) {
    const status = await readFile(`/proc/${p.id}/status`, 'utf8').catch(() => '');
    const kb = Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? 0);
    peak = Math.max(peak, kb / 1024);
  }
  return peak;
}

export const suite: BenchSuite = {
  name: `exchange in Chromium (${OBSERVATIONS} observations, ${TRACK_POINTS} track points)`,
  async run() {
    const server = await serveDbPage();
    const profile = await mkdtemp(join(tmpdir(), 'floe-bench-'));
    const rows: BenchRow[] = [];
    // The file comes from Node, so the page's memory holds only what the import itself needs.
    const logFile = 'bench-log.json';
    await writeFile(join(DB_PAGE_DIR, logFile), exportLogJson(bigCruise(OBSERVATIONS, TRACK_POINTS)).join(''));
    const url = `${server.url.replace(/\/?$/, '/')}${logFile}`;
    const baseProfile = await mkdtemp(join(tmpdir(), 'floe-bench-base-'));
    const session = async <T>(fn: (page: Page) => Promise<T>, userDataDir = profile): Promise<{ value: T; peakMb: number }> => {
      const browser = await launchChromium({ userDataDir });
      try {
        const page = browser.context.pages()[0] ?? (await browser.context.newPage());
        await gotoDbPage(page, server.url);
        const value = await fn(page);
        return { value, peakMb: await rendererPeakMb(browser) };
      } finally {
        await browser.close({ keepProfile: true });
      }
    };
    try {
      // The import in pieces (the Exchange screen's way now) and the whole-file import (before),
      // each into an empty store: the baseline on a profile of its own, deleted afterwards.
      const imp = await session((page) => page.evaluate((u) => (window as unknown as W).floeDbPage.bench.benchImportInPieces(u), url));
      if (imp.value.points !== TRACK_POINTS) throw new Error(`the import stored ${imp.value.points} of ${TRACK_POINTS} track points`);
      if (imp.value.route !== 'pieces') throw new Error(`the benchmark log was read ${imp.value.route}, not in pieces`);
      console.log(`db-exchange bench: import in pieces, stages (ms) ${JSON.stringify(imp.value.stages)}, ${(imp.value.bytes / 1e6).toFixed(0)} MB`);
      const twiceProfile = await mkdtemp(join(tmpdir(), 'floe-bench-twice-'));
      const twice = await session((page) => page.evaluate((u) => (window as unknown as W).floeDbPage.bench.benchImportInPieces(u, true), url), twiceProfile).finally(() =>
        rm(twiceProfile, { recursive: true, force: true }),
      );
      if (twice.value.points !== TRACK_POINTS) throw new Error(`the import read twice stored ${twice.value.points} of ${TRACK_POINTS} track points`);
      console.log(`db-exchange bench: import read twice, stages (ms) ${JSON.stringify(twice.value.stages)}`);
      const old = await session((page) => page.evaluate((u) => (window as unknown as W).floeDbPage.bench.benchImport(u), url), baseProfile);
      if (old.value.points !== TRACK_POINTS) throw new Error(`the whole-file import stored ${old.value.points} of ${TRACK_POINTS} track points`);
      console.log(`db-exchange bench: whole-file import, stages (ms) ${JSON.stringify(old.value.stages)}`);
      const parse = await session((page) => page.evaluate((u) => (window as unknown as W).floeDbPage.bench.benchParseOnly(u), url), baseProfile);
      const floorProfile = await mkdtemp(join(tmpdir(), 'floe-bench-floor-'));
      const floor = await session((page) => page.evaluate((u) => (window as unknown as W).floeDbPage.bench.benchBareObservationPut(u), url), floorProfile).finally(() =>
        rm(floorProfile, { recursive: true, force: true }),
      );
      const rawProfile = await mkdtemp(join(tmpdir(), 'floe-bench-raw-'));
      const raw = await session((page) => page.evaluate((u) => (window as unknown as W).floeDbPage.bench.benchRawObservationPut(u), url), rawProfile).finally(() =>
        rm(rawProfile, { recursive: true, force: true }),
      );
      const cruiseId = imp.value.cruiseId;
      const streamed = await session((page) => page.evaluate((id) => (window as unknown as W).floeDbPage.bench.benchStreamExport(id), cruiseId));
      const whole = await session((page) => page.evaluate((id) => (window as unknown as W).floeDbPage.bench.benchWholeExport(id), cruiseId));
      if (streamed.value.bytes !== whole.value.bytes) throw new Error(`streamed export ${streamed.value.bytes} bytes, whole export ${whole.value.bytes}`);
      rows.push(absoluteRow('import of the full-size log in pieces (Chromium, import worker: preview + one-transaction apply)', imp.value.ms, 'ms', 20_000));
      rows.push(ratioRow('same vs the whole-file import (before: read whole, plan, apply)', imp.value.ms, old.value.subject, 'ms', 1));
      rows.push(contextRow('context: the import of a file over the size whose pieces are kept (read again for the apply)', twice.value.ms, imp.value.ms, 'ms'));
      rows.push(ratioRow('context: the import in pieces vs JSON.parse of the same text', imp.value.ms, parse.value, 'ms', 20));
      rows.push(ratioRow('context: the import in pieces vs the floor, one bare bulkPut of its observations into an empty store', imp.value.ms, floor.value, 'ms', 2));
      rows.push(contextRow('context: the floor itself vs raw IndexedDB puts of the same observations (no Dexie, primary key only)', floor.value, raw.value, 'ms'));
      rows.push(absoluteRow('peak renderer memory, import in pieces', imp.peakMb, 'MB', 1024));
      rows.push(absoluteRow('context: peak renderer memory, the import read twice', twice.peakMb, 'MB', 1024));
      rows.push(contextRow('context: peak renderer memory, whole-file import (before)', old.peakMb, NaN, 'MB'));
      rows.push(ratioRow('export of the full log streamed from the store vs read whole', streamed.value.ms, whole.value.ms, 'ms', 1.5));
      rows.push(absoluteRow('peak renderer memory, streamed export', streamed.peakMb, 'MB', 1024));
      rows.push(contextRow('context: peak renderer memory, export read whole (before)', whole.peakMb, NaN, 'MB'));
      return rows;
    } finally {
      await rm(join(DB_PAGE_DIR, logFile), { force: true });
      await rm(profile, { recursive: true, force: true });
      await rm(baseProfile, { recursive: true, force: true });
      await server.close();
    }
  },
};
