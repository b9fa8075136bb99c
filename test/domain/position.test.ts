import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  formatCoordinate, formatPosition, isValidLatLon, parseCoordinate, parsePosition,
  type Axis, type CoordinateStyle,
} from '../../src/domain/position.ts';

// Conversions are plain arithmetic (1° = 60', 1' = 60"); the notations are common practice in
// bridge logs and charts (degrees and decimal minutes, hemisphere letter after).
const value = (text: string, axis: Axis): number => {
  const r = parseCoordinate(text, axis);
  if (!r.ok) throw new Error(r.error);
  return r.value;
};
const error = (text: string, axis: Axis): string => {
  const r = parseCoordinate(text, axis);
  if (r.ok) throw new Error(`expected an error for ${text}`);
  return r.error;
};

describe('parseCoordinate', () => {
  it.each([
    ["74°12.345'N", 'lat', 74 + 12.345 / 60],
    ['74 12.345 N', 'lat', 74 + 12.345 / 60],
    ['N 74 12.345', 'lat', 74 + 12.345 / 60],
    ['-74.2057', 'lat', -74.2057],
    ['74.2057S', 'lat', -74.2057],
    ['+12.5', 'lon', 12.5],
    ["74°12'20.7\"N", 'lat', 74 + 12 / 60 + 20.7 / 3600],
    ['74 12 20.7 s', 'lat', -(74 + 12 / 60 + 20.7 / 3600)],
    ["012°30.000'E", 'lon', 12.5],
    ["179°59.999'W", 'lon', -(179 + 59.999 / 60)],
    ['74º 12.5′ N', 'lat', 74 + 12.5 / 60],
    ['74° 12′ 30″ N', 'lat', 74 + 12 / 60 + 30 / 3600],
    ['−33.5', 'lat', -33.5],
    ['90N', 'lat', 90],
    ['180 W', 'lon', -180],
    ['0', 'lon', 0],
    ['.5', 'lat', 0.5],
  ] as const)('%s (%s) is %f', (text, axis, expected) => {
    expect(value(text, axis)).toBeCloseTo(expected, 10);
  });

  it.each([
    ['', 'lat', 'latitude is empty'],
    ['74 75 N', 'lat', 'minutes "75" must be less than 60'],
    ['74 60 N', 'lat', 'minutes "60" must be less than 60'],
    ['74 10 60 N', 'lat', 'seconds "60" must be less than 60'],
    ['74 12 61 N', 'lat', 'seconds "61" must be less than 60'],
    ['95N', 'lat', 'latitude "95N" is beyond 90°'],
    ['181 E', 'lon', 'longitude "181 E" is beyond 180°'],
    ["74°12.345'E", 'lat', 'hemisphere "E" belongs to a longitude; use N or S'],
    ['12 N', 'lon', 'hemisphere "N" belongs to a latitude; use E or W'],
    ['-74 S', 'lat', 'give a sign or a hemisphere letter, not both ("-" and "S")'],
    ['74x12 N', 'lat', 'unexpected "x12"'],
    ['74.5 12 N', 'lat', 'degrees "74.5" have decimals but minutes follow'],
    ['74 12.5 30 N', 'lat', 'minutes "12.5" have decimals but seconds follow'],
    ['74 12 30 10', 'lat', 'too many numbers'],
    ["12' 74°", 'lat', 'out of order'],
    ['74,2057', 'lat', 'use a point, not a comma, for decimals'],
    ['N 74 S', 'lat', 'two hemisphere letters'],
    ['N', 'lat', 'no degrees'],
  ] as const)('rejects %j (%s): %s', (text, axis, msg) => {
    expect(error(text, axis)).toContain(msg);
  });
});

describe('parsePosition', () => {
  it.each([
    ["74°12.345'N 012°30.000'E", 74 + 12.345 / 60, 12.5],
    ['74 12.345 N 012 30.000 E', 74 + 12.345 / 60, 12.5],
    ['N74 12.345 E012 30.000', 74 + 12.345 / 60, 12.5],
    ['S 66 33.0 W 070 15.5', -66.55, -(70 + 15.5 / 60)],
    ['-74.2057, 12.5', -74.2057, 12.5],
    ['-74.2057 -179.9', -74.2057, -179.9],
    ['74 12.345 012 30.000', 74 + 12.345 / 60, 12.5],
    ['74.5;-10.25', 74.5, -10.25],
  ])('%s', (text, lat, lon) => {
    const r = parsePosition(text);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.value.lat).toBeCloseTo(lat, 10);
      expect(r.value.lon).toBeCloseTo(lon, 10);
    }
  });

  it.each([
    ['', 'position is empty'],
    ['74 12.345 012', 'cannot tell where the latitude ends'],
    ['74,1, 12,5', 'more than one comma'],
    ['E012 30 N74 12', 'give the latitude first'],
    ['74.5,', 'longitude is missing'],
    ['74 75 N 012 30 E', 'latitude "74 75 N": minutes "75"'],
    ['74 12 N 200 E', 'longitude "200 E" is beyond 180°'],
  ])('rejects %j: %s', (text, msg) => {
    const r = parsePosition(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toContain(msg);
  });
});

