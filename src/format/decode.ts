// File -> model: a schema-valid version-2 log becomes a LogBundle, after the checks a schema
// cannot express (codes agree with terms, references resolve, revisions are consistent, dates
// exist on the calendar). Each problem names its JSON path.
import type { IceCategory, Observation, TrackPoint } from '../domain/model';
import { concentrationCode, floeSizeCode, stageCode, totalConcentrationCode } from './codes';
import { LIMITS } from './limits';
import type { Problem } from './problems';
import type { FileCategory, FileObservation, FileObservationVersion, LogBundle, LogFileV2, PhotoMeta } from './types';

/** True when an ISO 8601 UTC string that matched the schema's pattern names a real instant. */
export function isRealUtcTime(s: string): boolean {
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

/** Checks a schema-valid file and turns it into model objects. Problems go to `out`. */
export function decodeLog(file: LogFileV2, out: Problem[], archivePaths?: Map<string, string>): LogBundle {
  const cruiseId = file.cruise.id;
  for (const [k, v] of [['exportedAt', file.exportedAt], ['cruise.createdAt', file.cruise.createdAt], ['cruise.updatedAt', file.cruise.updatedAt]] as const) {
    checkTime(v, `$.${k}`, out);
  }
  const observerIds = new Set<string>();
  file.observers.forEach((o, i) => {
    if (observerIds.has(o.id)) out.push({ path: `$.observers[${i}].id`, message: `observer id "${o.id}" appears twice` });
    observerIds.add(o.id);
  });

  const observations: Observation[] = [];
  const history: Observation[] = [];
  const conflicts: Observation[] = [];
  const seen = new Set<string>();
  file.observations.forEach((fo, i) => {
    const path = `$.observations[${i}]`;
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

  const track: TrackPoint[] = new Array<TrackPoint>(file.track.points.length);
  const points = file.track.points;
  // Two points at one time with other positions: the file would mean two tracks. Written files
  // are in time order, so neighbours are compared; an unordered file gets a map of times.
  let byTime: Map<string, number> | null = null;
  for (let i = 0; i < points.length; i++) {
    const r = points[i] as (typeof points)[number];
    checkTime(r[0], `$.track.points[${i}][0]`, out);
    const prev = i > 0 ? (points[i - 1] as (typeof points)[number]) : null;
    if (prev && !byTime && prev[0] > r[0]) byTime = new Map(points.slice(0, i).map((q, j) => [q[0], j]));
    const j = byTime ? byTime.get(r[0]) : prev && prev[0] === r[0] ? i - 1 : undefined;
    const other = j === undefined ? undefined : points[j];
    if (other && (other[1] !== r[1] || other[2] !== r[2])) out.push({ path: `$.track.points[${i}]`, message: `is at ${r[0]}, the time of row ${j}, with another position (${r[1]}, ${r[2]} against ${other[1]}, ${other[2]})` });
    if (byTime && !byTime.has(r[0])) byTime.set(r[0], i);
    const p: TrackPoint = { cruiseId, time: r[0], lat: r[1], lon: r[2], source: r[3] };
    if (r[4] !== null) p.sogKn = r[4];
    if (r[5] !== null) p.cogDeg = r[5];
    if (r[6] !== null) p.headingDeg = r[6];
    track[i] = p;
  }

  const photoIds = new Set<string>();
  const photos: PhotoMeta[] = file.photos.map((fp, i) => {
    if (photoIds.has(fp.id)) out.push({ path: `$.photos[${i}].id`, message: `photo id "${fp.id}" appears twice` });
    photoIds.add(fp.id);
    if (!seen.has(fp.observationId)) out.push({ path: `$.photos[${i}].observationId`, message: `no observation "${fp.observationId}" in this file` });
    if (fp.addedAt !== undefined) checkTime(fp.addedAt, `$.photos[${i}].addedAt`, out);
    if (fp.takenAt !== undefined) checkTime(fp.takenAt, `$.photos[${i}].takenAt`, out);
    const { archivePath, ...meta } = fp;
    archivePaths?.set(fp.id, archivePath);
    return meta;
  });

  return {
    cruise: {
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
    },
    observations,
    history,
    conflicts,
    track,
    photos,
  };
}
