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

  // Meeus, Astronomical Algorithms (2nd ed., 1998), Example 25.a: the sun on 1992 October 13.0
  // TD (JDE 2448908.5) by the low-accuracy method of chapter 25, which the NOAA algorithm is:
  // apparent longitude 199.90895°, apparent right ascension 13h13m31.4s (198.38083°), apparent
  // declination -7°47'06" (-7.78507°). Our time argument is UT; ΔT (about 59 s in 1992) moves the
  // sun by 0.0007°, inside the tolerance.
  it('reproduces Meeus Example 25.a (1992 Oct 13.0 TD): λ 199.90895°, α 13h13m31.4s, δ -7°47\'06"', () => {
    const p = solarPosition(Date.UTC(1992, 9, 13), 0, 0);
    expect(p.apparentLongitudeDeg).toBeCloseTo(199.90895, 3);
    expect(p.rightAscensionDeg).toBeCloseTo(((13 + 13 / 60 + 31.4 / 3600) * 15), 3);
    expect(p.declinationDeg).toBeCloseTo(-(7 + 47 / 60 + 6 / 3600), 3);
    // Meeus Example 28.b (formula 28.3, the one NOAA uses) gives E = 13m42.7s for the same date
    // (value from memory of the example).
    expect(p.equationOfTimeMin).toBeCloseTo(13 + 42.7 / 60, 1);
  });

  it('puts the sun at apparent longitude 90° at the June solstice of Meeus Example 27.a (JDE 2437837.39245)', () => {
    // Meeus Example 27.a: the 1962 June solstice at JDE 2437837.39245 (1962 June 21, 21h25m TD).
    // The low-accuracy method is good to about 0.01° (Meeus ch. 25).
    const p = solarPosition((2437837.39245 - 2440587.5) * 86_400_000, 0, 0);
    expect(Math.abs(p.apparentLongitudeDeg - 90)).toBeLessThan(0.01);
  });

  it('noon and midnight elevations at 78.2°N at the solstices follow from the obliquity (Meeus 22.2)', () => {
    // At a solstice the declination is ±ε; ε = 23.436° in 2026 (Meeus formula 22.2, mean
    // obliquity 23°26'21.448" at J2000 less 46.815"/century). The highest sun on 21 December at
    // 78.2°N is 90 - 78.2 - 23.436 = -11.636° (polar night); the lowest on 21 June is +11.636°.
    const over = (day: number, month: number, pick: (a: number, b: number) => number, start: number) => {
      let e = start;
      for (let m = 0; m < 1440; m++) e = pick(e, solarPosition(Date.UTC(2026, month, day, 0, m), 78.2, 15.6).elevationDeg);
      return e;
    };
    expect(over(21, 11, Math.max, -90)).toBeCloseTo(90 - 78.2 - 23.436, 2);
    expect(over(21, 5, Math.min, 90)).toBeCloseTo(78.2 + 23.436 - 90, 2);
  });
});

// Civil twilight ends when the geometric centre of the sun is 6° below the horizon, refraction not
// counted (NOAA Global Monitoring Laboratory, solar calculator glossary). suncalc's "dusk" and
// "dawn" use the same definition (its -6° event has no refraction term) and cross-check it.
describe('themeForSunElevation (night below -6°, end of civil twilight, NOAA)', () => {
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

  it('themeAt switches at suncalc\'s dusk and dawn (geometric -6°), within two minutes', () => {
    for (const [lat, lon, day] of [[45, 10, '2026-03-10'], [60, -30, '2026-10-01'], [-55, -67, '2026-01-15']] as const) {
      const t = SunCalc.getTimes(new Date(`${day}T12:00:00Z`), lat, lon);
      const at = (d: Date | null, minutes: number) => {
        if (!d) throw new Error(`suncalc has no twilight at ${lat} on ${day}`);
        return themeAt(d.getTime() + minutes * 60_000, lat, lon);
      };
      expect(at(t.dusk, -2), `${lat} ${day} before dusk`).toBe('day');
      expect(at(t.dusk, 2), `${lat} ${day} after dusk`).toBe('night');
      expect(at(t.dawn, -2), `${lat} ${day} before dawn`).toBe('night');
      expect(at(t.dawn, 2), `${lat} ${day} after dawn`).toBe('day');
    }
  });

  it('counts no refraction: a sun geometrically just below -6° is night though refraction lifts it above', () => {
    // Refraction at -6° adds about 0.055° (NOAA's formula, -20.772" / tan h): a minute after
    // geometric -6° the apparent elevation is still above -6°. Before the fix this was "day".
    const t0 = SunCalc.getTimes(new Date('2026-03-10T12:00:00Z'), 45, 10).dusk?.getTime() ?? Number.NaN;
    expect(t0).not.toBeNaN();
    let ms = t0 - 120_000;
    while (solarPosition(ms, 45, 10).elevationDeg >= -6) ms += 1000;
    const p = solarPosition(ms, 45, 10);
    expect(p.elevationDeg).toBeLessThan(-6);
    expect(p.apparentElevationDeg).toBeGreaterThan(-6);
    expect(themeAt(ms, 45, 10)).toBe('night');
  });
});
