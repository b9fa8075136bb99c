// The documents a cruise is kept in on the server, and the check of pulled ones.
//
// Each document holds one piece of a log file in the file's own form (src/format), so a pulled
// piece goes through exactly the reader an imported file goes through: the pieces of a batch are
// put together as one log file and read by `readLogText` (limits, schema, migration, the checks
// a schema cannot make, the domain rules). A piece the reader rejects is refused on its own,
// with the reader's reason, and the rest of the batch is read again without it.
import type { Cruise, Observation, TrackPoint } from '../domain/model';
import { encodeLog, encodeTrackPoint, encodeVersion, photoArchivePath } from '../format/encode';
import { bundleTarget, canonicalJson, planMerge } from '../format/merge';
import { OLDEST_VERSION } from '../format/migrate';
import type { Problem } from '../format/problems';
import { formatProblem } from '../format/problems';
import { readLogText, type RuleCheck } from '../format/read';
import { scanText } from '../format/scan';
import { CURRENT_VERSION, TRACK_COLUMNS, type FileCruise, type FileObservationVersion, type FileVessel, type LogBundle, type PhotoMeta, type TrackRow } from '../format/types';
import type { Observer } from '../domain/model';
import { cruiseDocId, digest, observationDocId, photoDocId, trackDocId, utcHour } from './ids';

export const DOC_TYPES = ['floe-ledger/observation', 'floe-ledger/cruise', 'floe-ledger/track', 'floe-ledger/photo'] as const;
export type DocType = (typeof DOC_TYPES)[number];

interface Envelope<T extends DocType, B> {
  _id: string;
  _rev?: string;
  type: T;
  cruiseId: string;
  /** The log format version the body is written in. */
  formatVersion: number;
  body: B;
}

export interface CruiseBody {
  cruise: FileCruise;
  vessel: FileVessel;
  observers: Observer[];
}
export interface TrackBody {
  hour: string;
  columns: typeof TRACK_COLUMNS;
  points: TrackRow[];
}

export type ObservationDoc = Envelope<'floe-ledger/observation', FileObservationVersion>;
export type CruiseDoc = Envelope<'floe-ledger/cruise', CruiseBody>;
export type TrackDoc = Envelope<'floe-ledger/track', TrackBody>;
/** An attachment as written (`data`, base64) or as read from the changes feed (a stub). */
export interface Attachment {
  content_type: string;
  data?: string;
  length?: number;
  stub?: boolean;
  digest?: string;
}
/** A photo: its description (the log file's photo entry without archivePath), the image attached. */
export type PhotoDoc = Envelope<'floe-ledger/photo', PhotoMeta> & { _attachments?: Record<string, Attachment> };
export type SyncDoc = ObservationDoc | CruiseDoc | TrackDoc | PhotoDoc;

// ---------------------------------------------------------------- writing

export function observationDoc(o: Observation): ObservationDoc {
  const body = encodeVersion(o);
  return { _id: observationDocId(o.id, o.revision, digest(canonicalJson(body))), type: 'floe-ledger/observation', cruiseId: o.cruiseId, formatVersion: CURRENT_VERSION, body };
}

export function cruiseBody(c: Cruise): CruiseBody {
  const file = encodeLog({ cruise: c, observations: [], history: [], conflicts: [], track: [], photos: [] }, { exportedAt: c.updatedAt });
  return { cruise: file.cruise, vessel: file.vessel, observers: file.observers };
}

export function cruiseDoc(c: Cruise): CruiseDoc {
  const body = cruiseBody(c);
  return { _id: cruiseDocId(c.updatedAt, digest(canonicalJson(body))), type: 'floe-ledger/cruise', cruiseId: c.id, formatVersion: CURRENT_VERSION, body };
}

/** One document per UTC hour of track: pass the points of one hour, in time order. */
export function trackDoc(cruiseId: string, hour: string, points: readonly TrackPoint[]): TrackDoc {
  const body: TrackBody = { hour, columns: [...TRACK_COLUMNS] as unknown as typeof TRACK_COLUMNS, points: points.map(encodeTrackPoint) };
  return { _id: trackDocId(hour, digest(canonicalJson(body))), type: 'floe-ledger/track', cruiseId, formatVersion: CURRENT_VERSION, body };
}

