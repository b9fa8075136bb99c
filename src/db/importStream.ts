// An import walked in pieces (src/format/readStream.ts): observations a run at a time, the
// track a run of rows at a time. Two passes over the file:
//   preview  reads and checks every piece and plans it against the store (short read
//            transactions per piece), keeping only the counts, the warnings and, per
//            observation, the stored revision it was planned against;
//   apply    ONE read-write transaction: reads the file again piece by piece, plans each piece
//            against the store as it is inside the transaction, checks that every observation
//            still has the revision the preview saw, and writes the piece. A file that fails
//            part way (changed on disk, unreadable), a stale preview or a full disk throws, and
//            the transaction is aborted: the store is untouched.
// A file small enough (the caller decides, KEEP_PIECES_MAX_BYTES) is read once: the preview
// keeps its decoded pieces and the apply writes those, planned again inside its transaction,
// so it does not read the file a second time (about a third of a full-size import's time).
// Why a second read and not a staging table: a staging table costs a schema version and writes
// everything twice; IndexedDB's own transaction already holds the writes until the end. The
// file is read synchronously inside the transaction (FileReaderSync in the import worker, a
// string on the main thread, readSync on the command line), because a transaction commits as
// soon as it waits for anything that is not one of its own requests.
import type { MergeCounts, MergePlan, MergeTarget, StoredVersions, TimeSeen } from '../format/merge';
import { emptyCounts, emptyPlan, planCruise, planObservations, planPhotos, planTrack } from '../format/merge';
import type { Observation, TrackPoint } from '../domain/model';
import type { ProblemReport } from '../format/problems';
import type { ReadWarning } from '../format/read';
import type { LogCounts, LogPiece, LogVerdict, OpenPiecesRoute } from '../format/readStream';
import type { PhotoBytes } from '../format/types';
import Dexie from 'dexie';
import { getDb, writableDb } from './connection';
import type { FloeDatabase } from './database';
import { FloeDbError, mapWriteError } from './errors';
import { planRows, StaleImportError, writePlanInTransaction, type ApplyOptions, type ApplyResult } from './importPlan';
import { storedTrackTimes } from './trackPoints';
import { hourOf, instantOf } from './trackChunk';
import { nowIso } from './validate';
import { cruiseObservations } from './cruiseObservations';

/** The file read differently the second time (changed on disk, or unreadable): nothing was written. */
export class ImportFileChangedError extends FloeDbError {
  readonly kind = 'conflict' as const;
  constructor(why: string) {
    super(`The file changed since the preview was made (${why}). Nothing was imported; open the file again for a fresh preview.`);
    this.name = 'ImportFileChangedError';
  }
}

/**
 * Opens the file's pieces. The apply passes the way the preview read it (`route`) and, for a
 * file read in pieces, the hash of the text the preview checked: the schema and the rules are
 * not run again, and the reading fails at its end if the text is not the same.
 */
export type OpenPieces = (route?: OpenPiecesRoute, checkedHash?: string) => Generator<LogPiece, LogVerdict, void>;

/** What the preview shows, and what the apply needs to find the preview still true. */
export interface ImportSummary {
  cruise: MergePlan['cruise'];
  counts: MergeCounts;
  warnings: ReadWarning[];
  fromVersion: number;
  totals: LogCounts;
  /** Photos listed but without bytes in the file (a plain JSON log). */
  photosWithoutBytes: number;
  route: OpenPiecesRoute;
  /** Hash of the text the preview checked (a file read in pieces). */
  textHash?: string;
}

export type ImportPreview =
  | {
      ok: true;
      summary: ImportSummary;
      expected: Map<string, number | null>;
      /** The pieces the preview read (when asked to keep them): the apply writes these instead of reading the file again. */
      pieces?: LogPiece[];
    }
  | { ok: false; problems: ProblemReport };

/**
 * Largest file whose pieces a preview keeps for the apply: decoded, a log takes about 1.5 times
 * its size in memory (a 141 MB log of 50,000 observations and 1,000,000 track points: about
 * 200 MB; the import's peak in Chromium 774 MB against 532 MB read twice), so an import of a
 * file up to this size stays under 1 GB; a larger file is read a second time instead, and
 * memory stays bounded by a piece.
 */
