import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import geographiclib from 'geographiclib-geodesic';
import {
  alongTrackDistanceM, cumulativeDistancesM, destination, geodesicDistanceM, geodesicInverse,
  interpolatePosition, normaliseLon, pointAlongGeodesic, speedKn, type TimedPoint,
} from '../../src/domain/geodesy.ts';

// Reference: GeographicLib (Karney 2013, "Algorithms for geodesics"), called directly here.
const geod = geographiclib.Geodesic.WGS84;

describe('geodesic distance (WGS 84)', () => {
  it('Wellington to Salamanca is 19959679.267 m (GeographicLib JavaScript documentation example)', () => {
    const r = geodesicInverse({ lat: -41.32, lon: 174.81 }, { lat: 40.96, lon: -5.5 });
    expect(r.distanceM).toBeCloseTo(19959679.267, 3);
    // Azimuth from the same GeographicLib call (not a published figure).
    expect(r.initialBearingDeg).toBeCloseTo(geod.Inverse(-41.32, 174.81, 40.96, -5.5).azi1 ?? NaN, 9);
  });

  it('20000 km SW of Perth is (32.11195529, -63.95925278) (GeographicLib JavaScript documentation example)', () => {
    const p = destination({ lat: -32.06, lon: 115.74 }, 225, 20000e3);
    expect(p.lat).toBeCloseTo(32.11195529, 8);
    expect(p.lon).toBeCloseTo(-63.95925278, 8);
  });

  it('one minute of latitude at 45° is about 1852 m (definition of the nautical mile, common practice)', () => {
    expect(geodesicDistanceM({ lat: 44.5 + 0.5 / 60, lon: 0 }, { lat: 45 + 0.5 / 60, lon: 0 }) / 30).toBeCloseTo(1852, -1);
  });

  it('agrees with geographiclib for random pairs (fast-check)', () => {
    const pt = fc.record({ lat: fc.double({ min: -90, max: 90, noNaN: true }), lon: fc.double({ min: -180, max: 180, noNaN: true }) });
    fc.assert(fc.property(pt, pt, (a, b) => {
      expect(geodesicDistanceM(a, b)).toBeCloseTo(geod.Inverse(a.lat, a.lon, b.lat, b.lon).s12 ?? NaN, 6);
    }), { numRuns: 300 });
  });
});

describe('along-track distance', () => {
  it('sums the geodesic legs', () => {
    const pts = [{ lat: 78, lon: 10 }, { lat: 78.5, lon: 12 }, { lat: 79, lon: 9 }];
    const legs = [geod.Inverse(78, 10, 78.5, 12).s12 ?? NaN, geod.Inverse(78.5, 12, 79, 9).s12 ?? NaN];
    expect(cumulativeDistancesM(pts)).toEqual([0, expect.closeTo(legs[0] ?? 0, 6), expect.closeTo((legs[0] ?? 0) + (legs[1] ?? 0), 6)]);
    expect(alongTrackDistanceM(pts)).toBeCloseTo((legs[0] ?? 0) + (legs[1] ?? 0), 6);
    expect(alongTrackDistanceM([])).toBe(0);
  });

  it('speed: 1852 m in one hour is one knot (definition)', () => {
    expect(speedKn(1852, 3600)).toBe(1);
    expect(speedKn(18520, 1800)).toBe(20);
  });
});