/** Track points grouped by UTC hour, each group in time order. */
export function groupByHour(points: readonly TrackPoint[]): Map<string, TrackPoint[]> {
  const out = new Map<string, TrackPoint[]>();
  for (const p of points) {
    const h = utcHour(p.time);
    const l = out.get(h);
    if (l) l.push(p);
    else out.set(h, [p]);
  }
  for (const l of out.values()) l.sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
  return out;
}

/** Every document of a log: the cruise, every saved version of every observation, the track by hour. */
export function bundleDocs(bundle: LogBundle): SyncDoc[] {
  const docs: SyncDoc[] = [cruiseDoc(bundle.cruise)];
  for (const o of [...bundle.observations, ...bundle.history, ...bundle.conflicts]) docs.push(observationDoc(o));
  for (const [hour, points] of groupByHour(bundle.track)) docs.push(trackDoc(bundle.cruise.id, hour, points));
  return docs;
}

/**
 * A pulled batch with versions the server is known to hold of the same observations added as
 * history. A batch alone lacks the revisions its newer ones build on, and the merge rules read
 * descent from what a log holds (src/format/merge.ts): without them, an edit made on another
 * laptop would look like a conflict with the revision it replaced. With them, the batch is
 * judged as an import of the server's whole log would be. Versions already there merge as
 * identical.
 */
export function withHeldVersions(bundle: LogBundle, held: readonly Observation[]): LogBundle {
  return held.length === 0 ? bundle : { ...bundle, history: [...bundle.history, ...held] };
}

/** The ids of the observations a bundle holds versions of. */
export function observationIdsOf(bundle: LogBundle): Set<string> {
  return new Set([...bundle.observations, ...bundle.history, ...bundle.conflicts].map((o) => o.id));
}

// ---------------------------------------------------------------- checking pulled documents

export interface Refusal {
  docId: string;
  reason: string;
}

export interface CheckContext {
  cruiseId: string;
  /** The cruise as stored on this laptop (null on a laptop that joins). */
  storedCruise: Cruise | null;
  rules?: RuleCheck | null;
  /** An observation stored on this laptop (or read before), for the photos that belong to it. */
  observation?: (id: string) => Observation | undefined;
}

export interface CheckResult {
  /** The accepted pieces as one bundle, ready for the merge plan; null when nothing was accepted. */
  bundle: LogBundle | null;
  accepted: string[];
  refused: Refusal[];
  /** Documents that are not ours (design documents, deletions): passed over. */
  ignored: string[];
  /**
   * Photo documents whose description passed the reader and whose observation is known; not yet
   * in `accepted`: their image must still be fetched and checked (photos.ts).
   */
  photos: { doc: PhotoDoc; meta: PhotoMeta }[];
  /** The cruise as known after the batch. */
  cruise: Cruise | null;
}

const hasOwn = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);
const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);
const show = (s: string) => (s.length > 80 ? `${JSON.stringify(s.slice(0, 77))}...` : JSON.stringify(s));

