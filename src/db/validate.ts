// Structural checks the store makes before writing, so no malformed row is ever stored. The
// observation's meaning (stages, thicknesses, sums) is checked by src/domain before saving;
// these checks only guard the shape the indexes and the other layers rely on.
import {
  FLOE_SIZE_KEYS,
  ICE_TYPE_LETTERS,
  POSITION_SOURCES,
  STAGE_KEYS,
  VESSEL_ICE_CLASSES,
  type Cruise,
  type IsoUtc,
  type TrackPoint,
} from '../domain/model';
import { InvalidRecordError } from './errors';
import type { ObservationInput } from './rows';

/** ISO 8601 in UTC with a `Z`: seconds required, fractions optional, as the model asks. */
const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,9})?Z$/;

export function isIsoUtc(value: unknown): value is IsoUtc {
  return typeof value === 'string' && ISO_UTC.test(value) && !Number.isNaN(Date.parse(value));
}

export function nowIso(): IsoUtc {
  return new Date().toISOString();
}

class Checker {
  constructor(readonly table: string) {}
  fail(path: string, detail: string): never {
    throw new InvalidRecordError(this.table, path, detail);
  }
  text(path: string, v: unknown, { empty = false } = {}): void {
    if (typeof v !== 'string') this.fail(path, `must be text, got ${typeof v}`);
    if (!empty && v.trim() === '') this.fail(path, 'must not be empty');
  }
  time(path: string, v: unknown): void {
    if (!isIsoUtc(v)) this.fail(path, `must be an ISO 8601 UTC time such as 2026-03-04T05:00:00Z, got ${JSON.stringify(v)}`);
  }
  number(path: string, v: unknown, min: number, max: number, { integer = false } = {}): void {
    if (typeof v !== 'number' || !Number.isFinite(v)) this.fail(path, `must be a number, got ${JSON.stringify(v)}`);
    if (integer && !Number.isInteger(v)) this.fail(path, `must be a whole number, got ${v}`);
    if (v < min || v > max) this.fail(path, `must be between ${min} and ${max}, got ${v}`);
  }
  optionalNumber(path: string, v: unknown, min: number, max: number): void {
    if (v !== undefined) this.number(path, v, min, max);
  }
  oneOf(path: string, v: unknown, allowed: readonly string[]): void {
    if (typeof v !== 'string' || !allowed.includes(v)) this.fail(path, `must be one of ${allowed.join(', ')}, got ${JSON.stringify(v)}`);
  }
}

export function checkObservation(o: ObservationInput): void {
  const c = new Checker('observation');
  if (o === null || typeof o !== 'object') c.fail('', 'is not a record');
  c.text('id', o.id);
  c.text('cruiseId', o.cruiseId);
  c.time('time', o.time);
  c.text('observerId', o.observerId);
  if (o.totalConcentration !== null) c.number('totalConcentration', o.totalConcentration, 0, 10, { integer: true });
  if (o.position !== null) {
    if (typeof o.position !== 'object' || o.position === undefined) c.fail('position', 'must be a position or null');
    c.number('position.lat', o.position.lat, -90, 90);
    c.number('position.lon', o.position.lon, -180, 180);
    c.oneOf('position.source', o.position.source, POSITION_SOURCES);
    if (o.position.fixTime !== undefined) c.time('position.fixTime', o.position.fixTime);
  }
  if (!Array.isArray(o.categories)) c.fail('categories', 'must be a list');
  if (o.categories.length > 3) c.fail('categories', `holds at most 3 ice types, got ${o.categories.length}`);
  o.categories.forEach((cat, i) => {
    c.number(`categories.${i}.partialConcentration`, cat.partialConcentration, 0, 10, { integer: true });
    c.oneOf(`categories.${i}.stage`, cat.stage, STAGE_KEYS);
    if (cat.floeSize !== undefined) c.oneOf(`categories.${i}.floeSize`, cat.floeSize, FLOE_SIZE_KEYS);
    c.optionalNumber(`categories.${i}.thicknessCm`, cat.thicknessCm, 0, 10_000);
  });
  // Deformation and snow are records keyed by ice type letter.
  for (const group of ['deformation', 'snow'] as const) {
    const g: unknown = o[group];
    if (g === undefined) continue;
    if (typeof g !== 'object' || g === null || Array.isArray(g)) c.fail(group, 'must be a record keyed by ice type (a, b, c)');
    for (const [k, entry] of Object.entries(g as Record<string, unknown>)) {
      // A letter past the observation's ice types is the domain rules' to report (group-without-ice-type).
      if (!(ICE_TYPE_LETTERS as readonly string[]).includes(k)) c.fail(`${group}.${k}`, 'is not an ice type letter (a, b, c)');
      if (typeof entry !== 'object' || entry === null || Array.isArray(entry)) c.fail(`${group}.${k}`, 'must be a record');
    }
  }
  if (typeof o.notes !== 'string') c.fail('notes', 'must be text');
  if (!Array.isArray(o.photoIds) || o.photoIds.some((p) => typeof p !== 'string')) c.fail('photoIds', 'must be a list of photo ids');
}