describe('interpolatePosition', () => {
  const track = (pts: [string, number, number][]): TimedPoint[] => pts.map(([time, lat, lon]) => ({ time, lat, lon }));

  it('returns fixes at their own times and null outside the track', () => {
    const t = track([['2026-03-01T00:00:00Z', 70, 10], ['2026-03-01T01:00:00Z', 70.1, 10.2]]);
    expect(interpolatePosition(t, '2026-03-01T00:00:00Z')).toEqual({ lat: 70, lon: 10 });
    expect(interpolatePosition(t, '2026-03-01T01:00:00Z')).toEqual({ lat: 70.1, lon: 10.2 });
    expect(interpolatePosition(t, '2026-02-28T23:59:59Z')).toBeNull();
    expect(interpolatePosition(t, '2026-03-01T01:00:01Z')).toBeNull();
    expect(interpolatePosition([], '2026-03-01T00:00:00Z')).toBeNull();
    expect(interpolatePosition(t, 'not a time')).toBeNull();
  });

  it('crosses the antimeridian the short way (179°E to 179°W)', () => {
    const t = track([['2026-03-01T00:00:00Z', 70, 179], ['2026-03-01T02:00:00Z', 70, -179]]);
    const mid = interpolatePosition(t, '2026-03-01T01:00:00Z');
    expect(mid).not.toBeNull();
    if (!mid) return;
    expect(Math.abs(mid.lon)).toBeCloseTo(180, 6);
    // The geodesic bulges poleward of the parallel.
    expect(mid.lat).toBeGreaterThan(70);
    // Independent check: halfway along the geographiclib geodesic.
    const line = geod.InverseLine(70, 179, 70, -179);
    const ref = line.Position(line.s13 / 2);
    expect(mid.lat).toBeCloseTo(ref.lat2 ?? NaN, 9);
    expect(geodesicDistanceM({ lat: 70, lon: 179 }, mid)).toBeCloseTo(line.s13 / 2, 3);
  });

  it('passes over the pole between opposite meridians near it', () => {
    const t = track([['2026-03-01T00:00:00Z', 89.5, 0], ['2026-03-01T01:00:00Z', 89.5, 180]]);
    const mid = interpolatePosition(t, '2026-03-01T00:30:00Z');
    expect(mid?.lat).toBeCloseTo(90, 6);
    const q = interpolatePosition(t, '2026-03-01T00:15:00Z');
    // A quarter of the way: on the 0° meridian at about 89.75°N.
    expect(q?.lat).toBeCloseTo(89.75, 2);
    expect(q?.lon).toBeCloseTo(0, 6);
  });

  it('finds the right leg on a long track and moves at constant speed along it (fast-check)', () => {
    const t = track([
      ['2026-03-01T00:00:00Z', 75, 170], ['2026-03-01T01:00:00Z', 75.2, 175],
      ['2026-03-01T02:00:00Z', 75.1, -178], ['2026-03-01T03:00:00Z', 76, -170],
    ]);
    fc.assert(fc.property(fc.integer({ min: 0, max: 3 * 3600 - 1 }), (s) => {
      const ms = Date.parse('2026-03-01T00:00:00Z') + s * 1000;
      const leg = Math.floor(s / 3600);
      const a = t[leg] as TimedPoint;
      const b = t[leg + 1] as TimedPoint;
      const p = interpolatePosition(t, ms);
      const line = geod.InverseLine(a.lat, a.lon, b.lat, b.lon);
      const ref = line.Position(line.s13 * ((s % 3600) / 3600));
      expect(p?.lat).toBeCloseTo(ref.lat2 ?? NaN, 9);
      expect(normaliseLon((p?.lon ?? 0) - (ref.lon2 ?? 0))).toBeCloseTo(0, 9);
    }), { numRuns: 200 });
  });

  it('pointAlongGeodesic at 0 and 1 gives the end points', () => {
    const a = { lat: -60, lon: -170 };
    const b = { lat: -65, lon: 175 };
    expect(pointAlongGeodesic(a, b, 0).lat).toBeCloseTo(-60, 9);
    expect(pointAlongGeodesic(a, b, 1).lon).toBeCloseTo(175, 9);
  });

  it('normaliseLon keeps longitudes in range', () => {
    expect(normaliseLon(181)).toBeCloseTo(-179, 12);
    expect(normaliseLon(-181)).toBeCloseTo(179, 12);
    expect(normaliseLon(180)).toBe(180);
    expect(normaliseLon(540)).toBe(180);
    expect(normaliseLon(-180)).toBe(-180);
  });
});
