// `summary --chart/--grid` and `convert --chart/--grid`: a log of four invented observations
// placed in the test chart's polygons and the test grid's cells, and the agreement figures
// computed by hand.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import type { CliIO } from '../../src/cli/command.ts';
import { runCli } from '../../src/cli/main.ts';
import { makeDemoCruise } from '../../src/domain/demo.ts';
import { AGREEMENT_CAUTIONS } from '../../src/domain/collocation/index.ts';
import { exportLogJson } from '../../src/format/encode.ts';
import { FLAT_COLUMNS } from '../../src/format/flat.ts';
import { ICEINFO_COLUMNS } from '../../src/format/iceinfoColumns.ts';
import { KNOWN_GRID_CRS, planeOf } from '../../src/iceinfo/projections.ts';
import { chartGeoJson, shapefileZip } from '../iceinfo/chartFiles.ts';
import { centre, gridNc4, gridTiff } from '../iceinfo/gridFiles.ts';

const dir = mkdtempSync(join(tmpdir(), 'floe-cli-ice-'));
const logFile = join(dir, 'log.json');
const chartZip = join(dir, 'chart.zip');
const chartJson = join(dir, 'chart.geojson');
const gridTif = join(dir, 'grid.tif');
const gridNc = join(dir, 'grid.nc');

async function run(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { stdout: (l) => out.push(l), stderr: (l) => err.push(l) };
  const code = await runCli(argv, io);
  return { code, out, err };
}

beforeAll(async () => {
  const demo = makeDemoCruise(1);
  const [lonG, latG] = planeOf(KNOWN_GRID_CRS[3413]!.proj4).toLonLat(...centre(3, 4)) as [number, number];
  const place = [
    { lon: 15, lat: 79, total: 9 }, // chart: pack ice CT 92 (10/10): -1
    { lon: 25, lat: 79, total: 1 }, // chart: open water CT 01 (0/10): +1
    { lon: -175, lat: 71, total: 2 }, // chart: across the antimeridian, CT 46 (5/10): -3
    { lon: lonG, lat: latG, total: 0 }, // grid cell (3, 4): 5 %, i.e. 0.5/10: -0.5
  ];
  const observations = demo.observations.slice(0, 4).map((o, i) => {
    const p = place[i]!;
    return { ...o, time: `2026-03-04T1${2 + i}:00:00Z`, position: { ...(o.position ?? { source: 'manual' as const }), lat: p.lat, lon: p.lon }, totalConcentration: p.total, categories: p.total === 0 ? [] : o.categories.slice(0, 1).map((c) => ({ ...c, partialConcentration: p.total })), deleted: false };
  });
  const bundle = { cruise: demo.cruise, observations, history: [], conflicts: [], track: [], photos: [] };
  writeFileSync(logFile, exportLogJson(bundle).join(''));
  writeFileSync(chartZip, await shapefileZip(chartGeoJson()));
  writeFileSync(chartJson, JSON.stringify({ ...chartGeoJson(), chartDate: '2026-03-04T18:00:00Z' }));
  writeFileSync(gridTif, await gridTiff());
  writeFileSync(gridNc, await gridNc4());
}, 60_000);

