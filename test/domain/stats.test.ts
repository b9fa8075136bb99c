// Cruise review figures on small logs computed by hand (each expected value says how), the
// POLARIS values from IMO MSC.1/Circ.1519 Table 1.3, distances from GeographicLib
// (geographiclib-geodesic) called independently here.
import { describe, expect, it } from 'vitest';
import geographiclib from 'geographiclib-geodesic';
import type { Cruise, IceCategory, Observation } from '../../src/domain/model.ts';
import { attributeTime, iceRegime, latitudeBandLabel, reviewCruise, type ReviewInput } from '../../src/domain/stats.ts';
import { makeDemoCruise } from '../../src/domain/demo.ts';

const geod = geographiclib.Geodesic.WGS84;
const NM = 1852;
const refM = (lat1: number, lon1: number, lat2: number, lon2: number): number => geod.Inverse(lat1, lon1, lat2, lon2).s12 as number;
const H = 3_600_000;
const T0 = Date.parse('2026-03-01T00:00:00Z');
const iso = (hours: number): string => new Date(T0 + hours * H).toISOString().replace('.000Z', 'Z');

const cruise: Pick<Cruise, 'iceClass' | 'intervalMinutes' | 'observers'> = {
  iceClass: 'PC7',
  intervalMinutes: 60,
  observers: [
    { id: 'A', name: 'Observer A', initials: 'OA' },
    { id: 'B', name: 'Observer B', initials: 'OB' },
  ],
};

let seq = 0;
function obs(hours: number, observerId: string, total: number | null, categories: IceCategory[], lat: number | null, extra: Partial<Observation> = {}): Observation {
  seq++;
  return {
    id: `o${seq}`, cruiseId: 'c', time: iso(hours),
    position: lat === null ? null : { lat, lon: 0, source: 'gps-serial' },
    observerId, totalConcentration: total, categories, notes: '', photoIds: [],
    revision: 1, savedAt: iso(hours), savedBy: observerId, deviceId: 'd', deleted: false, ...extra,
  };
}

describe('time attribution', () => {
  it('each observation stands for the time to the next, capped at 1.5 intervals; the last for one interval', () => {
    // Hourly: 0, 1, 2, 5, 5.5 h. Hand-computed: 1, 1, min(3, 1.5) = 1.5 (gap after), 0.5, 1 (last).
    const a = attributeTime([0, 1, 2, 5, 5.5].map((h) => h * H), 60);
    expect([...a.durationsMs].map((d) => d / H)).toEqual([1, 1, 1.5, 0.5, 1]);
    expect([...a.gapAfter]).toEqual([0, 0, 1, 0, 0]);
    expect(a.capMs).toBe(1.5 * H);
  });
});

describe('ice regimes (WMO-No. 259 open water below 1/10; marginal 15-80 % common practice)', () => {
  it('classifies tenths', () => {
    expect([0, 1, 2, 8, 9, 10, null].map(iceRegime)).toEqual(['open-water', 'fringe', 'marginal', 'marginal', 'pack', 'pack', 'not-judged']);
  });
});

