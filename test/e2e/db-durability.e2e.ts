// The store in real Chromium with a persistent profile: what was reported saved survives a
// browser crash; a bulk write is found batch by batch, all or nothing; a full disk is refused
// cleanly. The page runs the real src/db module (see test/e2e/harness/db-page.ts for why).
// The kills are SIGKILLs of the browser: they prove commits are atomic and complete across a
// process crash, not across a power cut (the OS page cache survives; see
// reliability-durability.e2e.ts for the durability the app asks for).
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type Browser } from './harness/browser';
import { browserPids, killBrowser } from './harness/crash';
import { gotoDbPage, serveDbPage, type DbPageApi } from './harness/db-page';
import type { StaticServer } from './harness/server';

type W = Window & { floeDbPage: DbPageApi };

let server: StaticServer;
let profile: string;

beforeAll(async () => {
  server = await serveDbPage();
  profile = await mkdtemp(join(tmpdir(), 'floe-db-e2e-'));
});
afterAll(async () => {
  await server?.close();
  if (profile) await rm(profile, { recursive: true, force: true });
});

interface Session {
  browser: Browser;
  page: Page;
  pids: number[];
}

async function launch(): Promise<Session> {
  const browser = await launchChromium({ userDataDir: profile });
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await gotoDbPage(page, server.url);
  return { browser, page, pids: await browserPids(browser) };
}

async function newCruise(page: Page, name: string): Promise<string> {
  return page.evaluate(async (name) => {
    const { db, cruiseInput } = (window as unknown as W).floeDbPage;
    const c = await db.createCruise({ ...cruiseInput, name });
    return c.id;
  }, name);
}

/** Resolves with the console message that matched, e.g. the n-th "saved:" line. */
function waitForConsole(page: Page, test: (text: string) => boolean): Promise<string> {
  return new Promise((ok) => {
    const on = (msg: { text: () => string }) => {
      if (test(msg.text())) {
        page.off('console', on);
        ok(msg.text());
      }
    };
    page.on('console', on);
  });
}

describe('saved observations survive a browser crash', () => {
  // Each round saves in the page; the moment the page reports the k-th save as done, the test
  // SIGKILLs the browser. k varies so the kill lands at different points of the sequence.
  for (const k of [1, 4, 9]) {
    it(`all ${k} observations reported saved are there after SIGKILL and relaunch`, async () => {
      let s = await launch();
      const cruiseId = await newCruise(s.page, `crash after ${k}`);
      const saved: string[] = [];
      s.page.on('console', (m) => {
        const t = m.text();
        if (t.startsWith('saved:')) saved.push(t.slice(6));
      });
      const kth = waitForConsole(s.page, () => saved.length >= k);
      void s.page
        .evaluate(async (cruiseId) => {
          const { db } = (window as unknown as W).floeDbPage;
          for (let i = 0; i < 50; i++) {
            const id = crypto.randomUUID();
            await db.saveObservation({
              id,
              cruiseId,
              time: new Date(Date.UTC(2026, 1, 10, i)).toISOString().replace('.000Z', 'Z'),
              position: { lat: -70.5, lon: -12.3, source: 'gps-serial' },
              observerId: 'obs-ak',
              totalConcentration: i % 11,
              categories: [],
              notes: `hour ${i}`,
              photoIds: [],
            });
            // What the app shows as "saved" happens exactly here: after the commit resolved.
            console.log(`saved:${id}`);
          }
        }, cruiseId)
        .catch(() => undefined); // the page dies mid-loop
      await kth;
      const reported = [...saved];
      await killBrowser(s);

      s = await launch();
      const found = await s.page.evaluate(async (cruiseId) => {
        const { db } = (window as unknown as W).floeDbPage;
        return (await db.listObservations(cruiseId)).map((o) => ({ id: o.id, revision: o.revision, notes: o.notes }));
      }, cruiseId);
      await s.browser.close({ keepProfile: true });
      const ids = new Set(found.map((o) => o.id));
      for (const id of reported) expect(ids.has(id), `saved ${id}`).toBe(true);
      // Nothing half-written: every row found is a complete first revision, in save order.
      expect(found.every((o, i) => o.revision === 1 && o.notes === `hour ${i}`)).toBe(true);
      expect(found.length).toBeGreaterThanOrEqual(reported.length);
    });
  }

  it('an edit, a delete and a draft saved just before the crash are there, with the history', async () => {
    let s = await launch();
    const cruiseId = await newCruise(s.page, 'edit then crash');
    const id = await s.page.evaluate(async (cruiseId) => {
      const { db } = (window as unknown as W).floeDbPage;
      const base = {
        id: crypto.randomUUID(),
        cruiseId,
        time: '2026-02-10T06:00:00Z',
        position: null,
        observerId: 'obs-ak',
        totalConcentration: 6,
        categories: [],
        notes: 'first',
        photoIds: [],
      };
      const other = { ...base, id: crypto.randomUUID(), time: '2026-02-10T07:00:00Z' };
      const one = (await db.saveObservation(base)).observation;
      await db.saveObservation({ ...one, notes: 'second' }, { expectedRevision: 1 });
      await db.saveObservation(other);
      await db.softDeleteObservation(other.id, { savedBy: 'obs-ak' });
      await db.saveDraft(cruiseId, 'observation', { notes: 'typed, not saved' });
      return base.id;
    }, cruiseId);
    await killBrowser(s);

    s = await launch();
    const after = await s.page.evaluate(
      async ({ cruiseId, id }) => {
        const { db } = (window as unknown as W).floeDbPage;
        return {
          history: (await db.observationHistory(id)).map((o) => o.notes),
          all: (await db.listObservations(cruiseId, { includeDeleted: true })).map((o) => [o.revision, o.deleted]),
          draft: (await db.loadDraft<{ notes: string }>(cruiseId, 'observation'))?.data.notes,
        };
      },
      { cruiseId, id },
    );
    await s.browser.close({ keepProfile: true });
    expect(after).toEqual({ history: ['first', 'second'], all: [[2, false], [2, true]], draft: 'typed, not saved' });
  });
});