export function checkCruise(x: Cruise): void {
  const c = new Checker('cruise');
  c.text('id', x.id);
  c.text('name', x.name);
  c.text('vesselName', x.vesselName);
  c.oneOf('iceClass', x.iceClass, VESSEL_ICE_CLASSES);
  c.number('intervalMinutes', x.intervalMinutes, 1, 24 * 60, { integer: true });
  c.number('maxSpeedKn', x.maxSpeedKn, 0.1, 100);
  c.text('displayTimeZone', x.displayTimeZone);
  try {
    new Intl.DateTimeFormat('en', { timeZone: x.displayTimeZone });
  } catch {
    c.fail('displayTimeZone', `is not a known IANA time zone: ${JSON.stringify(x.displayTimeZone)}`);
  }
  if (!Array.isArray(x.observers)) c.fail('observers', 'must be a list');
  const ids = new Set<string>();
  x.observers.forEach((o, i) => {
    c.text(`observers.${i}.id`, o.id);
    c.text(`observers.${i}.name`, o.name);
    c.text(`observers.${i}.initials`, o.initials);
    if (ids.has(o.id)) c.fail(`observers.${i}.id`, `repeats the id ${JSON.stringify(o.id)}`);
    ids.add(o.id);
  });
  c.time('createdAt', x.createdAt);
  c.time('updatedAt', x.updatedAt);
  if (x.endTime !== undefined) c.time('endTime', x.endTime);
}

/**
 * Throws for the first bad point, naming its index in the list handed in. `timeChecked`: the
 * caller has already read the time with the track's own parser (which accepts only valid times).
 */
export function checkTrackPoint(p: TrackPoint, index: number, timeChecked = false): void {
  const c = new Checker('track point');
  const at = `points.${index}`;
  if (typeof p.cruiseId !== 'string' || p.cruiseId === '') c.fail(`${at}.cruiseId`, 'must not be empty');
  if (!timeChecked && !isIsoUtc(p.time)) c.time(`${at}.time`, p.time);
  // Plain comparisons first: this runs a million times in a bulk import.
  if (!(p.lat >= -90 && p.lat <= 90)) c.number(`${at}.lat`, p.lat, -90, 90);
  if (!(p.lon >= -180 && p.lon <= 180)) c.number(`${at}.lon`, p.lon, -180, 180);
  if (!POSITION_SOURCES.includes(p.source)) c.oneOf(`${at}.source`, p.source, POSITION_SOURCES);
  // The chunk columns keep "not known" as NaN, so a value that is present must be a number.
  if (p.sogKn !== undefined && !Number.isFinite(p.sogKn)) c.number(`${at}.sogKn`, p.sogKn, -Infinity, Infinity);
  if (p.cogDeg !== undefined && !Number.isFinite(p.cogDeg)) c.number(`${at}.cogDeg`, p.cogDeg, -Infinity, Infinity);
  if (p.headingDeg !== undefined && !Number.isFinite(p.headingDeg)) c.number(`${at}.headingDeg`, p.headingDeg, -Infinity, Infinity);
}
