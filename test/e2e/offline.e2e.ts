// The app installs itself as a service worker on the first load and then starts with no network.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DIST_DIR, openApp, type AppSession } from './harness/browser';
import { builtAppFiles, precachedPaths, serviceWorkerState, waitForServiceWorkerControl } from './harness/pwa';

describe('offline: service worker and precache', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('controls the very first page (clientsClaim) once the worker is installed', async () => {
    const t0 = Date.now();
    await waitForServiceWorkerControl(app.page);
    const state = await serviceWorkerState(app.page);
    console.log(`offline: first page controlled after ${Date.now() - t0} ms`, state);
    expect(state).toEqual({ controlled: true, active: 'activated', waiting: null, installing: null });
  });

  it('precaches every file of the build (basemap data and map bundle included)', async () => {
    const expected = builtAppFiles(DIST_DIR);
    const cached = await precachedPaths(app.page);
    console.log(`offline: ${cached.length} precached entries for ${expected.length} built files`);
    expect(expected).toContain('index.html');
    expect(cached).toEqual(expected);
  });

  it('serves a web manifest with our icons', async () => {
    const manifest = await app.page.evaluate(async () => {
      const href = document.querySelector<HTMLLinkElement>('link[rel="manifest"]')?.href;
      if (!href) return null;
      return (await (await fetch(href)).json()) as { name: string; display: string; start_url: string; icons: Array<{ src: string; sizes: string; purpose?: string }> };
    });
    expect(manifest?.name).toBe('Floe Ledger');
    expect(manifest?.display).toBe('standalone');
    expect(manifest?.icons.map((i) => `${i.sizes} ${i.purpose ?? 'any'}`)).toEqual(expect.arrayContaining(['192x192 any', '512x512 any', '512x512 maskable']));
    for (const icon of manifest?.icons ?? []) {
      const status = await app.page.evaluate(async (src) => (await fetch(src)).status, icon.src);
      expect(status, icon.src).toBe(200);
    }
  });

  it('reloads with no network at all and the shell still starts', async () => {
    const { page, browser, server } = app;
    await browser.context.setOffline(true);
    const before = server.requestCount();
    await page.reload();
    await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    expect(await page.getByTestId('navigation-notice').innerText()).toContain('Not for navigation');
    // Nothing reached the server: everything came from the service worker's cache.
    expect(server.requestCount() - before).toBe(0);

    // Stop the server as well, so not even a request that slipped past the offline emulation
    // could be answered, and start the app again in a new tab.
    await server.close();
    const tab = await browser.context.newPage();
    const t0 = Date.now();
    await tab.goto(server.url);
    await tab.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name: 'Settings' }).click();
    await tab.getByRole('heading', { name: 'Settings' }).waitFor();
    console.log(`offline: new tab with server stopped, shell usable after ${Date.now() - t0} ms`);
    expect(await tab.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true);
    await tab.close();
  });

  it('writes no error to the console', () => {
    expect(app.consoleErrors).toEqual([]);
  });
});
