// Ice charts and concentration grids: the store side. The files are read and checked by
// src/iceinfo before anything reaches here; these functions check the shape once more and write
// in one transaction, so a refused or failed import leaves the tables as they were.
import type { ConcentrationGrid, IceChart } from '../domain/collocation/chartModel';
import { getDb, writableDb } from './connection';
import { InvalidRecordError, mapWriteError, RecordNotFoundError } from './errors';
import type { IceChartRow, IceGridRow, IceInfoSummary } from './rows';
import { isIsoUtc } from './validate';

function fail(table: string, path: string, detail: string): never {
  throw new InvalidRecordError(table, path, detail);
}

function checkCommon(table: string, r: { id: unknown; sourceName: unknown; importedAt: unknown; fileName: unknown; crs: unknown }, time: [string, unknown]) {
  if (typeof r.id !== 'string' || r.id === '') fail(table, 'id', 'must be a non-empty text');
  if (typeof r.sourceName !== 'string' || r.sourceName.trim() === '') fail(table, 'sourceName', 'must name the source');
  if (typeof r.fileName !== 'string') fail(table, 'fileName', 'must be text');
  if (typeof r.crs !== 'string' || r.crs === '') fail(table, 'crs', 'must be a projection definition');
  if (!isIsoUtc(time[1])) fail(table, time[0], `must be an ISO 8601 UTC time such as 2026-03-04T05:00:00Z, got ${JSON.stringify(time[1])}`);
  if (!isIsoUtc(r.importedAt)) fail(table, 'importedAt', 'must be an ISO 8601 UTC time');
}

function checkChart(c: IceChart): void {
  checkCommon('iceCharts', c, ['chartTime', c.chartTime]);
  if (!Array.isArray(c.polygons) || c.polygons.length === 0) fail('iceCharts', 'polygons', 'must hold at least one polygon');
  c.polygons.forEach((p, i) => {
    if (!Array.isArray(p.rings) || p.rings.length === 0) fail('iceCharts', `polygons.${i}.rings`, 'must hold a ring');
    p.rings.forEach((r, k) => {
      if (!Array.isArray(r) || r.length < 6 || r.length % 2 !== 0 || !r.every(Number.isFinite)) fail('iceCharts', `polygons.${i}.rings.${k}`, 'must be pairs of finite numbers, at least three positions');
    });
    if (!Array.isArray(p.bbox) || p.bbox.length !== 4 || !p.bbox.every(Number.isFinite)) fail('iceCharts', `polygons.${i}.bbox`, 'must be four finite numbers');
  });
}

function checkGrid(g: ConcentrationGrid): void {
  checkCommon('iceGrids', g, ['gridTime', g.gridTime]);
  if (!Number.isInteger(g.width) || !Number.isInteger(g.height) || g.width < 1 || g.height < 1) fail('iceGrids', 'width', `and height must be whole numbers of cells, got ${g.width} x ${g.height}`);
  if (!(g.cells instanceof Uint8Array) || g.cells.length !== g.width * g.height) fail('iceGrids', 'cells', `must hold width x height = ${g.width * g.height} bytes`);
  for (const k of ['x0', 'y0', 'dx', 'dy'] as const) if (!Number.isFinite(g[k]) || ((k === 'dx' || k === 'dy') && g[k] === 0)) fail('iceGrids', k, 'must be a finite number (cell sizes not zero)');
}

/** Stores a chart read by src/iceinfo (shown on the map at once). */
export async function saveIceChart(chart: IceChart): Promise<IceChartRow> {
  checkChart(chart);
  const row: IceChartRow = { ...chart, visible: true };
  const db = await writableDb();
  try {
    await db.iceCharts.put(row);
  } catch (err) {
    throw mapWriteError(err, `the chart "${chart.sourceName}"`);
  }
  return row;
}

/** Stores a grid read by src/iceinfo (shown on the map at once). */
export async function saveIceGrid(grid: ConcentrationGrid): Promise<IceGridRow> {
  checkGrid(grid);
  const row: IceGridRow = { ...grid, visible: true };
  const db = await writableDb();
  try {
    await db.iceGrids.put(row);
  } catch (err) {
    throw mapWriteError(err, `the grid "${grid.sourceName}"`);
  }
  return row;
}

export async function listIceCharts(): Promise<IceChartRow[]> {
  return getDb().iceCharts.orderBy('chartTime').toArray();
}

export async function listIceGrids(): Promise<IceGridRow[]> {
  return getDb().iceGrids.orderBy('gridTime').toArray();
}

/** Charts and grids for the lists, newest first, without their polygons or cells. */
export async function listIceInfo(): Promise<IceInfoSummary[]> {
  const db = getDb();
  const out: IceInfoSummary[] = [];
  await db.iceCharts.each((c) => out.push({ kind: 'chart', id: c.id, sourceName: c.sourceName, time: c.chartTime, fileName: c.fileName, importedAt: c.importedAt, visible: c.visible, size: c.polygons.length }));
  await db.iceGrids.each((g) => out.push({ kind: 'grid', id: g.id, sourceName: g.sourceName, time: g.gridTime, fileName: g.fileName, importedAt: g.importedAt, visible: g.visible, size: g.width * g.height }));
  return out.sort((a, b) => (a.time < b.time ? 1 : a.time > b.time ? -1 : a.id.localeCompare(b.id)));
}

const tableOf = (kind: 'chart' | 'grid') => (kind === 'chart' ? 'iceCharts' : 'iceGrids');

export async function setIceInfoVisible(kind: 'chart' | 'grid', id: string, visible: boolean): Promise<void> {
  const db = await writableDb();
  let n: number;
  try {
    n = await db.table(tableOf(kind)).update(id, { visible });
  } catch (err) {
    throw mapWriteError(err, `the ${kind} display switch`);
  }
  if (n === 0 && !(await db.table(tableOf(kind)).get(id))) throw new RecordNotFoundError(tableOf(kind), id);
}

export async function deleteIceInfo(kind: 'chart' | 'grid', id: string): Promise<void> {
  const db = await writableDb();
  try {
    await db.table(tableOf(kind)).delete(id);
  } catch (err) {
    throw mapWriteError(err, `the ${kind} removal`);
  }
}
