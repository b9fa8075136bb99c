// Collocation: for each observation, the chart polygon it lies in (from the chart nearest in time
// within a limit) and the grid value at its position (from the grid nearest in time within a
// limit). Projections are passed in as functions, so this stays pure: src/iceinfo builds them
// with proj4 from the chart's or grid's definition.
import type { IsoUtc, Observation, StageKey } from '../model.ts';
import type { ChartPolygon, ConcentrationGrid, IceChart } from './chartModel.ts';
import { sampleGrid, type GridSample } from './gridSample.ts';
import { pointInPolygon } from './polygon.ts';
import { candidates, polygonIndex } from './polygonIndex.ts';
import { readConcentrationCode, readPolyType, readStageCode, type ChartConcentration, type PolyType } from './sigrid3.ts';

/** Longitude/latitude (WGS 84 degrees) to the product's plane; null where undefined. */
export type ToPlane = (lon: number, lat: number) => readonly [number, number] | null;

export interface ChartLocator {
  chart: Pick<IceChart, 'id' | 'sourceName' | 'chartTime' | 'polygons' | 'geographic'>;
  toPlane: ToPlane;
}

export interface GridLocator {
  grid: Pick<ConcentrationGrid, 'id' | 'sourceName' | 'gridTime' | 'width' | 'height' | 'x0' | 'y0' | 'dx' | 'dy' | 'cells'>;
  toPlane: ToPlane;
}

export type GridMethod = 'nearest' | 'bilinear';

export interface CollocationOptions {
  /** Largest time between an observation and a chart, hours. */
  chartMaxHours: number;
  /** Largest time between an observation and a grid, hours. */
  gridMaxHours: number;
}

export const DEFAULT_COLLOCATION: CollocationOptions = { chartMaxHours: 72, gridMaxHours: 36 };

export interface ChartMatch {
  chartId: string;
  sourceName: string;
  chartTime: IsoUtc;
  /** Observation time minus chart time, hours. */
  hoursApart: number;
  /** Index of the polygon in the chart, or null when the position lies in none. */
  polygonIndex: number | null;
  polyType: PolyType | null;
  concentration: ChartConcentration | null;
  ctCode: string | null;
  /** Stage of the thickest ice (SA), and its code. */
  stage: StageKey | null;
  saCode: string | null;
}

export interface GridMatch {
  gridId: string;
  sourceName: string;
  gridTime: IsoUtc;
  hoursApart: number;
  sample: GridSample;
}

export interface Collocation {
  observationId: string;
  chart: ChartMatch | null;
  grid: GridMatch | null;
}

const ms = (t: IsoUtc): number => Date.parse(t);

/** Index of the item nearest in time within maxHours (ties: the later one), by binary search; -1 if none. */
function nearestInTime(sorted: readonly { t: number }[], t: number, maxHours: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((sorted[mid] as { t: number }).t <= t) lo = mid + 1;
    else hi = mid;
  }
  let best = -1;
  let bestHours = 0;
  for (let i = lo - 1; i <= lo; i++) {
    const c = sorted[i];
    if (!c) continue;
    const hours = (t - c.t) / 3_600_000;
    if (Math.abs(hours) > maxHours) continue;
    if (best < 0 || Math.abs(hours) < Math.abs(bestHours) || (Math.abs(hours) === Math.abs(bestHours) && hours < bestHours)) {
      best = i;
      bestHours = hours;
    }
  }
  return best;
}

const hoursFrom = (t: number, item: { t: number }) => (t - item.t) / 3_600_000;

export function locateInChart(loc: ChartLocator, lon: number, lat: number): number | null {
  const p = loc.toPlane(lon, lat);
  if (!p) return null;
  const polys = loc.chart.polygons;
  const ix = polygonIndex(polys);
  const geo = loc.chart.geographic;
  // A geographic ring may be written past 180 degrees: the point is also looked up a turn away
  // (pointInPolygon tries those longitudes itself); the smallest index found wins, as in a scan.
  let best = firstContaining(polys, candidates(ix, p[0], p[1]), p[0], p[1], geo, Infinity);
  if (geo) {
    best = firstContaining(polys, candidates(ix, p[0] - 360, p[1]), p[0], p[1], geo, best);
    best = firstContaining(polys, candidates(ix, p[0] + 360, p[1]), p[0], p[1], geo, best);
  }
  return best === Infinity ? null : best;
}