export const KEEP_PIECES_MAX_BYTES = 160 * 1024 * 1024;

/**
 * Where a pass spends its time, in milliseconds added up per kind of work: `read` (the file's
 * pieces read, parsed and checked), `plan` and `planTrack` (observations and track planned
 * against the store), `write` (the writes).
 * For benchmarks; left out, nothing is measured.
 */
export type ImportTiming = Record<'read' | 'plan' | 'planTrack' | 'write', number>;

/** Times `f` into `timing[key]` when there is a timing. */
function timed<T>(timing: ImportTiming | undefined, key: keyof ImportTiming, f: () => T): T {
  if (!timing) return f();
  const t0 = performance.now();
  try {
    return f();
  } finally {
    timing[key] += performance.now() - t0;
  }
}

async function timedAsync<T>(timing: ImportTiming | undefined, key: keyof ImportTiming, f: () => Promise<T>): Promise<T> {
  if (!timing) return f();
  const t0 = performance.now();
  try {
    return await f();
  } finally {
    timing[key] += performance.now() - t0;
  }
}

/** Stored versions of some observations of a cruise, read inside the caller's transaction. */
async function storedVersions(db: FloeDatabase, cruiseId: string, ids: string[]): Promise<Map<string, StoredVersions>> {
  const out = new Map<string, StoredVersions>();
  if (ids.length === 0) return out;
  const current = (await db.observations.bulkGet(ids)).filter((o): o is Observation => o !== undefined && o.cruiseId === cruiseId);
  if (current.length === 0) return out;
  const known = current.map((o) => o.id);
  const revisions = await db.revisions.where('observationId').anyOf(known).toArray();
  const conflicts = (await db.conflicts.where('observationId').anyOf(known).toArray()).filter((c) => c.cruiseId === cruiseId);
  for (const o of current) out.set(o.id, { current: o, others: [] });
  for (const v of [...revisions.map((r) => r.observation), ...conflicts.map((c) => c.observation)]) (out.get(v.id)?.others as Observation[] | undefined)?.push(v);
  return out;
}

/** The stored track times of the hours some points fall in. */
async function storedTimesOf(db: FloeDatabase, cruiseId: string, points: readonly TrackPoint[]): Promise<(time: string) => boolean> {
  const hours = new Set<string>();
  let lastHour = NaN;
  for (const p of points) {
    const h = Math.floor(instantOf(p.time) / 3_600_000);
    if (h === lastHour || Number.isNaN(h)) continue;
    lastHour = h;
    hours.add(hourOf(h * 3_600_000));
  }
  const chunks = (await db.trackChunks.bulkGet([...hours].map((h) => [cruiseId, h]))).filter((c) => c !== undefined);
  return chunks.length === 0 ? () => false : storedTrackTimes(chunks);
}

/** The times already planned: the last one for a track in time order, every one otherwise. */
function lastTimeOnly(): TimeSeen {
  let last: string | null = null;
  return { has: (t) => t === last, add: (t) => void (last = t) };
}

/** Plans the pieces one by one; `read` gives the store's state for a piece. */
class PiecePlanner {
  counts: MergeCounts = emptyCounts();
  cruise: MergePlan['cruise'] | null = null;
  expected = new Map<string, number | null>();
  seen: TimeSeen = lastTimeOnly();
  photoIds = new Set<string>();
  cruiseId = '';
  photosWithoutBytes = 0;
  /**
   * Whether the store holds nothing of this cruise (a first import, the common case at full
   * size): then no piece needs to ask the store about its observations or track hours.
   */
  private nothingStored = false;

  constructor(
    private readonly db: FloeDatabase,
    private readonly photos: PhotoBytes | undefined,
  ) {}

  private add(plan: MergePlan) {
    for (const k of Object.keys(this.counts) as (keyof MergeCounts)[]) this.counts[k] += plan.counts[k];
  }

  private target(versions: Map<string, StoredVersions>, hasTrackTime: (t: string) => boolean = () => false): MergeTarget {
    return { cruise: null, versions: (id) => versions.get(id), hasTrackTime, hasPhoto: (id) => this.photoIds.has(id) };
  }

