// Reading and writing log files for the commands: the same readers as the app (src/format), a
// size check before a file is read, and problems printed one per line with the file name.
import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { looksLikeZip } from '../format/archive.ts';
import { readArchive } from '../format/archiveRead.ts';
import { LIMITS } from '../format/limits.ts';
import { formatReport, type ProblemReport } from '../format/problems.ts';
import { readLogText, type ReadWarning } from '../format/read.ts';
import type { LogBundle, PhotoBytes } from '../format/types.ts';
import { UsageError, type CliIO } from './command.ts';

export type LoadedLog =
  | { ok: true; file: string; bundle: LogBundle; photos: PhotoBytes; fromVersion: number; warnings: ReadWarning[] }
  | { ok: false; file: string; problems: ProblemReport };

export function loadLog(file: string): LoadedLog {
  let size: number;
  const unreadable = (why: string): LoadedLog => ({ ok: false, file, problems: { listed: [{ path: '$', message: why }], more: 0 } });
  try {
    const st = statSync(file);
    if (!st.isFile()) return unreadable('is not a file');
    size = st.size;
  } catch (e) {
    return unreadable(`cannot be read (${e instanceof Error ? e.message.replace(/^[A-Z]+: /, '') : String(e)})`);
  }
  if (size > LIMITS.maxFileBytes) {
    return { ok: false, file, problems: { listed: [{ path: '$', message: `the file has ${size} bytes, more than the limit of ${LIMITS.maxFileBytes}` }], more: 0 } };
  }
  const bytes = readFileSync(file);
  if (looksLikeZip(bytes)) {
    const r = readArchive(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength));
    return r.ok ? { ok: true, file, bundle: r.bundle, photos: r.photos, fromVersion: r.fromVersion, warnings: r.warnings } : { ok: false, file, problems: r.problems };
  }
  const r = readLogText(bytes.toString('utf8'), {}, size);
  return r.ok ? { ok: true, file, bundle: r.bundle, photos: new Map(), fromVersion: r.fromVersion, warnings: r.warnings } : { ok: false, file, problems: r.problems };
}

export function printProblems(io: CliIO, log: LoadedLog & { ok: false }) {
  for (const line of formatReport(log.problems)) io.stderr(`${log.file}: ${line}`);
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

export function writeOut(file: string, content: string[] | Uint8Array) {
  try {
    writeFileSync(file, Array.isArray(content) ? content.join('') : content);
  } catch (e) {
    throw new UsageError(`cannot write ${file}: ${e instanceof Error ? e.message.replace(/^[A-Z]+: /, '') : String(e)}`);
  }
}
