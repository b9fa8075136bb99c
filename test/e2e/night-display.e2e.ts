// The night displays in Chromium, pixel by pixel, on every screen: in the red display no pixel
// carries green or blue beyond a small share of its red, and none is brighter than the red
// limit; in the night display none is brighter than the night limit (test/e2e/night/nightPixels.ts
// holds the limits and why). A white box put on the page must fail the same check (positive
// control). Screenshots land in test-results/night-*.png.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { setTheme, showScreen } from './harness/screens';
import { openMapScreen, pagePoint, screenPoint, waitForIdle } from './map/mapPage';
import { checkNightPixels, describeVerdict } from './night/nightPixels';
import { makeDemoCruise } from '../../src/domain/demo';

const DISPLAYS = ['red', 'night'] as const;

describe('night displays on every screen', () => {
  let app: AppSession;
  const demo = makeDemoCruise();
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
  }, 120_000);
  afterAll(async () => {
    await app?.close();
  });

  /** Checks the page in both night displays; `settle` waits for what redraws on a change (the map). */
  async function sweep(label: string, settle: () => Promise<void> = async () => undefined, media: 'screen' | 'print' = 'screen'): Promise<void> {
    const { page } = app;
    const failures: string[] = [];
    for (const display of DISPLAYS) {
      // The display is chosen on screen: printing hides the header with the display switch.
      await page.emulateMedia({ media: 'screen' });
      await setTheme(page, display);
      await page.emulateMedia({ media });
      await settle();
      await page.waitForTimeout(200);
      await page.screenshot({ path: `test-results/night-${label}-${display}.png`, fullPage: true });
      const verdict = await checkNightPixels(page, display);
      expect(verdict.checked).toBeGreaterThan(100_000);
      if (verdict.bad > 0) failures.push(describeVerdict(`${label} in ${display}`, verdict));
    }
    await page.emulateMedia({ media: 'screen' });
    expect(failures).toEqual([]);
  }

  const mapSettles = async (): Promise<void> => waitForIdle(app.page);

  it('start screen', async () => {
    await app.page.getByRole('button', { name: 'Load the demo cruise' }).waitFor();
    await sweep('start');
  });

  it('watch log with a filled form, the list and a selected row', async () => {
    const { page } = app;
    await page.getByRole('button', { name: 'Load the demo cruise' }).click();
    const form = page.locator('form.observation-form');
    await form.waitFor({ timeout: 60_000 });
    await form.locator('#f-total').fill('8');
    await form.locator('#f-airTempC').fill('-95');
    await form.locator('#f-notes').fill('Night display check: grey-white floes, no lights.');
    await page.locator('.list-row[role="option"]').first().click();
    await sweep('log');
  });

  it('ice map, zoomed out, zoomed in with egg codes, and an observation selected', async () => {
    const { page } = app;
    await openMapScreen(page);
    await page.getByText(`${demo.observations.length} observations`).first().waitFor({ timeout: 120_000 });
    await waitForIdle(page);
    await sweep('map-out', mapSettles);
    const o = demo.observations.find((x) => x.position && x.categories.length >= 2) ?? demo.observations.find((x) => x.position);
    if (!o?.position) throw new Error('the demo has no observation with a position');
    await page.evaluate(([lon, lat]) => window.__floeMapDebug?.jumpTo(lon, lat, 9), [o.position.lon, o.position.lat] as const);
    await waitForIdle(page);
    await sweep('map-in', mapSettles);
    const at = await pagePoint(page, await screenPoint(page, o.position.lon, o.position.lat));
    await page.mouse.click(at.x, at.y);
    await page.locator('.map-details').waitFor();
    await sweep('map-details', mapSettles);
  }, 240_000);

  it('review with its charts, and its print preview', async () => {
    const { page } = app;
    await showScreen(page, 'Review');
    await page.locator('[data-testid^="chart-"] canvas').first().waitFor({ timeout: 60_000 });
    await sweep('review');
    await sweep('review-print', async () => undefined, 'print');
  }, 120_000);

  it('exchange and settings', async () => {
    await showScreen(app.page, 'Exchange');
    await sweep('exchange');
    await showScreen(app.page, 'Settings');
    await sweep('settings');
  }, 120_000);

  it('positive control: one white box on a night screen fails the check', async () => {
    const { page } = app;
    await page.evaluate(() => {
      const box = document.createElement('div');
      box.id = 'white-box';
      box.style.cssText = 'position:fixed;left:40px;top:40px;width:24px;height:24px;background:#fff;z-index:2147483647';
      document.body.appendChild(box);
    });
    for (const display of DISPLAYS) {
      await setTheme(page, display);
      const v = await checkNightPixels(page, display, false);
      expect(v.bad, display).toBeGreaterThanOrEqual(24 * 24);
      expect(v.examples[0]?.rgb).toEqual([255, 255, 255]);
    }
    await page.evaluate(() => document.getElementById('white-box')?.remove());
    for (const display of DISPLAYS) {
      await setTheme(page, display);
      expect((await checkNightPixels(page, display, false)).bad, `${display} without the box`).toBe(0);
    }
  });
});
