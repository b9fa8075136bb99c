// Guards issue 16 "Reading": the inputs an outside audit found accepted or badly explained. Each
// test names the case. Zip layout: PKWARE APPNOTE.TXT (local file header: signature 0x04034b50,
// uncompressed size at offset 22, file name at offset 30). UTF-8: RFC 3629. UTF-16 byte order
// marks FF FE / FE FF: the Unicode Standard, chapter 3.10. CSV injection: OWASP.
import { strToU8, zipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { writeArchive } from '../../src/format/archive';
import { readArchive } from '../../src/format/archiveRead';
import { csvCell } from '../../src/format/csv';
import { encodeLog, writeLogJson } from '../../src/format/encode';
import { readLogText } from '../../src/format/read';
import { decodeLogText, firstInvalidUtf8 } from '../../src/format/text';
import type { LogFileV2 } from '../../src/format/types';
import { sampleBundle } from './arbitraries';
import { validText } from './hostile';

const LOG = 'floe-ledger-log.json';
const logBytes = () => strToU8(validText());
const firstMessage = (r: { ok: boolean; problems?: { listed: { message: string }[] } }) => (r.ok ? 'accepted' : (r.problems?.listed[0]?.message ?? ''));
const photo = new Uint8Array([0xff, 0xd8, 0xff, 0xe0]); // the 4 bytes sampleBundle's photo declares

/** Offset of the local file header of `name` in a zip written by fflate. */
function localHeader(zip: Uint8Array, name: string): number {
  const want = strToU8(name);
  for (let i = 0; i + 30 < zip.length; i++) {
    if (zip[i] === 0x50 && zip[i + 1] === 0x4b && zip[i + 2] === 3 && zip[i + 3] === 4 && want.every((b, k) => zip[i + 30 + k] === b)) return i;
  }
  throw new Error(`no local header for ${name}`);
}

describe('zip archives (issue 16)', () => {
  const good = () => writeArchive(sampleBundle(), new Map([['ph-1', photo]]));

  it('a valid archive with its photo is read (the positive control)', () => {
    expect(readArchive(good()).ok).toBe(true);
  });

  it('a log entry declared larger than the log limit is refused before it is inflated', () => {
    const zip = zipSync({ [LOG]: new Uint8Array(3_000_000) }, { level: 9 }); // 3 MB of zeros, a few kB packed
    expect(zip.length).toBeLessThan(10_000);
    expect(firstMessage(readArchive(zip, { limits: { maxArchiveLogBytes: 1_000_000 } }))).toBe(`the entry "${LOG}" declares 3000000 bytes, more than the limit of 1000000 for the log`);
  });

  it('an entry that inflates to more than its header declares is stopped there', () => {
    const zip = zipSync({ [LOG]: new Uint8Array(3_000_000) }, { level: 9 });
    const at = localHeader(zip, LOG);
    new DataView(zip.buffer, zip.byteOffset).setUint32(at + 22, 1000, true); // the header now claims 1,000 bytes
    expect(firstMessage(readArchive(zip))).toBe(`the entry "${LOG}" unpacks to more than the 1000 bytes its header declares`);
  });

  it('the photo limit and the archive total hold on what is inflated too', () => {
    const zip = zipSync({ [LOG]: logBytes(), 'photos/ph-1.jpg': new Uint8Array(2_000_000) }, { level: 9 });
    const at = localHeader(zip, 'photos/ph-1.jpg');
    new DataView(zip.buffer, zip.byteOffset).setUint32(at + 22, 10, true);
    expect(firstMessage(readArchive(zip))).toBe('the entry "photos/ph-1.jpg" unpacks to more than the 10 bytes its header declares');
    expect(firstMessage(readArchive(good(), { limits: { maxArchiveUncompressedBytes: 100 } }))).toBe('the archive unpacks to more than 100 bytes');
  });

  it('refuses entry names with ".." or an absolute path, by name', () => {
    for (const name of ['../outside.jpg', 'photos/../../etc/x', '/abs/photo.jpg', 'C:\\photos\\x.jpg']) {
      const zip = zipSync({ [LOG]: logBytes(), [name]: photo });
      expect(firstMessage(readArchive(zip)), name).toBe(`the entry ${JSON.stringify(name)} has an absolute path or ".." in its name`);
    }
  });

  it('refuses an archive with two log entries', () => {
    const zip = zipSync({ [LOG]: logBytes(), 'floe-ledger-log.jsoX': logBytes() }, { level: 0 });
    // Rename the second entry to the log's name, in its local header and in the central directory.
    const from = strToU8('floe-ledger-log.jsoX');
    for (let i = 0; i + from.length <= zip.length; i++) if (from.every((b, k) => zip[i + k] === b)) zip[i + from.length - 1] = 0x6e; // 'n'
    expect(firstMessage(readArchive(zip))).toBe(`the archive has two entries named "${LOG}"`);
  });

  it('refuses photos the log does not name', () => {
    const zip = zipSync({ [LOG]: logBytes(), 'photos/ph-1.jpg': photo, 'photos/extra-1.jpg': photo, 'photos/extra-2.jpg': photo });
    const r = readArchive(zip);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems.listed.map((p) => p.message).sort()).toEqual(['the entry "photos/extra-1.jpg" is a photo the log does not name', 'the entry "photos/extra-2.jpg" is a photo the log does not name']);
  });
});

