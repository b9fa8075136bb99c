// The ice map in Chromium with software WebGL: the built app, test cruises put in through the
// local store, pixels read at known observation positions. Expected colours: the ice chart
// colour standard for total concentration (WMO/TD-No. 1215).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openApp, type AppSession } from './harness/browser';
import { BAND_TOTALS, LINE_75S, observationsAt, RING_85N, testCruise, trackThrough } from './map/fixtures';
import { colourDistance, hexRgb, loadCruise, mapRect, openMapScreen, pagePoint, pixels, screenPoint, waitForIdle, type Rgb, type ScreenPoint } from './map/mapPage';
import { band, bandOfTenths } from '../../src/features/map/concentrationBands';
import { PALETTES } from '../../src/features/map/style';

const MERCATOR_LIMIT = 85.0511;

function expected(i: number): readonly [number, number, number] {
  return band(bandOfTenths(BAND_TOTALS[i % BAND_TOTALS.length] as number)).rgb;
}

async function points(page: Page, positions: readonly (readonly [number, number])[]): Promise<ScreenPoint[]> {
  return Promise.all(positions.map(([lon, lat]) => screenPoint(page, lon, lat)));
}

/** Every position inside the map, and the cruise spread over a fair part of it (framed, not lost in a corner). */
async function expectFramed(page: Page, positions: readonly (readonly [number, number])[]): Promise<void> {
  const rect = await mapRect(page);
  const pts = await points(page, positions);
  for (const p of pts) {
    expect(p.x).toBeGreaterThan(rect.x);
    expect(p.x).toBeLessThan(rect.x + rect.width);
    expect(p.y).toBeGreaterThan(rect.y);
    expect(p.y).toBeLessThan(rect.y + rect.height);
  }
  const w = Math.max(...pts.map((p) => p.x)) - Math.min(...pts.map((p) => p.x));
  const h = Math.max(...pts.map((p) => p.y)) - Math.min(...pts.map((p) => p.y));
  expect(Math.max(w / rect.width, h / rect.height)).toBeGreaterThan(0.4);
}

/**
 * Each observation drawn in its band colour. The last one is where the track ends, under the
 * ship's symbol: there the ship must be drawn instead (its dark fill).
 */
async function expectBandColours(page: Page, positions: readonly (readonly [number, number])[], label: string): Promise<void> {
  const rgb = await pixels(page, await points(page, positions));
  const ship = rgb.pop() as Rgb;
  expect(colourDistance(ship, hexRgb(PALETTES.day.ship)), `${label}: ship drawn ${ship}`).toBeLessThan(40);
  rgb.forEach((c, i) => {
    expect(colourDistance(c, expected(i)), `${label}: observation ${i} at ${positions[i]} drawn ${c}, want ${expected(i)}`).toBeLessThan(30);
  });
}

/** Pixels in a ring round a point, to find a circle's stroke. */
function around(p: ScreenPoint, radius: number): ScreenPoint[] {
  return Array.from({ length: 16 }, (_, k) => ({ x: p.x + radius * Math.cos((k * Math.PI) / 8), y: p.y + radius * Math.sin((k * Math.PI) / 8) }));
}

async function setProjection(page: Page, value: 'globe' | 'mercator' | 'auto'): Promise<void> {
  await page.getByLabel('Projection').selectOption(value);
  await page.waitForTimeout(200);
  await waitForIdle(page);
}

