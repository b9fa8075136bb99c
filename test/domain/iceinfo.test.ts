import { describe, expect, it } from 'vitest';
import {
  agreement,
  agreementFigures,
  agreementScatter,
  agreementSeries,
  disagreementFindings,
  locateInChart,
  withDisagreements,
  type Collocation,
  chartPairs,
  collocate,
  GRID_FLAG,
  gridPairs,
  pointInPolygon,
  pointInRings,
  readConcentrationCode,
  readStageCode,
  ringBbox,
  sampleGrid,
  unwrapLongitudes,
  type AgreementPair,
  type ChartAttributes,
  type ChartLocator,
  type GridLocator,
} from '../../src/domain/collocation';

const attrs = (a: Partial<ChartAttributes>): ChartAttributes => ({ POLY_TYPE: 'I', CT: null, CA: null, SA: null, FA: null, CB: null, SB: null, FB: null, CC: null, SC: null, FC: null, CN: null, CD: null, ...a });

describe('SIGRID-3 codes read back (WMO/TD-No. 1214)', () => {
  it('reads single values, 9+/10, 10/10, ranges and unknown', () => {
    // WMO/TD-No. 1214 concentration table: 00 ice free, 01 < 1/10, 10..90 one value, 91 9+/10,
    // 92 10/10, "ab" ranges (46 = 4-6/10), 99 unknown.
    expect(readConcentrationCode('00')).toEqual({ lo: 0, hi: 0, tenths: 0 });
    expect(readConcentrationCode('01')).toEqual({ lo: 0, hi: 1, tenths: 0 });
    expect(readConcentrationCode('30')).toEqual({ lo: 3, hi: 3, tenths: 3 });
    expect(readConcentrationCode('91')).toEqual({ lo: 9, hi: 10, tenths: 9.5 });
    expect(readConcentrationCode('92')).toEqual({ lo: 10, hi: 10, tenths: 10 });
    expect(readConcentrationCode('46')).toEqual({ lo: 4, hi: 6, tenths: 5 });
    expect(readConcentrationCode(79)).toEqual({ lo: 7, hi: 9, tenths: 8 });
    expect(readConcentrationCode('99')).toBeNull();
    expect(readConcentrationCode('')).toBeNull();
    expect(readConcentrationCode('64')).toBeNull(); // a range must rise
    expect(readConcentrationCode('ab')).toBeNull();
  });
  it('reads stage codes to the WMO-No. 259 stages', () => {
    // WMO/TD-No. 1214 stage table: 81 new, 83 young, 86 first-year, 87 thin FY, 91 medium FY,
    // 93 thick FY, 95 old, 97 multi-year; 80 no stage, 99 unknown.
    expect(readStageCode('81')).toBe('new');
    expect(readStageCode('83')).toBe('young');
    expect(readStageCode('86')).toBe('first-year');
    expect(readStageCode('91')).toBe('medium-first-year');
    expect(readStageCode('93')).toBe('thick-first-year');
    expect(readStageCode('95')).toBe('old');
    expect(readStageCode('97')).toBe('multi-year');
    expect(readStageCode('80')).toBeNull();
    expect(readStageCode('99')).toBeNull();
    expect(readStageCode('50')).toBeNull();
  });
});

describe('point in polygon', () => {
  const square = [0, 0, 10, 0, 10, 10, 0, 10, 0, 0];
  const hole = [4, 4, 6, 4, 6, 6, 4, 6, 4, 4];
  it('tells the two sides of an edge apart and honours holes', () => {
    expect(pointInRings([square], 9.999, 5)).toBe(true);
    expect(pointInRings([square], 10.001, 5)).toBe(false);
    expect(pointInRings([square], 10, 5)).toBe(true); // on the edge: inside
    expect(pointInRings([square, hole], 5, 5)).toBe(false);
    expect(pointInRings([square, hole], 3.9, 5)).toBe(true);
  });
  it('finds a point across the antimeridian in a ring written either way', () => {
    // One ring from 170 E to 170 W written with a jump (170 .. -170), one with 190.
    const jump = unwrapLongitudes([170, 60, -170, 60, -170, 70, 170, 70, 170, 60]);
    expect(jump).toEqual([170, 60, 190, 60, 190, 70, 170, 70, 170, 60]);
    const bbox = ringBbox(jump);
    expect(pointInPolygon([jump], bbox, -175, 65, true)).toBe(true); // 175 W
    expect(pointInPolygon([jump], bbox, 175, 65, true)).toBe(true); // 175 E
    expect(pointInPolygon([jump], bbox, -165, 65, true)).toBe(false); // 165 W, outside
    expect(pointInPolygon([jump], bbox, 165, 65, true)).toBe(false);
    expect(pointInPolygon([jump], bbox, 180, 65, true)).toBe(true);
  });
});

