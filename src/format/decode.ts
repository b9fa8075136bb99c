// File -> model: a schema-valid version-2 log becomes a LogBundle, after the checks a schema
// cannot express (codes agree with terms, references resolve, revisions are consistent, dates
// exist on the calendar). Each problem names its JSON path.
import type { Cruise, IceCategory, Observation, TrackPoint } from '../domain/model';
import { concentrationCode, floeSizeCode, stageCode, totalConcentrationCode } from './codes';
import { LIMITS } from './limits';
import type { Problem } from './problems';
import type { FileCategory, FileObservation, FileObservationVersion, FilePhoto, LogBundle, LogFileV2, PhotoMeta, TrackRow } from './types';

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Digit value of `s[i]`, or -1. */
function digit(s: string, i: number): number {
  const c = s.charCodeAt(i) - 48;
  return c >= 0 && c <= 9 ? c : -1;
}

/** Value of the two digits at `s[i]`, or a large negative number when either is no digit. */
function two(s: string, i: number): number {
  const a = digit(s, i);
  const b = digit(s, i + 1);
  return a < 0 || b < 0 ? -10_000 : a * 10 + b;
}

/**
 * The usual shape `YYYY-MM-DDTHH:MM:SSZ` (or with 3 decimals) judged by its digits, without a
 * Date: a track of a million rows asks a million times. true: a real instant; null: not
 * this shape or not plainly in range, left to the Date check below.
 */
function plainUtcTime(s: string): boolean | null {
  const n = s.length;
  if ((n !== 20 && n !== 24) || s.charCodeAt(4) !== 45 || s.charCodeAt(7) !== 45 || s.charCodeAt(10) !== 84 || s.charCodeAt(13) !== 58 || s.charCodeAt(16) !== 58 || s.charCodeAt(n - 1) !== 90) return null;
  if (n === 24 && (s.charCodeAt(19) !== 46 || digit(s, 20) < 0 || digit(s, 21) < 0 || digit(s, 22) < 0)) return null;
  const year = two(s, 0) * 100 + two(s, 2);
  const month = two(s, 5);
  const day = two(s, 8);
  const hour = two(s, 11);
  const minute = two(s, 14);
  const second = two(s, 17);
  if (year < 0 || month < 1 || month > 12 || day < 1 || hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59) return null;
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  const last = month === 2 && leap ? 29 : (DAYS_IN_MONTH[month - 1] as number);
  return day <= last ? true : false;
}

/** True when an ISO 8601 UTC string that matched the schema's pattern names a real instant. */
export function isRealUtcTime(s: string): boolean {
  const plain = plainUtcTime(s);
  if (plain !== null) return plain;
  const t = Date.parse(s);
  if (Number.isNaN(t)) return false;
  // Date.parse rolls 2026-02-30 over to March; the day must survive the round trip.
  return new Date(t).toISOString().slice(0, 10) === s.slice(0, 10);
}

/** Pushes a problem when `value` is no date on the calendar or lies outside the years a log may hold. */
function checkTime(value: string, path: string, out: Problem[]) {
  if (!isRealUtcTime(value)) out.push({ path, message: `"${value}" is not a date on the calendar` });
  else {
    const year = Number(value.slice(0, 4));
    if (year < LIMITS.earliestYear || year > LIMITS.latestYear) out.push({ path, message: `"${value}" lies outside the years ${LIMITS.earliestYear} to ${LIMITS.latestYear} that a log may hold` });
  }
}

function decodeCategory(c: FileCategory): IceCategory {
  const { partialConcentrationSigrid3: _p, stageSigrid3: _s, floeSizeSigrid3: _f, ...rest } = c;
  return rest;
}

const DROPPED_KEYS = new Set(['totalConcentrationSigrid3', 'traceStageSigrid3', 'remainingStageSigrid3', 'history', 'conflicts']);

/** The model object of one version; keys keep the file's order, so an export writes them back alike. */
export function decodeVersion(v: FileObservationVersion | FileObservation): Observation {
  const out: Record<string, unknown> = {};
  for (const [k, x] of Object.entries(v)) {
    if (DROPPED_KEYS.has(k)) continue;
    out[k] = k === 'categories' ? (x as FileCategory[]).map(decodeCategory) : x;
  }
  return out as unknown as Observation;
}

