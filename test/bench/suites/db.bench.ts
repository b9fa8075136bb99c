// The local store against bare Dexie calls, timed inside Debian's Chromium on its real
// IndexedDB (fake-indexeddb in Node would measure the fake). Both sides use the same database
// with strict durability, so the ratio is the cost of what the store adds: checks, the
// conflict test and the revision row for a save; the checks and batching for a track import.
import { launchChromium } from '../../e2e/harness/browser';
import { gotoDbPage, serveDbPage, type DbPageApi } from '../../e2e/harness/db-page';
import { ratioRow, type BenchSuite } from '../bench-kit';

type W = Window & { floeDbPage: DbPageApi };

export const suite: BenchSuite = {
  name: 'local store (Chromium IndexedDB)',
  async run() {
    const server = await serveDbPage();
    const browser = await launchChromium();
    try {
      const page = browser.context.pages()[0] ?? (await browser.context.newPage());
      await gotoDbPage(page, server.url);
      const save = await page.evaluate((n) => (window as unknown as W).floeDbPage.bench.benchSaveVsPut(n), 40);
      const track = await page.evaluate(([n, rounds]) => (window as unknown as W).floeDbPage.bench.benchTrackVsBulkPut(n, rounds), [1_000_000, 1] as const);
      return [
        ratioRow('save one observation + revision vs bare put (Chromium, median of 40)', save.subject, save.baseline, 'ms', 1.5),
        ratioRow('1,000,000 track points in batches vs one bulkPut (Chromium, one run each)', track.subject, track.baseline, 'ms', 1.3),
      ];
    } finally {
      await browser.close();
      await server.close();
    }
  },
};