  async head(p: LogPiece & { kind: 'head' }): Promise<void> {
    this.cruiseId = p.cruise.id;
    const stored = (await this.db.cruises.get(p.cruise.id)) ?? null;
    this.photoIds = new Set(await this.db.photos.where('cruiseId').equals(p.cruise.id).primaryKeys());
    this.nothingStored =
      stored === null &&
      (await cruiseObservations(this.db, p.cruise.id).limit(1).count()) === 0 &&
      (await this.db.trackChunks.where('[cruiseId+hour]').between([p.cruise.id, Dexie.minKey], [p.cruise.id, Dexie.maxKey], true, true).limit(1).count()) === 0;
    this.cruise = planCruise(stored, p.cruise);
  }

  async observations(p: LogPiece & { kind: 'observations' }): Promise<MergePlan> {
    const stored = this.nothingStored ? new Map<string, StoredVersions>() : await storedVersions(this.db, this.cruiseId, p.observations.map((o) => o.id));
    const plan = emptyPlan(this.cruise as MergePlan['cruise']);
    planObservations(plan, this.target(stored), p);
    this.add(plan);
    return plan;
  }

  async track(p: LogPiece & { kind: 'track' }): Promise<MergePlan> {
    const plan = emptyPlan(this.cruise as MergePlan['cruise']);
    const hasTime = this.nothingStored ? () => false : await storedTimesOf(this.db, this.cruiseId, p.points);
    planTrack(plan, this.target(new Map(), hasTime), p.points, this.seen);
    this.add(plan);
    return plan;
  }

  photosPiece(p: LogPiece & { kind: 'photos' }): MergePlan {
    const plan = emptyPlan(this.cruise as MergePlan['cruise']);
    planPhotos(plan, this.target(new Map()), p.photos);
    this.photosWithoutBytes += plan.addPhotos.filter((x) => !this.photos?.has(x.id)).length;
    this.add(plan);
    return plan;
  }
}

/**
 * The first pass: reads and plans every piece, writes nothing. On a file the piece reader
 * leaves to the whole-file reader (a `restart` piece), the plan starts over.
 */
export async function previewImport(open: OpenPieces, opts: { photos?: PhotoBytes; onProgress?: (done: number) => void; timing?: ImportTiming; keepPieces?: boolean } = {}): Promise<ImportPreview> {
  const db = getDb();
  const timing = opts.timing;
  let planner = new PiecePlanner(db, opts.photos);
  let kept: LogPiece[] | null = opts.keepPieces === true ? [] : null;
  const gen = open();
  let done = 0;
  for (;;) {
    const n = timed(timing, 'read', () => gen.next());
    if (n.done) {
      const v = n.value;
      if (!v.ok) return v;
      const summary: ImportSummary = {
        cruise: planner.cruise as MergePlan['cruise'],
        counts: planner.counts,
        warnings: v.warnings,
        fromVersion: v.fromVersion,
        totals: v.counts,
        photosWithoutBytes: planner.photosWithoutBytes,
        route: v.route,
      };
      if (v.textHash !== undefined) summary.textHash = v.textHash;
      return kept ? { ok: true, summary, expected: planner.expected, pieces: kept } : { ok: true, summary, expected: planner.expected };
    }
    const p = n.value;
    if (kept) {
      if (p.kind === 'restart') kept = [];
      else kept.push(p);
    }
    if (p.kind === 'restart') {
      planner = new PiecePlanner(db, opts.photos);
      planner.seen = new Set<string>();
      done = 0;
    } else if (p.kind === 'head') await db.transaction('r', [db.cruises, db.photos, db.observations, db.trackChunks], () => planner.head(p));
    else if (p.kind === 'observations') {
      const plan = await timedAsync(timing, 'plan', () => db.transaction('r', [db.observations, db.revisions, db.conflicts], () => planner.observations(p)));
      for (const item of plan.items) planner.expected.set(item.id, item.storedRevision);
      done += p.observations.length;
    } else if (p.kind === 'track') {
      await timedAsync(timing, 'planTrack', () => db.transaction('r', [db.trackChunks], () => planner.track(p)));
      done += p.points.length;
    } else planner.photosPiece(p);
    opts.onProgress?.(done);
  }
}

/**
 * The pieces a preview kept, handed out again as the file's reader would, and let go of one by
 * one, so that memory shrinks as the apply writes them.
 */
