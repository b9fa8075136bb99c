import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { describeNmeaError, nmeaChecksum, parseNmea, withChecksum, type NmeaSentence } from '../../src/gps/nmea';
import { formatNmeaCoordinate, formatGga, formatHdt, formatRmc, formatVtg } from '../../src/gps/nmeaWrite';

function ok(line: string, opts = {}): NmeaSentence {
  const r = parseNmea(line, opts);
  if (!r.ok) throw new Error(`expected ${line} to parse: ${r.error.message}`);
  return r.value;
}

function err(line: string, opts = {}) {
  const r = parseNmea(line, opts);
  if (r.ok) throw new Error(`expected ${line} to fail`);
  return r.error;
}

describe('NMEA 0183 checksum', () => {
  it('matches sentences recorded by real receivers (open datasets)', () => {
    // NOAA PSL, PISTON 2019 cruise of R/V Sally Ride, raw GPS log 19259
    // (downloads.psl.noaa.gov/psd3/cruises/PISTON_2019/Sally_Ride/flux/Raw/19259/gps01925920_raw.txt).
    expect(nmeaChecksum('GPHDT,228.02,T')).toBe('0F');
    expect(nmeaChecksum('GPVTG,262.13,T,265.08,M,1.31,N,2.43,K,D')).toBe('2D');
    // Deltares OpenEarth raw data, Markermeer survey 2007, loc11GPS.txt.
    expect(nmeaChecksum('GPVTG,353.67,T,353.86,M,1.43,N,2.65,K,A')).toBe('2B');
    // NOAA NCEI format description scs_hdt (archive 0086548), example record.
    expect(nmeaChecksum('HEHDT,146.2,T')).toBe('2E');
  });

  it('rejects a wrong checksum, naming the sentence and both values', () => {
    const e = err('$GPHDT,228.02,T*0E');
    expect(e).toMatchObject({ kind: 'checksum', sentence: 'GPHDT', field: 'checksum' });
    expect(e.message).toBe('checksum 0E does not match 0F');
    expect(describeNmeaError(e)).toBe('GPHDT: checksum 0E does not match 0F');
  });

  it('accepts lower-case hex digits', () => {
    expect(ok('$GPHDT,228.02,T*0f').type).toBe('HDT');
  });

  it('rejects a missing checksum unless allowed, and says so', () => {
    const e = err('$HEHDT,146.2,T');
    expect(e.kind).toBe('checksum');
    expect(e.message).toMatch(/no checksum/);
    const s = ok('$HEHDT,146.2,T', { allowMissingChecksum: true });
    expect(s).toMatchObject({ type: 'HDT', headingTrueDeg: 146.2, checksum: 'absent' });
  });
});

