// Coordinates typed by people: parse and format decimal degrees, degrees and decimal minutes,
// and degrees minutes seconds, with hemisphere letters (N S E W, before or after) or a sign.
// Storage is always WGS 84 decimal degrees; these are for the screen, the CLI and imports.
// Parsing never throws: a Result carries a message that names the bad part.

import { err, ok, type Result } from './result.ts';

export type Axis = 'lat' | 'lon';
export type CoordinateStyle = 'dd' | 'ddm' | 'dms';

export interface LatLon {
  lat: number;
  lon: number;
}

const AXIS_NAME: Record<Axis, string> = { lat: 'latitude', lon: 'longitude' };
const AXIS_LIMIT: Record<Axis, number> = { lat: 90, lon: 180 };
const HEMISPHERES: Record<Axis, { pos: string; neg: string }> = {
  lat: { pos: 'N', neg: 'S' },
  lon: { pos: 'E', neg: 'W' },
};

/** Same-meaning characters people type or paste: prime marks, ordinal sign, minus sign. */
function normalise(text: string): string {
  return text
    .replace(/[′‘’`´]/g, "'")
    .replace(/[″“”]|''/g, '"')
    .replace(/[º˚]/g, '°')
    .replace(/[−–]/g, '-')
    .trim();
}

const MARKS: Record<string, 0 | 1 | 2> = { '°': 0, "'": 1, '"': 2 };
const PART_NAME = ['degrees', 'minutes', 'seconds'] as const;

/** Parse one latitude or longitude. */
export function parseCoordinate(text: string, axis: Axis): Result<number> {
  const name = AXIS_NAME[axis];
  const original = text.trim();
  let s = normalise(text);
  if (s === '') return err(`${name} is empty`);
  if (/\d,\d/.test(s)) return err(`${name} "${original}": use a point, not a comma, for decimals`);

  // Hemisphere letter, before or after the number.
  let hemi: string | null = null;
  const pre = /^([NSEWnsew])\s*/.exec(s);
  const post = /\s*([NSEWnsew])$/.exec(s);
  if (pre && post && pre.index !== post.index) return err(`${name} "${original}" has two hemisphere letters`);
  if (pre) { hemi = (pre[1] ?? '').toUpperCase(); s = s.slice(pre[0].length); }
  else if (post) { hemi = (post[1] ?? '').toUpperCase(); s = s.slice(0, post.index); }
  const h = HEMISPHERES[axis];
  if (hemi !== null && hemi !== h.pos && hemi !== h.neg) {
    return err(`${name} "${original}": hemisphere "${hemi}" belongs to a ${axis === 'lat' ? 'longitude' : 'latitude'}; use ${h.pos} or ${h.neg}`);
  }

  let sign = 1;
  const signMatch = /^([+-])\s*/.exec(s);
  if (signMatch) {
    if (hemi !== null) return err(`${name} "${original}": give a sign or a hemisphere letter, not both ("${signMatch[1]}" and "${hemi}")`);
    sign = signMatch[1] === '-' ? -1 : 1;
    s = s.slice(signMatch[0].length);
  }
  if (hemi === h.neg) sign = -1;

  // Up to three numbers, each optionally followed by its mark (°, ', ").
  const parts: (string | undefined)[] = [undefined, undefined, undefined];
  let next = 0;
  let rest = s;
  while (rest.length > 0) {
    const m = /^(\d+(?:\.\d*)?|\.\d+)\s*([°'"])?\s*/.exec(rest);
    if (!m) {
      const bad = /^\S+/.exec(rest)?.[0] ?? rest;
      return err(`${name} "${original}": unexpected "${bad}"`);
    }
    const num = m[1] ?? '';
    const slot = m[2] !== undefined ? MARKS[m[2]] ?? next : next;
    if (m[2] === undefined && next > 2) return err(`${name} "${original}": too many numbers (at most degrees, minutes, seconds)`);
    if (slot < next) {
      return err(`${name} "${original}": "${m[0].trim()}" is out of order (degrees, then minutes, then seconds)`);
    }
    parts[slot] = num;
    next = slot + 1;
    rest = rest.slice(m[0].length);
  }
  const [d, mi, se] = parts;
  if (d === undefined) return err(`${name} "${original}": no degrees`);
  if (se !== undefined && mi === undefined) return err(`${name} "${original}": seconds without minutes`);
  const last = se !== undefined ? 2 : mi !== undefined ? 1 : 0;
  for (let i = 0; i < last; i++) {
    const p = parts[i];
    if (p !== undefined && p.includes('.')) {
      return err(`${name} "${original}": ${PART_NAME[i]} "${p}" have decimals but ${PART_NAME[i + 1]} follow`);
    }
  }
  const deg = Number(d);
  const min = mi === undefined ? 0 : Number(mi);
  const sec = se === undefined ? 0 : Number(se);
  if (min >= 60) return err(`${name} "${original}": minutes "${mi}" must be less than 60`);
  if (sec >= 60) return err(`${name} "${original}": seconds "${se}" must be less than 60`);
  const value = deg + min / 60 + sec / 3600;
  if (value > AXIS_LIMIT[axis]) return err(`${name} "${original}" is beyond ${AXIS_LIMIT[axis]}°`);
  return ok(sign * value === 0 ? 0 : sign * value);
}

function countNumbers(s: string): number {
  return (s.match(/\d+(?:\.\d*)?|\.\d+/g) ?? []).length;
}

/**
 * Parse a latitude and longitude pair, latitude first: `74°12.345'N 012°30.000'E`,
 * `N74 12.345 E012 30.000`, `-74.2057, 12.5`, `74 12.345 012 30.000`.
 */
export function parsePosition(text: string): Result<LatLon> {
  const s = normalise(text);
  if (s === '') return err('position is empty');
  let latText: string;
  let lonText: string;
  const separators = (s.match(/[,;]/g) ?? []).length;
  if (separators > 1) {
    return err(`position "${text.trim()}": more than one comma; use a point for decimals and one comma between latitude and longitude`);
  }
  const sep = /\s*[,;]\s*/.exec(s);
  if (sep) {
    latText = s.slice(0, sep.index);
    lonText = s.slice(sep.index + sep[0].length);
  } else {
    const latLetter = /[NSns]/.exec(s);
    const lonLetter = /[EWew]/.exec(s);
    if (latLetter && lonLetter) {
      if (lonLetter.index < latLetter.index && lonLetter.index === 0) {
        return err(`position "${text.trim()}": give the latitude first`);
      }
      const splitAt = latLetter.index === 0 ? lonLetter.index : latLetter.index + 1;
      latText = s.slice(0, splitAt);
      lonText = s.slice(splitAt);
    } else {
      const chunks = s.split(/\s+/);
      const total = countNumbers(s);
      if (total % 2 !== 0) {
        return err(`position "${text.trim()}": cannot tell where the latitude ends; separate latitude and longitude with a comma or add hemisphere letters`);
      }
      let seen = 0;
      let i = 0;
      while (i < chunks.length && seen < total / 2) seen += countNumbers(chunks[i++] ?? '');
      if (seen !== total / 2) {
        return err(`position "${text.trim()}": cannot tell where the latitude ends; separate latitude and longitude with a comma`);
      }
      latText = chunks.slice(0, i).join(' ');
      lonText = chunks.slice(i).join(' ');
    }
  }
  if (lonText.trim() === '') return err(`position "${text.trim()}": longitude is missing`);
  const lat = parseCoordinate(latText, 'lat');
  if (!lat.ok) return lat;
  const lon = parseCoordinate(lonText, 'lon');
  if (!lon.ok) return lon;
  return ok({ lat: lat.value, lon: lon.value });
}

export interface FormatOptions {
  /** Decimals of the last part: default 5 for dd, 3 for ddm, 1 for dms. */
  decimals?: number;
  /** Hemisphere letter (default) or a minus sign for south and west. */
  hemisphere?: 'letter' | 'sign';
}

const DEFAULT_DECIMALS: Record<CoordinateStyle, number> = { dd: 5, ddm: 3, dms: 1 };

/** Format one coordinate: `74.20575°N`, `74°12.345'N`, `012°30'00.0"E`, or signed forms. */
export function formatCoordinate(value: number, axis: Axis, style: CoordinateStyle = 'ddm', opts: FormatOptions = {}): string {
  const decimals = opts.decimals ?? DEFAULT_DECIMALS[style];
  const scale = 10 ** decimals;
  const degWidth = axis === 'lat' ? 2 : 3;
  const abs = Math.abs(value);
  // Round once in the smallest unit so 59.9999' never shows as 60.000'.
  const perDegree = style === 'dd' ? 1 : style === 'ddm' ? 60 : 3600;
  const units = Math.round(abs * perDegree * scale);
  const negative = value < 0 && units !== 0;
  const h = HEMISPHERES[axis];
  const letter = negative ? h.neg : h.pos;
  const fixed = (u: number, intWidth: number): string => {
    const s = (u / scale).toFixed(decimals);
    const [int = '', frac] = s.split('.');
    return int.padStart(intWidth, '0') + (frac !== undefined ? `.${frac}` : '');
  };
  let body: string;
  if (style === 'dd') {
    body = opts.hemisphere === 'sign' ? fixed(units, 1) : `${fixed(units, 1)}°`;
  } else if (style === 'ddm') {
    const deg = Math.floor(units / (60 * scale));
    const minUnits = units - deg * 60 * scale;
    body = `${String(deg).padStart(degWidth, '0')}°${fixed(minUnits, 2)}'`;
  } else {
    const deg = Math.floor(units / (3600 * scale));
    const minInt = Math.floor((units - deg * 3600 * scale) / (60 * scale));
    const secUnits = units - deg * 3600 * scale - minInt * 60 * scale;
    body = `${String(deg).padStart(degWidth, '0')}°${String(minInt).padStart(2, '0')}'${fixed(secUnits, 2)}"`;
  }
  if (opts.hemisphere === 'sign') return negative ? `-${body}` : body;
  return `${body}${letter}`;
}

/** Format a position as latitude then longitude, separated by a space. */
export function formatPosition(pos: LatLon, style: CoordinateStyle = 'ddm', opts: FormatOptions = {}): string {
  const sepr = opts.hemisphere === 'sign' ? ', ' : ' ';
  return `${formatCoordinate(pos.lat, 'lat', style, opts)}${sepr}${formatCoordinate(pos.lon, 'lon', style, opts)}`;
}

/** A position is valid WGS 84 decimal degrees (finite, latitude -90..90, longitude -180..180). */
export function isValidLatLon(lat: number, lon: number): boolean {
  return Number.isFinite(lat) && Number.isFinite(lon) && Math.abs(lat) <= 90 && Math.abs(lon) <= 180;
}
