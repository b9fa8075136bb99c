// NMEA 0183 sentence parser for the sentences a bridge position source needs: GGA, RMC, VTG
// (position, time, speed and course) and HDT, HDG (heading). Any talker id is accepted.
//
// A sentence is `$` + talker (2 letters) + formatter (3 letters) + `,`-separated fields +
// `*` + two hex digits, the XOR of every character between `$` and `*` (NMEA 0183).
//
// Checksum policy: a sentence whose checksum does not match is always rejected. A sentence with
// no checksum at all is rejected by default too, because the position goes into a scientific
// record and a serial line at 4800 baud does drop bits; some older heading sensors send HDT
// without one, so `allowMissingChecksum` lets the user accept those deliberately.
//
// Parsing never throws: every failure is a `NmeaError` naming the sentence and the field.

export const SUPPORTED_SENTENCES = ['GGA', 'RMC', 'VTG', 'HDT', 'HDG'] as const;
export type SentenceType = (typeof SUPPORTED_SENTENCES)[number];

/** Longest sentence NMEA 0183 allows is 82 characters including `$` and CR LF; we allow slack. */
export const MAX_SENTENCE_LENGTH = 200;

interface SentenceBase {
  /** Two-letter talker id, e.g. `GP`, `GN`, `HE`. */
  talker: string;
  /** Whether the sentence carried a checksum (it was checked when it did). */
  checksum: 'valid' | 'absent';
  raw: string;
}

/** UTC time of day in seconds since midnight (fractional seconds kept). */
export type SecondsOfDay = number;

export interface UtcDate {
  year: number;
  month: number;
  day: number;
}

/** GGA: fix data. Latitude/longitude are null when the receiver has no fix. */
export interface GgaSentence extends SentenceBase {
  type: 'GGA';
  timeOfDay: SecondsOfDay | null;
  lat: number | null;
  lon: number | null;
  /** 0 invalid, 1 GPS, 2 DGPS, 3 PPS, 4 RTK, 5 float RTK, 6 estimated, 7 manual, 8 simulation. */
  fixQuality: number;
  satellites: number | null;
  hdop: number | null;
  altitudeM: number | null;
  geoidSeparationM: number | null;
}

/** RMC: recommended minimum data. `status` V means the data are not valid. */
export interface RmcSentence extends SentenceBase {
  type: 'RMC';
  timeOfDay: SecondsOfDay | null;
  status: 'A' | 'V';
  lat: number | null;
  lon: number | null;
  sogKn: number | null;
  cogDeg: number | null;
  date: UtcDate | null;
  /** Magnetic variation, east positive. */
  magneticVariationDeg: number | null;
  /** NMEA 2.3 mode indicator (A autonomous, D differential, E estimated, N not valid...). */
  mode: string | null;
}

/** VTG: course and speed over ground. */
export interface VtgSentence extends SentenceBase {
  type: 'VTG';
  cogTrueDeg: number | null;
  cogMagneticDeg: number | null;
  sogKn: number | null;
  sogKmh: number | null;
  mode: string | null;
}

/** HDT: true heading. */
export interface HdtSentence extends SentenceBase {
  type: 'HDT';
  headingTrueDeg: number | null;
}

/** HDG: magnetic sensor heading with deviation and variation (east positive). */
export interface HdgSentence extends SentenceBase {
  type: 'HDG';
  sensorHeadingDeg: number | null;
  deviationDeg: number | null;
  variationDeg: number | null;
  /** Sensor heading + deviation + variation, when variation is given (deviation taken as 0 if absent). */
  headingTrueDeg: number | null;
}

export type NmeaSentence = GgaSentence | RmcSentence | VtgSentence | HdtSentence | HdgSentence;

export type NmeaErrorKind = 'framing' | 'checksum' | 'unsupported' | 'field';

export interface NmeaError {
  kind: NmeaErrorKind;
  /** Address field such as `GPGGA`, or `?` when the sentence is too broken to tell. */
  sentence: string;
  /** Name of the offending field, when a field is at fault. */
  field?: string;
  message: string;
  raw: string;
}

export type ParseResult = { ok: true; value: NmeaSentence } | { ok: false; error: NmeaError };

export interface ParseOptions {
  /** Accept a sentence that has no `*hh` checksum (default false). */
  allowMissingChecksum?: boolean;
}

/** The XOR checksum of NMEA 0183 over the characters between `$` and `*`, as two upper-case hex digits. */
export function nmeaChecksum(body: string): string {
  let x = 0;
  for (let i = 0; i < body.length; i++) x ^= body.charCodeAt(i) & 0xff;
  return x.toString(16).toUpperCase().padStart(2, '0');
}