describe('ice map in Chromium', () => {
  let app: AppSession;
  const north = testCruise('north');
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
    await openMapScreen(app.page);
    await loadCruise(app.page, north, observationsAt(north.id, RING_85N, BAND_TOTALS), trackThrough(north.id, RING_85N));
    await app.page.getByText(`${RING_85N.length} observations`).waitFor();
    await app.page.waitForTimeout(300);
    await waitForIdle(app.page);
  }, 240_000);
  afterAll(async () => {
    await app?.close();
  }, 240_000);

  it('opens a cruise near 85 N on the globe, framed whole, each observation in its band colour', async () => {
    const { page } = app;
    expect(await page.evaluate(() => window.__floeMapDebug?.projection())).toBe('globe');
    await expectFramed(page, RING_85N);
    await page.screenshot({ path: 'test-results/map-85n-globe.png' });
    await expectBandColours(page, RING_85N, 'globe 85 N');
    await expect(page.getByTestId('map-caution').innerText()).resolves.toContain('Not for navigation');
    // Online, the worker fetched and fixed the 1:50m land for the larger scales.
    expect(await page.evaluate(() => window.__floeMapDebug?.fineLand())).toBe('loaded');
  }, 240_000);

  it('has MapLibre\'s own worker read the map\'s GeoJSON, with no copy sent back to the page', async () => {
    const { page } = app;
    expect(await page.evaluate(() => window.__floeMapDebug?.workerPatch())).toBe('ready');
    interface Probe {
      reads: number;
      wrapped: boolean;
    }
    const probes = await Promise.all(
      page.workers().map((w) =>
        w
          .evaluate((): Probe | null => {
            const s = self as unknown as { floeBlobReads?: number; worker?: { actor?: { messageHandlers?: Record<string, { floeWrapped?: boolean } | undefined> } } };
            const handlers = s.worker?.actor?.messageHandlers;
            return handlers ? { reads: s.floeBlobReads ?? 0, wrapped: handlers.LD?.floeWrapped === true } : null;
          })
          .catch(() => null),
      ),
    );
    const maplibreWorkers = probes.filter((p): p is Probe => p !== null);
    expect(maplibreWorkers.length).toBeGreaterThan(0);
    // Without the helper MapLibre would send each blob URL to the page to be fetched and parsed
    // there, and post every document back to the page after indexing it.
    for (const w of maplibreWorkers) expect(w.wrapped).toBe(true);
    // Observations, track levels, zone stretches, fine land and its coastlines.
    expect(maplibreWorkers.reduce((n, w) => n + w.reads, 0)).toBeGreaterThanOrEqual(5);
  }, 240_000);

  it('draws the same colours in Mercator (where Mercator reaches: up to 85.05 N)', async () => {
    const { page } = app;
    await setProjection(page, 'mercator');
    try {
      expect(await page.evaluate(() => window.__floeMapDebug?.projection())).toBe('mercator');
      await page.screenshot({ path: 'test-results/map-85n-mercator.png' });
      // Near 85 N the band of latitudes Mercator still shows is thin: look at each observation
      // at zoom 4, where it lies well inside the view.
      // The last observation is under the ship's symbol.
      const inside = RING_85N.map((p, i) => ({ p, i })).filter(({ p, i }) => p[1] <= MERCATOR_LIMIT - 0.15 && i < RING_85N.length - 1);
      expect(inside.length).toBeGreaterThanOrEqual(5);
      for (const { p, i } of inside) {
        await page.evaluate(([lon]) => window.__floeMapDebug?.jumpTo(lon, 84.6, 4), [p[0]] as const);
        await page.waitForTimeout(150);
        await waitForIdle(page);
        const [c] = await pixels(page, [await screenPoint(page, p[0], p[1])]);
        expect(colourDistance(c as Rgb, expected(i)), `mercator: observation ${i} at ${p} drawn ${c}`).toBeLessThan(30);
      }
    } finally {
      await setProjection(page, 'auto');
      await page.getByRole('button', { name: 'Whole cruise' }).click();
      await page.waitForTimeout(150);
      await waitForIdle(page);
    }
  }, 240_000);

  it('selects an observation by clicking it: details panel and a highlight by feature state', async () => {
    const { page } = app;
    const i = 4; // 10/10, red
    const [lon, lat] = RING_85N[i] as [number, number];
    const p = await screenPoint(page, lon, lat);
    const cyan = hexRgb(PALETTES.day.selected);
    const before = await pixels(page, around(p, 8));
    expect(before.some((c) => colourDistance(c, cyan) < 60)).toBe(false);
    const at = await pagePoint(page, p);
    await page.mouse.click(at.x, at.y);
    await page.getByTestId('map-details').waitFor();
    expect(await page.getByTestId('map-details').innerText()).toContain('10/10');
    await page.waitForTimeout(200);
    await waitForIdle(page);
    const after = await pixels(page, [...around(p, 8), ...around(p, 9), ...around(p, 10)]);
    expect(after.some((c) => colourDistance(c, cyan) < 60), `no highlight round ${p.x},${p.y}: ${JSON.stringify(after)}`).toBe(true);
    // The fill keeps its band colour: the data was not reloaded, only the state changed.
    expect(colourDistance((await pixels(page, [p]))[0] as Rgb, expected(i))).toBeLessThan(30);
    await page.getByRole('button', { name: 'Close details' }).click();
  }, 240_000);

  it('filters by observer without reloading: the other observer’s symbols go', async () => {
    const { page } = app;
    const odd = [1, 3, 5, 7]; // made by obs-b; 1 and 5 lie beyond Mercator's limit, drawn by the overlay
    const even = [0, 2, 4, 6];
    await page.getByLabel('Bo Checker').uncheck();
    try {
      await page.waitForTimeout(200);
      await waitForIdle(page);
      const rgb = await pixels(page, await points(page, odd.map((i) => RING_85N[i] as [number, number])));
      rgb.forEach((c, k) => expect(colourDistance(c, expected(odd[k] as number)), `observation ${odd[k]} still drawn: ${c}`).toBeGreaterThan(60));
      const kept = await pixels(page, await points(page, even.map((i) => RING_85N[i] as [number, number])));
      kept.forEach((c, k) => expect(colourDistance(c, expected(even[k] as number)), `observation ${even[k]} gone: ${c}`).toBeLessThan(30));
    } finally {
      await page.getByRole('button', { name: 'Show all' }).click();
      await page.waitForTimeout(200);
      await waitForIdle(page);
    }
    await expectBandColours(page, RING_85N, 'all again');
  }, 240_000);

  it('draws the egg code beside an observation at a larger scale', async () => {
    const { page } = app;
    const [lon, lat] = RING_85N[2] as [number, number];
    await page.evaluate(([lon, lat]) => window.__floeMapDebug?.jumpTo(lon, lat, 8), [lon, lat] as const);
    await page.waitForTimeout(300);
    await waitForIdle(page);
    const p = await screenPoint(page, lon, lat);
    await page.screenshot({ path: 'test-results/map-egg.png' });
    // The egg sits to the right of the symbol: its white paper and dark outline are there.
    const region: ScreenPoint[] = [];
    for (let dx = 14; dx <= 50; dx += 2) for (let dy = -30; dy <= 30; dy += 3) region.push({ x: p.x + dx, y: p.y + dy });
    const rgb = await pixels(page, region);
    expect(rgb.filter((c) => colourDistance(c, [255, 255, 255]) < 20).length).toBeGreaterThan(20);
    expect(rgb.filter((c) => colourDistance(c, [16, 22, 29]) < 60).length).toBeGreaterThan(3);
    await page.getByRole('button', { name: 'Whole cruise' }).click();
    await waitForIdle(page);
  }, 240_000);

  it('frames a cruise at 75 S on the globe when it becomes the active one', async () => {
    const { page } = app;
    const south = testCruise('south');
    await loadCruise(page, south, observationsAt(south.id, LINE_75S, BAND_TOTALS), trackThrough(south.id, LINE_75S));
    await page.getByText(`${LINE_75S.length} observations`).waitFor();
    await page.waitForTimeout(300);
    await waitForIdle(page);
    await page.screenshot({ path: 'test-results/map-75s-globe.png' });
    expect(await page.evaluate(() => window.__floeMapDebug?.projection())).toBe('globe');
    await expectFramed(page, LINE_75S);
    await expectBandColours(page, LINE_75S, 'globe 75 S');
    expect(app.consoleErrors).toEqual([]);
  }, 240_000);
});
