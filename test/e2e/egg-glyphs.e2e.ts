// The egg code image the map draws in Chromium (Canvas 2D, the system font), read back from the
// map and measured: along the stage row of "7. 1. 5" (old ice, medium first-year, grey-white:
// WMO-No. 259 stage codes) the ink falls into five runs, digit, dot, digit, dot, digit, and the
// air after each dot is several times the air between a digit and its own dot, and at least
// 0.3 em, so the row never reads as "7.1.5" or "1.75".
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { loadCruise, openMapScreen, waitForIdle } from './map/mapPage';
import { testCruise } from './map/fixtures';
import type { Observation } from '../../src/domain/model';
import { EGG_FONT } from '../../src/domain/eggCode';

/** Egg drawing units (the box is 120 x 160) and the image scale: 64 CSS px tall at pixel ratio 2. */
const SCALE = (64 * 2) / 160;
const S_ROW = 98;

describe('egg code glyph positions in the map image', () => {
  let app: AppSession;
  const cruise = testCruise('egg-glyphs');
  const obs: Observation = {
    id: 'egg-glyphs-o1', cruiseId: cruise.id, time: '2026-03-10T06:00:00Z', position: { lat: 78.5, lon: 10.5, source: 'manual' },
    observerId: 'obs-a', totalConcentration: 9,
    categories: [
      { partialConcentration: 4, stage: 'old', floeSize: 'big-floe' },
      { partialConcentration: 3, stage: 'medium-first-year', floeSize: 'medium-floe' },
      { partialConcentration: 2, stage: 'grey-white', floeSize: 'small-floe' },
    ],
    notes: '', photoIds: [], revision: 1, savedAt: '2026-03-10T06:00:00Z', savedBy: 'obs-a', deviceId: 'test', deleted: false,
  };
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
    await openMapScreen(app.page);
    await loadCruise(app.page, cruise, [obs], []);
  }, 120_000);
  afterAll(async () => {
    await app?.close();
  });

  it('keeps clear air after each stage dot', async () => {
    const { page } = app;
    await page.evaluate(() => window.__floeMapDebug?.jumpTo(10.5, 78.5, 9));
    await waitForIdle(page);
    await page.waitForFunction((id) => window.__floeMapDebug?.image(id) !== null, `egg:${obs.id}`, { timeout: 60_000 });
    const img = await page.evaluate((id) => window.__floeMapDebug?.image(id) ?? null, `egg:${obs.id}`);
    if (!img) throw new Error('no egg image');
    const at = (u: number) => Math.round(u * SCALE + 1);
    const half = EGG_FONT * 0.5;
    const [y0, y1] = [at(S_ROW - half), at(S_ROW + half)];
    // Inside the oval only: its outline would be ink at the row's ends.
    const [x0, x1] = [at(60 - 46), at(60 + 46)];
    const inkColumns: boolean[] = [];
    for (let x = x0; x <= x1; x++) {
      let ink = false;
      for (let y = y0; y <= y1 && !ink; y++) {
        const i = (y * img.width + x) * 4;
        const [r, g, b, a] = [img.data[i] ?? 0, img.data[i + 1] ?? 0, img.data[i + 2] ?? 0, img.data[i + 3] ?? 0];
        // Day ink is near black on white paper.
        ink = a > 128 && r + g + b < 3 * 128;
      }
      inkColumns.push(ink);
    }
    const runs: { from: number; to: number }[] = [];
    inkColumns.forEach((ink, i) => {
      const last = runs[runs.length - 1];
      if (ink && last && last.to === i - 1) last.to = i;
      else if (ink) runs.push({ from: i, to: i });
    });
    const widths = runs.map((r) => r.to - r.from + 1);
    expect(runs, `ink runs ${JSON.stringify(runs)}`).toHaveLength(5);
    // Dots are the narrow runs 2 and 4.
    expect(widths[1]).toBeLessThan(widths[0] as number);
    expect(widths[3]).toBeLessThan(widths[2] as number);
    const gap = (a: number) => (runs[a + 1]?.from as number) - (runs[a]?.to as number) - 1;
    const em = EGG_FONT * SCALE;
    for (const dot of [1, 3]) {
      const before = gap(dot - 1);
      const after = gap(dot);
      console.log(`egg glyphs: dot ${dot}: ${before} px after its digit, ${after} px before the next symbol (1 em = ${em} px)`);
      expect(after).toBeGreaterThanOrEqual(0.3 * em);
      expect(after).toBeGreaterThanOrEqual(2 * Math.max(1, before));
    }
  }, 120_000);
});