function checkCodes(v: FileObservationVersion, path: string, out: Problem[]) {
  const want = totalConcentrationCode(v);
  // Files written before 0/10 with ice noted was coded `01` carry `00` there: still readable.
  const legacyTrace = want === '01' && v.totalConcentrationSigrid3 === concentrationCode(0);
  if (v.totalConcentrationSigrid3 !== want && !legacyTrace) {
    out.push({ path: `${path}.totalConcentrationSigrid3`, message: `is "${v.totalConcentrationSigrid3}" but the total concentration ${v.totalConcentration ?? 'null'} has code "${want}"` });
  }
  v.categories.forEach((c, i) => {
    const p = `${path}.categories[${i}]`;
    const cc = concentrationCode(c.partialConcentration);
    if (c.partialConcentrationSigrid3 !== cc) out.push({ path: `${p}.partialConcentrationSigrid3`, message: `is "${c.partialConcentrationSigrid3}" but ${c.partialConcentration} tenths has code "${cc}"` });
    const sc = stageCode(c.stage);
    if (c.stageSigrid3 !== sc) out.push({ path: `${p}.stageSigrid3`, message: `is "${c.stageSigrid3}" but stage "${c.stage}" has code "${sc}"` });
    if (c.floeSize === undefined) {
      if (c.floeSizeSigrid3 !== undefined) out.push({ path: `${p}.floeSizeSigrid3`, message: 'is given but floeSize is not' });
    } else {
      const fc = floeSizeCode(c.floeSize);
      if (c.floeSizeSigrid3 !== fc) out.push({ path: `${p}.floeSizeSigrid3`, message: `is "${c.floeSizeSigrid3 ?? '(missing)'}" but floe size "${c.floeSize}" has code "${fc}"` });
    }
  });
  for (const [key, codeKey] of [['traceStage', 'traceStageSigrid3'], ['remainingStage', 'remainingStageSigrid3']] as const) {
    const term = v[key];
    const code = v[codeKey];
    if (term === undefined) {
      if (code !== undefined) out.push({ path: `${path}.${codeKey}`, message: `is given but ${key} is not` });
    } else if (code !== stageCode(term)) {
      out.push({ path: `${path}.${codeKey}`, message: `is "${code ?? '(missing)'}" but stage "${term}" has code "${stageCode(term)}"` });
    }
  }
}

function checkTimes(v: FileObservationVersion, path: string, out: Problem[]) {
  checkTime(v.time, `${path}.time`, out);
  checkTime(v.savedAt, `${path}.savedAt`, out);
  if (v.position?.fixTime !== undefined) checkTime(v.position.fixTime, `${path}.position.fixTime`, out);
}

/** The file's members other than the long lists: what a piece-by-piece reader holds first. */
export type LogHead = Omit<LogFileV2, 'observations' | 'track' | 'photos'>;

/** Decoded versions of a run of observations, in the shape of a LogBundle's lists. */
export interface DecodedObservations {
  observations: Observation[];
  history: Observation[];
  conflicts: Observation[];
}

/** Thrown by a piece-by-piece decoder for input it can only judge whole (an unordered track). */
export class NeedsWholeFile extends Error {
  constructor(reason: string) {
    super(reason);
    this.name = 'NeedsWholeFile';
  }
}

/**
 * The checks of decodeLog, fed in pieces: the head, then observations and track rows in runs
 * (each run with the index of its first item in the file), then the photos. The problems and
 * their paths are those of decodeLog on the whole file. Memory held between runs: the
 * observation ids (duplicates, photo references) and the previous track row.
 */
export class LogDecoder {
  private readonly seen = new Set<string>();
  private cruiseId = '';
  private prevRow: TrackRow | null = null;
  /** Set when the track is out of time order: decodeLog then compares every row by time. */
  private byTime: Map<string, number> | null = null;

  constructor(
    private readonly out: Problem[],
    private readonly archivePaths?: Map<string, string>,
  ) {}

  head(file: LogHead): Cruise {
    const cruiseId = (this.cruiseId = file.cruise.id);
    for (const [k, v] of [['exportedAt', file.exportedAt], ['cruise.createdAt', file.cruise.createdAt], ['cruise.updatedAt', file.cruise.updatedAt]] as const) {
      checkTime(v, `$.${k}`, this.out);
    }
    const observerIds = new Set<string>();
    file.observers.forEach((o, i) => {
      if (observerIds.has(o.id)) this.out.push({ path: `$.observers[${i}].id`, message: `observer id "${o.id}" appears twice` });
      observerIds.add(o.id);
    });
    return {
      id: cruiseId,
      name: file.cruise.name,
      vesselName: file.vessel.name,
      iceClass: file.vessel.iceClass,
      intervalMinutes: file.cruise.intervalMinutes,
      observers: file.observers.map((o) => ({ id: o.id, name: o.name, initials: o.initials })),
      displayTimeZone: file.cruise.displayTimeZone,
      maxSpeedKn: file.cruise.maxSpeedKn,
      createdAt: file.cruise.createdAt,
      updatedAt: file.cruise.updatedAt,
    };
  }

