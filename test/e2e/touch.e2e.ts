// Touch and glove use in Chromium with touch emulation (playwright `hasTouch`, taps through
// `page.touchscreen`): a tenths field and a temperature filled with the on-screen keypad alone,
// every control of the log form and of the map at least 44 px each way (the 44 px target is
// WCAG 2.1 success criterion 2.5.5, Target Size), and the map operated by taps: zoom and
// selecting an observation. The cruise and observers are invented for the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { openApp, type AppSession } from './harness/browser';
import { createCruise } from './harness/logFlow';
import { loadCruise, openMapScreen, pagePoint, screenPoint, waitForIdle } from './map/mapPage';
import { observationsAt, testCruise } from './map/fixtures';

async function tap(page: Page, target: Locator): Promise<void> {
  await target.scrollIntoViewIfNeeded();
  const box = await target.boundingBox();
  if (!box) throw new Error('nothing to tap');
  await page.touchscreen.tap(box.x + box.width / 2, box.y + box.height / 2);
}

/** Controls under `root` smaller than 44 x 44 CSS px (a check box counts by its label). */
async function smallTargets(root: Locator): Promise<string[]> {
  return root.evaluate((el) => {
    const out: string[] = [];
    for (const c of el.querySelectorAll<HTMLElement>('button, input, select, textarea, summary, [role="option"]')) {
      const style = getComputedStyle(c);
      if (style.display === 'none' || style.visibility === 'hidden' || c.offsetParent === null) continue;
      const target = c instanceof HTMLInputElement && (c.type === 'checkbox' || c.type === 'radio') ? (c.closest('label') ?? c) : c;
      const r = target.getBoundingClientRect();
      if (r.width < 44 || r.height < 44) out.push(`${c.tagName.toLowerCase()}#${c.id || ''}[${c.getAttribute('aria-label') ?? c.textContent?.trim().slice(0, 30) ?? ''}] ${Math.round(r.width)}x${Math.round(r.height)}`);
    }
    return out;
  });
}

describe('touch and gloves', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp({ hasTouch: true, path: '?map-debug' });
    await createCruise(app.page, { name: 'Touch test', vessel: 'RV Frostwren', observers: [{ name: 'Maren Holtvik', initials: 'MH' }] });
  }, 120_000);
  afterAll(async () => {
    await app?.close();
  });

  it('fills a tenths field and a temperature with the on-screen keypad alone', async () => {
    const { page } = app;
    const form = page.locator('form.observation-form');
    await tap(page, form.locator('#f-total'));
    const pad = page.getByRole('group', { name: 'Number keypad' });
    await pad.waitFor();
    await tap(page, pad.getByRole('button', { name: '7', exact: true }));
    // A tenths digit is complete: the value is set and the form moves on, as with the keyboard.
    expect(await form.locator('#f-total').inputValue()).toBe('7');
    expect(await page.evaluate(() => document.activeElement?.id)).not.toBe('f-total');

    await tap(page, form.locator('#f-airTempC'));
    await pad.waitFor();
    for (const k of ['minus', '1', '2', '2', 'delete', 'decimal point', '5']) await tap(page, pad.getByRole('button', { name: k, exact: true }));
    expect(await form.locator('#f-airTempC').inputValue()).toBe('-12.5');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('f-airTempC');
    await tap(page, pad.getByRole('button', { name: 'close the keypad' }));
    await pad.waitFor({ state: 'detached' });
  }, 120_000);

  it('every control of the form and the keypad is at least 44 px each way', async () => {
    const { page } = app;
    await tap(page, page.locator('form.observation-form #f-total'));
    const small = [...(await smallTargets(page.locator('form.observation-form'))), ...(await smallTargets(page.getByTestId('keypad')))];
    expect(small).toEqual([]);
  });

  it('works the map by touch: zoom, select an observation; its controls are 44 px', async () => {
    const { page } = app;
    const cruise = testCruise('touch');
    const spots: [number, number][] = [[14.0, 79.2], [15.5, 79.6]];
    await openMapScreen(page);
    await loadCruise(page, cruise, observationsAt(cruise.id, spots, [9, 5]), []);
    await page.getByText('2 observations').first().waitFor({ timeout: 60_000 });
    await waitForIdle(page);
    const before = await page.evaluate(() => window.__floeMapDebug?.zoom() ?? 0);
    await tap(page, page.getByRole('button', { name: 'Zoom in' }));
    await waitForIdle(page);
    expect(await page.evaluate(() => window.__floeMapDebug?.zoom() ?? 0)).toBeGreaterThan(before + 0.5);
    const [lon, lat] = spots[1] as [number, number];
    await page.evaluate(([lon, lat]) => window.__floeMapDebug?.jumpTo(lon, lat, 6), [lon, lat] as const);
    await waitForIdle(page);
    // A fingertip lands beside the symbol, not on its centre.
    const p = await screenPoint(page, lon, lat);
    const at = await pagePoint(page, { x: p.x + 9, y: p.y - 7 });
    await page.touchscreen.tap(at.x, at.y);
    await page.screenshot({ path: 'test-results/touch-map.png' });
    await page.locator('.map-details').waitFor({ timeout: 15_000 });
    expect(await page.locator('.map-details').innerText()).toContain('5/10');
    expect(await smallTargets(page.locator('.map-screen'))).toEqual([]);
  }, 300_000);
});
