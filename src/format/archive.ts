// The zip archive (fflate): the log as JSON plus the photos as files, for handing a whole cruise
// to someone else or to an archive. Images are stored, not deflated: JPEG and PNG are already
// compressed. Reading checks entry count and sizes from the zip directory before inflating
// anything, so a zip bomb is refused unopened.
import { strToU8, unzipSync, zipSync, type Zippable } from 'fflate';
import { encodeLog, writeLogJson, type EncodeOptions } from './encode';
import { LIMITS } from './limits';
import type { Problem } from './problems';
import { readLogText, type ReadOptions, type ReadResult } from './read';
import { report } from './problems';
import type { LogBundle, PhotoBytes } from './types';

export const ARCHIVE_LOG_NAME = 'floe-ledger-log.json';

const README = `Floe Ledger log archive
${ARCHIVE_LOG_NAME}  the log (format "floe-ledger-log", version 1; schema: format/floe-ledger-log-1.schema.json
                      served with the app, documented in docs/format.md)
photos/               the images referenced by the log's "photos" list (archivePath)
`;

export function writeArchive(bundle: LogBundle, photos: PhotoBytes, opts: EncodeOptions = {}): Uint8Array {
  const file = encodeLog(bundle, opts);
  const files: Zippable = {
    [ARCHIVE_LOG_NAME]: strToU8(writeLogJson(file).join('')),
    'README.txt': strToU8(README),
  };
  for (const p of file.photos) {
    const bytes = photos.get(p.id);
    if (bytes) files[p.archivePath] = [bytes, { level: 0 }];
  }
  return zipSync(files, { level: 6 });
}

/** True when the bytes start like a zip file ("PK\x03\x04"). */
export function looksLikeZip(bytes: Uint8Array): boolean {
  return bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04;
}

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