/** Wrap a body (`GPHDT,123.4,T`) into a full sentence with its checksum. */
export function withChecksum(body: string): string {
  return `$${body}*${nmeaChecksum(body)}`;
}

class FieldError extends Error {
  constructor(readonly field: string, message: string) {
    super(message);
  }
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)$/;

function num(fields: readonly string[], i: number, name: string, range?: [number, number]): number | null {
  const s = fields[i] ?? '';
  if (s === '') return null;
  if (!NUMBER.test(s)) throw new FieldError(name, `${name} "${s}" is not a number`);
  const v = Number(s);
  if (range && (v < range[0] || v > range[1])) throw new FieldError(name, `${name} ${v} is outside ${range[0]}..${range[1]}`);
  return v;
}

function int(fields: readonly string[], i: number, name: string, range: [number, number]): number | null {
  const s = fields[i] ?? '';
  if (s === '') return null;
  if (!/^\d+$/.test(s)) throw new FieldError(name, `${name} "${s}" is not a whole number`);
  return num(fields, i, name, range);
}

const TIME_OF_DAY = /^\d{6}(?:\.\d+)?$/;

/** `hhmmss` or `hhmmss.ss` to seconds of day. */
function time(fields: readonly string[], i: number): SecondsOfDay | null {
  const s = fields[i] ?? '';
  if (s === '') return null;
  if (!TIME_OF_DAY.test(s)) throw new FieldError('time', `time "${s}" is not hhmmss.ss`);
  // Digits by position: no capture groups, no substrings (a log has a time on every fix).
  const h = (s.charCodeAt(0) - 48) * 10 + s.charCodeAt(1) - 48;
  const mi = (s.charCodeAt(2) - 48) * 10 + s.charCodeAt(3) - 48;
  const sec = s.length === 6 ? (s.charCodeAt(4) - 48) * 10 + s.charCodeAt(5) - 48 : Number(s.slice(4));
  // 60 allows a leap second.
  if (h > 23 || mi > 59 || sec >= 61) throw new FieldError('time', `time "${s}" is not a valid time of day`);
  return h * 3600 + mi * 60 + sec;
}

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** `ddmmyy` to a date; two-digit years are taken as 2000-2099 except 80-99 (GPS began in 1980). */
function date(fields: readonly string[], i: number): UtcDate | null {
  const s = fields[i] ?? '';
  if (s === '') return null;
  const m = /^(\d\d)(\d\d)(\d\d)$/.exec(s);
  if (!m) throw new FieldError('date', `date "${s}" is not ddmmyy`);
  const day = Number(m[1]);
  const month = Number(m[2]);
  const yy = Number(m[3]);
  const year = yy >= 80 ? 1900 + yy : 2000 + yy;
  const daysInMonth = month === 2 ? (year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0) ? 29 : 28) : (DAYS_IN_MONTH[month - 1] ?? 0);
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth) throw new FieldError('date', `date "${s}" is not a calendar date`);
  return { year, month, day };
}

const LATITUDE = /^\d{4}(?:\.\d+)?$/;
const LONGITUDE = /^\d{5}(?:\.\d+)?$/;

/** `ddmm.mmmm` + hemisphere, or `dddmm.mmmm` for longitude, to signed decimal degrees. */
function coordinate(fields: readonly string[], i: number, axis: 'latitude' | 'longitude'): number | null {
  const v = fields[i] ?? '';
  const hemi = fields[i + 1] ?? '';
  if (v === '' && hemi === '') return null;
  const lat = axis === 'latitude';
  if (!(lat ? LATITUDE : LONGITUDE).test(v)) throw new FieldError(axis, `${axis} "${v}" is not ${lat ? 'ddmm.mmmm' : 'dddmm.mmmm'}`);
  const degDigits = lat ? 2 : 3;
  let deg = 0;
  for (let k = 0; k < degDigits; k++) deg = deg * 10 + v.charCodeAt(k) - 48;
  const min = Number(v.slice(degDigits));
  if (min >= 60) throw new FieldError(axis, `${axis} "${v}" has ${min} minutes`);
  const value = deg + min / 60;
  const max = axis === 'latitude' ? 90 : 180;
  if (value > max) throw new FieldError(axis, `${axis} "${v}" is beyond ${max} degrees`);
  const hemis = axis === 'latitude' ? ['N', 'S'] : ['E', 'W'];
  if (!hemis.includes(hemi)) throw new FieldError(`${axis} hemisphere`, `${axis} hemisphere "${hemi}" is not ${hemis.join(' or ')}`);
  return hemi === hemis[1] ? -value : value;
}