/** The envelope: what the document says it is, checked against its id and content. */
function checkEnvelope(raw: unknown, cruiseId: string): { doc: SyncDoc } | { refusal: Refusal } | { ignore: string } {
  if (!isObject(raw)) return { refusal: { docId: '?', reason: 'the server sent something that is not a document' } };
  const id = raw._id;
  if (typeof id !== 'string' || id === '') return { refusal: { docId: '?', reason: 'a document without an id' } };
  if (id.startsWith('_design/') || raw._deleted === true) return { ignore: id };
  const refuse = (reason: string) => ({ refusal: { docId: id, reason } });
  const type = raw.type;
  if (typeof type !== 'string' || !(DOC_TYPES as readonly string[]).includes(type)) return refuse(`type ${typeof type === 'string' ? show(type) : 'missing'} is not one this program writes`);
  if (raw.cruiseId !== cruiseId) return refuse(`belongs to cruise ${typeof raw.cruiseId === 'string' ? show(raw.cruiseId) : '(none)'}, not ${show(cruiseId)}`);
  const v = raw.formatVersion;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < OLDEST_VERSION) return refuse('formatVersion is not a known log format version');
  if (v > CURRENT_VERSION) return refuse(`written in log format version ${v} by a newer Floe Ledger; this laptop reads up to ${CURRENT_VERSION} (update it, then pull again)`);
  if (!hasOwn(raw, 'body') || !isObject(raw.body)) return refuse('has no body object');
  const body = raw.body;
  // The reader's pre-parse scan, on this body alone: a prototype key or a nesting or length
  // over the limits is this document's fault, not its batch's.
  let text: string;
  try {
    text = JSON.stringify(body);
  } catch {
    // Only nesting deeper than the engine's stack makes stringify throw here.
    return refuse('the body is nested too deeply to be a log entry');
  }
  const scanned = scanText(text);
  if (scanned) return refuse(scanned.message);
  const hash = digest(canonicalJson(body));
  let expected: string;
  if (type === 'floe-ledger/observation') {
    const oid = body.id;
    const rev = body.revision;
    if (typeof oid !== 'string' || typeof rev !== 'number' || !Number.isInteger(rev) || rev < 1) return refuse('the body has no observation id and revision');
    expected = observationDocId(oid, rev, hash);
  } else if (type === 'floe-ledger/cruise') {
    const c = body.cruise;
    if (!isObject(c) || typeof c.updatedAt !== 'string') return refuse('the body has no cruise record');
    expected = cruiseDocId(c.updatedAt, hash);
  } else if (type === 'floe-ledger/photo') {
    if (typeof body.id !== 'string') return refuse('the body has no photo id');
    // The digest of the image ends the id; the image itself is checked against it when fetched.
    expected = photoDocId(body.id, hash, /-([0-9a-f]{16})$/.exec(id)?.[1] ?? '?');
  } else {
    if (typeof body.hour !== 'string' || !Array.isArray(body.points)) return refuse('the body has no hour and points');
    expected = trackDocId(body.hour, hash);
    const hour = body.hour;
    const bad = body.points.findIndex((p) => !Array.isArray(p) || typeof p[0] !== 'string' || utcHour(p[0]) !== hour);
    if (bad >= 0) return refuse(`point ${bad} is not in the hour ${show(hour)} the document is for`);
  }
  if (expected !== id) return refuse(`its id does not match its content (the content names ${show(expected)}): altered on the server`);
  return { doc: raw as unknown as SyncDoc };
}

/** Where each piece of an assembled file came from, to turn a reader's problem into a document. */
interface Origins {
  entries: { doc: string | null; history: string[]; conflicts: string[] }[];
  points: string[];
}

interface Assembled {
  text: string;
  origins: Origins;
}

function header(version: number, cruise: Cruise) {
  const file = encodeLog({ cruise, observations: [], history: [], conflicts: [], track: [], photos: [] }, { exportedAt: cruise.updatedAt });
  return { ...file, formatVersion: version };
}

function assemble(version: number, cruise: Cruise, obs: ObservationDoc[], track: TrackDoc[]): Assembled {
  const byId = new Map<string, ObservationDoc[]>();
  for (const d of obs) {
    const l = byId.get(d.body.id);
    if (l) l.push(d);
    else byId.set(d.body.id, [d]);
  }
  const origins: Origins = { entries: [], points: [] };
  const entries: unknown[] = [];
  for (const docs of byId.values()) {
    docs.sort((a, b) => b.body.revision - a.body.revision || (a._id < b._id ? -1 : 1));
    const [top, ...rest] = docs as [ObservationDoc, ...ObservationDoc[]];
    const history: FileObservationVersion[] = [];
    const conflicts: FileObservationVersion[] = [];
    const origin = { doc: top._id, history: [] as string[], conflicts: [] as string[] };
    const revisions = new Set([top.body.revision]);
    for (const d of rest) {
      if (revisions.has(d.body.revision)) {
        conflicts.push(d.body);
        origin.conflicts.push(d._id);
      } else {
        revisions.add(d.body.revision);
        history.push(d.body);
        origin.history.push(d._id);
      }
    }
    history.reverse();
    origin.history.reverse();
    const entry: Record<string, unknown> = { ...top.body };
    if (history.length) entry.history = history;
    if (conflicts.length) entry.conflicts = conflicts;
    entries.push(entry);
    origins.entries.push(origin);
  }
  // Points of all hour documents in time order; a time two documents both hold is read once
  // (a later, fuller document of the same hour repeats the earlier points).
  const points: { row: TrackRow; doc: string }[] = [];
  const seen = new Set<string>();
  for (const d of track) {
    for (const row of d.body.points) {
      if (seen.has(row[0])) continue;
      seen.add(row[0]);
      points.push({ row, doc: d._id });
    }
  }
  points.sort((a, b) => (a.row[0] < b.row[0] ? -1 : a.row[0] > b.row[0] ? 1 : 0));
  origins.points = points.map((p) => p.doc);
  const file = { ...header(version, cruise), observations: entries, track: { columns: [...TRACK_COLUMNS], points: points.map((p) => p.row) } };
  return { text: JSON.stringify(file), origins };
}

