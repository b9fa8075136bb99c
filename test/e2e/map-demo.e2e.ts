// The demo cruise on the map, loaded the way a user does it ("Load the demo cruise"): the map
// opens on the globe (the cruise is north of 80 N), framed whole, and each well-separated
// observation is drawn in its WMO/TD-No. 1215 band colour.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { colourDistance, mapRect, openMapScreen, pixels, screenPoint, showMap, waitForIdle } from './map/mapPage';
import { makeDemoCruise } from '../../src/domain/demo';
import { band, bandOfObservation } from '../../src/features/map/concentrationBands';

describe('demo cruise on the map', () => {
  let app: AppSession;
  const demo = makeDemoCruise();
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
    await app.page.getByRole('button', { name: 'Load the demo cruise' }).click();
    await app.page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name: 'Ice map' }).waitFor();
    await app.page.waitForFunction(() => !document.body.innerText.includes('No cruise yet'), null, { timeout: 120_000 });
    await openMapScreen(app.page);
    await app.page.getByText(`${demo.observations.length} observations, ${demo.track.length} track points`).waitFor({ timeout: 120_000 });
    await app.page.waitForTimeout(500);
    await waitForIdle(app.page);
    await showMap(app.page);
  }, 240_000);
  afterAll(async () => {
    await app?.close();
  });

  it('shows the whole demo cruise on the globe with each observation in its band colour', async () => {
    const { page } = app;
    expect(await page.evaluate(() => window.__floeMapDebug?.projection())).toBe('globe');
    await page.screenshot({ path: 'test-results/map-demo.png' });
    const rect = await mapRect(page);
    const placed = demo.observations.filter((o) => o.position && !o.deleted);
    const pts = await Promise.all(placed.map((o) => screenPoint(page, o.position?.lon as number, o.position?.lat as number)));
    for (const p of pts) {
      expect(p.x).toBeGreaterThan(rect.x);
      expect(p.x).toBeLessThan(rect.x + rect.width);
      expect(p.y).toBeGreaterThan(rect.y);
      expect(p.y).toBeLessThan(rect.y + rect.height);
    }
    const last = demo.track[demo.track.length - 1];
    const ship = last ? await screenPoint(page, last.lon, last.lat) : { x: -1e9, y: -1e9 };
    // Symbols overlap at this scale: check the ones with no other symbol (or the ship) within 14 px.
    const alone = pts
      .map((p, i) => ({ p, o: placed[i] }))
      .filter(({ p }, i) => pts.every((q, j) => j === i || Math.hypot(p.x - q.x, p.y - q.y) > 14) && Math.hypot(p.x - ship.x, p.y - ship.y) > 20);
    expect(alone.length).toBeGreaterThanOrEqual(3);
    const rgb = await pixels(page, alone.map((a) => a.p));
    rgb.forEach((c, k) => {
      const o = alone[k]?.o;
      const want = band(bandOfObservation(o as NonNullable<typeof o>)).rgb;
      expect(colourDistance(c, want), `observation ${o?.time} drawn ${c}, want ${want}`).toBeLessThan(30);
    });
  }, 240_000);
});
