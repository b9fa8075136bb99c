// Reading a log file in pieces, so that memory is bounded by a constant plus the largest piece
// rather than by the file: the text arrives a few megabytes at a time, the structural scan
// (scan.ts) walks it and marks every 2,000th observation and every 50,000th track row, and each
// run between two marks is parsed, checked against the schema (as a small document made of the
// file's head and that run), migrated, checked by decode.ts and by the domain rules, and handed
// on as a piece. What remains of the file (its head, the track's columns, the photo list) is
// small and is checked whole at the end.
//
// The whole-file reader (read.ts) stays the reference: this reader accepts a file only when
// every check that reader makes has passed, and it gives up ("not ok") at the first doubt, a
// problem or a layout it does not handle (members after the lists, an unordered track, format
// version 0). The caller then reads the file whole (`openLog` below does it), which gives the
// same report, with lines and columns, as before. So a valid file of the usual layout never
// needs the whole text in memory, and a rejected file is described exactly as before.
import type { Cruise, Observation, TrackPoint } from '../domain/model';
import { validateObservation } from '../domain/rules';
import { LogDecoder, NeedsWholeFile, type DecodedObservations } from './decode';
import { groupById } from './encode';
import { LIMITS } from './limits';
import { migrateToCurrent, VALIDATORS } from './migrate';
import type { Problem, ProblemReport } from './problems';
import { photoWarnings, readLogText, ruleFindings, type ReadOptions, type ReadResult, type ReadWarning, type RuleCheck } from './read';
import { nextListRun } from './listRuns';
import { JsonScanner } from './scan';
import { decodeLogText } from './text';
import { CURRENT_VERSION, FORMAT_NAME, TRACK_COLUMNS, type FileObservation, type LogBundle, type LogFileV2, type PhotoMeta, type TrackRow } from './types';

/** What a reader hands on, in file order; every piece is provisional until the verdict is ok. */
export type LogPiece =
  | { kind: 'head'; cruise: Cruise; fromVersion: number }
  | ({ kind: 'observations'; first: number } & DecodedObservations)
  | { kind: 'track'; first: number; points: TrackPoint[] }
  | { kind: 'photos'; photos: PhotoMeta[] }
  /** The piece reader gave up and the file is read whole: forget the pieces so far. */
  | { kind: 'restart' };

export interface LogCounts {
  observations: number;
  history: number;
  conflicts: number;
  trackPoints: number;
  photos: number;
}

export type LogVerdict =
  | { ok: true; fromVersion: number; warnings: ReadWarning[]; archivePaths: Map<string, string>; counts: LogCounts; route: 'pieces' | 'whole'; textHash?: string }
  | { ok: false; problems: ProblemReport };

/** The piece reader's own end: accepted, or given up with a reason (for tests and logs). */
export type PieceVerdict = (LogVerdict & { ok: true; charScanned: number }) | { ok: false; reason: string };

/** Next piece of the file's text, or null at the end. */
export type TextSource = () => string | null;

export interface PieceOptions {
  rules?: RuleCheck | null;
  limits?: ReadOptions['limits'];
  /** Observations per piece (default 2,000). */
  observationBatch?: number;
  /** Track rows per piece (default 50,000). */
  trackBatch?: number;
  /**
   * The text's hash from an earlier reading that passed every check: the schema and the rules
   * are skipped, and the verdict is ok only if the text hashes the same (the second pass of an
   * import, inside its transaction, checks the file it read is the one the preview checked).
   */
  checkedHash?: string;
  /**
   * Text of a long list taken per run when its layout allows (listRuns.ts; default 1 MiB). The
   * pieces handed out are the same whatever the run.
   */
  runChars?: number;
  /** Read the long lists character by character only (the reference way, for tests). */
  charScan?: boolean;
}