describe('a four-observation log, hand-computed', () => {
  // o1 00:00 A  open water 0/10                                 69.9°N 0°
  // o2 01:00 A  3/10 grey ice 12 cm (single category)           70.0°N 0°
  // o3 02:00 B  9/10: 6/10 thick first-year 150 cm, 2/10 ridged;
  //                   3/10 grey-white 20 cm, 0/10 ridged         70.6°N 0°
  //             (3 h to the next: a gap)
  // o4 05:00 B  10/10 medium first-year 110 cm (single)          71.2°N 0°
  seq = 0;
  const o1 = obs(0, 'A', 0, [], 69.9, { weather: { airTempC: -5, waterTempC: 0.5 } });
  const o2 = obs(1, 'A', 3, [{ partialConcentration: 0, stage: 'grey', thicknessCm: 12 }], 70.0, { weather: { airTempC: -6 } });
  const o3 = obs(2, 'B', 9, [
    { partialConcentration: 6, stage: 'thick-first-year', thicknessCm: 150 },
    { partialConcentration: 3, stage: 'grey-white', thicknessCm: 20 },
  ], 70.6, { deformation: { a: { ridgedTenths: 2, sailHeightM: 1 }, b: { ridgedTenths: 0 } } });
  const o4 = obs(5, 'B', 10, [{ partialConcentration: 10, stage: 'medium-first-year', thicknessCm: 110 }], 71.2);
  const deleted = obs(3, 'A', 10, [], 80, { deleted: true });
  // Given out of order, with a deleted observation that must not count.
  const input: ReviewInput = { cruise, observations: [o3, o1, deleted, o4, o2] };
  const r = reviewCruise(input);
  const s = r.summary;
  // GeographicLib legs along the meridian 0°.
  const d12 = refM(69.9, 0, 70.0, 0);
  const d23 = refM(70.0, 0, 70.6, 0);
  const d34 = refM(70.6, 0, 71.2, 0);

  it('counts, span, hours and gaps', () => {
    expect(s.observations).toBe(4);
    expect(s.firstTime).toBe(iso(0));
    expect(s.lastTime).toBe(iso(5));
    expect(s.spanHours).toBe(5);
    // 1 + 1 + 1.5 + 1 (last) = 4.5; the gap o3..o4 is 3 h of which 1.5 h is unobserved.
    expect(s.observedHours).toBe(4.5);
    expect(s.unobservedHours).toBe(1.5);
    expect(s.gaps).toEqual([{ beforeId: o3.id, afterId: o4.id, fromMs: T0 + 2 * H, toMs: T0 + 5 * H, missedObservations: 2, unobservedHours: 1.5 }]);
    expect(s.observers.map((o) => [o.initials, o.observations, o.hours])).toEqual([['OA', 2, 2], ['OB', 2, 2.5]]);
  });

  it('distance from the observation positions (no track), checked against GeographicLib', () => {
    expect(s.distanceSource).toBe('observations');
    expect(s.sailedNm * NM).toBeCloseTo(d12 + d23 + d34, 2);
    // o1 stands for 0-1 h = leg 1-2; o2 for leg 2-3; o3 for 2-3.5 h = half of leg 3-4 (3 h long);
    // o4 for 5-6 h, after the last position: nothing. Unobserved: the other half of leg 3-4.
    expect(s.regimes.find((x) => x.regime === 'open-water')?.distanceNm ?? NaN).toBeCloseTo(d12 / NM, 5);
    expect(s.marginal.distanceNm * NM).toBeCloseTo(d23, 2);
    expect(s.pack.distanceNm * NM).toBeCloseTo(d34 / 2, 2);
    expect(s.inIce.distanceNm * NM).toBeCloseTo(d23 + d34 / 2, 2);
    expect(s.unobservedNm * NM).toBeCloseTo(d34 / 2, 2);
  });

  it('hours in ice, marginal ice zone and pack', () => {
    // In ice: o2 (1 h) + o3 (1.5 h) + o4 (1 h) = 3.5 h; marginal: o2 (3/10) = 1 h; pack: o3 + o4 = 2.5 h.
    expect(s.inIce.hours).toBe(3.5);
    expect(s.marginal.hours).toBe(1);
    expect(s.pack.hours).toBe(2.5);
    expect(s.regimes.reduce((a, x) => a + x.hours, 0)).toBe(s.observedHours);
  });

  it('mean concentration, weighted thickness, stage shares, ridged share', () => {
    // (0 + 3 + 9 + 10) / 4 = 5.5 tenths.
    expect(s.ice.meanConcentration).toBe(5.5);
    // Weights: o2 single category takes the total, 3; o3 6 and 3; o4 10. Σw = 22.
    // Σ w h = 3*12 + 6*150 + 3*20 + 10*110 = 36 + 900 + 60 + 1100 = 2096; 2096 / 22 = 95.2727...
    expect(s.ice.meanThicknessCm).toBeCloseTo(2096 / 22, 10);
    // Stage shares by weight: grey 3/22, grey-white 3/22, medium FY 10/22, thick FY 6/22 (thinnest first).
    expect(s.ice.stageShares.map((x) => [x.stage, x.share])).toEqual([
      ['grey', 3 / 22], ['grey-white', 3 / 22], ['medium-first-year', 10 / 22], ['thick-first-year', 6 / 22],
    ]);
    // Ridged share where recorded (o3 only): (6 * 0.2 + 3 * 0) / 9 = 0.1333...
    expect(s.ice.ridgedShare).toBeCloseTo(1.2 / 9, 12);
    // With ridges (ridges.ts, Timco and Burden 1997 ratios): first-year ridge mean thickness
    // 2.475 x 1 m sail = 247.5 cm; o3 thick FY: 0.8 x 150 + 0.2 x 247.5 = 169.5 cm, 19.5 more
    // than level, weight 6: (2096 + 6 x 19.5) / 22.
    expect(s.ice.meanThicknessWithRidgesCm).toBeCloseTo((2096 + 6 * 19.5) / 22, 10);
    expect(reviewCruise({ ...input, ridgeEstimate: null }).summary.ice.meanThicknessWithRidgesCm).toBeNull();
  });

  it('POLARIS for PC7 (IMO MSC.1/Circ.1519 Table 1.3, PC7 row: ice free 3, grey 2, grey-white 2, medium FY -1, thick FY -2)', () => {
    // o1: 10 x 3 = 30. o2: 3 x 2 + 7 x 3 = 27. o3: 6 x -2 + 3 x 2 + 1 x 3 = -3. o4: 10 x -1 = -10.
    // Table 1.1: PC7 normal >= 0; elevated -10 <= RIO < 0.
    expect(r.series.rio).toEqual([30, 27, -3, null, -10]);
    expect(s.polaris.minRio).toBe(-10);
    expect(s.polaris.minRioObservationId).toBe(o4.id);
    expect(s.polaris.meanRio).toBe((30 + 27 - 3 - 10) / 4);
    const hours = Object.fromEntries(s.polaris.outcomes.map((o) => [o.outcome, o.hours]));
    // normal: o1 + o2 = 2 h; elevated: o3 (1.5 h) + o4 (1 h) = 2.5 h.
    expect(hours).toEqual({ normal: 2, elevated: 2.5, special: 0 });
  });

  it('latitude bands', () => {
    const b = r.bands.bands;
    expect(b.map((x) => [x.south, x.observations, x.hours])).toEqual([[69, 1, 1], [70, 2, 2.5], [71, 1, 1]]);
    // Band 70: concentration (3 + 9) / 2 = 6; thickness (36 + 960) / 12 = 83 cm; stages grey 3/12,
    // grey-white 3/12, thick FY 6/12.
    expect(b[1]?.meanConcentration).toBe(6);
    expect(b[1]?.meanThicknessCm).toBe(83);
    expect(b[1]?.stageShares.map((x) => x.share)).toEqual([0.25, 0.25, 0.5]);
    expect(b[0]?.meanThicknessCm).toBeNull();
    expect(latitudeBandLabel(70)).toBe('70°N to 71°N');
    expect(latitudeBandLabel(-66)).toBe('66°S to 65°S');
    expect(latitudeBandLabel(-1)).toBe('1°S to 0°');
  });

  it('handover: A to B at 01:00-02:00 only (o3 to o4 is a gap, o1 to o2 the same observer)', () => {
    const h = r.handover;
    expect(h.pairs).toHaveLength(1);
    const p = h.pairs[0]!;
    expect([p.fromObserverId, p.toObserverId, p.handovers]).toEqual(['A', 'B', 1]);
    // Concentration 9 - 3 = 6; thickness o3 (900 + 60) / 9 = 106.67 minus o2 12 = 94.67 cm.
    expect(p.concentration.meanDiff).toBe(6);
    expect(p.thicknessCm.meanDiff).toBeCloseTo(960 / 9 - 12, 10);
    expect(h.observers.find((o) => o.observerId === 'A')?.concentration.meanDiff).toBe(-6);
    expect(h.observers.find((o) => o.observerId === 'B')?.concentration.meanDiff).toBe(6);
    // Same observer o1 -> o2: concentration +3; thickness not on both sides.
    expect(h.sameObserver.pairs).toBe(1);
    expect(h.sameObserver.concentration.meanDiff).toBe(3);
    expect(h.sameObserver.thicknessCm.count).toBe(0);
  });

  it('chart series with a null row at the end of the capped time before the gap', () => {
    const sr = r.series;
    expect(sr.time).toEqual([0, 1, 2, 3.5, 5].map((h) => (T0 + h * H) / 1000));
    expect(sr.totalConcentration).toEqual([0, 3, 9, null, 10]);
    expect(sr.levelThicknessCm[3]).toBeNull();
    expect(sr.levelThicknessCm[4]).toBe(110);
    expect(sr.airTempC).toEqual([-5, -6, null, null, null]);
    expect(sr.waterTempC).toEqual([0.5, null, null, null, null]);
    expect(sr.observationId).toEqual([o1.id, o2.id, o3.id, null, o4.id]);
  });

  it('an observer filter keeps attribution and distance sailed of the whole cruise', () => {
    const onlyB = reviewCruise({ ...input, include: (o) => o.observerId === 'B' });
    expect(onlyB.summary.observations).toBe(2);
    expect(onlyB.summary.observedHours).toBe(2.5);
    expect(onlyB.summary.sailedNm).toBeCloseTo(s.sailedNm, 12);
    expect(onlyB.summary.pack.hours).toBe(2.5);
    expect(onlyB.summary.marginal.hours).toBe(0);
    expect(onlyB.handover.pairs).toEqual(r.handover.pairs);
  });

  it('uses the ridge estimate when given one', () => {
    // A stand-in estimate: level thickness plus 10 cm for each tenth ridged (test only).
    const withRidges = reviewCruise({ ...input, ridgeEstimate: (c, d) => (c.thicknessCm === undefined ? null : c.thicknessCm + 10 * (d?.ridgedTenths ?? 0)) });
    // Σ w h' = 2096 + 6 * 20 = 2216 over 22.
    expect(withRidges.summary.ice.meanThicknessWithRidgesCm).toBeCloseTo(2216 / 22, 10);
  });
});

