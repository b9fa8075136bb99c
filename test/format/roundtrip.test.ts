import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { encodeLog, exportLogJson, writeLogJson } from '../../src/format/encode';
import { readLogText } from '../../src/format/read';
import { canonicalJson } from '../../src/format/merge';
import type { LogBundle } from '../../src/format/types';
import { arbBundle, sampleBundle } from './arbitraries';

function roundTrip(b: LogBundle): LogBundle {
  const text = exportLogJson(b, { exportedAt: '2026-04-01T00:00:00Z' }).join('');
  const r = readLogText(text, { rules: null });
  if (!r.ok) throw new Error(JSON.stringify(r.problems, null, 1));
  return r.bundle;
}

const sortById = <T extends { id: string; revision?: number }>(xs: T[]) =>
  [...xs].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : (a.revision ?? 0) - (b.revision ?? 0)));

function normal(b: LogBundle) {
  return { ...b, observations: sortById(b.observations), history: sortById(b.history), conflicts: sortById(b.conflicts) };
}

describe('log file round trip', { timeout: 120_000 }, () => {
  it('keeps a hand-made log exactly', () => {
    const b = sampleBundle();
    expect(normal(roundTrip(b))).toStrictEqual(normal(b));
  });

  it('keeps random valid logs exactly (fast-check)', () => {
    fc.assert(
      fc.property(arbBundle, (b) => {
        expect(normal(roundTrip(b))).toStrictEqual(structuredClone(normal(b)));
      }),
      { numRuns: 300 },
    );
  });

  it('the export writer gives the same document as encodeLog, codes beside their terms (fast-check)', () => {
    fc.assert(
      fc.property(arbBundle, (b) => {
        const opts = { exportedAt: '2026-04-01T00:00:00Z' };
        const fast = JSON.parse(exportLogJson(b, opts).join('')) as unknown;
        const slow = JSON.parse(writeLogJson(encodeLog(b, opts)).join('')) as unknown;
        expect(fast).toEqual(slow);
        expect(canonicalJson(fast)).toBe(canonicalJson(slow));
      }),
      { numRuns: 300 },
    );
  });

  it('puts each SIGRID-3 code right after its term', () => {
    const line = exportLogJson(sampleBundle()).join('').split('\n').find((l) => l.includes('"id":"o-1"')) ?? '';
    expect(line).toContain('"totalConcentration":9,"totalConcentrationSigrid3":"90"');
    expect(line).toContain('"stage":"thick-first-year","stageSigrid3":"93"');
    expect(line).toContain('"floeSize":"big-floe","floeSizeSigrid3":"05"');
    expect(line).toContain('"traceStage":"multi-year","traceStageSigrid3":"97"');
  });

  it('writes one observation and one track row per line', () => {
    const lines = writeLogJson(encodeLog(sampleBundle())).join('').split('\n');
    expect(lines.filter((l) => l.includes('"id":"o-1"') && l.includes('"history"'))).toHaveLength(1);
    expect(lines.filter((l) => l.startsWith('    ["2026-03-02T'))).toHaveLength(3);
  });
});