/** A streaming hash of text (two 32-bit FNV-1a style lanes): equal text, equal hash. */
class TextHash {
  private a = 0x811c9dc5;
  private b = 0x01000193;
  private n = 0;
  add(text: string): void {
    let { a, b } = this;
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      a = Math.imul(a ^ c, 0x01000193);
      b = Math.imul(b ^ c, 0x5bd1e995) ^ (b >>> 15);
    }
    this.a = a;
    this.b = b;
    this.n += text.length;
  }
  value(): string {
    return `${(this.a >>> 0).toString(16).padStart(8, '0')}${(this.b >>> 0).toString(16).padStart(8, '0')}:${this.n}`;
  }
}

class GiveUp extends Error {}

const WHITESPACE = /^[ \t\r\n]*$/;

/** Largest run of list elements, or skeleton, held as text (a run of the usual size is a few MB). */
const MAX_RUN_CHARS = 64 << 20;

/** `{...head}` text cut before member `key` (its start in `text` is `end`): closed and parsed. */
function parseOpening(text: string, end: number, close: string): unknown {
  let t = text.slice(0, end).trimEnd();
  if (t.endsWith(',')) t = t.slice(0, -1);
  try {
    return JSON.parse(t + close);
  } catch {
    throw new GiveUp('the opening of the file is not JSON');
  }
}

/**
 * Reads log text in pieces (see the header). Returns the verdict; on `ok: false` the pieces
 * handed out must be dropped and the file read whole for its report.
 */
export function* readLogPieces(source: TextSource, opts: PieceOptions = {}): Generator<LogPiece, PieceVerdict, void> {
  try {
    return yield* piecesOf(source, opts);
  } catch (err) {
    if (err instanceof GiveUp || err instanceof NeedsWholeFile) return { ok: false, reason: err.message };
    throw err;
  }
}