describe('GGA', () => {
  it('parses the widely published example fix', () => {
    // The GGA example quoted on many NMEA reference pages (e.g. the field-by-field explanation at
    // mpt-internal.uni-hohenheim.de "nmea_strings"); from memory as the standard's own example,
    // checksum verified by our own XOR. 48 deg 07.038' N, 11 deg 31.000' E, 12:35:19 UTC.
    const s = ok('$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47');
    expect(s).toMatchObject({ type: 'GGA', talker: 'GP', timeOfDay: 12 * 3600 + 35 * 60 + 19, fixQuality: 1, satellites: 8, hdop: 0.9, altitudeM: 545.4, geoidSeparationM: 46.9 });
    if (s.type !== 'GGA') throw new Error();
    expect(s.lat).toBeCloseTo(48 + 7.038 / 60, 10);
    expect(s.lon).toBeCloseTo(11 + 31 / 60, 10);
  });

  it('parses a recorded DGPS fix with fractional seconds and 8-decimal minutes', () => {
    // NOAA PSL PISTON 2019 / R/V Sally Ride log (see above).
    const s = ok('$GPGGA,195959.00,1813.38282955,N,12606.12767097,E,2,07,1.4,17.2,M,36.5,M,4.0,0129*78');
    if (s.type !== 'GGA') throw new Error();
    expect(s.fixQuality).toBe(2);
    expect(s.timeOfDay).toBe(71999);
    expect(s.lat).toBeCloseTo(18 + 13.38282955 / 60, 12);
    expect(s.lon).toBeCloseTo(126 + 6.12767097 / 60, 12);
  });

  it('keeps a no-fix sentence (quality 0) with empty position fields', () => {
    const s = ok(withChecksum('GNGGA,001500.00,,,,,0,00,99.99,,,,,,'));
    expect(s).toMatchObject({ type: 'GGA', talker: 'GN', lat: null, lon: null, fixQuality: 0, satellites: 0 });
  });

  it('gives southern and western hemispheres a negative sign', () => {
    const s = ok(withChecksum('GPGGA,120000,6530.000,S,14745.500,W,1,10,0.8,5.0,M,-20.1,M,,'));
    if (s.type !== 'GGA') throw new Error();
    expect(s.lat).toBeCloseTo(-65.5, 12);
    expect(s.lon).toBeCloseTo(-(147 + 45.5 / 60), 12);
    expect(s.geoidSeparationM).toBe(-20.1);
  });

  it.each([
    ['GPGGA,123519,48O7.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,', 'latitude', /latitude "48O7.038"/],
    ['GPGGA,123519,4807.038,X,01131.000,E,1,08,0.9,545.4,M,46.9,M,,', 'latitude hemisphere', /hemisphere "X"/],
    ['GPGGA,123519,4867.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,', 'latitude', /67.038 minutes/],
    ['GPGGA,123519,9107.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,', 'latitude', /beyond 90/],
    ['GPGGA,123519,4807.038,N,1131.000,E,1,08,0.9,545.4,M,46.9,M,,', 'longitude', /dddmm/],
    ['GPGGA,253519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,', 'time', /not a valid time/],
    ['GPGGA,123519,4807.038,N,01131.000,E,A,08,0.9,545.4,M,46.9,M,,', 'fix quality', /not a whole number/],
    ['GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,F,46.9,M,,', 'altitude', /unit "F"/],
    ['GPGGA,123519,4807.038,N', 'field count', /needs at least 14/],
  ])('names the bad field in %s', (body, field, message) => {
    const e = err(withChecksum(body));
    expect(e).toMatchObject({ kind: 'field', sentence: 'GPGGA', field });
    expect(e.message).toMatch(message);
    expect(e.message.startsWith('GPGGA: ')).toBe(true);
  });
});

describe('RMC', () => {
  it('parses the widely published example, with date and westerly variation', () => {
    // Companion RMC example to the GGA one above (same reference pages); from memory, checksum
    // verified by our XOR. 22.4 kn, 84.4 deg true, 23 March 1994, variation 3.1 W.
    const s = ok('$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A');
    expect(s).toMatchObject({ type: 'RMC', status: 'A', sogKn: 22.4, cogDeg: 84.4, date: { year: 1994, month: 3, day: 23 }, magneticVariationDeg: -3.1, mode: null });
  });

  it('parses a recorded NMEA 2.3 sentence with mode indicator', () => {
    // NOAA PSL PISTON 2019 / R/V Sally Ride log.
    const s = ok('$GPRMC,195959.00,A,1813.38282955,N,12606.12767097,E,1.31,262.13,160919,3.0,W,D*21');
    expect(s).toMatchObject({ type: 'RMC', date: { year: 2019, month: 9, day: 16 }, mode: 'D', sogKn: 1.31, cogDeg: 262.13 });
  });

  it('rejects an impossible date and an unknown status', () => {
    expect(err(withChecksum('GPRMC,120000,A,8200.000,N,01500.000,E,3.0,10.0,310226,,,A'))).toMatchObject({ field: 'date' });
    expect(err(withChecksum('GPRMC,120000,X,8200.000,N,01500.000,E,3.0,10.0,090326,,,A'))).toMatchObject({ field: 'status' });
    expect(err(withChecksum('GPRMC,120000,A,8200.000,N,01500.000,E,3.0,400.0,090326,,,A'))).toMatchObject({ field: 'course over ground' });
  });

  it('keeps a void sentence (status V) as such', () => {
    expect(ok(withChecksum('GPRMC,120000,V,,,,,,,090326,,,N'))).toMatchObject({ status: 'V', lat: null, lon: null, mode: 'N' });
  });
});

