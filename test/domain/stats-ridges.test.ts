// The review's lean equivalent thickness must equal ridges.ts equivalentThickness (Timco and
// Burden 1997 ratios as ridges.ts applies them) on the demo cruise and on random categories.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { makeDemoCruise } from '../../src/domain/demo.ts';
import { STAGE_KEYS, type IceCategory } from '../../src/domain/model.ts';
import { equivalentThickness } from '../../src/domain/ridges.ts';
import { equivalentThicknessCm } from '../../src/domain/stats.ts';

const ref = (c: IceCategory): number | null => equivalentThickness(c)?.equivalentCm ?? null;

describe('lean equivalent thickness', () => {
  it('equals equivalentThickness on every demo category', () => {
    for (const o of makeDemoCruise().observations) for (const c of o.categories) expect(equivalentThicknessCm(c)).toBe(ref(c));
  });

  it('equals equivalentThickness on random categories (fast-check)', () => {
    const opt = <T,>(a: fc.Arbitrary<T>) => fc.option(a, { nil: undefined });
    fc.assert(
      fc.property(
        fc.record({
          partialConcentration: fc.integer({ min: 0, max: 10 }),
          stage: fc.constantFrom(...STAGE_KEYS),
          thicknessCm: opt(fc.double({ min: -10, max: 500, noNaN: true })),
          ridgedTenths: opt(fc.integer({ min: -1, max: 11 })),
          raftedTenths: opt(fc.integer({ min: -1, max: 11 })),
          sailHeightM: opt(fc.double({ min: -1, max: 8, noNaN: true })),
        }) as fc.Arbitrary<IceCategory>,
        (c) => {
          expect(equivalentThicknessCm(c)).toBe(ref(c));
        },
      ),
      { numRuns: 5000, seed: 3 },
    );
  });
});
