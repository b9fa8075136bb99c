// Model -> file: a LogBundle becomes a version-2 log file (SIGRID-3 codes added beside the WMO
// terms, revisions grouped under their observation, the track as rows).
import type { FloeSizeKey, IceCategory, Observation, StageKey, TrackPoint } from '../domain/model';
import { sigrid3Concentration } from '../domain/nomenclature';
import { concentrationCode, floeSizeCode, stageCode, totalConcentrationCode } from './codes';
import {
  FORMAT_NAME,
  SCHEMA_V2_PATH,
  TRACK_COLUMNS,
  UNITS_V2,
  type FileCategory,
  type FileObservation,
  type FileObservationVersion,
  type FilePhoto,
  type LogBundle,
  type LogFileV2,
  type PhotoMeta,
  type TrackRow,
} from './types';

export const GENERATOR = { name: 'Floe Ledger', version: '0.1.0' } as const;

export interface EncodeOptions {
  /** When the file is written; defaults to now. */
  exportedAt?: string;
}

export function encodeCategory(c: IceCategory): FileCategory {
  const out: FileCategory = {
    ...c,
    partialConcentrationSigrid3: concentrationCode(c.partialConcentration),
    stageSigrid3: stageCode(c.stage),
  };
  if (c.floeSize !== undefined) out.floeSizeSigrid3 = floeSizeCode(c.floeSize);
  return out;
}

export function encodeVersion(o: Observation): FileObservationVersion {
  const out: FileObservationVersion = {
    ...o,
    totalConcentrationSigrid3: totalConcentrationCode(o),
    categories: o.categories.map(encodeCategory),
  };
  if (o.traceStage !== undefined) out.traceStageSigrid3 = stageCode(o.traceStage);
  if (o.remainingStage !== undefined) out.remainingStageSigrid3 = stageCode(o.remainingStage);
  return out;
}

export function encodeTrackPoint(p: TrackPoint): TrackRow {
  return [p.time, p.lat, p.lon, p.source, p.sogKn ?? null, p.cogDeg ?? null, p.headingDeg ?? null];
}

export function photoArchivePath(p: PhotoMeta): string {
  const ext = /^image\/(jpeg|png|webp|gif|heic|avif)$/.exec(p.mediaType)?.[1];
  const safeId = p.id.replace(/[^A-Za-z0-9._-]/g, '_');
  return `photos/${safeId}${ext ? `.${ext === 'jpeg' ? 'jpg' : ext}` : ''}`;
}

function groupById(versions: Observation[]): Map<string, Observation[]> {
  const m = new Map<string, Observation[]>();
  for (const v of versions) {
    const list = m.get(v.id);
    if (list) list.push(v);
    else m.set(v.id, [v]);
  }
  return m;
}

const byTime = (a: { time: string }, b: { time: string }) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0);