describe('formatCoordinate', () => {
  it.each([
    [74 + 12.345 / 60, 'lat', 'ddm', "74°12.345'N"],
    [12.5, 'lon', 'ddm', "012°30.000'E"],
    [-(74 + 12 / 60 + 20.7 / 3600), 'lat', 'dms', "74°12'20.7\"S"],
    [-74.2057, 'lat', 'dd', '74.20570°S'],
    [5.05, 'lat', 'ddm', "05°03.000'N"],
    [0, 'lon', 'ddm', "000°00.000'E"],
    // 59.99996' rounds up to the next degree, never to 60.000'.
    [10 + 59.99996 / 60, 'lat', 'ddm', "11°00.000'N"],
    [-1e-9, 'lat', 'ddm', "00°00.000'N"],
  ] as const)('%f %s %s -> %s', (v, axis, style, expected) => {
    expect(formatCoordinate(v, axis, style)).toBe(expected);
  });

  it('signed forms', () => {
    expect(formatCoordinate(-74.2057, 'lat', 'dd', { hemisphere: 'sign', decimals: 4 })).toBe('-74.2057');
    expect(formatPosition({ lat: -74.2057, lon: 12.5 }, 'dd', { hemisphere: 'sign', decimals: 4 })).toBe('-74.2057, 12.5000');
    expect(formatPosition({ lat: 74.20575, lon: 12.5 })).toBe("74°12.345'N 012°30.000'E");
  });
});

describe('format -> parse round trip (fast-check)', () => {
  const styles: CoordinateStyle[] = ['dd', 'ddm', 'dms'];
  // Half a unit of the last printed decimal, in degrees.
  const tolerance = (style: CoordinateStyle, decimals: number) => 0.5 * 10 ** -decimals / (style === 'dd' ? 1 : style === 'ddm' ? 60 : 3600) + 1e-12;

  it.each(styles)('%s, letters and signs, latitude and longitude', (style) => {
    fc.assert(fc.property(
      fc.constantFrom<Axis>('lat', 'lon'),
      fc.double({ min: -1, max: 1, noNaN: true }),
      fc.integer({ min: 0, max: 6 }),
      fc.constantFrom<'letter' | 'sign'>('letter', 'sign'),
      (axis, unit, decimals, hemisphere) => {
        const v = unit * (axis === 'lat' ? 90 : 180);
        const text = formatCoordinate(v, axis, style, { decimals, hemisphere });
        const back = parseCoordinate(text, axis);
        expect(back.ok, text).toBe(true);
        if (back.ok) expect(Math.abs(back.value - v)).toBeLessThanOrEqual(tolerance(style, decimals));
      },
    ), { numRuns: 400 });
  });

  it('pairs round trip in every style', () => {
    fc.assert(fc.property(
      fc.double({ min: -90, max: 90, noNaN: true }),
      fc.double({ min: -180, max: 180, noNaN: true }),
      fc.constantFrom(...styles),
      fc.constantFrom<'letter' | 'sign'>('letter', 'sign'),
      (lat, lon, style, hemisphere) => {
        const text = formatPosition({ lat, lon }, style, { hemisphere });
        const back = parsePosition(text);
        expect(back.ok, text).toBe(true);
        const tol = tolerance(style, style === 'dd' ? 5 : style === 'ddm' ? 3 : 1);
        if (back.ok) {
          expect(Math.abs(back.value.lat - lat)).toBeLessThanOrEqual(tol);
          expect(Math.abs(back.value.lon - lon)).toBeLessThanOrEqual(tol);
        }
      },
    ), { numRuns: 400 });
  });
});

describe('isValidLatLon', () => {
  it('accepts WGS 84 ranges only', () => {
    expect(isValidLatLon(90, -180)).toBe(true);
    expect(isValidLatLon(90.0001, 0)).toBe(false);
    expect(isValidLatLon(0, 180.5)).toBe(false);
    expect(isValidLatLon(Number.NaN, 0)).toBe(false);
  });
});