describe('bytes and encodings (issue 16)', () => {
  const text = validText();
  it('UTF-16 with and without a byte order mark, UTF-32, binary and compressed data say what they are', () => {
    const le = new Uint8Array(text.length * 2);
    for (let i = 0; i < text.length; i++) le[2 * i] = text.charCodeAt(i) & 0xff;
    const cases: [Uint8Array, RegExp][] = [
      [new Uint8Array([0xff, 0xfe, ...le]), /^the file is UTF-16 text; a log file is UTF-8 JSON text/],
      [new Uint8Array([0xfe, 0xff, 0, 0x7b]), /^the file is UTF-16 text/],
      [le, /^the file looks like UTF-16 text \(a zero byte beside every letter\)/],
      [new Uint8Array([0xff, 0xfe, 0, 0, 0x7b, 0, 0, 0]), /^the file is UTF-32 text/],
      [new Uint8Array([0x1f, 0x8b, 8, 0, 1, 2]), /^the file is a gzip-compressed file: unpack it first/],
      [new Uint8Array([0x7b, 0x0a, 0x22, 0, 0x22]), /^the file holds binary data \(a zero byte at byte 3\), not text/],
    ];
    for (const [bytes, want] of cases) {
      const r = decodeLogText(bytes);
      expect(r.ok ? 'accepted' : r.problem.message).toMatch(want);
    }
  });

  it('invalid UTF-8 is refused with the byte and line, and the checker agrees with TextDecoder (RFC 3629)', () => {
    const bytes = strToU8(text);
    const line2 = bytes.indexOf(0x0a) + 1;
    bytes[line2 + 2] = 0xc3;
    bytes[line2 + 3] = 0x28; // 0xC3 must be followed by a continuation byte
    const r = decodeLogText(bytes);
    expect(r.ok ? null : r.problem).toMatchObject({ line: 2, message: expect.stringMatching(new RegExp(`^the file is not valid UTF-8: byte ${line2 + 2} \\(0xc3\\) starts no character`)) });
    // Overlong form, a surrogate, above U+10FFFF, a lone continuation byte, a cut sequence.
    for (const bad of [[0xc0, 0xaf], [0xed, 0xa0, 0x80], [0xf4, 0x90, 0x80, 0x80], [0x80], [0xe2, 0x82]]) {
      const b = new Uint8Array([0x41, ...bad, 0x42]);
      expect(firstInvalidUtf8(b), String(bad)).toBe(1);
      expect(() => new TextDecoder('utf-8', { fatal: true }).decode(b)).toThrow();
    }
    expect(firstInvalidUtf8(strToU8('Grüße, 氷, 🧊'))).toBe(-1);
  });

  it('CSV, NDJSON and GeoJSON given as a log say what they look like and what is read', () => {
    const csv = readLogText('time_utc,lat,lon,total_tenths\r\n2026-03-02T10:00:00Z,78.2,-15.5,9\r\n');
    expect(firstMessage(csv)).toBe('this looks like a CSV table (first line "time_utc,lat,lon,total_tenths"), an export of Floe Ledger, which is written but not read back; a log file is UTF-8 JSON text (format "floe-ledger-log") or its zip archive');
    const nd = readLogText('{"id":"o-1","total":9}\n{"id":"o-2","total":3}\n');
    expect(firstMessage(nd)).toMatch(/^this looks like NDJSON \(one JSON record per line\)/);
    const geo = readLogText('{"type":"FeatureCollection","features":[]}');
    expect(firstMessage(geo)).toMatch(/^must be "floe-ledger-log": this looks like GeoJSON/);
  });
});

