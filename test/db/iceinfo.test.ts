import { describe, expect, it } from 'vitest';
import { getDb, InvalidRecordError, listIceCharts, listIceGrids, listIceInfo, saveIceChart, saveIceGrid, setIceInfoVisible, deleteIceInfo, RecordNotFoundError } from '../../src/db';
import type { ConcentrationGrid, IceChart } from '../../src/domain/collocation';
import { freshDatabasePerTest } from './helpers';

freshDatabasePerTest();

const chart = (over: Partial<IceChart> = {}): IceChart => ({
  id: 'chart-1',
  sourceName: 'Frostwren test chart',
  chartTime: '2026-03-04T18:00:00Z',
  importedAt: '2026-03-05T00:00:00Z',
  fileName: 'chart.zip',
  crs: 'EPSG:4326',
  geographic: true,
  polygons: [{ rings: [[0, 70, 10, 70, 10, 80, 0, 70]], bbox: [0, 70, 10, 80], attributes: { POLY_TYPE: 'I', CT: '92', CA: null, SA: '93', FA: null, CB: null, SB: null, FB: null, CC: null, SC: null, FC: null, CN: null, CD: null } }],
  ...over,
});

const grid = (over: Partial<ConcentrationGrid> = {}): ConcentrationGrid => ({
  id: 'grid-1',
  sourceName: 'Frostwren test grid',
  gridTime: '2026-03-04T12:00:00Z',
  importedAt: '2026-03-05T00:00:00Z',
  fileName: 'grid.tif',
  crs: '+proj=stere +lat_0=90 +lat_ts=70 +lon_0=-45 +k=1 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs',
  epsg: 3413,
  width: 2,
  height: 2,
  x0: 0,
  y0: 0,
  dx: 25_000,
  dy: -25_000,
  cells: Uint8Array.from([0, 50, 251, 254]),
  ...over,
});

describe('ice charts and grids in the store (schema version 5)', () => {
  it('saves, lists (newest first), switches and removes', async () => {
    await saveIceChart(chart());
    await saveIceGrid(grid());
    expect((await listIceCharts())[0]?.polygons[0]?.attributes.CT).toBe('92');
    expect(Array.from((await listIceGrids())[0]?.cells ?? [])).toEqual([0, 50, 251, 254]);
    const list = await listIceInfo();
    expect(list.map((x) => [x.kind, x.id, x.visible, x.size])).toEqual([
      ['chart', 'chart-1', true, 1],
      ['grid', 'grid-1', true, 4],
    ]);
    await setIceInfoVisible('grid', 'grid-1', false);
    expect((await listIceGrids())[0]?.visible).toBe(false);
    await expect(setIceInfoVisible('chart', 'nope', false)).rejects.toBeInstanceOf(RecordNotFoundError);
    await deleteIceInfo('chart', 'chart-1');
    expect(await listIceCharts()).toEqual([]);
  });
  it('refuses a malformed chart or grid with a message naming the field, and stores nothing', async () => {
    await expect(saveIceChart(chart({ chartTime: '4 March' }))).rejects.toThrow(/iceCharts field "chartTime" must be an ISO 8601 UTC time/);
    await expect(saveIceChart(chart({ polygons: [{ ...chart().polygons[0]!, rings: [[0, 1, Number.NaN, 2, 3, 4]] }] }))).rejects.toBeInstanceOf(InvalidRecordError);
    await expect(saveIceGrid(grid({ cells: new Uint8Array(3) }))).rejects.toThrow(/iceGrids field "cells" must hold width x height = 4 bytes/);
    await expect(saveIceGrid(grid({ sourceName: ' ' }))).rejects.toThrow(/sourceName/);
    expect(await getDb().iceCharts.count()).toBe(0);
    expect(await getDb().iceGrids.count()).toBe(0);
  });
});