describe('VTG, HDT, HDG', () => {
  it('parses recorded VTG with units', () => {
    // NOAA PSL PISTON 2019 / R/V Sally Ride log.
    expect(ok('$GPVTG,262.13,T,265.08,M,1.31,N,2.43,K,D*2D')).toMatchObject({ type: 'VTG', cogTrueDeg: 262.13, cogMagneticDeg: 265.08, sogKn: 1.31, sogKmh: 2.43, mode: 'D' });
  });

  it('parses the old VTG form without unit letters (NMEA 0183 before 2.0, from memory)', () => {
    expect(ok(withChecksum('GPVTG,054.7,034.4,005.5,010.2'))).toMatchObject({ cogTrueDeg: 54.7, cogMagneticDeg: 34.4, sogKn: 5.5, sogKmh: 10.2 });
  });

  it('parses HDT from any talker', () => {
    // NOAA NCEI scs_hdt format description example record.
    expect(ok('$HEHDT,146.2,T*2E')).toMatchObject({ type: 'HDT', talker: 'HE', headingTrueDeg: 146.2 });
    expect(ok(withChecksum('IIHDT,359.9,T'))).toMatchObject({ talker: 'II', headingTrueDeg: 359.9 });
  });

  it('turns HDG into a true heading: sensor + deviation + variation, east positive', () => {
    // Rule as given in NMEA 0183 HDG notes (quoted in e.g. the Furuno FR-1500 MARK-3 manual,
    // section on HDG): add easterly deviation/variation, subtract westerly.
    const s = ok(withChecksum('HCHDG,101.1,2.5,W,12.0,E'));
    expect(s).toMatchObject({ type: 'HDG', sensorHeadingDeg: 101.1, deviationDeg: -2.5, variationDeg: 12 });
    if (s.type !== 'HDG') throw new Error();
    expect(s.headingTrueDeg).toBeCloseTo(110.6, 10);
    // Wraps through north.
    const w = ok(withChecksum('HCHDG,355.0,,,10.0,E'));
    if (w.type !== 'HDG') throw new Error();
    expect(w.headingTrueDeg).toBeCloseTo(5, 10);
    // Without variation there is no true heading.
    expect(ok(withChecksum('HCHDG,355.0,1.0,E,,'))).toMatchObject({ headingTrueDeg: null });
  });

  it('rejects a bad HDG direction letter by name', () => {
    expect(err(withChecksum('HCHDG,101.1,2.5,Q,12.0,E'))).toMatchObject({ sentence: 'HCHDG', field: 'deviation direction' });
  });
});

describe('framing', () => {
  it('says why a line is not a sentence', () => {
    expect(err('GPGGA,1,2,3*00')).toMatchObject({ kind: 'framing', message: 'does not start with "$"' });
    expect(err('$G,1*00')).toMatchObject({ kind: 'framing', sentence: '?' });
    expect(err('$' + 'A'.repeat(300)).message).toMatch(/too long/);
    expect(err('$GPHDT,1\u00ff0,T*00')).toMatchObject({ kind: 'framing', sentence: 'GPHDT' });
    expect(err('$GPHDT,10,T*G1')).toMatchObject({ kind: 'checksum', message: 'checksum "G1" is not two hex digits' });
  });

  it('marks well-formed sentences of other types as unsupported, not as errors in the data', () => {
    // NOAA PSL PISTON 2019 / R/V Sally Ride log.
    expect(err('$GPZDA,195959.00,16,09,2019,00,00*6A')).toMatchObject({ kind: 'unsupported', sentence: 'GPZDA' });
    // Proprietary ($P...) and encapsulated (!, AIS) sentences: invented bodies, checksums computed here.
    expect(err(withChecksum('PUBX,00,120000.00,8230.0000,N'))).toMatchObject({ kind: 'unsupported', sentence: 'PUBX' });
    expect(err(withChecksum('PGRME,15.0,M,45.0,M,25.0,M'))).toMatchObject({ kind: 'unsupported', sentence: 'PGRME' });
    expect(err('!' + withChecksum('AIVDM,1,1,,A,13u?etPv2;0n:dDPwUM1U1Cb069D,0').slice(1))).toMatchObject({ kind: 'unsupported', sentence: 'AIVDM' });
    // ... but their checksum is still checked.
    expect(err('!AIVDM,1,1,,A,13u?etPv2;0n:dDPwUM1U1Cb069D,0*00')).toMatchObject({ kind: 'checksum' });
  });
});

