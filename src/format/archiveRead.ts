// Reading the zip archive: entry count and sizes are checked from the zip directory before
// anything is inflated, so a zip bomb is refused unopened; then the log is read like a JSON
// file and every photo it lists must be in the archive with the stated size.
import { unzipSync } from 'fflate';
import { ARCHIVE_LOG_NAME } from './archive';
import { LIMITS } from './limits';
import type { Problem } from './problems';
import { report } from './problems';
import { readLogText, type ReadOptions, type ReadResult } from './read';
import type { PhotoBytes } from './types';

export type ArchiveReadResult = (ReadResult & { ok: false }) | (ReadResult & { ok: true; photos: PhotoBytes });

export function readArchive(bytes: Uint8Array, opts: ReadOptions = {}): ArchiveReadResult {
  const limits = { ...LIMITS, ...opts.limits };
  const fail = (problems: Problem[]): ArchiveReadResult => ({ ok: false, problems: report(problems) });
  if (bytes.length > limits.maxFileBytes) return fail([{ path: '$', message: `the archive has ${bytes.length} bytes, more than the limit of ${limits.maxFileBytes}` }]);
  let entries = 0;
  let total = 0;
  let refusal: string | null = null;
  let unzipped: Record<string, Uint8Array>;
  try {
    unzipped = unzipSync(bytes, {
      filter: (f) => {
        entries++;
        total += f.originalSize;
        if (entries > limits.maxArchiveEntries) refusal = `the archive has more than ${limits.maxArchiveEntries} entries`;
        else if (total > limits.maxArchiveUncompressedBytes) refusal = `the archive unpacks to more than ${limits.maxArchiveUncompressedBytes} bytes`;
        else if (f.name !== ARCHIVE_LOG_NAME && f.originalSize > limits.maxPhotoBytes) refusal = `the entry "${f.name.slice(0, 100)}" is larger than ${limits.maxPhotoBytes} bytes`;
        if (refusal) throw new Error(refusal);
        return f.name === ARCHIVE_LOG_NAME || f.name.startsWith('photos/');
      },
    });
  } catch (err) {
    return fail([{ path: '$', message: refusal ?? `not a readable zip archive (${err instanceof Error ? err.message : String(err)})` }]);
  }
  const logBytes = unzipped[ARCHIVE_LOG_NAME];
  if (!logBytes) return fail([{ path: '$', message: `the archive has no ${ARCHIVE_LOG_NAME}` }]);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(logBytes);
  } catch {
    return fail([{ path: `${ARCHIVE_LOG_NAME}`, message: 'is not UTF-8 text' }]);
  }
  const read = readLogText(text, opts, logBytes.length);
  if (!read.ok) {
    return { ok: false, problems: { ...read.problems, listed: read.problems.listed.map((p) => ({ ...p, message: `${ARCHIVE_LOG_NAME}: ${p.message}` })) } };
  }
  const photos: PhotoBytes = new Map();
  const problems: Problem[] = [];
  read.bundle.photos.forEach((p, i) => {
    const path = read.archivePaths.get(p.id) ?? '';
    const data = Object.prototype.hasOwnProperty.call(unzipped, path) ? unzipped[path] : undefined;
    if (!data) problems.push({ path: `$.photos[${i}].archivePath`, message: `"${path}" is not in the archive` });
    else if (data.length !== p.byteLength) problems.push({ path: `$.photos[${i}].byteLength`, message: `is ${p.byteLength} but "${path}" has ${data.length} bytes` });
    else photos.set(p.id, data);
  });
  if (problems.length > 0) return fail(problems);
  return { ...read, photos };
}
