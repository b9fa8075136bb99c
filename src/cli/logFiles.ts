// Reading and writing log files for the commands: the same readers as the app (src/format), a
// size check before a file is read, and problems printed one per line with the file name.
import { closeSync, openSync, readSync, statSync } from 'node:fs';
import { looksLikeZip, writeArchive } from '../format/archive.ts';
import { exportLogJson } from '../format/encode.ts';
import { readArchive } from '../format/archiveRead.ts';
import { LIMITS } from '../format/limits.ts';
import { formatProblem, formatReport, type ProblemReport } from '../format/problems.ts';
import { readLogText, type ReadWarning } from '../format/read.ts';
import { bundlePieces, byteRangeSource, collectPieces, openLog, type LogCounts, type LogPiece, type LogVerdict } from '../format/readStream.ts';
import type { LogBundle, PhotoBytes } from '../format/types.ts';
import { writeFileAtomic } from './atomicWrite.ts';
import type { CliIO } from './command.ts';
import { visible } from './terminalText.ts';

export type LoadedLog =
  | { ok: true; file: string; bundle: LogBundle; photos: PhotoBytes; fromVersion: number; warnings: ReadWarning[] }
  | { ok: false; file: string; problems: ProblemReport };

export type CheckedLog =
  | { ok: true; file: string; counts: LogCounts; fromVersion: number; warnings: ReadWarning[] }
  | { ok: false; file: string; problems: ProblemReport };

/** The file's bytes from `at`, `n` of them (fewer at its end), read without waiting. */
function fileRange(file: string, size: number): (at: number, n: number) => Uint8Array {
  return (at, n) => {
    const fd = openSync(file, 'r');
    try {
      const buf = Buffer.alloc(Math.max(0, Math.min(n, size - at)));
      const got = readSync(fd, buf, 0, buf.length, at);
      return new Uint8Array(buf.buffer, buf.byteOffset, got);
    } finally {
      closeSync(fd);
    }
  };
}

/**
 * A log file's pieces (src/format/readStream.ts): a JSON log is read a few megabytes at a time
 * and never held whole unless it is rejected (its report comes from the whole-file reader); a
 * zip archive is unpacked whole, as its photos must be.
 */
function openFile(file: string): { ok: true; pieces: Generator<LogPiece, LogVerdict, void>; photos: PhotoBytes } | (LoadedLog & { ok: false }) {
  let size: number;
  const unreadable = (why: string) => ({ ok: false as const, file, problems: { listed: [{ path: '$', message: why }], more: 0 } });
  try {
    const st = statSync(file);
    if (!st.isFile()) return unreadable('is not a file');
    size = st.size;
  } catch (e) {
    return unreadable(`cannot be read (${e instanceof Error ? e.message.replace(/^[A-Z]+: /, '') : String(e)})`);
  }
  if (size > LIMITS.maxFileBytes) return unreadable(`the file has ${size} bytes, more than the limit of ${LIMITS.maxFileBytes}`);
  const range = fileRange(file, size);
  if (looksLikeZip(range(0, 4))) {
    const r = readArchive(range(0, size));
    return r.ok ? { ok: true, pieces: bundlePieces(r), photos: r.photos } : { ok: false, file, problems: r.problems };
  }
  return { ok: true, pieces: openLog(byteRangeSource(size, range)), photos: new Map() };
}

export function loadLog(file: string): LoadedLog {
  const opened = openFile(file);
  if (!opened.ok) return opened;
  const { verdict, bundle } = collectPieces(opened.pieces);
  if (!verdict.ok || !bundle) return { ok: false, file, problems: verdict.ok ? { listed: [{ path: '$', message: 'no log in the file' }], more: 0 } : verdict.problems };
  return { ok: true, file, bundle, photos: opened.photos, fromVersion: verdict.fromVersion, warnings: verdict.warnings };
}

/** Checks a log file as loadLog does but keeps only counts: its memory does not grow with the file. */
export function checkLog(file: string): CheckedLog {
  const opened = openFile(file);
  if (!opened.ok) return opened;
  for (;;) {
    const n = opened.pieces.next();
    if (!n.done) continue;
    const v = n.value;
    return v.ok ? { ok: true, file, counts: v.counts, fromVersion: v.fromVersion, warnings: v.warnings } : { ok: false, file, problems: v.problems };
  }
}

export function printProblems(io: CliIO, log: { file: string; problems: ProblemReport }) {
  for (const line of formatReport(log.problems)) io.stderr(visible(`${log.file}: ${line}`));
}

/** Loads every file or none: the first rejected file is reported and null returned. */
export function loadAll(files: string[], io: CliIO): (LoadedLog & { ok: true })[] | null {
  const out: (LoadedLog & { ok: true })[] = [];
  let failed = false;
  for (const f of files) {
    const log = loadLog(f);
    if (log.ok) out.push(log);
    else {
      printProblems(io, log);
      failed = true;
    }
  }
  return failed ? null : out;
}

/** Replaces `file` whole or not at all (see atomicWrite.ts); a failure throws WriteFailed. */
export function writeOut(file: string, content: string[] | Uint8Array) {
  writeFileAtomic(file, content);
}

/**
 * Writes a log as JSON or, for a name ending in .zip, as an archive with its photos; but first
 * reads the result back as `validate` would, so the tool never writes a file it rejects. An
 * archive needs the bytes of every photo the log names: a JSON log carries only their
 * descriptions, so such a merge or conversion is refused with the names of what is missing.
 */
export function writeLog(file: string, bundle: LogBundle, photos: PhotoBytes): void {
  const asZip = file.toLowerCase().endsWith('.zip');
  if (asZip) {
    const missing = bundle.photos.filter((p) => !photos.has(p.id));
    if (missing.length > 0) {
      const first = missing.slice(0, 3).map((p) => `"${p.id}"`).join(', ');
      throw new Error(
        `${file}: the log names ${missing.length} photo${missing.length === 1 ? '' : 's'} (${first}${missing.length > 3 ? ', ...' : ''}) whose bytes are in none of the input files ` +
          '(a JSON log carries photo descriptions only); give the zip archives that hold them, or write a JSON log; nothing written',
      );
    }
  }
  const content = asZip ? writeArchive(bundle, photos) : exportLogJson(bundle);
  const back = content instanceof Uint8Array ? readArchive(content) : readLogText(content.join(''));
  if (!back.ok) {
    const why = back.problems.listed[0];
    throw new Error(`${file}: the result would not pass validate (${why ? formatProblem(why) : 'rejected'}); nothing written`);
  }
  writeOut(file, content);
}