function firstContaining(polys: IceChart['polygons'], list: readonly number[], x: number, y: number, geographic: boolean, below: number): number {
  for (const i of list) {
    if (i >= below) return below;
    const poly = polys[i];
    if (poly && pointInPolygon(poly.rings, poly.bbox, x, y, geographic)) return i;
  }
  return below;
}

interface DecodedPolygon {
  polyType: PolyType | null;
  concentration: ChartConcentration | null;
  stage: StageKey | null;
}

// Codes are decoded once per polygon, not once per observation.
const decoded = new WeakMap<object, DecodedPolygon>();

function decode(a: ChartPolygon['attributes']): DecodedPolygon {
  const hit = decoded.get(a);
  if (hit) return hit;
  const polyType = readPolyType(a.POLY_TYPE);
  let concentration = readConcentrationCode(a.CT);
  // An open-water polygon without CT is ice free by its type.
  if (polyType === 'W' && concentration === null) concentration = { lo: 0, hi: 0, tenths: 0 };
  if (polyType === 'L' || polyType === 'N') concentration = null;
  const d = { polyType, concentration, stage: readStageCode(a.SA) };
  decoded.set(a, d);
  return d;
}

export function chartMatch(loc: ChartLocator, lon: number, lat: number, hoursApart: number): ChartMatch {
  const idx = locateInChart(loc, lon, lat);
  const a = idx === null ? null : (loc.chart.polygons[idx]?.attributes ?? null);
  const d = a ? decode(a) : null;
  const polyType = d?.polyType ?? null;
  const concentration = d?.concentration ?? null;
  return {
    chartId: loc.chart.id,
    sourceName: loc.chart.sourceName,
    chartTime: loc.chart.chartTime,
    hoursApart,
    polygonIndex: idx,
    polyType,
    concentration,
    ctCode: a?.CT ?? null,
    stage: d?.stage ?? null,
    saCode: a?.SA ?? null,
  };
}

export function collocate(
  observations: readonly Pick<Observation, 'id' | 'time' | 'position'>[],
  charts: readonly ChartLocator[],
  grids: readonly GridLocator[],
  opts: CollocationOptions = DEFAULT_COLLOCATION,
): Map<string, Collocation> {
  const chartsByTime = charts.map((c) => ({ t: ms(c.chart.chartTime), item: c })).sort((a, b) => a.t - b.t);
  const gridsByTime = grids.map((g) => ({ t: ms(g.grid.gridTime), item: g })).sort((a, b) => a.t - b.t);
  const out = new Map<string, Collocation>();
  for (const o of observations) {
    const pos = o.position;
    if (!pos) continue;
    const t = ms(o.time);
    const ci = nearestInTime(chartsByTime, t, opts.chartMaxHours);
    const gi = nearestInTime(gridsByTime, t, opts.gridMaxHours);
    if (ci < 0 && gi < 0) continue;
    let grid: GridMatch | null = null;
    if (gi >= 0) {
      const g = gridsByTime[gi] as { t: number; item: GridLocator };
      const p = g.item.toPlane(pos.lon, pos.lat);
      grid = {
        gridId: g.item.grid.id,
        sourceName: g.item.grid.sourceName,
        gridTime: g.item.grid.gridTime,
        hoursApart: hoursFrom(t, g),
        sample: p ? sampleGrid(g.item.grid, p[0], p[1]) : { kind: 'outside' },
      };
    }
    const c = ci >= 0 ? (chartsByTime[ci] as { t: number; item: ChartLocator }) : null;
    out.set(o.id, { observationId: o.id, chart: c ? chartMatch(c.item, pos.lon, pos.lat, hoursFrom(t, c)) : null, grid });
  }
  return out;
}

/** The grid's concentration in tenths by the chosen method, or null (flag, outside, none). */
export function gridTenths(m: GridMatch | null, method: GridMethod): number | null {
  if (!m || m.sample.kind !== 'value') return null;
  return (method === 'nearest' ? m.sample.nearestPercent : m.sample.bilinearPercent) / 10;
}
