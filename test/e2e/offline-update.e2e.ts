// A new version is announced, waits, and is applied only when the observer agrees.
// Two real builds: the one under test (dist/) and a second one from the same source with another
// build marker, which the server switches to as a deployment would.
import { execFileSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { serviceWorkerState, waitForServiceWorkerControl } from './harness/pwa';
import { createCruise } from './harness/logFlow';

const ROOT = resolve(import.meta.dirname, '../..');
const NEXT_DIR = resolve(ROOT, 'dist-update-test');
const NEXT_BUILD = `update-test-${Date.now()}`;
const DRAFT_NOTES = 'Half-typed when the update came: nilas in the leads, not yet saved.';

const buildOf = (page: Page) => page.evaluate(() => document.documentElement.dataset.build);
const bannerPhase = (page: Page) => page.getByTestId('update-banner').getAttribute('data-phase');

async function waitForPhase(page: Page, phase: string): Promise<void> {
  await page.locator(`[data-testid="update-banner"][data-phase="${phase}"]`).waitFor({ timeout: 30_000 });
}

describe('offline: app update only with the observer’s agreement', () => {
  let app: AppSession;
  let firstBuild: string | undefined;

  beforeAll(async () => {
    const t0 = Date.now();
    execFileSync('npx', ['vite', 'build', '--outDir', NEXT_DIR, '--emptyOutDir', '--logLevel', 'warn'], {
      cwd: ROOT,
      env: { ...process.env, FLOE_BUILD_ID: NEXT_BUILD },
      stdio: 'inherit',
    });
    console.log(`update: second build (${NEXT_BUILD}) in ${Date.now() - t0} ms`);
    app = await openApp();
    await waitForServiceWorkerControl(app.page);
    firstBuild = await buildOf(app.page);
  });
  afterAll(async () => {
    await app?.close();
    rmSync(NEXT_DIR, { recursive: true, force: true });
  });

  it('announces the first install as ready for offline use', async () => {
    await waitForPhase(app.page, 'offline-ready');
    await app.page.getByTestId('update-banner').getByRole('button', { name: 'OK' }).click();
    expect(await app.page.getByTestId('update-banner').count()).toBe(0);
  });

  it('an observation is half typed (the draft, never saved)', async () => {
    const { page } = app;
    await createCruise(page, { name: 'Update trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] });
    await page.locator('#f-total').fill('6');
    await page.locator('#f-notes').fill(DRAFT_NOTES);
    // Give the autosave its moment, as an observer would have between keystrokes.
    await page.waitForTimeout(1000);
  });

  it('announces a new version, says the draft is kept, and does not apply it by itself', async () => {
    const { page, server } = app;
    expect(firstBuild).toBeTruthy();
    expect(firstBuild).not.toBe(NEXT_BUILD);
    await server.setRoot(NEXT_DIR);
    await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.update());
    await waitForPhase(page, 'waiting');
    const text = await page.getByTestId('update-banner').innerText();
    expect(text).toContain('A new version of Floe Ledger is ready');
    expect(text).toContain('draft');
    expect((await serviceWorkerState(page)).waiting).toBe('installed');
    expect(await buildOf(page)).toBe(firstBuild);
  });

  it('"Later" keeps the old version running, across a reload too', async () => {
    const { page } = app;
    await page.getByRole('button', { name: 'Later' }).click();
    expect(await bannerPhase(page)).toBe('postponed');
    await page.waitForTimeout(1000);
    expect(await buildOf(page)).toBe(firstBuild);
    await page.reload();
    await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    expect(await buildOf(page)).toBe(firstBuild);
    // The waiting version is announced again after the reload.
    await waitForPhase(page, 'waiting');
    expect((await serviceWorkerState(page)).waiting).toBe('installed');
  });

  it('"Update now" applies it; another open window is told, not reloaded under the observer', async () => {
    const { page, browser, server } = app;
    const other = await browser.context.newPage();
    await other.goto(server.url);
    await other.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    expect(await buildOf(other)).toBe(firstBuild);

    // The app falls back to the banner with a reason when the new worker does not take over;
    // wait for either outcome so that a failure says which it was instead of a bare timeout.
    const loaded = page.waitForEvent('load', { timeout: 60_000 }).then(() => 'loaded');
    const refused = page
      .locator('[data-testid="update-banner"][data-phase="waiting"] .update-banner-error')
      .waitFor({ timeout: 60_000 })
      .then(async () => `refused: ${await page.getByTestId('update-banner').innerText()}`);
    await page.getByRole('button', { name: 'Update now' }).click();
    expect(await Promise.race([loaded, refused.catch(() => new Promise<string>(() => undefined))])).toBe('loaded');
    await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    expect(await buildOf(page)).toBe(NEXT_BUILD);
    await waitForPhase(page, 'updated');
    expect(await page.getByTestId('update-banner').innerText()).toContain(NEXT_BUILD);
    expect(await serviceWorkerState(page)).toEqual({ controlled: true, active: 'activated', waiting: null, installing: null });
    // The draft came through the update.
    await page.locator('#f-notes').waitFor();
    expect(await page.locator('#f-notes').inputValue()).toBe(DRAFT_NOTES);
    expect(await page.locator('#f-total').inputValue()).toBe('6');

    await waitForPhase(other, 'updated-elsewhere');
    expect(await buildOf(other)).toBe(firstBuild);
    await Promise.all([other.waitForEvent('load'), other.getByRole('button', { name: 'Reload now' }).click()]);
    await other.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    expect(await buildOf(other)).toBe(NEXT_BUILD);
    await other.close();
  });

  it('the new version starts offline', async () => {
    const { page, browser } = app;
    await browser.context.setOffline(true);
    await page.reload();
    await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    expect(await buildOf(page)).toBe(NEXT_BUILD);
    await browser.context.setOffline(false);
  });

  it('writes no error to the console', () => {
    expect(app.consoleErrors).toEqual([]);
  });
});