function* keptPieces(pieces: LogPiece[], summary: ImportSummary): Generator<LogPiece, LogVerdict, void> {
  for (let p = pieces.shift(); p !== undefined; p = pieces.shift()) yield p;
  return { ok: true, fromVersion: summary.fromVersion, warnings: summary.warnings, archivePaths: new Map(), counts: summary.totals, route: summary.route };
}

/**
 * The second pass, in one read-write transaction (see the header). `open` must read the same
 * file as the preview did; `onProgress` gets the observations and track points written so far.
 */
export async function applyImport(open: OpenPieces, preview: ImportPreview & { ok: true }, opts: ApplyOptions & { onProgress?: (done: number) => void; timing?: ImportTiming }): Promise<ApplyResult> {
  const db = await writableDb();
  const timing = opts.timing;
  const at = nowIso();
  const result: ApplyResult = { observations: 0, history: 0, conflicts: 0, trackPoints: 0, photos: 0, photosWithoutBytes: 0 };
  // Kept pieces serve one apply: another try (after a full disk, say) reads the file again.
  const kept = preview.pieces;
  delete preview.pieces;
  try {
    await db.transaction('rw', [db.cruises, db.observations, db.revisions, db.conflicts, db.trackChunks, db.photos], async () => {
      const planner = new PiecePlanner(db, opts.photos);
      if (preview.summary.route === 'whole') planner.seen = new Set<string>();
      const gen = kept ? keptPieces(kept, preview.summary) : open(preview.summary.route, preview.summary.textHash);
      let planned = 0;
      let done = 0;
      // The next piece, read while the writes of the one before were in flight.
      let prefetched: IteratorResult<LogPiece, LogVerdict> | null = null;
      for (;;) {
        const n = prefetched ?? timed(timing, 'read', () => gen.next());
        prefetched = null;
        if (n.done) {
          if (!n.value.ok) throw new ImportFileChangedError(n.value.problems.listed[0]?.message ?? 'it no longer reads');
          break;
        }
        const p = n.value;
        let plan: MergePlan | null = null;
        if (p.kind === 'restart') throw new ImportFileChangedError('it no longer reads in pieces');
        if (p.kind === 'head') {
          await planner.head(p);
          const cruise = planner.cruise as MergePlan['cruise'];
          if (cruise.action !== 'unchanged') await db.cruises.put(cruise.value);
        } else if (p.kind === 'observations') {
          plan = await timedAsync(timing, 'plan', () => planner.observations(p));
          for (const item of plan.items) {
            const want = preview.expected.get(item.id);
            if (want === undefined) throw new ImportFileChangedError(`observation ${item.id} is new in it`);
            if (want !== item.storedRevision) throw new StaleImportError(item.id);
          }
          planned += plan.items.length;
          done += p.observations.length;
        } else if (p.kind === 'track') {
          plan = await timedAsync(timing, 'planTrack', () => planner.track(p));
          done += p.points.length;
        } else plan = planner.photosPiece(p);
        if (plan) {
          const rows = planRows(plan, opts, at);
          const ready = plan;
          // The next piece is read (parsed, checked) while IndexedDB writes this one outside
          // this thread, so the two overlap; memory holds at most two pieces. The writes are
          // awaited in this same turn: awaiting them later, after other awaits, would leave
          // Dexie's transaction zone and the transaction would commit early. The next piece is
          // planned only after, so its plan sees these writes.
          const writing = writePlanInTransaction(db, ready, rows);
          try {
            prefetched = timed(timing, 'read', () => gen.next());
          } catch (err) {
            writing.catch(() => undefined);
            throw err;
          }
          await timedAsync(timing, 'write', () => writing);
          result.observations += plan.putCurrent.length;
          result.history += rows.revisions.length;
          result.conflicts += rows.conflicts.length;
          result.trackPoints += plan.addTrack.length;
          result.photos += rows.photos.length;
          result.photosWithoutBytes += rows.photosWithoutBytes;
        }
        opts.onProgress?.(done);
      }
      if (planned !== preview.expected.size) throw new ImportFileChangedError(`it holds ${planned} observations, not ${preview.expected.size}`);
    });
  } catch (err) {
    if (err instanceof StaleImportError || err instanceof ImportFileChangedError) throw err;
    throw mapWriteError(err, 'the import');
  }
  return result;
}