describe('lax values (issue 16)', () => {
  const file = (): LogFileV2 => encodeLog(sampleBundle(), { exportedAt: '2026-04-01T00:00:00Z' });
  const text = (f: LogFileV2) => writeLogJson(f).join('');

  it('a key given twice in one object is refused, whichever value comes first', () => {
    const t = validText();
    const bad = t.replace('"revision":1,', '"revision":-5,"revision":1,');
    expect(bad).not.toBe(t);
    const r = readLogText(bad);
    expect(firstMessage(r)).toBe('the key "revision" appears twice in one object');
    // An escaped spelling of the same key is the same key.
    expect(firstMessage(readLogText(t.replace('"revision":1,', '"revision":1,"r\\u0065vision":1,')))).toBe('the key "revision" appears twice in one object');
    // The same key in two different objects is fine (the positive control).
    expect(readLogText(t).ok).toBe(true);
  });

  it('times in year 0000 or 9999 are refused with the allowed years', () => {
    for (const year of ['0000', '9999']) {
      const f = file();
      (f.observations[0] as { time: string }).time = `${year}-03-02T10:00:00Z`;
      const r = readLogText(text(f));
      expect(r.ok).toBe(false);
      if (r.ok) continue;
      expect(r.problems.listed).toContainEqual(expect.objectContaining({ path: '$.observations[0].time', message: `"${year}-03-02T10:00:00Z" lies outside the years 1900 to 2199 that a log may hold` }));
    }
  });

  it('two track points at one time with other positions are refused; the same point twice is not', () => {
    const f = file();
    const p = f.track.points;
    p[1] = [p[0]?.[0] as string, 71, 10, 'gps-serial', null, null, null];
    const r = readLogText(text(f));
    expect(r.ok ? null : r.problems.listed[0]).toMatchObject({ path: '$.track.points[1]', message: `is at ${p[0]?.[0]}, the time of row 0, with another position (71, 10 against ${p[0]?.[1]}, ${p[0]?.[2]})` });
    const g = file();
    g.track.points[1] = g.track.points[0] as (typeof g.track.points)[number];
    expect(readLogText(text(g)).ok).toBe(true);
  });

  it('a photo id that names no photo in the file is imported with a warning', () => {
    const f = file();
    f.observations[0]?.photoIds.push('ph-missing');
    const r = readLogText(text(f));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.warnings).toContainEqual({ path: '$.observations[0].photoIds[1]', message: 'names photo "ph-missing", which is not in this file' });
  });
});

describe('CSV formula guard (issue 16, OWASP CSV injection)', () => {
  it('also guards a leading space, tab or line break before = + - @, and the full-width signs', () => {
    for (const s of [' =1+1', '\n=1+1', '  @SUM(A1)', '\u3000+1', '＝1+1', '＋1', '－1', '＠A1', '\t1']) {
      expect(csvCell(s).replace(/^"/, '').startsWith("'"), JSON.stringify(s)).toBe(true);
    }
    for (const s of ['ice 1+1', 'a=b', '5 - 3']) expect(csvCell(s), s).toBe(s);
    expect(csvCell(-12.5)).toBe('-12.5');
  });
});
