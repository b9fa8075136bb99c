// Bytes to log text, the same in the app and on the command line. A log file is UTF-8 JSON; a
// file that is not gets a message saying what it is instead (UTF-16 or UTF-32 text, binary data,
// a compressed file, bytes that are not UTF-8 and where the first one is), rather than a JSON
// syntax error about a stray character. otherFormat() names the exports (CSV, NDJSON, GeoJSON)
// that are sometimes given where a log is read.
import type { Problem } from './problems';

export type DecodedText = { ok: true; text: string } | { ok: false; problem: Problem };

const READS = 'a log file is UTF-8 JSON text (format "floe-ledger-log") or its zip archive';

const SIGNATURES: [number[], string][] = [
  [[0x1f, 0x8b], 'a gzip-compressed file: unpack it first'],
  [[0x89, 0x50, 0x4e, 0x47], 'a PNG image'],
  [[0xff, 0xd8, 0xff], 'a JPEG image'],
  [[0x25, 0x50, 0x44, 0x46], 'a PDF document'],
  [[0x42, 0x5a, 0x68], 'a bzip2-compressed file: unpack it first'],
  [[0xfd, 0x37, 0x7a, 0x58, 0x5a], 'an xz-compressed file: unpack it first'],
  [[0x50, 0x4b, 0x05, 0x06], 'an empty zip archive'],
];

const starts = (b: Uint8Array, sig: number[]) => b.length >= sig.length && sig.every((x, i) => b[i] === x);

/** Offset of the first byte that breaks UTF-8 (RFC 3629: no overlongs, surrogates or > U+10FFFF), or -1. */
export function firstInvalidUtf8(b: Uint8Array): number {
  const n = b.length;
  for (let i = 0; i < n; ) {
    const c = b[i] as number;
    if (c < 0x80) {
      i++;
      continue;
    }
    // Lead bytes C2-DF, E0-EF and F0-F4 start sequences of 2, 3 and 4 bytes; C0, C1, F5-FF never occur.
    const len = c >= 0xc2 && c <= 0xdf ? 2 : c >= 0xe0 && c <= 0xef ? 3 : c >= 0xf0 && c <= 0xf4 ? 4 : 0;
    if (len === 0) return i;
    const min = len === 2 ? 0x80 : len === 3 ? 0x800 : 0x10000;
    if (i + len > n) return i;
    let cp = c & (len === 2 ? 0x1f : len === 3 ? 0x0f : 0x07);
    for (let k = 1; k < len; k++) {
      const d = b[i + k] as number;
      if ((d & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (d & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += len;
  }
  return -1;
}

function lineOf(b: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (b[i] === 10) line++;
  return line;
}

export function decodeLogText(bytes: Uint8Array): DecodedText {
  const fail = (message: string, line?: number): DecodedText => ({ ok: false, problem: { path: '$', ...(line !== undefined ? { line } : {}), message } });
  if (starts(bytes, [0xff, 0xfe, 0, 0]) || starts(bytes, [0, 0, 0xfe, 0xff])) return fail(`the file is UTF-32 text; ${READS} (save it again as UTF-8)`);
  if (starts(bytes, [0xff, 0xfe]) || starts(bytes, [0xfe, 0xff])) return fail(`the file is UTF-16 text; ${READS} (save it again as UTF-8)`);
  // UTF-16 without a byte order mark: ASCII characters with a zero byte beside each.
  if (bytes.length >= 4 && ((bytes[0] !== 0 && bytes[1] === 0 && bytes[2] !== 0 && bytes[3] === 0) || (bytes[0] === 0 && bytes[1] !== 0 && bytes[2] === 0 && bytes[3] !== 0))) {
    return fail(`the file looks like UTF-16 text (a zero byte beside every letter); ${READS} (save it again as UTF-8)`);
  }
  for (const [sig, what] of SIGNATURES) if (starts(bytes, sig)) return fail(`the file is ${what}, not a log; ${READS}`);
  const nul = bytes.indexOf(0);
  if (nul !== -1) return fail(`the file holds binary data (a zero byte at byte ${nul}), not text; ${READS}`, lineOf(bytes, nul));
  const bad = firstInvalidUtf8(bytes);
  if (bad !== -1) return fail(`the file is not valid UTF-8: byte ${bad} (0x${(bytes[bad] as number).toString(16).padStart(2, '0')}) starts no character; ${READS}`, lineOf(bytes, bad));
  return { ok: true, text: new TextDecoder('utf-8').decode(bytes) };
}

/**
 * When text that is not a log was given: what it looks like, for the message. `text` failed to
 * parse as one JSON document, or parsed (`doc`) without the log's format name.
 */
export function otherFormat(text: string, doc?: unknown): string | null {
  const what = (kind: string) => `this looks like ${kind}, an export of Floe Ledger, which is written but not read back; ${READS}`;
  if (doc !== undefined) {
    const type = doc !== null && typeof doc === 'object' && !Array.isArray(doc) ? (doc as Record<string, unknown>).type : undefined;
    if (type === 'FeatureCollection' || type === 'Feature') return what('GeoJSON');
    return null;
  }
  const trimmed = text.trimStart();
  const firstLine = trimmed.slice(0, Math.min(trimmed.length, 2000)).split(/\r?\n/)[0] ?? '';
  if (trimmed.startsWith('{')) {
    const lines = trimmed.slice(0, 200_000).split(/\r?\n/).filter((l) => l.trim() !== '');
    if (lines.length >= 2 && lines.slice(0, 3).every((l) => l.trim().startsWith('{') && l.trim().endsWith('}'))) {
      try {
        JSON.parse(lines[0] as string);
        return what('NDJSON (one JSON record per line)');
      } catch {
        return null;
      }
    }
    return null;
  }
  if (!trimmed.startsWith('[') && firstLine.includes(',') && !firstLine.includes('{')) return what(`a CSV table (first line ${JSON.stringify(firstLine.length > 60 ? `${firstLine.slice(0, 57)}...` : firstLine)})`);
  return null;
}
