// The local store against bare Dexie calls, timed inside Debian's Chromium on its real
// IndexedDB (fake-indexeddb in Node would measure the fake). Both sides use the same database
// with strict durability, so the ratio is the cost of what the store adds.
//   save: saveObservation against a bare Dexie transaction doing the same read and two writes
//         (target 1.2x); a single bare put of the record is kept as context.
//   track: 1,000,000 points through addTrackPoints (target under 10 s) against one bare bulkPut
//          of the same hour chunks; a live fix appended to a full hour against a bare put of
//          the chunk it writes (context).
import { launchChromium } from '../../e2e/harness/browser';
import { gotoDbPage, serveDbPage, type DbPageApi } from '../../e2e/harness/db-page';
import { absoluteRow, ratioRow, type BenchSuite } from '../bench-kit';

type W = Window & { floeDbPage: DbPageApi };

export const suite: BenchSuite = {
  name: 'local store (Chromium IndexedDB)',
  async run() {
    const server = await serveDbPage();
    const browser = await launchChromium();
    try {
      const page = browser.context.pages()[0] ?? (await browser.context.newPage());
      await gotoDbPage(page, server.url);
      const save = await page.evaluate((n) => (window as unknown as W).floeDbPage.bench.benchSave(n), 40);
      const live = await page.evaluate((n) => (window as unknown as W).floeDbPage.bench.benchLiveFix(n), 40);
      const track = await page.evaluate(([n, rounds]) => (window as unknown as W).floeDbPage.bench.benchTrackVsBulkPut(n, rounds), [1_000_000, 3] as const);
      return [
        ratioRow('save one observation vs bare Dexie transaction, same read + 2 writes (Chromium, median of 40)', save.subject, save.baseline, 'ms', 1.2),
        ratioRow('context: save one observation vs a single bare put', save.subject, save.put, 'ms', 1.5),
        absoluteRow('1,000,000 track points stored through addTrackPoints (Chromium, median of 3)', track.subject, 'ms', 10_000),
        ratioRow('1,000,000 track points vs one bare bulkPut of the same hour chunks', track.subject, track.baseline, 'ms', 1.3),
        ratioRow('context: one live fix into a full hour vs bare put of that chunk (median of 40)', live.subject, live.baseline, 'ms', 2),
      ];
    } finally {
      await browser.close();
      await server.close();
    }
  },
};
