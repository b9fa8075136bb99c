// A full disk in real Chromium: the origin's quota is shrunk through the DevTools protocol
// (Storage.overrideQuotaForOrigin), then saves must fail with the typed error, write nothing
// partial and leave the old data as it was.
import type { CDPSession, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type Browser } from './harness/browser';
import { gotoDbPage, serveDbPage, type DbPageApi } from './harness/db-page';
import type { StaticServer } from './harness/server';

type W = Window & { floeDbPage: DbPageApi };

let server: StaticServer;
let browser: Browser;
let page: Page;
let cdp: CDPSession;
let origin: string;

beforeAll(async () => {
  server = await serveDbPage();
  origin = new URL(server.url).origin;
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await gotoDbPage(page, server.url);
  cdp = await browser.context.newCDPSession(page);
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** Everything stored, in a comparable form (photo bytes by size and type). */
function snapshot(p: Page) {
  return p.evaluate(async () => {
    const { db } = (window as unknown as W).floeDbPage;
    const d = db.getDb();
    return {
      cruises: await d.cruises.toArray(),
      observations: await d.observations.toArray(),
      revisions: await d.revisions.toArray(),
      trackPoints: (await d.trackChunks.toArray()).reduce((n, c) => n + c.count, 0),
      photos: (await d.photos.toArray()).map((ph) => ({ ...ph, blob: [ph.blob.size, ph.blob.type] })),
      drafts: await d.drafts.toArray(),
    };
  });
}

describe('storage full (quota shrunk by the DevTools protocol)', () => {
  it('refuses edits, new observations, photos and track batches with a clear error; nothing partial; old data intact', async () => {
    const ids = await page.evaluate(async () => {
      const { db, cruiseInput } = (window as unknown as W).floeDbPage;
      const c = await db.createCruise({ ...cruiseInput, name: 'Quota cruise' });
      const saved = [];
      for (let i = 0; i < 3; i++) {
        saved.push(
          (
            await db.saveObservation({
              id: crypto.randomUUID(),
              cruiseId: c.id,
              time: `2026-02-10T0${i}:00:00Z`,
              position: { lat: -70.5, lon: -12.3, source: 'gps-serial' },
              observerId: 'obs-ak',
              totalConcentration: 7,
              categories: [{ partialConcentration: 7, stage: 'grey', thicknessCm: 12 }],
              notes: `obs ${i}`,
              photoIds: [],
            })
          ).observation,
        );
      }
      await db.attachPhoto(
        { observationId: saved[0]!.id, cruiseId: c.id, blob: new Blob([new Uint8Array([1, 2, 3])], { type: 'image/jpeg' }), fileName: 'small.jpg' },
        { expectedRevision: 1, savedBy: 'obs-ak' },
      );
      const t0 = Date.UTC(2026, 1, 10);
      await db.addTrackPoints(
        Array.from({ length: 2_000 }, (_, i) => ({ cruiseId: c.id, time: new Date(t0 + i * 1000).toISOString(), lat: -70.5, lon: -12.3, source: 'gps-serial' as const })),
      );
      await db.saveDraft(c.id, 'observation', { notes: 'typed before the disk filled' });
      return { cruiseId: c.id, first: saved[0]!.id };
    });

    // Chromium checks the quota against room it set aside when the database was opened, so
    // the smaller quota must be in force before the store opens: relaunch, shrink, then open.
    await browser.close({ keepProfile: true });
    browser = await launchChromium({ userDataDir: browser.userDataDir });
    page = browser.context.pages()[0] ?? (await browser.context.newPage());
    await page.goto(`${server.url}blank.html`);
    cdp = await browser.context.newCDPSession(page);
    const { usage } = (await cdp.send('Storage.getUsageAndQuota', { origin })) as { usage: number };
    await cdp.send('Storage.overrideQuotaForOrigin', { origin, quotaSize: usage + 40_000 });
    await gotoDbPage(page, server.url);
    const before = await snapshot(page);

    const results = await page.evaluate(async ({ cruiseId, first }) => {
      const { db } = (window as unknown as W).floeDbPage;
      // Random text does not compress, so it really takes the room it claims.
      const random = (n: number) => {
        const b = new Uint8Array(n);
        for (let i = 0; i < n; i += 65_536) crypto.getRandomValues(b.subarray(i, Math.min(n, i + 65_536)));
        let s = '';
        for (const x of b) s += String.fromCharCode(65 + (x % 26));
        return s;
      };
      const outcome = async (f: () => Promise<unknown>) => {
        try {
          await f();
          return { ok: true };
        } catch (e) {
          const err = e as { name: string; kind?: string; message: string; committedRows?: number; reason?: { kind: string } };
          return { ok: false, name: err.name, kind: err.kind, message: err.message, committedRows: err.committedRows, reasonKind: err.reason?.kind };
        }
      };
      const current = (await db.getObservation(first))!;
      return {
        edit: await outcome(() => db.saveObservation({ ...current, notes: random(400_000) }, { expectedRevision: current.revision })),
        add: await outcome(() =>
          db.saveObservation({ ...current, id: crypto.randomUUID(), time: '2026-02-10T05:00:00Z', notes: random(400_000), photoIds: [] }),
        ),
        photo: await outcome(() =>
          db.attachPhoto(
            { observationId: first, cruiseId, blob: new Blob([crypto.getRandomValues(new Uint8Array(60_000)), crypto.getRandomValues(new Uint8Array(60_000)), crypto.getRandomValues(new Uint8Array(60_000))], { type: 'image/jpeg' }), fileName: 'big.jpg' },
            { expectedRevision: current.revision, savedBy: 'obs-ak' },
          ),
        ),
        track: await outcome(() =>
          db.addTrackPoints(
            Array.from({ length: 40_000 }, (_, i) => ({
              cruiseId,
              time: new Date(Date.UTC(2026, 1, 11) + i * 1000).toISOString(),
              lat: -70 + Math.random(),
              lon: -12 + Math.random(),
              source: 'gps-serial' as const,
              sogKn: Math.random() * 10,
            })),
            { chunkSize: 5_000 },
          ),
        ),
        draft: (await db.loadDraft<{ notes: string }>(cruiseId, 'observation'))?.data.notes,
      };
    }, ids);

    for (const key of ['edit', 'add', 'photo'] as const) {
      expect(results[key], key).toMatchObject({ ok: false, name: 'StorageFullError', kind: 'storage-full' });
      expect(results[key].message, key).toMatch(/^Storage is full: .* was not saved, and nothing of it was written/);
    }
    expect(results.track).toMatchObject({ ok: false, name: 'BulkWriteInterruptedError', reasonKind: 'storage-full' });
    expect((results.track.committedRows ?? -1) % 5_000).toBe(0);
    expect(results.draft).toBe('typed before the disk filled');

    const after = await snapshot(page);
    // Only whole track batches may have been added before the disk filled; all else unchanged.
    expect(after.trackPoints).toBe(before.trackPoints + (results.track.committedRows ?? 0));
    expect({ ...after, trackPoints: 0 }).toEqual({ ...before, trackPoints: 0 });

    // With room again, the same kind of save goes through.
    await cdp.send('Storage.overrideQuotaForOrigin', { origin });
    const ok = await page.evaluate(async (first) => {
      const { db } = (window as unknown as W).floeDbPage;
      const current = (await db.getObservation(first))!;
      return (await db.saveObservation({ ...current, notes: 'after freeing space' }, { expectedRevision: current.revision })).observation.revision;
    }, ids.first);
    expect(ok).toBe(3);
  });
});
