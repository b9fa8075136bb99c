// The Exchange screen's flat exports with stored ice information: the derived chart and grid block
// (docs/format.md) follows every other column in CSV, NDJSON and GeoJSON when a chart or grid is
// switched on, is left out when none is, and never enters the JSON log. The values are worked by
// hand from the invented chart and grid below.
import proj4 from 'proj4';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { closeFloeDb, createCruise, openFloeDb, saveIceChart, saveIceGrid, saveObservation, selectDatabase, setIceInfoVisible } from '../../../src/db';
import { buildExport } from '../../../src/features/exchange/exportFiles';
import { FLAT_COLUMNS } from '../../../src/format/flat';
import { ICEINFO_COLUMNS } from '../../../src/format/iceinfoColumns';
import { CRUISE_INPUT, makeObservation } from '../../db/helpers';
import { EPSG_3413, storedChart, storedGrid } from '../../iceinfo/storedProducts';

// The chart's triangle (CT 92, SA 93) is valid 6 h before the observations; the grid's four cells
// round the pole, 40 60 / 80 100 percent, 12 h before.
const chart = storedChart();
const grid = storedGrid({ cells: Uint8Array.from([40, 60, 80, 100]) });

// On the first cell column, 10 km down the rows: nearest is the first cell (40 %), bilinear 40 +
// (80 - 40) * 10/25 = 56 %.
const [gridLon, gridLat] = proj4(EPSG_3413, 'EPSG:4326', [0, -10_000]) as [number, number];

let n = 0;
let cruiseId = '';
beforeEach(async () => {
  selectDatabase(`floe-export-iceinfo-${process.pid}-${++n}`);
  await openFloeDb();
  cruiseId = (await createCruise(CRUISE_INPUT)).id;
  await saveObservation(makeObservation(cruiseId, { id: 'in-chart', time: '2026-03-05T00:00:00Z', position: { lat: 72, lon: 5, source: 'manual' }, totalConcentration: 8 }));
  await saveObservation(makeObservation(cruiseId, { id: 'on-grid', time: '2026-03-05T00:00:00Z', position: { lat: gridLat, lon: gridLon, source: 'manual' }, totalConcentration: 5, categories: [] }));
});
afterEach(() => closeFloeDb());

const text = async (kind: 'csv' | 'ndjson' | 'geojson' | 'log') => (await buildExport(cruiseId, kind)).blob.text();

describe('exports with ice charts and grids', () => {
  it('appends the derived block after every other CSV column, with the hand-worked values', async () => {
    await saveIceChart(chart);
    await saveIceGrid(grid);
    const lines = (await text('csv')).trim().split('\r\n');
    expect(lines[0]).toBe([...FLAT_COLUMNS, ...ICEINFO_COLUMNS].join(','));
    // The block's cells hold no commas or quotes, so the last 16 fields of a line are the block.
    const rows = new Map(lines.slice(1).map((l) => [l.split(',')[0], l.split(',').slice(-ICEINFO_COLUMNS.length)]));
    // CT 92 is 10/10 (WMO/TD-No. 1214); SA 93 is thick first-year ice (WMO/TD-No. 1214); observation 6 h after the chart; the
    // grid does not reach 72 N 5 E.
    expect(rows.get('in-chart')).toEqual(['Frostwren test chart', '2026-03-04T18:00:00Z', '6', 'I', '92', '10', '10', '10', '93', 'Thick first-year ice', 'Frostwren test grid', '2026-03-04T12:00:00Z', '12', 'outside', '', '']);
    expect(rows.get('on-grid')?.slice(10)).toEqual(['Frostwren test grid', '2026-03-04T12:00:00Z', '12', '', '40', '56']);
    // The chart is within its 72 h but the position lies in none of its polygons.
    expect(rows.get('on-grid')?.slice(0, 10)).toEqual(['Frostwren test chart', '2026-03-04T18:00:00Z', '6', '', '', '', '', '', '', '']);
  });

  it('carries the same block in NDJSON and GeoJSON properties, and never in the JSON log', async () => {
    await saveIceGrid(grid);
    const nd = (await text('ndjson')).trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>);
    const onGrid = nd.find((r) => r.observation_id === 'on-grid');
    expect(Object.keys(onGrid ?? {}).slice(-ICEINFO_COLUMNS.length)).toEqual(ICEINFO_COLUMNS);
    expect(onGrid?.grid_concentration_bilinear_percent).toBe(56);
    expect(nd.find((r) => r.observation_id === 'in-chart')?.grid_flag).toBe('outside');
    const geo = JSON.parse(await text('geojson')) as { features: { properties: Record<string, unknown> }[] };
    expect(geo.features.find((f) => f.properties.observation_id === 'on-grid')?.properties.grid_concentration_nearest_percent).toBe(40);
    const log = await text('log');
    expect(log).not.toContain('grid_concentration');
    expect(log).not.toContain('Frostwren test grid');
  });

  it('leaves the block out when no chart or grid is switched on', async () => {
    await saveIceChart(chart);
    await setIceInfoVisible('chart', 'chart-1', false);
    const header = (await text('csv')).split('\r\n')[0];
    expect(header).toBe(FLAT_COLUMNS.join(','));
  });
});
