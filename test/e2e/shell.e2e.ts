import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';

describe('app shell in Chromium', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('renders the shell with the standing navigation caution and no console errors', async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    expect(await page.getByTestId('navigation-notice').innerText()).toContain('Not for navigation');
    for (const name of ['Watch log', 'Ice map', 'Review', 'Exchange', 'Settings']) {
      expect(await page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name }).count()).toBe(1);
    }
    expect(app.consoleErrors).toEqual([]);
  });

  it('switches between day, night and red display', async () => {
    const { page } = app;
    const select = page.getByLabel('Display theme');
    await select.selectOption('red');
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('red');
    const bg = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
    expect(bg).toBe('rgb(0, 0, 0)');
    await select.selectOption('day');
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('day');
  });
});