describe('writer and parser agree (property)', () => {
  const fix = fc.record({
    timeMs: fc.integer({ min: Date.UTC(1999, 0, 1), max: Date.UTC(2079, 11, 31) }),
    lat: fc.double({ min: -89.999, max: 89.999, noNaN: true }),
    lon: fc.double({ min: -179.999, max: 179.999, noNaN: true }),
    sogKn: fc.double({ min: 0, max: 30, noNaN: true }),
    cogDeg: fc.double({ min: 0, max: 359.9, noNaN: true }),
    headingDeg: fc.double({ min: 0, max: 359.9, noNaN: true }),
    satellites: fc.integer({ min: 0, max: 24 }),
  });
  // 5 decimals of minutes: half of 1e-5 minute, in degrees.
  const posTol = 0.5e-5 / 60 + 1e-12;

  it('round-trips random fixes through GGA, RMC, VTG and HDT', () => {
    fc.assert(fc.property(fix, (f) => {
      const gga = ok(formatGga(f, 'GN'));
      const rmc = ok(formatRmc(f));
      const vtg = ok(formatVtg(f));
      const hdt = ok(formatHdt(f.headingDeg));
      if (gga.type !== 'GGA' || rmc.type !== 'RMC' || vtg.type !== 'VTG' || hdt.type !== 'HDT') return false;
      const d = new Date(f.timeMs);
      const tod = d.getUTCHours() * 3600 + d.getUTCMinutes() * 60 + d.getUTCSeconds() + Math.floor((f.timeMs % 1000) / 10) / 100;
      expect(gga.timeOfDay).toBeCloseTo(tod, 6);
      expect(Math.abs(gga.lat! - f.lat)).toBeLessThanOrEqual(posTol);
      expect(Math.abs(gga.lon! - f.lon)).toBeLessThanOrEqual(posTol);
      expect(Math.abs(rmc.lat! - f.lat)).toBeLessThanOrEqual(posTol);
      expect(rmc.date).toEqual({ year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() });
      expect(gga.satellites).toBe(f.satellites);
      expect(Math.abs(vtg.sogKn! - f.sogKn)).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs(rmc.cogDeg! - f.cogDeg)).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs(hdt.headingTrueDeg! - f.headingDeg)).toBeLessThanOrEqual(0.05 + 1e-9);
      return true;
    }), { numRuns: 500 });
  });

  it('writes coordinates the way NMEA 0183 spells them', () => {
    expect(formatNmeaCoordinate(82.5, 'lat')).toBe('8230.00000,N');
    expect(formatNmeaCoordinate(-0.999999999, 'lon')).toBe('00100.00000,W');
    expect(formatNmeaCoordinate(15.25, 'lon')).toBe('01515.00000,E');
  });

  it('rejects any single-character change in the body of a valid sentence', () => {
    fc.assert(fc.property(fix, fc.nat(), fc.integer({ min: 0x20, max: 0x7e }), (f, at, code) => {
      const s = formatGga(f);
      const star = s.lastIndexOf('*');
      const i = 1 + (at % (star - 1));
      const ch = String.fromCharCode(code);
      fc.pre(ch !== s[i]);
      const mutated = s.slice(0, i) + ch + s.slice(i + 1);
      expect(parseNmea(mutated).ok).toBe(false);
    }), { numRuns: 500 });
  });

  it('never throws on random text or random sentence-like garbage', () => {
    const sentenceish = fc.tuple(fc.constantFrom('GP', 'GN', 'II', 'HE', 'XX'), fc.constantFrom('GGA', 'RMC', 'VTG', 'HDT', 'HDG', 'GSV'), fc.array(fc.string({ maxLength: 12 }), { maxLength: 16 }))
      .map(([t, f, fields]) => withChecksum([t + f, ...fields].join(',')));
    fc.assert(fc.property(fc.oneof(fc.string({ maxLength: 300 }), sentenceish), (line) => {
      const r = parseNmea(line);
      if (!r.ok) expect(r.error.message.length).toBeGreaterThan(0);
    }), { numRuns: 2000 });
  });
});