export function encodeLog(bundle: LogBundle, opts: EncodeOptions = {}): LogFileV2 {
  const { cruise } = bundle;
  const history = groupById(bundle.history);
  const conflicts = groupById(bundle.conflicts);
  const observations = [...bundle.observations].sort((a, b) => byTime(a, b) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const fileObservations: FileObservation[] = observations.map((o) => {
    const out: FileObservation = encodeVersion(o);
    const h = history.get(o.id);
    if (h) out.history = [...h].sort((a, b) => a.revision - b.revision).map(encodeVersion);
    const c = conflicts.get(o.id);
    if (c) out.conflicts = [...c].sort((a, b) => a.revision - b.revision || (a.savedAt < b.savedAt ? -1 : 1)).map(encodeVersion);
    return out;
  });
  const track = bundle.track.length > 1 && !isSortedByTime(bundle.track) ? [...bundle.track].sort(byTime) : bundle.track;
  const photos: FilePhoto[] = bundle.photos.map((p) => ({ ...p, archivePath: photoArchivePath(p) }));
  return {
    $schema: SCHEMA_V2_PATH,
    format: FORMAT_NAME,
    formatVersion: 2,
    exportedAt: opts.exportedAt ?? new Date().toISOString(),
    generator: { ...GENERATOR },
    units: { ...UNITS_V2 },
    cruise: {
      id: cruise.id,
      name: cruise.name,
      intervalMinutes: cruise.intervalMinutes,
      maxSpeedKn: cruise.maxSpeedKn,
      displayTimeZone: cruise.displayTimeZone,
      createdAt: cruise.createdAt,
      updatedAt: cruise.updatedAt,
    },
    vessel: { name: cruise.vesselName, iceClass: cruise.iceClass },
    observers: cruise.observers.map((o) => ({ id: o.id, name: o.name, initials: o.initials })),
    observations: fileObservations,
    track: { columns: [...TRACK_COLUMNS] as unknown as typeof TRACK_COLUMNS, points: track.map(encodeTrackPoint) },
    photos,
  };
}

function isSortedByTime(xs: readonly { time: string }[]): boolean {
  for (let i = 1; i < xs.length; i++) if ((xs[i] as { time: string }).time < (xs[i - 1] as { time: string }).time) return false;
  return true;
}

const SAFE_STRING = /^[0-9A-Za-z:.+-]*$/;
const CHUNK = 4096;

/**
 * Lines of an array, one record per line, gathered into chunks so a million rows make few
 * parts. `chunk(start, end)` returns the records' JSON lines joined by ",\n    ".
 */
function pushChunked(parts: string[], open: string, count: number, chunk: (start: number, end: number) => string, close: string) {
  if (count === 0) {
    parts.push(open + close.trimStart());
    return;
  }
  parts.push(`${open}\n`);
  for (let start = 0; start < count; start += CHUNK) {
    const end = Math.min(count, start + CHUNK);
    parts.push(`    ${chunk(start, end)}${end < count ? ',' : ''}\n`);
  }
  parts.push(close);
}

const eachLine = (items: readonly unknown[]) => (start: number, end: number) => {
  const lines = new Array<string>(end - start);
  for (let i = start; i < end; i++) lines[i - start] = JSON.stringify(items[i]);
  return lines.join(',\n    ');
};

/**
 * Track rows through one JSON.stringify per chunk (the engine's fast path), split into lines at
 * the row boundaries. A row's only strings are a time and a source key; should one hold
 * anything but time characters, that chunk is written row by row instead.
 */
const trackLines = (rowAt: (i: number) => TrackRow) => (start: number, end: number) => {
  const rows = new Array<TrackRow>(end - start);
  let plain = true;
  for (let i = start; i < end; i++) {
    const r = rowAt(i);
    if (plain && !(SAFE_STRING.test(r[0]) && SAFE_STRING.test(r[3]))) plain = false;
    rows[i - start] = r;
  }
  if (!plain) return rows.map((r) => JSON.stringify(r)).join(',\n    ');
  return JSON.stringify(rows).slice(1, -1).replaceAll('],[', '],\n    [');
};

function writeParts(
  file: LogFileV2,
  observationCount: number,
  observationLines: (start: number, end: number) => string,
  trackCount: number,
  rowAt: (i: number) => TrackRow,
): string[] {
  const parts: string[] = ['{\n'];
  const { observations: _o, track, photos, ...head } = file;
  for (const [k, v] of Object.entries(head)) parts.push(`  ${JSON.stringify(k)}: ${JSON.stringify(v)},\n`);
  pushChunked(parts, '  "observations": [', observationCount, observationLines, '  ],\n');
  parts.push(`  "track": {\n    "columns": ${JSON.stringify(track.columns)},\n`);
  pushChunked(parts, '    "points": [', trackCount, trackLines(rowAt), '    ]\n  },\n');
  pushChunked(parts, '  "photos": [', photos.length, eachLine(photos), '  ]\n');
  parts.push('}\n');
  return parts;
}

/**
 * The file text, in parts so a large log never has to exist as one string: a Blob or a write
 * stream takes the parts as they are. One observation and one track row per line keeps the
 * file readable and makes line numbers in error messages point at a record.
 */
export function writeLogJson(file: LogFileV2): string[] {
  const points = file.track.points;
  return writeParts(file, file.observations.length, eachLine(file.observations), points.length, (i) => points[i] as TrackRow);
}

// The SIGRID-3 code of every coded field, put in beside it as text. Keys in JSON text are the
// only places where `"stage":"` and the like occur unescaped (a quote inside a string value is
// always escaped), and these keys exist only where the model has them, so the replacement
// touches exactly the coded fields. test/format/roundtrip.test.ts checks the result against
// encodeVersion for random observations.
// A total of 0/10 with ice noted codes as `01`, which the key alone cannot tell: markTrace puts the
// string TRACE_ZERO (JSON `"\u0001"`, which no number field can hold) in its place first.
const CODED_FIELD = /"(totalConcentration|partialConcentration)":(null|\d+|"\\u0001")|"(stage|traceStage|remainingStage|floeSize)":"([a-z0-9-]+)"/g;
const TRACE_ZERO = '\u0001';
const TRACE_ZERO_JSON = '"\\u0001"';

/** The version with its total replaced by TRACE_ZERO where the total codes as `01`. */
function markTrace(o: Observation): Observation {
  if (o.totalConcentration !== 0 || totalConcentrationCode(o) === concentrationCode(0)) return o;
  // The marker is a string in a number's place only on its way through JSON.stringify.
  return { ...o, totalConcentration: TRACE_ZERO as unknown as number };
}

// Distinct matches are few (a key and one of a few dozen terms), so replacements are cached.
const codedCache = new Map<string, string>();

function codedReplacement(m: string, concKey?: string, concValue?: string, termKey?: string, termValue?: string): string {
  let out = codedCache.get(m);
  if (out === undefined) {
    if (concValue === TRACE_ZERO_JSON) out = `"${concKey}":0,"${concKey}Sigrid3":"${sigrid3Concentration(0, { trace: true })}"`;
    else if (concKey) out = `${m},"${concKey}Sigrid3":"${concentrationCode(concValue === 'null' ? null : Number(concValue))}"`;
    else out = `${m},"${termKey}Sigrid3":"${termKey === 'floeSize' ? floeSizeCode(termValue as FloeSizeKey) : stageCode(termValue as StageKey)}"`;
    if (codedCache.size < 10_000) codedCache.set(m, out);
  }
  return out;
}

function withCodes(json: string): string {
  return json.replace(CODED_FIELD, codedReplacement);
}

/** One version of an observation as file JSON: the model's JSON with the codes beside the terms. */
export function versionJson(o: Observation): string {
  return withCodes(JSON.stringify(markTrace(o)));
}

/**
 * Marks the boundary between two observations inside one JSON.stringify of a chunk: a string
 * holding only NUL, written as `"\u0000"`. Between two objects of the array it reads
 * `},"\u0000",{`, which nothing else in a log can produce (ids never hold NUL, and a NUL in a
 * text value stands after a colon, not between objects), so the boundaries can be cut there.
 */
const BOUNDARY = '\u0000';
const BOUNDARY_JSON = '},"\\u0000",{';

/**
 * encodeLog and writeLogJson in one, for export: the same document (codes placed right after
 * their terms), but each chunk of observations goes through one JSON.stringify (the engine's
 * fast path) instead of one file object and one stringify per observation.
 */
export function exportLogJson(bundle: LogBundle, opts: EncodeOptions = {}): string[] {
  const file = encodeLog({ ...bundle, observations: [], history: [], conflicts: [], track: [] }, opts);
  const history = groupById(bundle.history);
  const conflicts = groupById(bundle.conflicts);
  const observations = [...bundle.observations].sort((a, b) => byTime(a, b) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const observationLines = (start: number, end: number) => observationsJson(observations.slice(start, end), history, conflicts);
  const track = bundle.track.length > 1 && !isSortedByTime(bundle.track) ? [...bundle.track].sort(byTime) : bundle.track;
  return writeParts(file, observations.length, observationLines, track.length, (i) => encodeTrackPoint(track[i] as TrackPoint));
}

/** Earlier revisions or conflict copies by observation id. */
export type VersionsById = Map<string, Observation[]>;
export { groupById };

/**
 * Observations (in file order) as their file lines joined by `,\n    `, with their history and
 * conflict copies nested and the codes beside the terms. Each call is one JSON.stringify (the
 * engine's fast path), so a writer that streams a log calls it once per batch.
 */
export function observationsJson(observations: readonly Observation[], history: VersionsById, conflicts: VersionsById): string {
  const items: unknown[] = [];
  for (let i = 0; i < observations.length; i++) {
    if (i > 0) items.push(BOUNDARY);
    items.push(entryWithVersions(observations[i] as Observation, history, conflicts));
  }
  return withCodes(JSON.stringify(items).slice(1, -1)).replaceAll(BOUNDARY_JSON, '},\n    {');
}

function entryWithVersions(o: Observation, history: VersionsById, conflicts: VersionsById): Observation | (Observation & { history?: Observation[]; conflicts?: Observation[] }) {
  const h = history.get(o.id);
  const c = conflicts.get(o.id);
  if (!h && !c) return markTrace(o);
  const out: Observation & { history?: Observation[]; conflicts?: Observation[] } = { ...markTrace(o) };
  if (h) out.history = [...h].sort((a, b) => a.revision - b.revision).map(markTrace);
  if (c) out.conflicts = [...c].sort((a, b) => a.revision - b.revision || (a.savedAt < b.savedAt ? -1 : 1)).map(markTrace);
  return out;
}

/** Track rows as their file lines joined by `,\n    `. */
export function trackRowsJson(rows: readonly TrackRow[]): string {
  return trackLines((i) => rows[i] as TrackRow)(0, rows.length);
}