describe('grid sampling', () => {
  // 3 x 3 cells of 10 m, row 0 on top (north), centres at x 0,10,20 and y 20,10,0.
  const P = 255;
  const g = { width: 3, height: 3, x0: 0, y0: 20, dx: 10, dy: -10, cells: Uint8Array.from([0, 20, 40, 60, 80, GRID_FLAG.land, P, 100, GRID_FLAG.poleHole]) };
  it('nearest cell and bilinear between four centres', () => {
    const s = sampleGrid(g, 4, 16); // nearest centre (0, 20): 0 %
    expect(s).toMatchObject({ kind: 'value', nearestPercent: 0, row: 0, col: 0 });
    // Bilinear by hand: tx = 0.4, ty = 0.4 between 0, 20 (row 0) and 60, 80 (row 1):
    // 0.36*0 + 0.24*20 + 0.24*60 + 0.16*80 = 32.
    expect(s.kind === 'value' && s.bilinearPercent).toBeCloseTo(32, 10);
  });
  it('leaves flagged neighbours out and renormalises', () => {
    // Between cells (1,1)=80, (1,2)=land, (2,1)=100, (2,2)=pole hole, at tx = ty = 0.2: weights
    // 0.64 (80), 0.16 (land, out), 0.16 (100), 0.04 (pole hole, out): (0.64*80 + 0.16*100)/0.8 = 84.
    const s = sampleGrid(g, 12, 8);
    expect(s).toMatchObject({ kind: 'value', nearestPercent: 80 });
    expect(s.kind === 'value' && s.bilinearPercent).toBeCloseTo(84, 10);
  });
  it('reports the flag of the nearest cell, and outside', () => {
    expect(sampleGrid(g, 20, 10)).toMatchObject({ kind: 'flag', flag: 'land' });
    expect(sampleGrid(g, 19, 1)).toMatchObject({ kind: 'flag', flag: 'poleHole' });
    expect(sampleGrid(g, 0, 0)).toMatchObject({ kind: 'flag', flag: 'missing' });
    expect(sampleGrid(g, 26, 10)).toEqual({ kind: 'outside' });
    expect(sampleGrid(g, -5.1, 10)).toEqual({ kind: 'outside' });
  });
});

describe('collocation', () => {
  const ident = (lon: number, lat: number) => [lon, lat] as const;
  const chart = (id: string, t: string, ct: string): ChartLocator => ({
    chart: { id, sourceName: id, chartTime: t, geographic: true, polygons: [{ rings: [[0, 70, 10, 70, 10, 80, 0, 80, 0, 70]], bbox: [0, 70, 10, 80], attributes: attrs({ CT: ct, SA: '86' }) }] },
    toPlane: ident,
  });
  const obs = (id: string, t: string, lon: number, lat: number, total: number | null = 8) => ({ id, time: t, position: { lat, lon, source: 'manual' as const }, observerId: 'ob1', totalConcentration: total, deleted: false });
  it('takes the chart nearest in time within the limit', () => {
    const charts = [chart('mon', '2026-03-02T00:00:00Z', '30'), chart('thu', '2026-03-05T00:00:00Z', '92')];
    const list = [obs('a', '2026-03-03T06:00:00Z', 5, 75), obs('b', '2026-03-03T18:00:00Z', 5, 75), obs('c', '2026-03-12T00:00:00Z', 5, 75), obs('d', '2026-03-03T06:00:00Z', 20, 75)];
    const c = collocate(list, charts, [], { chartMaxHours: 72, gridMaxHours: 24 });
    expect(c.get('a')?.chart).toMatchObject({ chartId: 'mon', hoursApart: 30, concentration: { tenths: 3 }, stage: 'first-year', polygonIndex: 0 });
    expect(c.get('b')?.chart).toMatchObject({ chartId: 'thu', hoursApart: -30, concentration: { tenths: 10 } });
    expect(c.has('c')).toBe(false); // 7 days from either chart
    expect(c.get('d')?.chart).toMatchObject({ chartId: 'mon', polygonIndex: null, concentration: null });
  });
  it('samples the grid nearest in time', () => {
    const grid: GridLocator = { grid: { id: 'g', sourceName: 'g', gridTime: '2026-03-03T12:00:00Z', width: 2, height: 2, x0: 0, y0: 80, dx: 10, dy: -10, cells: Uint8Array.from([50, 70, 90, 100]) }, toPlane: ident };
    const c = collocate([obs('a', '2026-03-03T00:00:00Z', 5, 75, 9)], [], [grid], { chartMaxHours: 1, gridMaxHours: 24 });
    const m = c.get('a')?.grid;
    expect(m?.hoursApart).toBe(-12);
    // Nearest: (5, 75) is equidistant; Math.round picks col 1, row 1 (100 %). Bilinear: the mean, 77.5 %.
    expect(m?.sample).toMatchObject({ kind: 'value', nearestPercent: 100, bilinearPercent: 77.5 });
    const list = [obs('a', '2026-03-03T00:00:00Z', 5, 75, 9)];
    expect(gridPairs(list, c, 'bilinear')[0]?.difference).toBeCloseTo(9 - 7.75, 10);
    expect(gridPairs(list, c, 'nearest')[0]?.difference).toBeCloseTo(-1, 10);
    expect(chartPairs(list, c)).toEqual([]);
  });
});

