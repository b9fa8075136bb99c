// Reading the zip archive. The entries are inflated as a stream, and every entry is held to
// limits while it inflates: the size its header declares and the bytes actually produced, each
// against the entry's own limit (the log as large as a JSON log may be, a photo), and the sum
// against the archive's limit. A zip bomb or an entry that lies about its size is refused after
// at most a limit's worth of output, never inflated whole. Names with ".." or an absolute path,
// two entries of one name and photos the log does not name are refused by name; then the log is
// read like a JSON file and every photo it lists must be in the archive with the stated size.
import { Unzip, UnzipInflate } from 'fflate';
import { ARCHIVE_LOG_NAME } from './archive';
import { LIMITS } from './limits';
import type { Problem } from './problems';
import { report } from './problems';
import { readLogText, type ReadOptions, type ReadResult } from './read';
import { decodeLogText } from './text';
import type { PhotoBytes } from './types';

export type ArchiveReadResult = (ReadResult & { ok: false }) | (ReadResult & { ok: true; photos: PhotoBytes });

class Refused extends Error {}

/** An entry name that could point outside a folder it is unpacked into. */
function unsafeName(name: string): boolean {
  return /^([/\\]|[A-Za-z]:)/.test(name) || name.split(/[/\\]/).includes('..');
}

const quoted = (name: string) => JSON.stringify(name.length > 100 ? `${name.slice(0, 97)}...` : name);

/** Inflates the log and photo entries under the limits; throws Refused with the reason. */
function inflate(bytes: Uint8Array, limits: Record<keyof typeof LIMITS, number>): Map<string, Uint8Array> {
  const out = new Map<string, Uint8Array>();
  const names = new Set<string>();
  let entries = 0;
  let total = 0;
  const unzip = new Unzip((file) => {
    const name = file.name;
    if (++entries > limits.maxArchiveEntries) throw new Refused(`the archive has more than ${limits.maxArchiveEntries} entries`);
    if (unsafeName(name)) throw new Refused(`the entry ${quoted(name)} has an absolute path or ".." in its name`);
    if (names.has(name)) throw new Refused(`the archive has two entries named ${quoted(name)}`);
    names.add(name);
    if (name.endsWith('/')) return; // a folder entry
    const isLog = name === ARCHIVE_LOG_NAME;
    if (!isLog && !name.startsWith('photos/')) return; // README.txt and the like: not inflated
    const cap = isLog ? limits.maxArchiveLogBytes : limits.maxPhotoBytes;
    const what = isLog ? 'the log' : 'a photo';
    const declared = file.originalSize;
    if (declared !== undefined && declared > cap) throw new Refused(`the entry ${quoted(name)} declares ${declared} bytes, more than the limit of ${cap} for ${what}`);
    const chunks: Uint8Array[] = [];
    let got = 0;
    // fflate hands an exception thrown here back to this handler as `err`: keep the first reason.
    let refusal: Refused | null = null;
    const refuse = (message: string) => {
      refusal = new Refused(message);
      throw refusal;
    };
    file.ondata = (err, chunk, final) => {
      if (err) throw refusal ?? new Refused(`the entry ${quoted(name)} cannot be unpacked (${err.message})`);
      got += chunk.length;
      total += chunk.length;
      if (got > cap) refuse(`the entry ${quoted(name)} unpacks to more than the limit of ${cap} bytes for ${what}`);
      if (declared !== undefined && got > declared) refuse(`the entry ${quoted(name)} unpacks to more than the ${declared} bytes its header declares`);
      if (total > limits.maxArchiveUncompressedBytes) refuse(`the archive unpacks to more than ${limits.maxArchiveUncompressedBytes} bytes`);
      chunks.push(chunk);
      if (!final) return;
      if (declared !== undefined && got !== declared) refuse(`the entry ${quoted(name)} unpacks to ${got} bytes, not the ${declared} its header declares`);
      const whole = new Uint8Array(got);
      let at = 0;
      for (const c of chunks) {
        whole.set(c, at);
        at += c.length;
      }
      out.set(name, whole);
    };
    file.start();
  });
  unzip.register(UnzipInflate);
  // Fed in slices: deflate expands at most about 1,000-fold, so no slice inflates to more than
  // about 16 MB before the limits above see it.
  const SLICE = 16 * 1024;
  for (let at = 0; at < bytes.length; at += SLICE) unzip.push(bytes.subarray(at, Math.min(bytes.length, at + SLICE)), at + SLICE >= bytes.length);
  if (bytes.length === 0) unzip.push(bytes, true);
  return out;
}

export function readArchive(bytes: Uint8Array, opts: ReadOptions = {}): ArchiveReadResult {
  const limits = { ...LIMITS, ...opts.limits };
  const fail = (problems: Problem[]): ArchiveReadResult => ({ ok: false, problems: report(problems) });
  if (bytes.length > limits.maxFileBytes) return fail([{ path: '$', message: `the archive has ${bytes.length} bytes, more than the limit of ${limits.maxFileBytes}` }]);
  let unzipped: Map<string, Uint8Array>;
  try {
    unzipped = inflate(bytes, limits);
  } catch (err) {
    if (err instanceof Refused) return fail([{ path: '$', message: err.message }]);
    return fail([{ path: '$', message: `not a readable zip archive (${err instanceof Error ? err.message : String(err)})` }]);
  }
  const logBytes = unzipped.get(ARCHIVE_LOG_NAME);
  if (!logBytes) return fail([{ path: '$', message: `the archive has no ${ARCHIVE_LOG_NAME}` }]);
  const decoded = decodeLogText(logBytes);
  if (!decoded.ok) return fail([{ ...decoded.problem, message: `${ARCHIVE_LOG_NAME}: ${decoded.problem.message}` }]);
  const read = readLogText(decoded.text, opts, logBytes.length);
  if (!read.ok) {
    return { ok: false, problems: { ...read.problems, listed: read.problems.listed.map((p) => ({ ...p, message: `${ARCHIVE_LOG_NAME}: ${p.message}` })) } };
  }
  const photos: PhotoBytes = new Map();
  const problems: Problem[] = [];
  const named = new Set<string>();
  read.bundle.photos.forEach((p, i) => {
    const path = read.archivePaths.get(p.id) ?? '';
    named.add(path);
    const data = unzipped.get(path);
    if (!data) problems.push({ path: `$.photos[${i}].archivePath`, message: `"${path}" is not in the archive` });
    else if (data.length !== p.byteLength) problems.push({ path: `$.photos[${i}].byteLength`, message: `is ${p.byteLength} but "${path}" has ${data.length} bytes` });
    else photos.set(p.id, data);
  });
  for (const name of unzipped.keys()) {
    if (name !== ARCHIVE_LOG_NAME && !named.has(name)) problems.push({ path: '$', message: `the entry ${quoted(name)} is a photo the log does not name` });
  }
  if (problems.length > 0) return fail(problems);
  return { ...read, photos };
}
