// NMEA 0183 sentence writer: turns a fix into GGA, RMC, VTG and HDT sentences. Used to replay a
// track through the same path a real receiver takes (the fake serial device of the browser
// tests) and to test the parser by round trip.
import { withChecksum } from './nmea';

export interface FixToWrite {
  /** Epoch milliseconds (UTC). */
  timeMs: number;
  lat: number;
  lon: number;
  fixQuality?: number;
  satellites?: number;
  hdop?: number;
  altitudeM?: number;
  sogKn?: number;
  cogDeg?: number;
  headingDeg?: number;
}

const pad = (n: number, width: number): string => String(n).padStart(width, '0');

function hhmmss(ms: number): string {
  const d = new Date(ms);
  const cs = Math.floor((ms % 1000) / 10);
  return `${pad(d.getUTCHours(), 2)}${pad(d.getUTCMinutes(), 2)}${pad(d.getUTCSeconds(), 2)}.${pad(cs, 2)}`;
}

function ddmmyy(ms: number): string {
  const d = new Date(ms);
  return `${pad(d.getUTCDate(), 2)}${pad(d.getUTCMonth() + 1, 2)}${pad(d.getUTCFullYear() % 100, 2)}`;
}

/** Decimal degrees to `ddmm.mmmmm,N` (or `dddmm.mmmmm,E`), with 5 decimals of minutes (about 2 cm). */
export function formatNmeaCoordinate(value: number, axis: 'lat' | 'lon'): string {
  const abs = Math.abs(value);
  let deg = Math.floor(abs);
  let min = Math.round((abs - deg) * 60 * 1e5) / 1e5;
  if (min >= 60) {
    deg += 1;
    min -= 60;
  }
  const hemi = axis === 'lat' ? (value < 0 ? 'S' : 'N') : value < 0 ? 'W' : 'E';
  return `${pad(deg, axis === 'lat' ? 2 : 3)}${min.toFixed(5).padStart(8, '0')},${hemi}`;
}

const opt = (v: number | undefined, digits: number): string => (v === undefined ? '' : v.toFixed(digits));

export function formatGga(fix: FixToWrite, talker = 'GP'): string {
  const q = fix.fixQuality ?? 1;
  return withChecksum([
    `${talker}GGA`, hhmmss(fix.timeMs), formatNmeaCoordinate(fix.lat, 'lat'), formatNmeaCoordinate(fix.lon, 'lon'),
    String(q), pad(fix.satellites ?? 9, 2), opt(fix.hdop ?? 0.9, 1), opt(fix.altitudeM ?? 12.0, 1), 'M', '', 'M', '', '',
  ].join(','));
}

export function formatRmc(fix: FixToWrite, talker = 'GP'): string {
  return withChecksum([
    `${talker}RMC`, hhmmss(fix.timeMs), 'A', formatNmeaCoordinate(fix.lat, 'lat'), formatNmeaCoordinate(fix.lon, 'lon'),
    opt(fix.sogKn, 1), opt(fix.cogDeg, 1), ddmmyy(fix.timeMs), '', '', 'A',
  ].join(','));
}

export function formatVtg(fix: FixToWrite, talker = 'GP'): string {
  const kmh = fix.sogKn === undefined ? undefined : fix.sogKn * 1.852;
  return withChecksum([`${talker}VTG`, opt(fix.cogDeg, 1), 'T', '', 'M', opt(fix.sogKn, 1), 'N', opt(kmh, 1), 'K', 'A'].join(','));
}

export function formatHdt(headingDeg: number, talker = 'HE'): string {
  return withChecksum(`${talker}HDT,${headingDeg.toFixed(1)},T`);
}

/** The sentences a typical ship's receiver and gyro send for one fix, in the usual order. */
export function sentencesForFix(fix: FixToWrite): string[] {
  const out = [formatRmc(fix), formatGga(fix), formatVtg(fix)];
  if (fix.headingDeg !== undefined) out.push(formatHdt(fix.headingDeg));
  return out;
}