/** A magnitude with an E/W letter, east positive. */
function eastWest(fields: readonly string[], i: number, name: string): number | null {
  const v = num(fields, i, name, [0, 180]);
  const d = fields[i + 1] ?? '';
  if (v === null) return null;
  if (d !== 'E' && d !== 'W') throw new FieldError(`${name} direction`, `${name} direction "${d}" is not E or W`);
  return d === 'W' ? -v : v;
}

function unit(fields: readonly string[], i: number, expected: string, name: string): void {
  const u = fields[i] ?? '';
  if (u !== '' && u !== expected) throw new FieldError(name, `${name} unit "${u}" is not ${expected}`);
}

function need(fields: readonly string[], count: number): void {
  if (fields.length < count) throw new FieldError('field count', `has ${fields.length} fields, needs at least ${count}`);
}

const norm360 = (d: number): number => ((d % 360) + 360) % 360;

function parseFields(type: SentenceType, f: readonly string[], base: SentenceBase): NmeaSentence {
  switch (type) {
    case 'GGA': {
      need(f, 14);
      const fixQuality = int(f, 5, 'fix quality', [0, 9]) ?? 0;
      unit(f, 9, 'M', 'altitude');
      unit(f, 11, 'M', 'geoid separation');
      return {
        talker: base.talker, checksum: base.checksum, raw: base.raw, type, timeOfDay: time(f, 0),
        lat: coordinate(f, 1, 'latitude'), lon: coordinate(f, 3, 'longitude'),
        fixQuality, satellites: int(f, 6, 'satellites', [0, 99]), hdop: num(f, 7, 'HDOP', [0, 99.99]),
        altitudeM: num(f, 8, 'altitude'), geoidSeparationM: num(f, 10, 'geoid separation'),
      };
    }
    case 'RMC': {
      need(f, 11);
      const status = f[1] ?? '';
      if (status !== 'A' && status !== 'V') throw new FieldError('status', `status "${status}" is not A or V`);
      return {
        talker: base.talker, checksum: base.checksum, raw: base.raw, type, timeOfDay: time(f, 0), status,
        lat: coordinate(f, 2, 'latitude'), lon: coordinate(f, 4, 'longitude'),
        sogKn: num(f, 6, 'speed over ground', [0, 1000]), cogDeg: num(f, 7, 'course over ground', [0, 360]),
        date: date(f, 8), magneticVariationDeg: eastWest(f, 9, 'magnetic variation'),
        mode: f[11] === undefined || f[11] === '' ? null : f[11],
      };
    }
    case 'VTG': {
      // The old (pre-2.0) form without unit letters has 4 fields; the usual one has 8 or 9.
      if (f.length === 4) {
        return {
          talker: base.talker, checksum: base.checksum, raw: base.raw, type, cogTrueDeg: num(f, 0, 'true course', [0, 360]), cogMagneticDeg: num(f, 1, 'magnetic course', [0, 360]),
          sogKn: num(f, 2, 'speed in knots', [0, 1000]), sogKmh: num(f, 3, 'speed in km/h', [0, 2000]), mode: null,
        };
      }
      need(f, 8);
      unit(f, 1, 'T', 'true course');
      unit(f, 3, 'M', 'magnetic course');
      unit(f, 5, 'N', 'speed in knots');
      unit(f, 7, 'K', 'speed in km/h');
      return {
        talker: base.talker, checksum: base.checksum, raw: base.raw, type, cogTrueDeg: num(f, 0, 'true course', [0, 360]), cogMagneticDeg: num(f, 2, 'magnetic course', [0, 360]),
        sogKn: num(f, 4, 'speed in knots', [0, 1000]), sogKmh: num(f, 6, 'speed in km/h', [0, 2000]),
        mode: f[8] === undefined || f[8] === '' ? null : f[8],
      };
    }
    case 'HDT': {
      need(f, 2);
      unit(f, 1, 'T', 'heading');
      return { talker: base.talker, checksum: base.checksum, raw: base.raw, type, headingTrueDeg: num(f, 0, 'heading', [0, 360]) };
    }
    case 'HDG': {
      need(f, 5);
      const sensor = num(f, 0, 'sensor heading', [0, 360]);
      const deviation = eastWest(f, 1, 'deviation');
      const variation = eastWest(f, 3, 'variation');
      // Sensor + deviation = magnetic heading; + variation = true heading (NMEA 0183 HDG notes).
      const headingTrueDeg = sensor !== null && variation !== null ? norm360(sensor + (deviation ?? 0) + variation) : null;
      return { talker: base.talker, checksum: base.checksum, raw: base.raw, type, sensorHeadingDeg: sensor, deviationDeg: deviation, variationDeg: variation, headingTrueDeg };
    }
  }
}

