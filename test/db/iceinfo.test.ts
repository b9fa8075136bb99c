import { describe, expect, it } from 'vitest';
import { getDb, InvalidRecordError, listIceCharts, listIceGrids, listIceInfo, saveIceChart, saveIceGrid, setIceInfoVisible, deleteIceInfo, RecordNotFoundError } from '../../src/db';
import { freshDatabasePerTest } from './helpers';
import { storedChart, storedGrid } from '../iceinfo/storedProducts';

freshDatabasePerTest();

const chart = storedChart;
const grid = storedGrid;

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
