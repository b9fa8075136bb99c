// The bundled basemap in Chromium, with the browser offline from the moment the map opens:
// land drawn cleanly across the antimeridian (no stripes in Mercator), no false ring of land at
// the North Pole on the globe, Antarctica filled at the South Pole. Geography checked here
// (which places are land or sea) is common geography: Natural Earth's coastlines.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { waitForServiceWorkerControl } from './harness/pwa';
import type { Page } from 'playwright-core';
import { openApp, type AppSession } from './harness/browser';
import { colourDistance, hexRgb, openMapScreen, pixels, screenPoint, waitForIdle, type Rgb } from './map/mapPage';
import { PALETTES } from '../../src/features/map/style';

const LAND = hexRgb(PALETTES.day.land);
const OCEAN = hexRgb(PALETTES.day.ocean);

type LonLat = readonly [number, number];

async function classify(page: Page, positions: readonly LonLat[]): Promise<('land' | 'sea' | Rgb)[]> {
  const pts = await Promise.all(positions.map(([lon, lat]) => screenPoint(page, lon, lat)));
  const rgb = await pixels(page, pts);
  if (process.env.MAP_DEBUG) console.log(JSON.stringify(pts.map((p, i) => [positions[i], Math.round(p.x), Math.round(p.y), rgb[i]])));
  return rgb.map((c) => (colourDistance(c, LAND) < 25 ? 'land' : colourDistance(c, OCEAN) < 25 ? 'sea' : c));
}

async function view(page: Page, lon: number, lat: number, zoom: number): Promise<void> {
  await page.evaluate(([lon, lat, zoom]) => window.__floeMapDebug?.jumpTo(lon, lat, zoom), [lon, lat, zoom] as const);
  await page.waitForTimeout(150);
  await waitForIdle(page);
}

function row(lat: number, from: number, to: number, step: number): LonLat[] {
  const out: LonLat[] = [];
  // Longitudes past 180 on purpose: MapLibre projects them onto the world copy in view.
  for (let lon = from; lon <= to; lon += step) out.push([lon, lat]);
  return out;
}

describe('basemap offline', () => {
  let app: AppSession;
  const requests: string[] = [];
  // The app's own lazy chunks answered by the service worker's precache are not network use.
  const fromPrecache: string[] = [];
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
    await app.page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    // The map's code is a lazy chunk: offline it comes from the service worker's precache, which
    // is complete once the worker controls the page (as after any first visit with a network).
    await waitForServiceWorkerControl(app.page, 180_000);
    await app.browser.context.setOffline(true);
    app.page.on('request', (r) => {
      if (/^(blob|data):/.test(r.url())) return;
      void r.response().then((res) => {
        if (res?.fromServiceWorker()) fromPrecache.push(r.url());
        else requests.push(r.url());
      }, () => requests.push(r.url()));
    });
    await openMapScreen(app.page);
  }, 240_000);
  afterAll(async () => {
    await app?.close();
  }, 240_000);

  it('renders with no network: no cruise yet, the basemap drawn, the caution shown', async () => {
    const { page } = app;
    expect(await page.getByTestId('map-caution').innerText()).toContain('Not for navigation');
    expect(await page.evaluate(() => window.__floeMapDebug?.projection())).toBe('mercator');
    await view(page, 20, 50, 2);
    expect(await classify(page, [[10, 50], [-30, 45]])).toEqual(['land', 'sea']);
    // Only the fine land's asset may be asked for (without an offline cache it fails, and the
    // coarse land, bundled in the code, serves at every zoom).
    expect(requests.filter((u) => !/land-50m/.test(u))).toEqual([]);
    expect(fromPrecache.some((u) => /\/assets\/MapScreen-[^/]+\.js$/.test(u)), 'the map screen came from the precache').toBe(true);
    expect(['loaded', 'failed']).toContain(await page.evaluate(() => window.__floeMapDebug?.fineLand()));
    // MapLibre's workers took the helper script from the precache too (maplibreWorkerPatch.ts).
    expect(await page.evaluate(() => window.__floeMapDebug?.workerPatch())).toBe('ready');
  }, 240_000);

  it('draws no stripes across Mercator at the antimeridian', async () => {
    const { page } = app;
    await view(page, 180, 20, 1.5);
    await page.screenshot({ path: 'test-results/map-seam-mercator.png' });
    // Rows of open sea either side of 180 degrees, at the latitudes of land that straddles it
    // (Fiji about 17 S, Wrangel Island about 71 N) and in the open Pacific.
    for (const r of [row(5, 166, 196, 3), row(25, 166, 196, 3), row(-16.6, 191, 209, 2)]) {
      expect(await classify(page, r), `row at ${r[0]?.[1]}`).toEqual(r.map(() => 'sea'));
    }
    await view(page, 180, 66, 3);
    const wrangel = row(71.3, 185, 199, 2);
    expect(await classify(page, wrangel), 'row at 71.3').toEqual(wrangel.map(() => 'sea'));
    // Land on both sides of the seam: Chukotka west and east of 180 degrees.
    expect(await classify(page, [[175, 67], [185, 66.5]])).toEqual(['land', 'land']);
    await view(page, 180, 20, 1.5);
    expect(await classify(page, [[145, -25], [260, 40]])).toEqual(['land', 'land']);
    // Antarctica either side of the seam (Natural Earth's land leaves the Ross Ice Shelf out,
    // so the points are on the land east and west of it).
    await view(page, 180, -72, 2);
    expect(await classify(page, [[137, -77], [236, -77], [152, -78]])).toEqual(['land', 'land', 'land']);
  }, 240_000);

  it('leaves the North Pole as sea on the globe, with no false ring round it', async () => {
    const { page } = app;
    await page.getByLabel('Projection').selectOption('globe');
    await page.waitForTimeout(200);
    await waitForIdle(page);
    await view(page, 0, 85, 0);
    await page.screenshot({ path: 'test-results/map-north-pole-globe.png' });
    const ring: LonLat[] = [];
    for (const lat of [89.5, 88, 86]) for (const lon of [15, 75, 135, -165, -105, -45]) ring.push([lon, lat]);
    expect(await classify(page, [[0, 90], ...ring])).toEqual([[0, 90], ...ring].map(() => 'sea'));
    // Greenland's north and Svalbard are land nearby.
    expect(await classify(page, [[-40, 82], [16, 78.5]])).toEqual(['land', 'land']);
  }, 240_000);

  it('fills Antarctica at the South Pole on the globe', async () => {
    const { page } = app;
    await view(page, 0, -85, 0);
    await page.screenshot({ path: 'test-results/map-south-pole-globe.png' });
    const ring: LonLat[] = [];
    for (const lat of [-89.5, -88, -86]) for (const lon of [15, 75, 135, -165, -105, -45]) ring.push([lon, lat]);
    expect(await classify(page, [[0, -90], ...ring])).toEqual([[0, -90], ...ring].map(() => 'land'));
    expect(app.consoleErrors.filter((e) => !/ERR_INTERNET_DISCONNECTED|Failed to fetch|fine land/.test(e))).toEqual([]);
  }, 240_000);
});