/** The document a problem of an assembled file points at, or null when it is about the whole. */
function culprit(p: Problem, o: Origins): string | null {
  let m = /^\$\.observations\[(\d+)\](?:\.(history|conflicts)\[(\d+)\])?/.exec(p.path);
  if (m) {
    const e = o.entries[Number(m[1])];
    if (!e) return null;
    if (m[2] === 'history') return e.history[Number(m[3])] ?? null;
    if (m[2] === 'conflicts') return e.conflicts[Number(m[3])] ?? null;
    return e.doc;
  }
  m = /^\$\.track\.points\[(\d+)\]/.exec(p.path);
  if (m) return o.points[Number(m[1])] ?? null;
  return null;
}

const mergeCruise = (into: Cruise | null, c: Cruise): Cruise => planMerge(bundleTarget(into && { cruise: into, observations: [], history: [], conflicts: [], track: [], photos: [] }), { cruise: c, observations: [], history: [], conflicts: [], track: [], photos: [] }).cruise.value;

/**
 * Checks a batch of pulled documents. Cruise records are read first (each as a log file of its
 * own); the observations and the track are read with the cruise as known after them.
 */
export function checkPulled(raw: readonly unknown[], ctx: CheckContext): CheckResult {
  const refused: Refusal[] = [];
  const ignored: string[] = [];
  const accepted: string[] = [];
  const docs: SyncDoc[] = [];
  const seenIds = new Set<string>();
  for (const r of raw) {
    const e = checkEnvelope(r, ctx.cruiseId);
    if ('ignore' in e) ignored.push(e.ignore);
    else if ('refusal' in e) refused.push(e.refusal);
    else if (!seenIds.has(e.doc._id)) {
      seenIds.add(e.doc._id);
      docs.push(e.doc);
    }
  }
  const rules = ctx.rules;
  let cruise = ctx.storedCruise;
  let cruiseChanged = false;
  for (const d of docs) {
    if (d.type !== 'floe-ledger/cruise') continue;
    const text = JSON.stringify({ ...header(d.formatVersion, ctx.storedCruise ?? placeholderCruise(ctx.cruiseId)), ...d.body, formatVersion: d.formatVersion, observations: [], track: { columns: [...TRACK_COLUMNS], points: [] }, photos: [] });
    const r = readLogText(text, { rules: null });
    if (!r.ok) {
      refused.push({ docId: d._id, reason: r.problems.listed.map(formatProblem).join('; ') });
      continue;
    }
    if (r.bundle.cruise.id !== ctx.cruiseId) {
      refused.push({ docId: d._id, reason: `is a record of cruise ${show(r.bundle.cruise.id)}` });
      continue;
    }
    cruise = mergeCruise(cruise, r.bundle.cruise);
    cruiseChanged = true;
    accepted.push(d._id);
  }

  const obs = docs.filter((d): d is ObservationDoc => d.type === 'floe-ledger/observation');
  const track = docs.filter((d): d is TrackDoc => d.type === 'floe-ledger/track');
  const photoDocs = docs.filter((d): d is PhotoDoc => d.type === 'floe-ledger/photo');
  if (!cruise) {
    for (const d of [...obs, ...track, ...photoDocs]) refused.push({ docId: d._id, reason: 'no valid cruise record of this cruise is on the server or on this laptop yet' });
    return { bundle: null, accepted, refused, ignored, photos: [], cruise };
  }

  const bundle: LogBundle = { cruise, observations: [], history: [], conflicts: [], track: [], photos: [] };
  const versions = new Set([...obs, ...track].map((d) => d.formatVersion));
  for (const version of versions) {
    let o = obs.filter((d) => d.formatVersion === version);
    let t = track.filter((d) => d.formatVersion === version);
    // Each round refuses at least one document or ends, so this stops.
    for (;;) {
      if (o.length === 0 && t.length === 0) break;
      const a = assemble(version, cruise, o, t);
      const r = readLogText(a.text, rules === undefined ? {} : { rules });
      if (r.ok) {
        bundle.observations.push(...r.bundle.observations);
        bundle.history.push(...r.bundle.history);
        bundle.conflicts.push(...r.bundle.conflicts);
        bundle.track.push(...r.bundle.track);
        for (const d of [...o, ...t]) accepted.push(d._id);
        break;
      }
      const bad = new Map<string, string[]>();
      let whole: Problem | null = null;
      for (const p of r.problems.listed) {
        const id = culprit(p, a.origins);
        if (id === null) {
          whole ??= p;
          continue;
        }
        const l = bad.get(id);
        if (l) l.push(formatProblem(p));
        else bad.set(id, [formatProblem(p)]);
      }
      if (bad.size === 0) {
        const reason = `the batch cannot be read: ${whole ? formatProblem(whole) : 'unknown problem'}`;
        for (const d of [...o, ...t]) refused.push({ docId: d._id, reason });
        break;
      }
      for (const [id, reasons] of bad) refused.push({ docId: id, reason: reasons.join('; ').replace(/\$\.observations\[\d+\](\.(history|conflicts)\[\d+\])?/g, '$').replace(/\$\.track\.points\[\d+\]/g, 'track point') });
      o = o.filter((d) => !bad.has(d._id));
      t = t.filter((d) => !bad.has(d._id));
    }
  }
  const photos = checkPhotoDescriptions(photoDocs, cruise, bundle.observations, ctx.observation, refused);
  const any = bundle.observations.length + bundle.history.length + bundle.conflicts.length + bundle.track.length > 0 || cruiseChanged;
  return { bundle: any ? bundle : null, accepted, refused, ignored, photos, cruise };
}