function* piecesOf(source: TextSource, opts: PieceOptions): Generator<LogPiece, PieceVerdict, void> {
  const limits = { ...LIMITS, ...opts.limits };
  const rules = opts.rules === undefined ? validateObservation : opts.rules;
  const obsBatch = Math.max(1, opts.observationBatch ?? 2_000);
  const trackBatch = Math.max(1, opts.trackBatch ?? 50_000);
  const scanner = new JsonScanner(limits, true);
  const problems: Problem[] = [];
  const archivePaths = new Map<string, string>();
  const decoder = new LogDecoder(problems, archivePaths);
  const obsWarnings: ReadWarning[] = [];
  const historyWarnings: ReadWarning[] = [];
  const photoRefs: [number, readonly string[]][] = [];
  const counts: LogCounts = { observations: 0, history: 0, conflicts: 0, trackPoints: 0, photos: 0 };

  // The file's text outside the two lists, which are left as `[]`.
  let skel = '';
  const memberAt = new Map<string, number>();
  const trackMemberAt = new Map<string, number>();
  let topKey = '';
  let head: Record<string, unknown> | null = null;
  let cruise: Cruise | null = null;
  let version = 0;
  let trackHead: Record<string, unknown> | null = null;
  let listsStarted = false;
  let big: { kind: 'observations' | 'track'; from: number; index: number; cut: boolean } | null = null;

  const listKind = (depth: number, path: readonly string[]): 'observations' | 'track' | null =>
    depth === 2 && path[0] === 'observations' ? 'observations' : depth === 3 && path[0] === 'track' && path[1] === 'points' ? 'track' : null;
  scanner.pauseOnWatch = opts.charScan !== true;
  const runChars = Math.max(1, opts.runChars ?? 1 << 20);
  scanner.watchArray = (depth, path) => {
    const kind = listKind(depth, path);
    return kind === 'observations' ? obsBatch : kind === 'track' ? trackBatch : 0;
  };

  const emptyTrack = () => ({ columns: [...TRACK_COLUMNS], points: [] as TrackRow[] });
  /** The schema of the file's version, then migration and the current schema, on a small document. */
  const trusted = opts.checkedHash !== undefined;
  const hash = new TextHash();
  const checkDoc = (doc: Record<string, unknown>): LogFileV2 => {
    const validate = VALIDATORS[version];
    if (!trusted && !validate?.(doc)) throw new GiveUp('the schema refuses a piece');
    if (version === CURRENT_VERSION) return doc as unknown as LogFileV2;
    const migrated = migrateToCurrent(doc, version);
    if (!trusted && !(VALIDATORS[CURRENT_VERSION] as NonNullable<(typeof VALIDATORS)[number]>)(migrated)) throw new GiveUp('a migrated piece fails the current schema');
    return migrated;
  };
  const noProblems = (what: string) => {
    if (problems.length > 0) throw new GiveUp(`${what}: ${problems[0]?.path} ${problems[0]?.message}`);
  };

  function startHead(): LogPiece {
    head = parseOpening(skel, memberAt.get(topKey) ?? skel.length, '}') as Record<string, unknown>;
    if (head === null || typeof head !== 'object' || Array.isArray(head)) throw new GiveUp('the file is not a JSON object');
    if (head.format !== FORMAT_NAME) throw new GiveUp('not a Floe Ledger log');
    const v = head.formatVersion;
    // Version 0 keeps its track elsewhere; it and anything unknown are read whole.
    if (typeof v !== 'number' || !Number.isInteger(v) || v < 1 || v > CURRENT_VERSION) throw new GiveUp(`format version ${String(v)} is read whole`);
    version = v;
    const doc = checkDoc({ ...head, observations: [], track: emptyTrack(), photos: [] });
    cruise = decoder.head(doc);
    noProblems('head');
    return { kind: 'head', cruise, fromVersion: version };
  }

  function batch(text: string, last: boolean): LogPiece | null {
    const b = big as NonNullable<typeof big>;
    if (WHITESPACE.test(text)) {
      // Only an empty list may have nothing between its brackets; `[a,]` and `[,a]` may not.
      if (last && !b.cut && b.index === 0) return null;
      throw new GiveUp('an empty element in a list');
    }
    let items: unknown[];
    try {
      items = JSON.parse(`[${text}]`) as unknown[];
    } catch {
      throw new GiveUp('a list element is not JSON');
    }
    charScanned += items.length;
    if (pending.length > 0) {
      items = [...pending, ...items];
      pending = [];
    }
    return listPiece(items);
  }

  /** The next piece of the open list: `items` follow the elements handed out so far. */
  function listPiece(items: unknown[]): LogPiece {
    const b = big as NonNullable<typeof big>;
    const first = b.index;
    b.index += items.length;
    if (b.kind === 'observations') {
      if (b.index > limits.maxObservations) throw new GiveUp('too many observations');
      const doc = checkDoc({ ...(head as object), observations: items, track: emptyTrack(), photos: [] });
      const lists: DecodedObservations = { observations: [], history: [], conflicts: [] };
      decoder.observations(doc.observations, first, lists);
      noProblems('observations');
      checkRules(doc.observations, first, lists);
      counts.observations += lists.observations.length;
      counts.history += lists.history.length;
      counts.conflicts += lists.conflicts.length;
      return { kind: 'observations', first, ...lists };
    }
    if (b.index > limits.maxTrackPoints) throw new GiveUp('too many track points');
    const doc = checkDoc({ ...(head as object), observations: [], track: { ...(trackHead as object), points: items }, photos: [] });
    const points: TrackPoint[] = [];
    decoder.track(doc.track.points, first, points);
    noProblems('track');
    counts.trackPoints += points.length;
    return { kind: 'track', first, points };
  }

  function checkRules(file: readonly FileObservation[], first: number, lists: DecodedObservations) {
    const c = cruise as Cruise;
    let h = 0;
    lists.observations.forEach((o, k) => {
      const i = first + k;
      if (o.photoIds.length > 0) photoRefs.push([i, o.photoIds]);
      if (!rules || trusted) return;
      const ruleProblems: Problem[] = [];
      ruleFindings(rules, o, c, `$.observations[${i}]`, ruleProblems, obsWarnings);
      (file[k]?.history ?? []).forEach((_, j) => ruleFindings(rules, lists.history[h++] as Observation, c, `$.observations[${i}].history[${j}]`, ruleProblems, historyWarnings));
      if (ruleProblems.length > 0) throw new GiveUp(`a rule error at ${ruleProblems[0]?.path}`);
    });
  }

  let buf = '';
  let skelFrom = 0;
  // Taking the open list a run at a time (listRuns.ts): whether a comma came last, and the
  // elements parsed but not yet handed out (fewer than a piece).
  let listRun: { afterComma: boolean; carry: unknown[] } | null = null;
  // Elements of the long lists read after a character scan (the layout did not allow runs).
  let charScanned = 0;
  // Elements a run parsed before the scan took over, handed out with the scan's first piece.
  let pending: unknown[] = [];
  let firstPiece = true;
  for (;;) {
    let piece = source();
    const final = piece === null;
    if (piece !== null) {
      if (firstPiece && piece.charCodeAt(0) === 0xfeff) piece = piece.slice(1);
      firstPiece = false;
      hash.add(piece);
      buf += piece;
    }
    // The scan and the runs of a long list take turns until the text in hand is used up.
    for (;;) {
      if (listRun) {
        const b = big as NonNullable<typeof big>;
        const r = nextListRun(buf, b.from, final, { trusted, maxStringLength: limits.maxStringLength, maxDepth: limits.maxDepth, minChars: runChars, maxChars: Math.max(16 * runChars, limits.maxStringLength + 64), afterComma: listRun.afterComma });
        if (r.kind === 'more') break;
        if (r.kind === 'scan') {
          // The rest of this list is scanned character by character, as a file of another
          // layout; the pieces are cut where the scan alone would have cut them.
          pending = listRun.carry;
          scanner.resumeInList(b.from, b.index + pending.length, pending.length);
          b.cut = b.index + pending.length > 0;
          listRun = null;
        } else {
          const carry = listRun.carry;
          for (const item of r.items) carry.push(item);
          if (b.index + carry.length > limits.maxArrayLength) throw new GiveUp(`an array with more than ${limits.maxArrayLength} elements`);
          const size = b.kind === 'observations' ? obsBatch : trackBatch;
          let at = 0;
          for (; carry.length - at >= size; at += size) yield listPiece(carry.slice(at, at + size));
          listRun.carry = at === 0 ? carry : carry.slice(at);
          if (r.kind === 'run') {
            b.from = r.next;
            listRun.afterComma = true;
            continue;
          }
          if (listRun.carry.length > 0) yield listPiece(listRun.carry);
          skelFrom = r.close;
          big = null;
          listRun = null;
          scanner.resumeAfterList(r.close);
        }
      }
      const fault = scanner.scan(buf, final);
      if (fault) throw new GiveUp(fault.message);
      for (const e of scanner.events) {
        if (e.type === 'key') {
          skel += buf.slice(skelFrom, e.at);
          skelFrom = e.at;
          if (e.depth === 1) {
            topKey = e.key;
            // Every list piece is checked with the head: no member may come after the lists but them.
            if (listsStarted && e.key !== 'observations' && e.key !== 'track' && e.key !== 'photos') throw new GiveUp(`the member "${e.key}" comes after the lists`);
            memberAt.set(e.key, skel.length);
          } else if (topKey === 'track') trackMemberAt.set(e.key, skel.length);
        } else if (e.type === 'open') {
          const kind = e.watched ? listKind(e.depth, e.path) : null;
          if (kind === null) continue;
          skel += buf.slice(skelFrom, e.at + 1);
          skelFrom = e.at + 1;
          if (!head) yield startHead();
          listsStarted = true;
          if (kind === 'track') {
            const start = memberAt.get('track') ?? 0;
            const opening = parseOpening(`{${skel.slice(start)}`, (trackMemberAt.get('points') ?? skel.length) - start + 1, '}}');
            trackHead = (opening as { track?: Record<string, unknown> }).track ?? null;
            if (!trackHead || typeof trackHead !== 'object') throw new GiveUp('the track has no opening');
          }
          big = { kind, from: e.at + 1, index: 0, cut: false };
        } else if (e.type === 'cut') {
          const b = big as NonNullable<typeof big>;
          const p = batch(buf.slice(b.from, e.at), false);
          b.from = e.at + 1;
          b.cut = true;
          if (p) yield p;
        } else {
          if (buf.charCodeAt(e.at) !== 93 /* ] */) throw new GiveUp('a list closed with "}"');
          const b = big as NonNullable<typeof big>;
          const p = batch(buf.slice(b.from, e.at), true);
          if (p) yield p;
          skelFrom = e.at;
          big = null;
        }
      }
      scanner.events.length = 0;
      if (!scanner.paused) break;
      // Paused at a long list's `[`: its elements are taken a run at a time.
      listRun = { afterComma: false, carry: [] };
    }
    // Keep only what is not yet handed on: the open run of a list, or the text after the scan.
    let drop: number;
    if (big) drop = big.from;
    else {
      drop = scanner.keepFrom;
      skel += buf.slice(skelFrom, drop);
    }
    // A run or a skeleton far beyond what any log holds (a file of one giant element): the
    // whole reader takes it, so this reader never copies an ever-growing run again and again.
    if ((big && buf.length - big.from > MAX_RUN_CHARS) || skel.length > MAX_RUN_CHARS) throw new GiveUp('a piece larger than the piece reader takes');
    if (drop > 0) {
      buf = buf.slice(drop);
      scanner.rebase(drop);
      if (big) big.from -= drop;
      // Outside a list the skeleton was taken up to here; inside one, the list's end resets it.
      skelFrom = 0;
    }
    if (final) break;
  }
  if (buf.trim() !== '') throw new GiveUp('text after the end');
  if (!head) throw new GiveUp('no list found');
  let whole: unknown;
  try {
    whole = JSON.parse(skel);
  } catch {
    throw new GiveUp('the file around the lists is not JSON');
  }
  const doc = checkDoc(whole as Record<string, unknown>);
  const photos = decoder.photos(doc.photos);
  noProblems('photos');
  counts.photos = photos.length;
  yield { kind: 'photos', photos };
  const warnings: ReadWarning[] = [];
  photoWarnings(photoRefs, new Set(photos.map((p) => p.id)), warnings);
  warnings.push(...obsWarnings, ...historyWarnings);
  const textHash = hash.value();
  if (trusted && textHash !== opts.checkedHash) throw new GiveUp('the text is not the text that was checked');
  return { ok: true, fromVersion: version, warnings, archivePaths, counts, route: 'pieces', textHash, charScanned };
}