describe('summary with a chart and a grid', { timeout: 60_000 }, () => {
  it('prints the agreement figures, computed by hand', async () => {
    const r = await run('summary', logFile, '--json', '--chart', chartZip, '--chart-time', '2026-03-04T18:00:00Z', '--grid', gridTif, '--grid-time', '2026-03-04T12:00:00Z');
    expect(r.err).toEqual([]);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out[0] as string);
    // Chart differences -1, +1, -3: mean -1, RMS sqrt(11/3), within 1/10: 2 of 3, within 2/10: 2 of 3.
    expect(s.iceInfo.chart.overall.count).toBe(3);
    expect(s.iceInfo.chart.overall.meanDifference).toBeCloseTo(-1, 12);
    expect(s.iceInfo.chart.overall.rmsDifference).toBeCloseTo(Math.sqrt(11 / 3), 12);
    expect(s.iceInfo.chart.overall.within1Share).toBeCloseTo(2 / 3, 12);
    expect(s.iceInfo.chart.largest[0].difference).toBe(-3);
    // Grid: only the observation in cell (3, 4) is on the grid: 0 - 0.5.
    expect(s.iceInfo.grid.overall).toMatchObject({ count: 1, within1Share: 1 });
    expect(s.iceInfo.grid.overall.meanDifference).toBeCloseTo(-0.5, 9);
    expect(s.iceInfo.gridMethod).toBe('bilinear');
    expect(s.iceInfo.products.map((p: { kind: string; resolutionKm: number | null }) => [p.kind, p.resolutionKm])).toEqual([['chart', null], ['grid', 25]]);
    expect(s.iceInfo.cautions).toEqual(AGREEMENT_CAUTIONS);
  });
  it('reads a GeoJSON chart with its own date and a NetCDF-4 grid with its time variable', async () => {
    const r = await run('summary', logFile, '--json', '--chart', chartJson, '--grid', gridNc, '--grid-method', 'nearest');
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out[0] as string);
    expect(s.iceInfo.chart.overall.count).toBe(3);
    expect(s.iceInfo.grid.overall.count).toBe(1);
    expect(s.iceInfo.gridMethod).toBe('nearest');
  });
  it('prints the figures and the cautions as text', async () => {
    const r = await run('summary', logFile, '--chart', chartZip, '--chart-time', '2026-03-04T18:00:00Z');
    expect(r.out.join('\n')).toMatch(/chart: 3 pairs, mean -1\.00, RMS 1\.91, within 1\/10 67 %, within 2\/10 67 %/);
    expect(r.out.join('\n')).toContain('Caution: Neither the ice chart nor the satellite grid is a navigation product');
  });
  it('refuses a chart without a date, and an unknown method, with a clear message', async () => {
    const r = await run('summary', logFile, '--chart', chartZip);
    expect(r.code).toBe(1);
    expect(r.err.join('\n')).toMatch(/chart\.zip carries no chart date/);
    const u = await run('summary', logFile, '--grid', gridTif, '--grid-method', 'cubic');
    expect(u.code).toBe(2);
    expect(u.err.join('\n')).toMatch(/--grid-method "cubic" is not nearest or bilinear/);
  });
});

describe('convert with a chart and a grid', { timeout: 60_000 }, () => {
  it('appends the derived columns at the end of the CSV', async () => {
    const out = join(dir, 'out.csv');
    const r = await run('convert', logFile, '--to', 'csv', '-o', out, '--chart', chartZip, '--chart-time', '2026-03-04T18:00:00Z', '--grid', gridTif, '--grid-time', '2026-03-04T12:00:00Z');
    expect(r.code).toBe(0);
    const parsed = Papa.parse<Record<string, string>>(readFileSync(out, 'utf8'), { header: true, skipEmptyLines: true });
    expect(parsed.meta.fields).toEqual([...FLAT_COLUMNS, ...ICEINFO_COLUMNS]);
    const rows = parsed.data;
    expect(rows[0]).toMatchObject({ chart_ct_sigrid3: '92', chart_total_concentration_tenths: '10', chart_stage_a: 'Thick first-year ice', chart_hours_apart: '-6', grid_flag: 'outside' });
    expect(rows[2]).toMatchObject({ chart_total_concentration_tenths: '5', chart_total_concentration_min_tenths: '4', chart_total_concentration_max_tenths: '6' });
    expect(rows[3]).toMatchObject({ chart_ct_sigrid3: '', grid_concentration_nearest_percent: '5', grid_concentration_bilinear_percent: '5', grid_hours_apart: '3' });
  });
  it('leaves the columns out without ice information', async () => {
    const out = join(dir, 'plain.csv');
    expect((await run('convert', logFile, '--to', 'csv', '-o', out)).code).toBe(0);
    expect(Papa.parse(readFileSync(out, 'utf8'), { header: true }).meta.fields).toEqual([...FLAT_COLUMNS]);
  });
});