  /** `first`: the index in the file of `list[0]`. */
  observations(list: readonly FileObservation[], first: number, into: DecodedObservations): void {
    const { out, seen, cruiseId } = this;
    const { observations, history, conflicts } = into;
    list.forEach((fo, k) => {
      const path = `$.observations[${first + k}]`;
      if (seen.has(fo.id)) out.push({ path: `${path}.id`, message: `observation id "${fo.id}" appears twice` });
      seen.add(fo.id);
      if (fo.cruiseId !== cruiseId) out.push({ path: `${path}.cruiseId`, message: `is "${fo.cruiseId}", not this file's cruise "${cruiseId}"` });
      checkCodes(fo, path, out);
      checkTimes(fo, path, out);
      observations.push(decodeVersion(fo));
      const revisions = new Set<number>([fo.revision]);
      fo.history?.forEach((h, j) => {
        const hp = `${path}.history[${j}]`;
        if (h.id !== fo.id) out.push({ path: `${hp}.id`, message: `is "${h.id}", not the observation's id "${fo.id}"` });
        if (h.cruiseId !== cruiseId) out.push({ path: `${hp}.cruiseId`, message: `is "${h.cruiseId}", not this file's cruise "${cruiseId}"` });
        if (h.revision >= fo.revision) out.push({ path: `${hp}.revision`, message: `earlier revision ${h.revision} is not below the current revision ${fo.revision}` });
        else if (revisions.has(h.revision)) out.push({ path: `${hp}.revision`, message: `revision ${h.revision} appears twice` });
        revisions.add(h.revision);
        checkCodes(h, hp, out);
        checkTimes(h, hp, out);
        history.push(decodeVersion(h));
      });
      fo.conflicts?.forEach((c, j) => {
        const cp = `${path}.conflicts[${j}]`;
        if (c.id !== fo.id) out.push({ path: `${cp}.id`, message: `is "${c.id}", not the observation's id "${fo.id}"` });
        if (c.cruiseId !== cruiseId) out.push({ path: `${cp}.cruiseId`, message: `is "${c.cruiseId}", not this file's cruise "${cruiseId}"` });
        checkCodes(c, cp, out);
        checkTimes(c, cp, out);
        conflicts.push(decodeVersion(c));
      });
    });
  }

  /**
   * Track rows `points`, the first at index `first` of the file. Two points at one time with
   * other positions would mean two tracks: written files are in time order, so neighbours are
   * compared; out of order, every earlier row is needed (`all`: the whole list, when the caller
   * holds it; otherwise NeedsWholeFile is thrown).
   */
  track(points: readonly TrackRow[], first: number, into: TrackPoint[], all?: readonly TrackRow[]): void {
    const { out, cruiseId } = this;
    for (let k = 0; k < points.length; k++) {
      const i = first + k;
      const r = points[k] as TrackRow;
      checkTime(r[0], `$.track.points[${i}][0]`, out);
      const prev = this.prevRow;
      if (prev && !this.byTime && prev[0] > r[0]) {
        if (!all) throw new NeedsWholeFile('the track is not in time order');
        this.byTime = new Map(all.slice(0, i).map((q, j) => [q[0], j]));
      }
      const j = this.byTime ? this.byTime.get(r[0]) : prev && prev[0] === r[0] ? i - 1 : undefined;
      const other = j === undefined ? undefined : j === i - 1 ? prev : all?.[j];
      if (other && (other[1] !== r[1] || other[2] !== r[2])) out.push({ path: `$.track.points[${i}]`, message: `is at ${r[0]}, the time of row ${j}, with another position (${r[1]}, ${r[2]} against ${other[1]}, ${other[2]})` });
      if (this.byTime && !this.byTime.has(r[0])) this.byTime.set(r[0], i);
      const p: TrackPoint = { cruiseId, time: r[0], lat: r[1], lon: r[2], source: r[3] };
      if (r[4] !== null) p.sogKn = r[4];
      if (r[5] !== null) p.cogDeg = r[5];
      if (r[6] !== null) p.headingDeg = r[6];
      into.push(p);
      this.prevRow = r;
    }
  }

  /** The photo list; call after every observation (a photo must name one of the file). */
  photos(list: readonly FilePhoto[]): PhotoMeta[] {
    const { out, seen } = this;
    const photoIds = new Set<string>();
    return list.map((fp, i) => {
      if (photoIds.has(fp.id)) out.push({ path: `$.photos[${i}].id`, message: `photo id "${fp.id}" appears twice` });
      photoIds.add(fp.id);
      if (!seen.has(fp.observationId)) out.push({ path: `$.photos[${i}].observationId`, message: `no observation "${fp.observationId}" in this file` });
      if (fp.addedAt !== undefined) checkTime(fp.addedAt, `$.photos[${i}].addedAt`, out);
      if (fp.takenAt !== undefined) checkTime(fp.takenAt, `$.photos[${i}].takenAt`, out);
      const { archivePath, ...meta } = fp;
      this.archivePaths?.set(fp.id, archivePath);
      return meta;
    });
  }
}

/** Checks a schema-valid file and turns it into model objects. Problems go to `out`. */
export function decodeLog(file: LogFileV2, out: Problem[], archivePaths?: Map<string, string>): LogBundle {
  const d = new LogDecoder(out, archivePaths);
  const cruise = d.head(file);
  const lists: DecodedObservations = { observations: [], history: [], conflicts: [] };
  d.observations(file.observations, 0, lists);
  const track: TrackPoint[] = [];
  d.track(file.track.points, 0, track, file.track.points);
  const photos = d.photos(file.photos);
  return { cruise, ...lists, track, photos };
}
