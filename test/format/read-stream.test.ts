// The piece-by-piece reader (src/format/readStream.ts) against the whole-file reader, which is
// the reference: for every file the piece reader accepts, the whole reader accepts it too and
// gives the same bundle and warnings; every file the whole reader rejects, the piece reader
// refuses; through openLog a rejected file gets exactly the whole reader's report.
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { isRealUtcTime } from '../../src/format/decode';
import { exportLogJson } from '../../src/format/encode';
import { readLogText } from '../../src/format/read';
import { collectPieces, openLog, readLogPieces, stringSource, utf8Source, type LogPiece, type PieceOptions, type TextSource } from '../../src/format/readStream';
import type { LogBundle } from '../../src/format/types';
import { arbBundle, sampleBundle } from './arbitraries';
import { hostileCases, validText } from './hostile';

const AT = { exportedAt: '2026-04-01T00:00:00Z' };

/** Runs the piece reader alone and gathers what it hands out. */
function pieces(src: TextSource, opts: PieceOptions = {}) {
  const gen = readLogPieces(src, opts);
  const out: LogPiece[] = [];
  for (;;) {
    const n = gen.next();
    if (n.done) return { verdict: n.value, out };
    out.push(n.value);
  }
}

function gathered(text: string, opts: PieceOptions = {}, pieceChars?: number): LogBundle | null {
  const { verdict, bundle } = collectPieces(
    (function* () {
      const r = yield* readLogPieces(stringSource(text, pieceChars), opts);
      if (!r.ok) return { ok: false as const, problems: { listed: [{ path: '$', message: r.reason }], more: 0 } };
      return r;
    })(),
  );
  return verdict.ok ? bundle : null;
}

const source = (text: string) => ({ pieces: () => stringSource(text, 997), whole: () => ({ text, byteLength: text.length }) });

