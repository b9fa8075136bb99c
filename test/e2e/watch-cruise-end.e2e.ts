// The watch and the cruise's end in Chromium, with the page's clock held at set times
// (playwright's clock): a missed-hours run across midnight names both dates in the watch panel
// and in the list; "End the cruise now" in Settings stops the due banner and the alarm sound
// (counted through the page's AudioContext); the demo cruise, which lies in the past, does not
// ring. The cruise, observers and times are invented for the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { showScreen } from './harness/screens';
import { loadCruise, openMapScreen } from './map/mapPage';
import { observationsAt, testCruise } from './map/fixtures';

/** Counts the oscillators the page starts: each alarm beep starts two. */
const COUNT_BEEPS = `
  window.__beeps = 0;
  const create = AudioContext.prototype.createOscillator;
  AudioContext.prototype.createOscillator = function (...args) { window.__beeps += 1; return create.apply(this, args); };
`;

declare global {
  interface Window {
    __beeps?: number;
  }
}

describe('the watch knows the cruise', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
    await app.page.addInitScript(COUNT_BEEPS);
    // 18:20 UTC on 2 December 2026: the last observation was made at 18:00.
    await app.page.clock.setFixedTime(new Date('2026-12-02T18:20:00Z'));
    await app.page.reload();
  }, 120_000);
  afterAll(async () => {
    await app?.close();
  });

  it('names both dates of a missed run across midnight, in the watch and in the list', async () => {
    const { page } = app;
    const cruise = testCruise('midnight');
    // 18:00 on 1 December, then nothing until 18:00 on 2 December: 19:00 to 17:00 are missed.
    const obs = observationsAt(cruise.id, [[12.0, 81.0], [12.5, 81.2]], [8, 9]).map((o, i) => ({
      ...o,
      time: i === 0 ? '2026-12-01T18:00:00Z' : '2026-12-02T18:00:00Z',
      savedAt: i === 0 ? '2026-12-01T18:00:00Z' : '2026-12-02T18:00:00Z',
    }));
    await openMapScreen(page);
    await loadCruise(page, cruise, obs, []);
    await showScreen(page, 'Watch log');
    const want = '19:00 on 2026-12-01 to 17:00 on 2026-12-02 UTC (23 observations)';
    await page.getByTestId('missed-list').getByText(want).waitFor({ timeout: 30_000 });
    await page.getByTestId('missed-row').getByText(`Missed: ${want}`).waitFor();
    expect(await page.getByTestId('watch-panel').getAttribute('data-state')).toBe('waiting');
  }, 120_000);

  it('"End the cruise now" stops the due banner and the alarm', async () => {
    const { page } = app;
    // 18:57: the 19:00 observation is due, the banner shows and the alarm sounds.
    await page.clock.setFixedTime(new Date('2026-12-02T18:57:00Z'));
    const panel = page.getByTestId('watch-panel');
    await page.waitForFunction(() => document.querySelector('[data-testid="watch-panel"]')?.getAttribute('data-state') === 'due', null, { timeout: 15_000 });
    await panel.getByRole('alert').waitFor();
    await page.waitForFunction(() => (window.__beeps ?? 0) > 0, null, { timeout: 15_000 });

    await showScreen(page, 'Settings');
    await page.getByRole('button', { name: 'End the cruise now' }).click();
    await page.getByRole('status').getByText('ended at 2026-12-02 18:57 UTC').waitFor();
    expect(await page.getByTestId('cruise-end-state').innerText()).toContain('ended at 2026-12-02 18:57 UTC');
    await showScreen(page, 'Watch log');
    await page.getByTestId('watch-ended').waitFor();
    expect(await panel.getAttribute('data-state')).toBe('ended');
    expect(await panel.getByRole('alert').count()).toBe(0);

    // 19:20, well past the 19:00 slot: no banner, no new beep, no missed hour after the end.
    const beeps = await page.evaluate(() => window.__beeps ?? 0);
    await page.clock.setFixedTime(new Date('2026-12-02T19:20:00Z'));
    await page.waitForTimeout(6_500); // the background caller looks every 5 s
    expect(await panel.getAttribute('data-state')).toBe('ended');
    expect(await page.evaluate(() => window.__beeps ?? 0)).toBe(beeps);
    expect(await page.getByTestId('missed-list').innerText()).not.toContain('19:00 UTC on 2026-12-02');
  }, 120_000);

  it('the demo cruise, which lies in the past, does not ring', async () => {
    // The demo loads from the start screen, shown while no cruise is active: a fresh browser.
    // 06:58 UTC: were the demo's watch running, the 07:00 observation would be due.
    const fresh = await openApp();
    try {
      await fresh.page.addInitScript(COUNT_BEEPS);
      await fresh.page.clock.setFixedTime(new Date('2026-12-05T06:58:00Z'));
      await fresh.page.reload();
      await fresh.page.getByRole('button', { name: 'Load the demo cruise' }).click();
      await fresh.page.getByTestId('watch-ended').waitFor({ timeout: 60_000 });
      await fresh.page.waitForTimeout(6_500);
      const p = fresh.page.getByTestId('watch-panel');
      expect(await p.getAttribute('data-state')).toBe('ended');
      expect(await p.getByRole('alert').count()).toBe(0);
      expect(await fresh.page.evaluate(() => window.__beeps ?? 0)).toBe(0);
    } finally {
      await fresh.close();
    }
  }, 180_000);
});
