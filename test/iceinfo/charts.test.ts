import { describe, expect, it } from 'vitest';
import { locateInChart, chartMatch } from '../../src/domain/collocation';
import { readChartFile, type ChartMeta } from '../../src/iceinfo/chartRead';
import { planeOf } from '../../src/iceinfo/projections';
import { chartGeoJson, chartGeoJson3413, patchZip, shapefileZip, WKT_3413 } from './chartFiles';

const meta = (over: Partial<ChartMeta> = {}): ChartMeta => ({ id: 'c1', sourceName: 'Frostwren test chart', chartTime: '2026-03-04T18:00:00Z', fileName: 'chart.zip', importedAt: '2026-03-05T00:00:00Z', ...over });
const locator = (chart: Awaited<ReturnType<typeof readChartFile>>['chart']) => ({ chart, toPlane: planeOf(chart.crs).toPlane });

describe('SIGRID-3 chart as a zipped shapefile (written with @mapbox/shp-write)', () => {
  it('reads the polygons and their attributes in longitude/latitude', async () => {
    const { chart } = await readChartFile(await shapefileZip(chartGeoJson()), meta());
    expect(chart.geographic).toBe(true);
    expect(chart.polygons).toHaveLength(3);
    expect(chart.polygons[0]?.attributes).toMatchObject({ POLY_TYPE: 'I', CT: '92', SA: '93', FA: '05', CA: null });
    expect(chart.chartTime).toBe('2026-03-04T18:00:00Z');
    const loc = locator(chart);
    expect(chartMatch(loc, 15, 79, 0)).toMatchObject({ polygonIndex: 0, concentration: { tenths: 10 }, stage: 'thick-first-year' });
    expect(chartMatch(loc, 25, 79, 0)).toMatchObject({ polygonIndex: 1, polyType: 'W', concentration: { tenths: 0 } });
    expect(chartMatch(loc, 35, 79, 0)).toMatchObject({ polygonIndex: null, concentration: null });
  });
  it('finds observations on both sides of the antimeridian in the polygon written 170..190', async () => {
    const loc = locator((await readChartFile(await shapefileZip(chartGeoJson()), meta())).chart);
    expect(locateInChart(loc, 175, 71)).toBe(2);
    expect(locateInChart(loc, -175, 71)).toBe(2);
    expect(locateInChart(loc, -169.9, 71)).toBeNull();
    expect(chartMatch(loc, -179.5, 70.5, 0)).toMatchObject({ concentration: { lo: 4, hi: 6, tenths: 5 }, stage: 'young' });
  });
  it('reads a chart in the EPSG:3413 plane from its .prj and tells the two sides of an edge apart', async () => {
    const { chart } = await readChartFile(await shapefileZip(chartGeoJson3413(), WKT_3413), meta());
    expect(chart.geographic).toBe(false);
    const plane = planeOf(chart.crs);
    // The shared edge of the two polygons runs between the projected corners (20 E, 78 N) and
    // (20 E, 80 N); step 300 m off its middle on each side, in the chart plane.
    const a = plane.toPlane(20, 78) as [number, number];
    const b = plane.toPlane(20, 80) as [number, number];
    const mid = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    const n = [(b[1] - a[1]) / len, -(b[0] - a[0]) / len];
    const side = (k: number) => plane.toLonLat(mid[0]! + k * 300 * n[0]!, mid[1]! + k * 300 * n[1]!) as [number, number];
    const [p, q] = [side(1), side(-1)];
    const loc = locator(chart);
    const found = [locateInChart(loc, p[0], p[1]), locateInChart(loc, q[0], q[1])].sort();
    expect(found).toEqual([0, 1]);
    // The east side (larger longitude) is the open water.
    const east = p[0] > q[0] ? p : q;
    expect(locateInChart(loc, east[0], east[1])).toBe(1);
  });
  it('takes the chart date from the user, else refuses without one', async () => {
    const zip = await shapefileZip(chartGeoJson());
    await expect(readChartFile(zip, meta({ chartTime: undefined }))).rejects.toThrow(/no chart date: type the chart's date/);
    await expect(readChartFile(zip, meta({ chartTime: '4 March' }))).rejects.toThrow(/"4 March" is not an ISO 8601/);
    expect((await readChartFile(zip, meta({ chartTime: '2026-03-04' }))).chart.chartTime).toBe('2026-03-04T00:00:00Z');
  });
});

describe('SIGRID-3 chart as GeoJSON', () => {
  it('reads the attributes and the date carried in the file', async () => {
    const fc = { ...chartGeoJson(), chartDate: '2026-03-02T12:00:00Z' };
    const { chart } = await readChartFile(new TextEncoder().encode(JSON.stringify(fc)), meta({ chartTime: undefined, fileName: 'chart.geojson' }));
    expect(chart.chartTime).toBe('2026-03-02T12:00:00Z');
    expect(chart.polygons.map((p) => p.attributes.CT)).toEqual(['92', '01', '46']);
  });
  it('reads a projected GeoJSON named by its crs member', async () => {
    const fc = { ...chartGeoJson3413(), crs: { type: 'name', properties: { name: 'urn:ogc:def:crs:EPSG::3413' } } };
    const { chart } = await readChartFile(new TextEncoder().encode(JSON.stringify(fc)), meta({ fileName: 'chart.geojson' }));
    expect(chartMatch(locator(chart), 15, 79, 0).polygonIndex).toBe(0);
  });
});

describe('hostile chart files: a clear message', () => {
  it('a broken .shx (a record pointing outside the .shp)', async () => {
    const zip = patchZip(await shapefileZip(chartGeoJson()), '.shx', (b) => {
      const c = b.slice();
      new DataView(c.buffer).setInt32(100, 0x7ffff, false);
      return c;
    });
    await expect(readChartFile(zip, meta())).rejects.toThrow(/\.shx: record 1 points to bytes .* outside .*\.shp/);
  });
  it('a cut .shx', async () => {
    const zip = patchZip(await shapefileZip(chartGeoJson()), '.shx', (b) => b.slice(0, b.length - 8));
    await expect(readChartFile(zip, meta())).rejects.toThrow(/\.shx says it is \d+ bytes long but has \d+/);
  });
  it('a .dbf with codes SIGRID-3 does not define', async () => {
    const fc = chartGeoJson();
    fc.features[1]!.properties = { ...fc.features[1]!.properties, CT: '64' };
    fc.features[2]!.properties = { ...fc.features[2]!.properties, SA: 'X9' };
    await expect(readChartFile(await shapefileZip(fc), meta())).rejects.toThrow(/polygon 2: CT "64" is not a SIGRID-3 concentration code; polygon 3: SA "X9" is not a two-digit SIGRID-3 code/);
  });
  it('a shapefile without SIGRID-3 attributes, a zip without .prj, a projection we do not support', async () => {
    const fc = chartGeoJson();
    for (const f of fc.features) f.properties = { NAME: 'x' };
    await expect(readChartFile(await shapefileZip(fc), meta())).rejects.toThrow(/no CT attribute/);
    const { unzipSync, zipSync } = await import('fflate');
    const files = unzipSync(await shapefileZip(chartGeoJson()));
    for (const k of Object.keys(files)) if (k.endsWith('.prj')) delete files[k];
    await expect(readChartFile(zipSync(files), meta())).rejects.toThrow(/holds .*\.shp but no .*\.prj/);
    const merc = WKT_3413.replace('Polar_Stereographic', 'Mercator_1SP').replace(',AUTHORITY["EPSG","3413"]', '');
    await expect(readChartFile(await shapefileZip(chartGeoJson(), merc), meta())).rejects.toThrow(/"Mercator_1SP" is not supported/);
  });
  it('neither a zip nor GeoJSON', async () => {
    await expect(readChartFile(new TextEncoder().encode('not a chart'), meta())).rejects.toThrow(/neither a zipped shapefile nor GeoJSON/);
  });
});