describe('distance from the track when there is one', () => {
  it('gives each observation the track distance of its attributed time (GeographicLib legs)', () => {
    seq = 100;
    const a = obs(0, 'A', 0, [], 70);
    const b = obs(1, 'A', 9, [{ partialConcentration: 9, stage: 'grey', thicknessCm: 12 }], 70.2);
    // Track at 0 h, 2 h: one leg of 0.2° of latitude, 2 h long.
    const track = [
      { cruiseId: 'c', time: iso(0), lat: 70, lon: 0, source: 'gps-serial' as const },
      { cruiseId: 'c', time: iso(2), lat: 70.2, lon: 0, source: 'gps-serial' as const },
    ];
    const r = reviewCruise({ cruise, observations: [a, b], track });
    const leg = refM(70, 0, 70.2, 0);
    expect(r.summary.distanceSource).toBe('track');
    expect(r.summary.sailedNm * NM).toBeCloseTo(leg, 2);
    // a stands for 0-1 h (half the leg, open water), b for 1-2 h (the other half, pack).
    expect(r.summary.pack.distanceNm * NM).toBeCloseTo(leg / 2, 2);
    expect(r.summary.unobservedNm).toBeCloseTo(0, 9);
  });
});

describe('the demo cruise', () => {
  const demo = makeDemoCruise();
  const r = reviewCruise({ cruise: demo.cruise, observations: demo.observations, track: demo.track });
  const s = r.summary;

  it('finds exactly the gaps the demo documents', () => {
    const gaps = s.gaps.map((g) => [new Date(g.fromMs).toISOString().replace('.000Z', 'Z'), new Date(g.toMs).toISOString().replace('.000Z', 'Z'), g.missedObservations]);
    expect(gaps).toEqual(demo.gaps.map((g) => [g.before, g.after, g.missedHours]));
  });

  it('adds up: hours and distances of the regimes cover the cruise', () => {
    expect(s.observations).toBe(demo.observations.length);
    // Span plus the last observation's interval is every hour of the cruise.
    expect(s.observedHours + s.unobservedHours).toBeCloseTo(s.spanHours + 1, 9);
    expect(s.regimes.reduce((a, x) => a + x.hours, 0)).toBeCloseTo(s.observedHours, 9);
    expect(s.regimes.reduce((a, x) => a + x.distanceNm, 0) + s.unobservedNm).toBeCloseTo(s.sailedNm, 6);
    expect(s.polaris.outcomes.reduce((a, x) => a + x.hours, 0) + s.polaris.notAssessed.hours).toBeCloseTo(s.observedHours, 9);
    expect(r.bands.bands.reduce((a, b) => a + b.observations, 0)).toBe(s.observations);
  });

  it('the track distance equals GeographicLib summed over the demo track', () => {
    let m = 0;
    for (let i = 1; i < demo.track.length; i++) {
      const p = demo.track[i - 1]!;
      const q = demo.track[i]!;
      m += refM(p.lat, p.lon, q.lat, q.lon);
    }
    expect(s.sailedNm * NM).toBeCloseTo(m, 0);
  });
});