describe('a bulk write killed at many moments: each batch all or none', () => {
  const CHUNK = 10_000;
  const TOTAL = 100_000;
  const found: number[] = [];
  // Kill after the n-th reported batch plus a delay, so the kill lands between commits and
  // inside running transactions; -1 means right after the write started.
  const moments: [number, number][] = [
    [-1, 0],
    [-1, 150],
    [1, 0],
    [2, 23],
    [4, 61],
    [6, 5],
  ];
  for (const [afterBatch, delayMs] of moments) {
    it(`killed ${afterBatch < 0 ? 'at the start' : `after batch ${afterBatch}`} + ${delayMs} ms`, async () => {
      let s = await launch();
      const cruiseId = `bulk-${afterBatch}-${delayMs}`;
      let reported = 0;
      s.page.on('console', (m) => {
        const t = m.text();
        if (t.startsWith('batch:')) reported = Math.max(reported, Number(t.slice(6)));
      });
      const started = waitForConsole(s.page, (t) => t === 'started');
      const moment = afterBatch < 0 ? started : waitForConsole(s.page, (t) => t === `batch:${afterBatch * CHUNK}`);
      void s.page
        .evaluate(
          async ({ cruiseId, CHUNK, TOTAL }) => {
            const { db } = (window as unknown as W).floeDbPage;
            const t0 = Date.UTC(2026, 1, 1);
            const pts = Array.from({ length: TOTAL }, (_, i) => ({
              cruiseId,
              time: new Date(t0 + i * 1000).toISOString().replace('.000Z', 'Z'),
              lat: -70 + i * 1e-6,
              lon: -12,
              source: 'gps-serial' as const,
            }));
            console.log('started');
            await db.addTrackPoints(pts, { chunkSize: CHUNK, onProgress: (n) => console.log(`batch:${n}`) });
          },
          { cruiseId, CHUNK, TOTAL },
        )
        .catch(() => undefined);
      await moment;
      if (delayMs) await new Promise((r) => setTimeout(r, delayMs));
      const reportedAtKill = reported;
      await killBrowser(s);

      s = await launch();
      const got = await s.page.evaluate(async (cruiseId) => {
        const { db } = (window as unknown as W).floeDbPage;
        const pts = await db.listTrackPoints(cruiseId);
        return { count: pts.length, first: pts[0]?.time, last: pts[pts.length - 1]?.time, contiguous: pts.every((p, i) => p.time === new Date(Date.UTC(2026, 1, 1) + i * 1000).toISOString().replace('.000Z', 'Z')) };
      }, cruiseId);
      await s.browser.close({ keepProfile: true });
      found.push(got.count);
      expect(got.count % CHUNK, `${got.count} rows found`).toBe(0);
      expect(got.count).toBeGreaterThanOrEqual(reportedAtKill);
      expect(got.contiguous).toBe(true);
    });
  }

  it('the kills did land part way through the write (not all before or after it)', () => {
    // Otherwise the rounds above would prove nothing about batches.
    expect(found.filter((n) => n > 0 && n < TOTAL).length, `rows found per round: ${found.join(', ')}`).toBeGreaterThanOrEqual(3);
  });
});