/** The pieces of a bundle already read whole, in the order the piece reader gives them. */
export function* bundlePieces(read: ReadResult & { ok: true }, batch = 2_000): Generator<LogPiece, LogVerdict, void> {
  const b = read.bundle;
  yield { kind: 'head', cruise: b.cruise, fromVersion: read.fromVersion };
  const history = groupById(b.history);
  const conflicts = groupById(b.conflicts);
  for (let i = 0; i < b.observations.length; i += batch) {
    const observations = b.observations.slice(i, i + batch);
    yield {
      kind: 'observations',
      first: i,
      observations,
      history: observations.flatMap((o) => history.get(o.id) ?? []),
      conflicts: observations.flatMap((o) => conflicts.get(o.id) ?? []),
    };
  }
  const trackBatch = batch * 25;
  for (let i = 0; i < b.track.length; i += trackBatch) yield { kind: 'track', first: i, points: b.track.slice(i, i + trackBatch) };
  yield { kind: 'photos', photos: b.photos };
  const counts: LogCounts = { observations: b.observations.length, history: b.history.length, conflicts: b.conflicts.length, trackPoints: b.track.length, photos: b.photos.length };
  return { ok: true, fromVersion: read.fromVersion, warnings: read.warnings, archivePaths: read.archivePaths, counts, route: 'whole' };
}