describe('reading a log in pieces', { timeout: 600_000 }, () => {
  it('gives the whole reader\'s bundle and warnings for random valid logs, any piece and batch size (fast-check)', () => {
    fc.assert(
      fc.property(arbBundle, fc.integer({ min: 1, max: 5_000 }), fc.integer({ min: 1, max: 7 }), fc.integer({ min: 1, max: 40 }), (b, chars, obsBatch, trackBatch) => {
        const text = exportLogJson(b, AT).join('');
        const whole = readLogText(text);
        const run = pieces(stringSource(text, chars), { observationBatch: obsBatch, trackBatch });
        // Random logs may break a domain rule: then both refuse.
        expect(run.verdict.ok, JSON.stringify(run.verdict)).toBe(whole.ok);
        if (!whole.ok || !run.verdict.ok) return;
        expect(run.verdict.warnings).toStrictEqual(whole.warnings);
        expect(run.verdict.route).toBe('pieces');
        expect(gathered(text, { observationBatch: obsBatch, trackBatch }, chars)).toStrictEqual(whole.bundle);
      }),
      { numRuns: 100 },
    );
  });

  it('reads other layouts of the same document: minified, indented, lists first, photos first', () => {
    const b = sampleBundle();
    const doc = JSON.parse(exportLogJson(b, AT).join('')) as Record<string, unknown>;
    const { observations, track, photos, ...head } = doc;
    const layouts = {
      minified: JSON.stringify(doc),
      indented: JSON.stringify(doc, null, 2),
      'track before observations': JSON.stringify({ ...head, track, observations, photos }),
      'photos first': JSON.stringify({ photos, ...head, observations, track }),
      'CRLF and tabs': JSON.stringify(doc, null, '\t').replace(/\n/g, '\r\n'),
    };
    const reference = readLogText(layouts.minified);
    expect(reference.ok).toBe(true);
    for (const [name, text] of Object.entries(layouts)) {
      for (const chars of [7, 64, 1 << 20]) {
        const run = pieces(stringSource(text, chars), { observationBatch: 1, trackBatch: 2 });
        expect(run.verdict.ok, `${name}: ${JSON.stringify(run.verdict)}`).toBe(true);
        expect(gathered(text, { observationBatch: 1, trackBatch: 2 }, chars), name).toStrictEqual(reference.ok ? reference.bundle : null);
      }
    }
  });

  it('leaves to the whole reader what it cannot judge in pieces, and openLog then gives the whole reader\'s result', () => {
    const b = sampleBundle();
    const doc = JSON.parse(exportLogJson(b, AT).join('')) as Record<string, unknown> & { track: { points: unknown[] } };
    const { observers, ...rest } = doc;
    const unordered = { ...doc, track: { ...doc.track, points: [...doc.track.points].reverse() } };
    const cases = {
      'a head member after the lists': JSON.stringify({ ...rest, observers }),
      'an unordered track': JSON.stringify(unordered),
      'format version 0': readFileSync('test/format/fixtures/log-v0.json', 'utf8'),
    };
    for (const [name, text] of Object.entries(cases)) {
      expect(pieces(stringSource(text)).verdict.ok, name).toBe(false);
      const whole = readLogText(text);
      const via = collectPieces(openLog(source(text)));
      expect(via.verdict.ok, name).toBe(whole.ok);
      if (whole.ok && via.verdict.ok) {
        expect(via.verdict.route, name).toBe('whole');
        expect(via.bundle, name).toStrictEqual(whole.bundle);
        expect(via.verdict.warnings, name).toStrictEqual(whole.warnings);
      }
    }
  });

  it('reads a version-1 file in pieces, lifted as the whole reader lifts it', () => {
    const text = readFileSync('test/format/fixtures/log-v1.json', 'utf8');
    const whole = readLogText(text);
    expect(whole.ok).toBe(true);
    const run = pieces(stringSource(text, 50), { observationBatch: 1, trackBatch: 1 });
    expect(run.verdict.ok, JSON.stringify(run.verdict)).toBe(true);
    if (whole.ok && run.verdict.ok) {
      expect(run.verdict.fromVersion).toBe(1);
      expect(gathered(text, { observationBatch: 1, trackBatch: 1 }, 50)).toStrictEqual(whole.bundle);
      expect(run.verdict.warnings).toStrictEqual(whole.warnings);
    }
  });

  it('refuses every hostile or broken file the whole reader rejects, and openLog reports it exactly as readLogText does', () => {
    const cases = hostileCases();
    const accepted: string[] = [];
    cases.forEach((c, i) => {
      // Whole and in small pieces, in turn (each case once: the machine is shared).
      const chars = i % 2 === 0 ? c.text.length + 1 : 61;
      const run = pieces(stringSource(c.text, chars), { observationBatch: 1 + (i % 3), trackBatch: 1 + (i % 4), runChars: 1 + ((i * 37) % 400) });
      if (run.verdict.ok) accepted.push(`${c.name} (${chars})`);
      if (i % 10 !== 0) return;
      const via = collectPieces(openLog(source(c.text)));
      const whole = readLogText(c.text);
      expect(via.verdict, c.name).toStrictEqual(whole.ok ? expect.anything() : { ok: false, problems: whole.problems });
    });
    expect(accepted).toEqual([]);
    expect(readLogText(validText()).ok).toBe(true);
  });

  it('refuses trailing commas, empty elements and lists closed with the wrong bracket', () => {
    const text = exportLogJson(sampleBundle(), AT).join('');
    const broken = {
      'trailing comma in observations': text.replace(/\}\n {2}\],\n {2}"track"/, '},\n  ],\n  "track"'),
      'leading comma in points': text.replace('"points": [', '"points": [,'),
      'double comma': text.replace(/\],\n {4}\[/, '],,\n    ['),
      'list closed with a brace': text.replace(/\]\n {2}\},\n {2}"photos"/, '}\n  },\n  "photos"'),
    };
    for (const [name, t] of Object.entries(broken)) {
      expect(t, name).not.toBe(text);
      expect(readLogText(t).ok, name).toBe(false);
      for (const batch of [1, 2, 1000]) {
        expect(pieces(stringSource(t, 13), { observationBatch: batch, trackBatch: batch }).verdict.ok, `${name} ${batch}`).toBe(false);
        expect(pieces(stringSource(t, 13), { observationBatch: batch, trackBatch: batch, runChars: 40 }).verdict.ok, `${name} ${batch} in runs`).toBe(false);
      }
    }
  });

  it('reads bytes: UTF-8 split anywhere passes; other encodings and zero bytes are left to the whole reader', () => {
    const b = sampleBundle();
    const withAccents: LogBundle = { ...b, observations: b.observations.map((o) => ({ ...o, notes: 'Grüße, Ærø, 氷山, 🧊' })) };
    const text = exportLogJson(withAccents, AT).join('');
    const bytes = new TextEncoder().encode(text);
    for (const step of [1, 2, 3, 5, 4096]) {
      let at = 0;
      const src = utf8Source(() => {
        if (at >= bytes.length) return null;
        const piece = bytes.subarray(at, at + step);
        at += step;
        return piece;
      });
      const run = pieces(src);
      expect(run.verdict.ok, `step ${step}`).toBe(true);
    }
    const once = (b: Uint8Array) => {
      let given = false;
      return utf8Source(() => (given ? null : ((given = true), b)));
    };
    const latin1 = Uint8Array.from(bytes);
    latin1[bytes.indexOf(0xc3)] = 0xe9;
    expect(pieces(once(latin1)).verdict.ok).toBe(false);
    const nul = Uint8Array.from(bytes);
    nul[100] = 0;
    expect(pieces(once(nul)).verdict.ok).toBe(false);
  });

  it('takes the long lists a run of lines at a time, handing out exactly the pieces of the character scan (fast-check)', () => {
    fc.assert(
      fc.property(
        arbBundle,
        fc.integer({ min: 1, max: 5_000 }),
        fc.integer({ min: 1, max: 3_000 }),
        fc.integer({ min: 1, max: 7 }),
        fc.integer({ min: 1, max: 40 }),
        (b, chars, runChars, observationBatch, trackBatch) => {
          const text = exportLogJson(b, AT).join('');
          const runs = pieces(stringSource(text, chars), { observationBatch, trackBatch, runChars });
          const scanned = pieces(stringSource(text, chars), { observationBatch, trackBatch, charScan: true });
          expect(runs.out).toStrictEqual(scanned.out);
          expect(runs.verdict.ok).toBe(scanned.verdict.ok);
          if (runs.verdict.ok && scanned.verdict.ok) {
            expect(scanned.verdict.charScanned).toBe(runs.verdict.counts.observations + runs.verdict.counts.trackPoints);
            expect({ ...runs.verdict, charScanned: 0 }).toStrictEqual({ ...scanned.verdict, charScanned: 0 });
          }
        },
      ),
      { numRuns: 100 },
    );
  });

  it('hands a run to the character scan when its text could hide what the scan refuses, and judges the file the same', () => {
    const text = exportLogJson(sampleBundle(), AT).join('');
    // The first observation, set out over several lines as an indenting tool would.
    const line = /\n {4}\{"id":[^\n]*/.exec(text)?.[0];
    if (!line) throw new Error('no observation line');
    const comma = line.endsWith(',') ? ',' : '';
    const pretty = `\n${JSON.stringify(JSON.parse(line.trim().replace(/,$/, '')), null, 2)}${comma}`;
    const variants: Record<string, [string, boolean]> = {
      // [text, whether the whole reader accepts it]
      'a key given twice in one observation': [text.replace('"notes":"', '"notes":"x","notes":"'), false],
      'a key given twice, one with a blank before its colon': [text.replace('"notes":"', '"notes" :"x","notes":"'), false],
      'a key with blanks before its colon': [text.replace('"notes":"', '"notes" \t:"'), true],
      'a note that opens with a colon': [text.replace('"notes":"', '"notes":":'), true],
      'a note of escaped quotes and backslashes around colons': [text.replace('"notes":"', `"notes":${JSON.stringify('a":b\\":c\\\\":d').slice(0, -1)}`), true],
      'a note naming a prototype key': [text.replace('"notes":"', '"notes":"\\"constructor\\" '), true],
      'a key that reaches the prototype': [text.replace('"notes":"', '"__proto__":{},"notes":"'), false],
      'a track row with a key in an object': [text.replace(/\n {4}\["/, '\n    [{"a":1,"a":2},"'), false],
      'deep nesting in an observation': [text.replace('"notes":"', `"notes":${'['.repeat(20)}1${']'.repeat(20)},"x":"`), false],
      'one observation spread over several lines': [text.replace(line, pretty), true],
      'the observations closed on the line of the last one': [text.replace(/\}\n {2}\],\n {2}"track"/, '}],\n  "track"'), true],
      'no observations': [exportLogJson({ ...sampleBundle(), observations: [], history: [], conflicts: [], photos: [] }, AT).join(''), true],
      'CRLF line ends': [text.replace(/\n/g, '\r\n'), true],
    };
    // The file's own layout (one element per line) never needs the character scan.
    const own = pieces(stringSource(text, 97), { runChars: 50 });
    expect(own.verdict.ok && own.verdict.charScanned).toBe(0);
    for (const [name, [t, accepted]] of Object.entries(variants)) {
      expect(t, name).not.toBe(text);
      expect(readLogText(t).ok, name).toBe(accepted);
      const scanned = pieces(stringSource(t, 97), { observationBatch: 2, trackBatch: 3, charScan: true });
      expect(scanned.verdict.ok, name).toBe(accepted);
      for (const runChars of [1, 50, 1 << 20]) {
        const runs = pieces(stringSource(t, 97), { observationBatch: 2, trackBatch: 3, runChars });
        expect(runs.verdict.ok, `${name} (${runChars})`).toBe(accepted);
        expect(runs.out, `${name} (${runChars})`).toStrictEqual(scanned.out);
      }
    }
    // Where a run cannot be taken (here: the text in hand ends inside the spread observation),
    // the scan takes over the rest of that list, and the track is taken in runs again.
    const spread = pieces(stringSource((variants['one observation spread over several lines'] as [string, boolean])[0], 97), { runChars: 50 });
    expect(spread.verdict.ok && spread.verdict.charScanned).toBe(spread.verdict.ok && spread.verdict.counts.observations);
    // A long string: over a small limit both ways refuse it, under it both read it.
    for (const maxStringLength of [10, 100_000]) {
      const limits = { maxStringLength };
      const scanned = pieces(stringSource(text, 97), { charScan: true, limits });
      const runs = pieces(stringSource(text, 97), { runChars: 60, limits });
      expect(runs.verdict.ok, String(maxStringLength)).toBe(scanned.verdict.ok);
      expect(runs.verdict.ok, String(maxStringLength)).toBe(maxStringLength > 10);
    }
  });

  it('judges calendar times by digits as Date does (fast-check against Date.parse and back)', () => {
    const byDate = (s: string) => {
      const t = Date.parse(s);
      return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === s.slice(0, 10);
    };
    const pad = (n: number, w: number) => String(n).padStart(w, '0');
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 9999 }),
        fc.integer({ min: 0, max: 13 }),
        fc.integer({ min: 0, max: 32 }),
        fc.integer({ min: 0, max: 24 }),
        fc.integer({ min: 0, max: 60 }),
        fc.integer({ min: 0, max: 60 }),
        fc.option(fc.integer({ min: 0, max: 999 })),
        (y, mo, d, h, mi, s, ms) => {
          const t = `${pad(y, 4)}-${pad(mo, 2)}-${pad(d, 2)}T${pad(h, 2)}:${pad(mi, 2)}:${pad(s, 2)}${ms === null ? '' : `.${pad(ms, 3)}`}Z`;
          expect(isRealUtcTime(t), t).toBe(byDate(t));
        },
      ),
      { numRuns: 3_000 },
    );
    // Leap years by the Gregorian rule (common practice, ISO 8601 uses the proleptic Gregorian calendar).
    expect(isRealUtcTime('2024-02-29T00:00:00Z')).toBe(true);
    expect(isRealUtcTime('2100-02-29T00:00:00Z')).toBe(false);
    expect(isRealUtcTime('2000-02-29T00:00:00Z')).toBe(true);
  });
});
