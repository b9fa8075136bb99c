// The built app's own storage screens in Chromium: the settings panel reports what the browser
// says about persistence and room; another tab upgrading the database makes the app ask for a
// reload; data from a newer version makes it refuse to write and say why.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { openAtVersion } from './harness/idbCounts';
import { LATEST_SCHEMA_VERSION } from '../../src/db/schema';

describe('storage in the built app', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('settings show persistence, usage and quota as the browser reports them', async () => {
    const { page } = app;
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name: 'Settings' }).click();
    const panel = page.getByTestId('storage-panel');
    await panel.getByTestId('storage-persisted').waitFor();
    const truth = await page.evaluate(async () => ({ persisted: await navigator.storage.persisted(), estimate: await navigator.storage.estimate() }));
    expect(await panel.getByTestId('storage-persisted').innerText()).toBe(truth.persisted ? 'granted' : 'not granted');
    expect(await panel.getByTestId('storage-warning').count()).toBe(truth.persisted ? 0 : 1);
    if (!truth.persisted) expect(await panel.getByTestId('storage-warning').innerText()).toContain('Export the cruise regularly');
    const quotaGb = (truth.estimate.quota ?? 0) / 1024 ** 3;
    expect(await panel.getByTestId('storage-quota').innerText()).toContain(quotaGb >= 100 ? quotaGb.toFixed(0) : quotaGb.toFixed(1));
    // The app asked once at first use and keeps the answer in its database.
    const asked = await page.evaluate(
      () =>
        new Promise<unknown>((ok, fail) => {
          const req = indexedDB.open('floe-ledger');
          req.onerror = () => fail(req.error);
          req.onsuccess = () => {
            const get = req.result.transaction('meta').objectStore('meta').get('persistenceRequest');
            get.onsuccess = () => {
              req.result.close();
              ok(get.result);
            };
          };
        }),
    );
    expect(asked).toMatchObject({ key: 'persistenceRequest', value: { granted: truth.persisted } });
    expect(await page.getByTestId('database-alert').count()).toBe(0);
  });

  it('asks for a reload when another tab upgrades the database, and refuses writes from older code', async () => {
    const { page } = app;
    const other = await page.context().newPage();
    // A second tab of the app; from it, a newer release is played by opening the database at a
    // higher version (its own app connection closes itself on the versionchange, as this one must).
    await other.goto(app.server.url);
    const newVersion = await openAtVersion(other, 990);
    expect(newVersion).toBe(990);
    const alert = page.getByTestId('database-alert');
    await alert.waitFor();
    expect(await alert.innerText()).toMatch(/updated in another tab\. Reload this page to continue; your draft is kept/);
    // After the reload this (older) code finds version 99 and says it will not write.
    await other.close();
    await page.reload();
    await page.getByTestId('database-alert').waitFor();
    expect(await page.getByTestId('database-alert').innerText()).toContain(`saved by a newer version of Floe Ledger (database version 99; this page knows up to version ${LATEST_SCHEMA_VERSION})`);
  });
});