/** The way a file was read: in pieces, or whole (after the piece reader gave up). */
export type OpenPiecesRoute = 'pieces' | 'whole';

/** A log file that can be read more than once: in pieces, or whole when that is needed. */
export interface LogSource {
  /** A fresh reader of the text from the start. */
  pieces: () => TextSource;
  /** The whole text, as the whole-file reader takes it (with the file's size in bytes). */
  whole: () => { text: string; byteLength: number } | { problem: Problem };
}

/** Bytes of a file read per piece. */
export const PIECE_BYTES = 4 << 20;

/**
 * A log file read through `range` (its bytes from `at`, `n` of them or fewer at the end): in
 * pieces of PIECE_BYTES for the reader in pieces, whole for the whole-file reader. The app's
 * import worker reads with FileReaderSync, the command line with readSync. `onPiece` gets the
 * fraction of the file read.
 */
export function byteRangeSource(size: number, range: (at: number, n: number) => Uint8Array, onPiece?: (fraction: number) => void): LogSource {
  return {
    pieces: () => {
      let at = 0;
      return utf8Source(() => {
        if (at >= size) return null;
        const bytes = range(at, PIECE_BYTES);
        at += PIECE_BYTES;
        onPiece?.(Math.min(1, at / size));
        return bytes;
      });
    },
    whole: () => {
      const decoded = decodeLogText(range(0, size));
      return decoded.ok ? { text: decoded.text, byteLength: size } : { problem: decoded.problem };
    },
  };
}

