// Reliability 7, offline end to end: load once with a network, lose it (and the server), reload,
// set up a cruise, log an observation, find it on the map, export the log. Figures are printed.
import { readFileSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readLogText } from '../../src/format/read';
import { openApp, type AppSession } from './harness/browser';
import { createCruise, detailsOnMap, logObservation } from './harness/logFlow';
import { waitForServiceWorkerControl } from './harness/pwa';
import { showScreen } from './harness/screens';

const NOTES = 'Offline journey: grey-white pancakes between old floes, logged with no network.';

describe('offline end to end', () => {
  let app: AppSession;
  let dir: string;
  const figures: Record<string, number> = {};
  const t = async <T>(name: string, f: () => Promise<T>): Promise<T> => {
    const t0 = Date.now();
    const r = await f();
    figures[name] = Date.now() - t0;
    return r;
  };

  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'floe-journey-'));
    app = await openApp({ path: '?map-debug' });
    await waitForServiceWorkerControl(app.page);
  });
  afterAll(async () => {
    console.log(`offline journey, ms: ${JSON.stringify(figures)}`);
    await app?.close();
    await rm(dir, { recursive: true, force: true });
  });

  it('with no network and no server, the app reloads, logs, maps and exports an observation', async () => {
    const { page, browser, server } = app;
    await browser.context.setOffline(true);
    await server.close();
    const requestsBefore = server.requestCount();

    await t('reload offline', async () => {
      await page.reload();
      await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    });
    expect(await page.evaluate(() => navigator.onLine)).toBe(false);

    await t('create cruise', () =>
      createCruise(page, { name: 'Offline trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] }),
    );
    const status = await t('log observation', () => logObservation(page, { position: '78 30.0 N 015 00.0 E', total: '7', notes: NOTES }));
    expect(status).toMatch(/^Saved: the \d\d:\d\d UTC observation, revision 1\./);

    const details = await t('find it on the map', () => detailsOnMap(page, 15, 78.5));
    expect(details?.notes).toBe(NOTES);
    expect(details?.all).toContain('7/10');

    await showScreen(page, 'Exchange');
    const [dl] = await t('export', () => Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Full log (JSON)' }).click()]));
    const path = join(dir, dl.suggestedFilename());
    await dl.saveAs(path);
    const read = readLogText(readFileSync(path, 'utf8'));
    expect(read.ok).toBe(true);
    if (read.ok) {
      expect(read.bundle.cruise.name).toBe('Offline trial');
      expect(read.bundle.observations).toHaveLength(1);
      expect(read.bundle.observations[0]).toMatchObject({ notes: NOTES, totalConcentration: 7 });
      expect(read.bundle.observations[0]?.position?.lat).toBeCloseTo(78.5, 6);
      expect(read.bundle.observations[0]?.position?.lon).toBeCloseTo(15, 6);
    }
    // Not one request reached the (stopped) server.
    expect(server.requestCount()).toBe(requestsBefore);
  });

  it('the observation is still there after another offline reload', async () => {
    const { page } = app;
    await page.reload();
    const details = await detailsOnMap(page, 15, 78.5);
    expect(details?.notes).toBe(NOTES);
  });
});