describe('agreement figures', () => {
  const pair = (id: string, observed: number, product: number, observerId = 'ob1'): AgreementPair => ({ observationId: id, time: `2026-03-03T0${id}:00:00Z`, observerId, observed, product, difference: observed - product });
  it('count, mean, RMS and shares within 1/10 and 2/10, by hand', () => {
    // Differences 0, 1, -2, 3: mean 0.5; RMS sqrt((0+1+4+9)/4) = sqrt(3.5); within 1: 2/4; within 2: 3/4.
    const pairs = [pair('1', 9, 9), pair('2', 9, 8), pair('3', 3, 5, 'ob2'), pair('4', 0, -3)];
    const f = agreementFigures(pairs);
    expect(f.count).toBe(4);
    expect(f.meanDifference).toBeCloseTo(0.5, 12);
    expect(f.rmsDifference).toBeCloseTo(Math.sqrt(3.5), 12);
    expect(f.within1Share).toBe(0.5);
    expect(f.within2Share).toBe(0.75);
    const a = agreement(pairs, 2);
    expect(a.largest.map((p) => p.observationId)).toEqual(['4', '3']);
    expect(a.byRegime.pack.count).toBe(2);
    expect(a.byRegime.marginal.count).toBe(1);
    expect(a.byRegime['open-water'].count).toBe(1);
    expect(a.byObserver.ob2?.meanDifference).toBe(-2);
    expect(agreementFigures([]).meanDifference).toBeNull();
  });
});

