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
import { gridTiff, H, W } from '../iceinfo/gridFiles';
import { KNOWN_GRID_CRS, planeOf } from '../../src/iceinfo/projections';

// The grid: 6 x 5 cells of 80 km on the EPSG:3413 plane, all 30 % (a darker blue than the pale
// sea of the day display), centred on 45 E 76.5 N in the
// Barents Sea (open sea all round, away from the chart), so Web Mercator tiles reach all of it.
const CELL_M = 80_000;
const plane = planeOf(KNOWN_GRID_CRS[3413]!.proj4);
const [cx, cy] = plane.toPlane(45, 76.5) as [number, number];
const LEFT = cx - (W * CELL_M) / 2;
const TOP = cy + (H * CELL_M) / 2;
const cellCentre = (row: number, col: number) => plane.toLonLat(LEFT + CELL_M * (col + 0.5), TOP - CELL_M * (row + 0.5)) as [number, number];
const gridFile = () => gridTiff(new Array<number>(W * H).fill(30), { ModelPixelScale: [CELL_M, CELL_M, 0], ModelTiepoint: [0, 0, 0, LEFT, TOP, 0] });

// Observations an hour apart from 2026-03-10T00:00Z (fixtures.ts): two in the chart's pack ice
// (CT 92), one in its open water (CT 01), one in the young ice across the antimeridian (CT 46),
// and one on the grid's first cell (outside every chart polygon).
const POSITIONS: [number, number][] = [
  [12, 78.5],
  [18, 79.5],
  [28, 78.5],
  [-178, 71],
  cellCentre(0, 0),
];
const TOTALS = [9, 10, 1, 2, 5];