function failure(kind: NmeaErrorKind, sentence: string, message: string, raw: string, field?: string): ParseResult {
  const error: NmeaError = { kind, sentence, message, raw };
  if (field !== undefined) error.field = field;
  return { ok: false, error };
}

const ADDRESS = /^[A-Z][A-Z0-9]{4}$/;
const PROPRIETARY = /^P[A-Z0-9]{3,9}$/;
const HEX2 = /^[0-9A-Fa-f]{2}$/;
const SUPPORTED = new Set<string>(SUPPORTED_SENTENCES);

/** Parse one NMEA 0183 sentence (leading/trailing whitespace and CR LF are ignored). */
/** Value of a hex digit's character code (either case), or a large negative number. */
function hexDigit(c: number): number {
  if (c >= 48 && c <= 57) return c - 48;
  if (c >= 65 && c <= 70) return c - 55;
  if (c >= 97 && c <= 102) return c - 87;
  return -1_000;
}

export function parseNmea(line: string, opts: ParseOptions = {}): ParseResult {
  const raw = line.trim();
  if (raw.length > MAX_SENTENCE_LENGTH) return failure('framing', '?', `line of ${raw.length} characters is too long for an NMEA sentence`, raw);
  // `!` starts encapsulated sentences (AIS VDM/VDO) that share a line with GPS on many ships.
  const startChar = raw.charCodeAt(0);
  if (startChar !== 36 /* $ */ && startChar !== 33 /* ! */) return failure('framing', '?', 'does not start with "$"', raw);
  const star = raw.lastIndexOf('*');
  const body = star >= 0 ? raw.slice(1, star) : raw.slice(1);
  const comma = body.indexOf(',');
  const address = comma >= 0 ? body.slice(0, comma) : body;
  // Proprietary sentences ($P + maker code + anything, e.g. $PGRME, $PUBX) are checked but not used.
  const proprietary = PROPRIETARY.test(address);
  if (!proprietary && !ADDRESS.test(address)) return failure('framing', '?', `address field "${address.slice(0, 12)}" is not a talker id and a sentence type`, raw);
  const name = address;
  // Printable ASCII only (NMEA 0183 reserves the rest); a stray byte means line noise. The same
  // pass sums the checksum: this runs for every line of a log of millions.
  let xor = 0;
  for (let i = 0; i < body.length; i++) {
    const c = body.charCodeAt(i);
    if (c < 0x20 || c > 0x7e) return failure('framing', name, 'contains characters that are not printable ASCII', raw);
    xor ^= c;
  }
  let checksum: 'valid' | 'absent' = 'absent';
  if (star >= 0) {
    // Compared as a number: no strings made for the millions of lines that match.
    const givenValue = raw.length === star + 3 ? hexDigit(raw.charCodeAt(star + 1)) * 16 + hexDigit(raw.charCodeAt(star + 2)) : -1;
    if (givenValue !== xor) {
      const given = raw.slice(star + 1);
      if (!HEX2.test(given)) return failure('checksum', name, `checksum "${given}" is not two hex digits`, raw, 'checksum');
      const expected = (xor < 16 ? '0' : '') + xor.toString(16).toUpperCase();
      return failure('checksum', name, `checksum ${given} does not match ${expected}`, raw, 'checksum');
    }
    checksum = 'valid';
  } else if (!opts.allowMissingChecksum) {
    return failure('checksum', name, 'has no checksum (accept such sentences only if the source never sends one)', raw, 'checksum');
  }
  if (proprietary) return failure('unsupported', name, `proprietary sentence ${name} is not used here`, raw);
  const formatter = name.slice(2);
  if (startChar === 33 || !SUPPORTED.has(formatter)) return failure('unsupported', name, `${formatter} sentences are not used here`, raw);
  const fields = comma >= 0 ? body.slice(comma + 1).split(',') : [];
  try {
    return { ok: true, value: parseFields(formatter as SentenceType, fields, { talker: name.slice(0, 2), checksum, raw }) };
  } catch (e) {
    if (e instanceof FieldError) return failure('field', name, `${name}: ${e.message}`, raw, e.field);
    throw e;
  }
}

/** A readable one-line description of a parse error, for the status line and the bad-line list. */
export function describeNmeaError(e: NmeaError): string {
  if (e.kind === 'field' || e.sentence === '?') return e.message;
  return `${e.sentence}: ${e.message}`;
}