/**
 * The pieces of a log: read in pieces when it can be, otherwise (after a `restart` piece) read
 * whole and handed out in the same pieces. `route` forces one way (the second pass of an
 * import takes the way the first one took).
 */
export function* openLog(src: LogSource, opts: PieceOptions & { route?: OpenPiecesRoute } = {}): Generator<LogPiece, LogVerdict, void> {
  if (opts.route !== 'whole') {
    const r = yield* readLogPieces(src.pieces(), opts);
    if (r.ok) return r;
    if (opts.route === 'pieces') return { ok: false, problems: { listed: [{ path: '$', message: `the file changed since it was first read (${r.reason})` }], more: 0 } };
    yield { kind: 'restart' };
  }
  const w = src.whole();
  if ('problem' in w) return { ok: false, problems: { listed: [w.problem], more: 0 } };
  const read = readLogText(w.text, { rules: opts.rules, limits: opts.limits }, w.byteLength);
  if (!read.ok) return read;
  return yield* bundlePieces(read, opts.observationBatch);
}

/** Gathers the pieces into a LogBundle (the command line, tests). */
export function collectPieces(gen: Generator<LogPiece, LogVerdict, void>): { verdict: LogVerdict; bundle: LogBundle | null } {
  let bundle: LogBundle | null = null;
  for (;;) {
    const n = gen.next();
    if (n.done) return { verdict: n.value, bundle: n.value.ok ? bundle : null };
    const p = n.value;
    if (p.kind === 'restart') bundle = null;
    else if (p.kind === 'head') bundle = { cruise: p.cruise, observations: [], history: [], conflicts: [], track: [], photos: [] };
    else if (!bundle) continue;
    else if (p.kind === 'observations') {
      for (const o of p.observations) bundle.observations.push(o);
      for (const o of p.history) bundle.history.push(o);
      for (const o of p.conflicts) bundle.conflicts.push(o);
    } else if (p.kind === 'track') for (const t of p.points) bundle.track.push(t);
    else bundle.photos = p.photos;
  }
}

/** A text source over a string already in memory, a few megabytes at a time (tests, jsdom). */
export function stringSource(text: string, pieceChars = 4 << 20): TextSource {
  let at = 0;
  return () => {
    if (at >= text.length) return null;
    const piece = text.slice(at, at + pieceChars);
    at += pieceChars;
    return piece;
  };
}

/**
 * A text source over bytes read a piece at a time (`next` gives the next bytes or null). Only
 * UTF-8 without zero bytes passes; anything else ends the piece reading (GiveUp), and the whole
 * file reader then names what the file is (text.ts).
 */
export function utf8Source(next: () => Uint8Array | null): TextSource {
  const decoder = new TextDecoder('utf-8', { fatal: true });
  let done = false;
  return () => {
    if (done) return null;
    const bytes = next();
    try {
      if (bytes === null) {
        done = true;
        const rest = decoder.decode();
        return rest === '' ? null : rest;
      }
      if (bytes.indexOf(0) !== -1) throw new GiveUp('a zero byte');
      return decoder.decode(bytes, { stream: true });
    } catch (err) {
      if (err instanceof GiveUp) throw err;
      throw new GiveUp('not UTF-8');
    }
  };
}