describe('the largest disagreements as Review findings, and the plots of the pairs', () => {
  const pair = (id: string, hour: number, observed: number, product: number): AgreementPair => ({ observationId: id, time: `2026-03-03T${String(hour).padStart(2, '0')}:00:00Z`, observerId: 'ob1', observed, product, difference: observed - product });
  // Chart pairs: differences 0, +1, -3 (CT 46 read as 5/10, the middle of 4-6: WMO/TD-No. 1214),
  // +2.5; grid pairs (bilinear): +2.0 exactly and -6.5.
  const chart = [pair('a', 1, 9, 9), pair('b', 2, 9, 8), pair('c', 3, 2, 5), pair('d', 4, 10, 7.5)];
  const grid = [pair('a', 1, 9, 7), pair('e', 5, 1, 7.5)];
  const coll = new Map<string, Collocation>([
    ['c', { observationId: 'c', chart: { chartId: 'k', sourceName: 'Test chart', chartTime: '2026-03-03T00:00:00Z', hoursApart: 3, polygonIndex: 0, polyType: 'I', concentration: readConcentrationCode('46'), ctCode: '46', stage: null, saCode: null }, grid: null }],
  ]);
  const report = { chart: agreement(chart), grid: agreement(grid), gridMethod: 'bilinear' as const };
  const reviewed = { reviews: [{ code: 'grid-disagreement', path: 'totalConcentration', comment: 'Melt ponds fooled the sensor.', by: 'Chief', at: '2026-03-04T00:00:00Z' }] };

  it('lists the pairs more than 2/10 apart, largest first per product, with their reviews', () => {
    const f = disagreementFindings(report, coll, new Map([['e', reviewed]]));
    // |2.0| is not beyond 2/10 (the agreement table counts it within 2/10): only c, d and e.
    expect(f.map((x) => [x.code, x.observationId, x.severity, x.path])).toEqual([
      ['chart-disagreement', 'c', 'info', 'totalConcentration'],
      ['chart-disagreement', 'd', 'info', 'totalConcentration'],
      ['grid-disagreement', 'e', 'info', 'totalConcentration'],
    ]);
    expect(f[0]?.message).toBe('Observed 2/10, chart "Test chart" (valid 2026-03-03T00:00:00Z) CT 46, read as 5/10: difference -3.0 tenths.');
    expect(f[1]?.message).toContain('difference +2.5 tenths');
    expect(f[2]?.message).toContain('75 % (bilinear): difference -6.5 tenths');
    expect(f[2]?.review?.comment).toBe('Melt ponds fooled the sensor.');
    expect(f[0]?.review).toBeNull();
    expect(new Set(f.map((x) => x.key)).size).toBe(3);
  });

  it('merges them into the rule findings in time order', () => {
    const f = disagreementFindings(report, coll, new Map());
    const rule = { severity: 'warning' as const, code: 'x', path: 'p', message: 'm', observationId: 'z', time: '2026-03-03T03:30:00Z', observerId: 'ob1', scope: 'observation' as const, key: 'z|x|p', review: null };
    expect(withDisagreements([rule], f).map((x) => x.observationId)).toEqual(['c', 'z', 'd', 'e']);
    expect(withDisagreements([rule], [])).toEqual([rule]);
  });

  it('lays the pairs out for the scatter (by product value) and the time series (by time)', () => {
    const s = agreementScatter(chart, grid);
    expect(s.product).toEqual([5, 7, 7.5, 7.5, 8, 9]);
    expect(s.chartObserved).toEqual([2, null, 10, null, 9, 9]);
    expect(s.gridObserved).toEqual([null, 9, null, 1, null, null]);
    const t = agreementSeries(chart, grid);
    // 2026-03-03T01:00:00Z is 1,772,499,600 s after 1970 (Date.UTC by hand: 20,515 days + 1 h).
    expect(t.time[0]).toBe(1_772_499_600);
    expect(t.time).toHaveLength(6);
    expect(t.chartDifference).toEqual([0, null, 1, -3, 2.5, null]);
    expect(t.gridDifference).toEqual([null, 2, null, null, null, -6.5]);
  });
});

describe('the polygon index of a chart', () => {
  it('finds the same first polygon as a scan of every polygon, across the antimeridian and on edges', () => {
    // Overlapping boxes and triangles, some written with longitudes past 180 (170..190), some
    // from -180; points on a lattice that hits their edges and corners exactly.
    const polygons: ChartLocator['chart']['polygons'] = [];
    for (let k = 0; k < 300; k++) {
      const lon = -180 + ((k * 37) % 380);
      const lat = 60 + ((k * 7) % 25);
      const w = 1 + (k % 7);
      const h = 0.5 + (k % 5) * 0.5;
      const ring = k % 3 === 0 ? [lon, lat, lon + w, lat, lon + w, lat + h, lon, lat] : [lon, lat, lon + w, lat, lon + w, lat + h, lon, lat + h, lon, lat];
      polygons.push({ rings: [ring], bbox: ringBbox(ring), attributes: { POLY_TYPE: 'I', CT: '92', CA: null, SA: null, FA: null, CB: null, SB: null, FB: null, CC: null, SC: null, FC: null, CN: null, CD: null } });
    }
    const loc: ChartLocator = { chart: { id: 'k', sourceName: 's', chartTime: '2026-03-03T00:00:00Z', polygons, geographic: true }, toPlane: (lon, lat) => [lon, lat] };
    const scan = (lon: number, lat: number) => {
      const i = polygons.findIndex((p) => pointInPolygon(p.rings, p.bbox, lon, lat, true));
      return i < 0 ? null : i;
    };
    let found = 0;
    for (let lon = -180; lon <= 180; lon += 0.5) {
      for (let lat = 59.5; lat <= 87; lat += 0.5) {
        const want = scan(lon, lat);
        if (want !== null) found++;
        expect(locateInChart(loc, lon, lat)).toBe(want);
      }
    }
    expect(found).toBeGreaterThan(1000);
  });
});