describe('ice charts and grids in Chromium', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp({ path: '?map-debug' });
  });
  afterAll(async () => {
    await app?.close();
  });

  it('imports a chart and a grid, draws them in day and night, and shows the agreement', async () => {
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
    await page.getByLabel('Chart or grid file').setInputFiles({ name: 'grid.tif', mimeType: 'image/tiff', buffer: Buffer.from(await gridFile()) });
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Imported grid.tif' }).count(), { timeout: 30_000 }).toBe(1);
    expect(await page.getByRole('list', { name: 'Stored charts and grids' }).getByRole('listitem').count()).toBe(2);

    // A hostile file: a refusal naming the problem, nothing more stored.
    await page.getByLabel('Chart or grid file').setInputFiles({ name: 'bad.geojson', mimeType: 'application/json', buffer: Buffer.from('{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"CT":"64"},"geometry":{"type":"Polygon","coordinates":[[[0,70],[1,70],[1,71],[0,70]]]}}]}') });
    await expect.poll(() => page.getByRole('alert').textContent(), { timeout: 30_000 }).toMatch(/Nothing was stored: .*CT "64" is not a SIGRID-3 concentration code/);
    expect(await page.getByRole('list', { name: 'Stored charts and grids' }).getByRole('listitem').count()).toBe(2);

    await openMapScreen(page);
    await expect.poll(() => page.getByTestId('iceinfo-legend').textContent()).toContain('Frostwren test chart');
    expect(await page.getByTestId('iceinfo-legend').textContent()).toContain('Frostwren test grid');
    await showMap(page);
    await waitForIdle(page, 240_000);
    await page.screenshot({ path: 'test-results/iceinfo-day.png' });
    // Inside the pack ice polygon, away from the observations: the chart's WMO/TD-No. 1215
    // 9-10/10 red (255, 0, 0) laid over the ocean at the day display's opacity.
    const inside = await screenPoint(page, 15, 79.8);
    const outside = await screenPoint(page, 40, 79.8);
    // The grid's far corner cell, and open sea 200 km beyond its left edge.
    const onGrid = await screenPoint(page, ...cellCentre(H - 1, W - 1));
    const offGrid = await screenPoint(page, ...(plane.toLonLat(LEFT - 200_000, cy) as [number, number]));
    const box = await page.getByTestId('map-canvas').boundingBox();
    for (const p of [inside, outside, onGrid, offGrid]) expect(p.x > 0 && p.y > 0 && p.x < (box?.width ?? 0) && p.y < (box?.height ?? 0), `${JSON.stringify(p)} on the map`).toBe(true);
    const [dayIn, dayOut, dayGrid, dayOff] = (await pixels(page, [inside, outside, onGrid, offGrid])) as [Rgb, Rgb, Rgb, Rgb];
    expect(dayIn[0] - dayIn[1]).toBeGreaterThan(60);
    expect(colourDistance(dayIn, dayOut)).toBeGreaterThan(60);
    // The grid's own scale at 30 % in the day display is a blue (iceInfoColours.ts): bluer than
    // red, and unlike the sea beside it.
    expect(dayGrid[2]).toBeGreaterThan(dayGrid[0]);
    expect(colourDistance(dayGrid, dayOff)).toBeGreaterThan(40);

    await setTheme(page, 'night');
    // The night display repaints every layer and re-makes the grid image: slow in software WebGL.
    await waitForIdle(page, 240_000);
    const [nightIn, nightOut, nightGrid, nightOff] = (await pixels(page, [inside, outside, onGrid, offGrid])) as [Rgb, Rgb, Rgb, Rgb];
    // Dimmed at night, but still the chart's red over the dark ocean.
    expect(nightIn[0] - nightIn[1]).toBeGreaterThan(30);
    expect(nightIn[0]).toBeLessThan(dayIn[0]);
    expect(colourDistance(nightIn, nightOut)).toBeGreaterThan(30);
    expect(colourDistance(nightGrid, nightOff)).toBeGreaterThan(25);
    expect(nightGrid[0] + nightGrid[1] + nightGrid[2]).toBeLessThan(dayGrid[0] + dayGrid[1] + dayGrid[2]);
    await page.screenshot({ path: 'test-results/iceinfo-night.png' });
    await setTheme(page, 'day');

    await showScreen(page, 'Review');
    const panel = page.getByTestId('agreement-chart');
    await panel.waitFor({ timeout: 30_000 });
    // Chart pairs: 9 - 10, 10 - 10, 1 - 0, 2 - 5: mean -0.75, within 1/10 three of four.
    const text = (await panel.textContent()) ?? '';
    expect(text).toContain('All observations4-0.75');
    expect(text).toContain('75 %');
    // Grid pair: 5 - 3 = +2 tenths, within 2/10 but not within 1/10.
    expect((await page.getByTestId('agreement-grid').textContent()) ?? '').toContain('All observations12.002.000 %100 %');
    expect(await page.getByTestId('agreement-panel').textContent()).toContain('Neither the ice chart nor the satellite grid is a navigation product');
    // The scatter and the time series are drawn (uPlot canvases), for 4 chart and 1 grid pairs.
    for (const id of ['chart-agreement-scatter', 'chart-agreement-series']) {
      await page.getByTestId(id).locator('canvas').first().waitFor({ timeout: 30_000 });
      expect(await page.getByTestId(id).textContent()).toContain('Ice chart: 4 pairs; satellite grid: 1 pair.');
    }
    // Only the young ice pair (2 - 5 = -3) lies beyond 2/10: one finding, of our own kind.
    const finding = page.getByTestId('findings-list').locator('li[data-code="chart-disagreement"]');
    expect(await finding.count()).toBe(1);
    expect(await finding.textContent()).toContain('Observed 2/10, chart "Frostwren test chart" (valid 2026-03-10T06:00:00Z) CT 46, read as 5/10: difference -3.0 tenths.');
    expect(await page.getByTestId('findings-list').locator('li[data-code="grid-disagreement"]').count()).toBe(0);
    expect(app.consoleErrors).toEqual([]);
  }, 900_000);
});
