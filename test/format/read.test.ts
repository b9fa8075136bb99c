import { describe, expect, it } from 'vitest';
import { writeArchive } from '../../src/format/archive';
import { readArchive } from '../../src/format/archiveRead';
import { zipSync } from 'fflate';
import { encodeLog, writeLogJson } from '../../src/format/encode';
import { LIMITS } from '../../src/format/limits';
import { formatReport } from '../../src/format/problems';
import { readLogText } from '../../src/format/read';
import { scanText } from '../../src/format/scan';
import { sampleBundle } from './arbitraries';
import { validText } from './hostile';

describe('reading: problems name their place', () => {
  it('gives the JSON path, line and reason of a schema problem', () => {
    const text = validText().replace('"partialConcentration":3', '"partialConcentration":12');
    const r = readLogText(text);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const p = r.problems.listed[0];
    expect(p?.path).toBe('$.observations[0].categories[1].partialConcentration');
    expect(p?.message).toContain('12 is above the largest allowed value 10');
    // One observation per line: the first observation is on line 13 of the written file.
    const line = validText().split('\n').findIndex((l) => l.includes('"id":"o-1"')) + 1;
    expect(p?.line).toBe(line);
  });

  it('lists the first 20 problems and counts the rest', () => {
    const b = sampleBundle();
    const file = encodeLog(b);
    const many = { ...file, observations: Array.from({ length: 30 }, (_, i) => ({ ...file.observations[1], id: `o-${i}`, revision: 0 })) };
    const r = readLogText(JSON.stringify(many));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems.listed).toHaveLength(20);
    expect(r.problems.more).toBe(10);
    expect(formatReport(r.problems).at(-1)).toBe('... and 10 more problems');
  });

  it('names the line of a syntax error that JSON.parse gives no position for', () => {
    const text = validText().replace('"revision":1', '"revision":NaN');
    const r = readLogText(text);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const line = text.split('\n').findIndex((l) => l.includes('NaN')) + 1;
    expect(r.problems.listed[0]?.line).toBe(line);
    expect(r.problems.listed[0]?.message).toMatch(/not valid JSON: unexpected "N"/);
  });

  it('reports truncation', () => {
    const text = validText();
    const r = readLogText(text.slice(0, Math.floor(text.length / 2)));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems.listed[0]?.message).toMatch(/truncated/);
  });

  it('refuses a file over the size limit before reading it', () => {
    const r = readLogText('{}', {}, LIMITS.maxFileBytes + 1);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems.listed[0]?.message).toContain('more than the limit');
  });

  it('refuses a newer format version with a clear message', () => {
    const r = readLogText(validText().replace('"formatVersion": 2', '"formatVersion": 3'));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems.listed[0]?.message).toContain('newer Floe Ledger');
  });

  it('runs domain rules: an error rejects, a warning is reported', () => {
    const rules = (o: { id: string }) =>
      o.id === 'o-2' ? [{ severity: 'warning' as const, code: 'demo-warning', path: 'categories.0.stage', message: 'check this' }] : [];
    const ok = readLogText(validText(), { rules });
    expect(ok.ok && ok.warnings).toEqual([{ path: '$.observations[1].categories[0].stage', message: 'check this (rule demo-warning)' }]);
    const bad = readLogText(validText(), { rules: () => [{ severity: 'error', code: 'x', path: 'time', message: 'bad time' }] });
    expect(bad.ok).toBe(false);
  });
});

describe('the pre-parse scan', () => {
  const limits = { maxDepth: 3, maxStringLength: 5, maxArrayLength: 4 };
  it('enforces depth, string length and array length on the text', () => {
    expect(scanText('[[[]]]', limits)).toBeNull();
    expect(scanText('[[[[]]]]', limits)?.message).toContain('nesting deeper than 3');
    expect(scanText('["12345"]', limits)).toBeNull();
    expect(scanText('["123456"]', limits)?.message).toContain('longer than the limit');
    expect(scanText('[1,2,3,4]', limits)).toBeNull();
    expect(scanText('[1,2,3,4,5]', limits)?.message).toContain('more than 4 elements');
    expect(scanText('{"a":[1,2],"b":[1,2]}', limits)).toBeNull(); // commas of an object do not count
    expect(scanText('["a,b,c"]', { ...limits, maxArrayLength: 1 })).toBeNull(); // nor commas in strings
  });
  it('spots prototype keys but not the same words as values', () => {
    expect(scanText('{"__proto__":1}')?.message).toContain('"__proto__" is not allowed');
    expect(scanText('{"a":{ "constructor" :1}}')?.message).toContain('"constructor"');
    expect(scanText('{"a":"constructor","b":["__proto__"]}')).toBeNull();
  });
});

describe('zip archive', () => {
  it('round-trips the log and the photos', () => {
    const b = sampleBundle();
    const photos = new Map([['ph-1', new Uint8Array([0xff, 0xd8, 0xff, 0xd9])]]);
    const r = readArchive(writeArchive(b, photos));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.bundle.observations.map((o) => o.id).sort()).toEqual(['o-1', 'o-2']);
    expect([...(r.photos.get('ph-1') ?? [])]).toEqual([0xff, 0xd8, 0xff, 0xd9]);
  });
  it('refuses an archive whose photo is missing or whose size differs', () => {
    const b = sampleBundle();
    expect(readArchive(writeArchive(b, new Map())).ok).toBe(false);
    const r = readArchive(writeArchive(b, new Map([['ph-1', new Uint8Array(9)]])));
    expect(!r.ok && r.problems.listed[0]?.path).toBe('$.photos[0].byteLength');
  });
  it('refuses too many entries and oversized entries before inflating them', () => {
    const files: Record<string, Uint8Array> = { 'floe-ledger-log.json': new TextEncoder().encode(writeLogJson(encodeLog(sampleBundle())).join('')) };
    for (let i = 0; i < 10; i++) files[`photos/p${i}`] = new Uint8Array(1);
    const r = readArchive(zipSync(files), { limits: { maxArchiveEntries: 5 } });
    expect(!r.ok && r.problems.listed[0]?.message).toContain('more than 5 entries');
    const big = zipSync({ 'floe-ledger-log.json': files['floe-ledger-log.json'] as Uint8Array, 'photos/big': new Uint8Array(2_000_000) });
    const r2 = readArchive(big, { limits: { maxPhotoBytes: 1_000_000 } });
    expect(!r2.ok && r2.problems.listed[0]?.message).toBe('the entry "photos/big" declares 2000000 bytes, more than the limit of 1000000 for a photo');
    expect(readArchive(new Uint8Array([0x50, 0x4b, 3, 4, 9, 9])).ok).toBe(false);
  });
});