/**
 * Photo descriptions, read as the photo list of a log file that holds the observations they
 * belong to (from this batch or this laptop's log): the schema's limits (media type, size),
 * the times and the reference checks of an imported file. A photo whose observation is in
 * neither is refused.
 */
function checkPhotoDescriptions(docs: PhotoDoc[], cruise: Cruise, batch: Observation[], stored: CheckContext['observation'], refused: Refusal[]): { doc: PhotoDoc; meta: PhotoMeta }[] {
  if (docs.length === 0) return [];
  const inBatch = new Map(batch.map((o) => [o.id, o]));
  const owners = new Map<string, Observation>();
  let list = docs.filter((d) => {
    const oid = d.body.observationId;
    const o = typeof oid === 'string' ? (inBatch.get(oid) ?? stored?.(oid)) : undefined;
    if (o) owners.set(o.id, o);
    else refused.push({ docId: d._id, reason: `belongs to observation ${typeof oid === 'string' ? show(oid) : '(none)'}, which is not in this laptop's log` });
    return o !== undefined;
  });
  // Each round refuses at least one document or ends, so this stops.
  while (list.length > 0) {
    const used = new Set(list.map((d) => d.body.observationId));
    const observations = [...owners.values()].filter((o) => used.has(o.id)).map((o) => encodeVersion(o));
    const photos = list.map((d) => ({ ...d.body, archivePath: photoArchivePath(d.body) }));
    const r = readLogText(JSON.stringify({ ...header(CURRENT_VERSION, cruise), observations, track: { columns: [...TRACK_COLUMNS], points: [] }, photos }), { rules: null });
    if (r.ok) return list.map((doc, i) => ({ doc, meta: r.bundle.photos[i] as PhotoMeta }));
    const bad = new Map<number, string[]>();
    for (const p of r.problems.listed) {
      const m = /^\$\.photos\[(\d+)\]/.exec(p.path);
      const i = m ? Number(m[1]) : -1;
      const l = bad.get(i);
      const text = formatProblem(p).replace(/\$\.photos\[\d+\]/g, 'the photo');
      if (l) l.push(text);
      else bad.set(i, [text]);
    }
    const whole = bad.get(-1);
    if (whole) {
      for (const d of list) refused.push({ docId: d._id, reason: `the photo cannot be read with its observation: ${whole.join('; ')}` });
      return [];
    }
    for (const [i, reasons] of bad) refused.push({ docId: (list[i] as PhotoDoc)._id, reason: reasons.join('; ') });
    list = list.filter((_, i) => !bad.has(i));
  }
  return [];
}

/** Only to give a lone cruise record the fields a file needs around it; all are replaced by the record. */
function placeholderCruise(id: string): Cruise {
  return { id, name: id, vesselName: '-', iceClass: 'PC7', intervalMinutes: 60, observers: [], displayTimeZone: 'UTC', maxSpeedKn: 20, createdAt: '2000-01-01T00:00:00Z', updatedAt: '2000-01-01T00:00:00Z' };
}
