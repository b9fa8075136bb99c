// The review's leg distance and distance timeline against GeographicLib (Karney 2013), called
// independently here through geographiclib-geodesic.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import geographiclib from 'geographiclib-geodesic';
import { legDistanceM, SHORT_LEG_LIMIT_M, buildDistanceTimeline, distanceAt, distanceBetween } from '../../src/domain/stats.ts';

const geod = geographiclib.Geodesic.WGS84;
const ref = (lat1: number, lon1: number, lat2: number, lon2: number): number => geod.Inverse(lat1, lon1, lat2, lon2).s12 as number;

describe('leg distance', () => {
  it('matches GeographicLib within 1e-6 of the length for short legs at every latitude (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -89.99, max: 89.99, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: 1, max: SHORT_LEG_LIMIT_M * 0.99, noNaN: true }),
        (lat, lon, azi, s) => {
          const end = geod.Direct(lat, lon, azi, s);
          const want = ref(lat, lon, end.lat2 as number, end.lon2 as number);
          const got = legDistanceM(lat, lon, end.lat2 as number, end.lon2 as number);
          expect(Math.abs(got - want)).toBeLessThanOrEqual(Math.max(1e-6 * want, 1e-6));
        },
      ),
      { numRuns: 3000, seed: 7 },
    );
  });

  it('is exact GeographicLib for long legs (Wellington to Salamanca, 19959679.267 m, GeographicLib documentation)', () => {
    expect(legDistanceM(-41.32, 174.81, 40.96, -5.5)).toBeCloseTo(19959679.267, 3);
  });

  it('crosses the antimeridian the short way: 179.9°E to 179.9°W at 80°N', () => {
    const want = ref(80, 179.9, 80, -179.9);
    expect(want).toBeLessThan(4000);
    expect(legDistanceM(80, 179.9, 80, -179.9)).toBeCloseTo(want, 3);
  });

  it('is zero for the same fix, and symmetric', () => {
    expect(legDistanceM(82, 15, 82, 15)).toBe(0);
    expect(legDistanceM(82, 15, 82.1, 15.3)).toBeCloseTo(legDistanceM(82.1, 15.3, 82, 15), 9);
  });
});

describe('distance timeline', () => {
  // Three fixes on the meridian 0° at 0 h, 2 h and 6 h.
  const H = 3_600_000;
  const fixes = [
    { timeMs: 0, lat: 70, lon: 0 },
    { timeMs: 2 * H, lat: 70.1, lon: 0 },
    { timeMs: 6 * H, lat: 70.3, lon: 0 },
  ];
  const leg1 = ref(70, 0, 70.1, 0);
  const leg2 = ref(70.1, 0, 70.3, 0);
  // Within 5 mm (toBeCloseTo 2 digits): the short-leg formula agrees to about 1e-8 of the length.
  const tl = buildDistanceTimeline(fixes, 'track');

  it('the total is the sum of the GeographicLib legs', () => {
    expect(tl.totalM).toBeCloseTo(leg1 + leg2, 2);
  });

  it('interpolates at constant speed along each leg and holds at the ends', () => {
    // 1 h is half of leg 1; 4 h is half of leg 2 after leg 1 (hand-computed fractions).
    expect(distanceAt(tl, 1 * H)).toBeCloseTo(leg1 / 2, 2);
    expect(distanceAt(tl, 4 * H)).toBeCloseTo(leg1 + leg2 / 2, 2);
    expect(distanceAt(tl, -H)).toBe(0);
    expect(distanceAt(tl, 9 * H)).toBeCloseTo(leg1 + leg2, 2);
    // 1 h .. 3 h: half of leg 1 plus a quarter of leg 2.
    expect(distanceBetween(tl, 1 * H, 3 * H)).toBeCloseTo(leg1 / 2 + leg2 / 4, 2);
  });

  it('skips fixes that do not advance in time and bad numbers', () => {
    const t2 = buildDistanceTimeline([...fixes.slice(0, 2), { timeMs: 2 * H, lat: 75, lon: 0 }, { timeMs: 3 * H, lat: NaN, lon: 0 }, fixes[2]!], 'track');
    expect(t2.totalM).toBeCloseTo(leg1 + leg2, 2);
    expect(buildDistanceTimeline([fixes[0]!], 'track').source).toBe('none');
  });
});
