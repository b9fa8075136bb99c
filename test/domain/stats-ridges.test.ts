// The review's lean equivalent thickness must equal ridges.ts equivalentThickness (Timco and
// Burden 1997 ratios as ridges.ts applies them) on the demo cruise and on random categories.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { makeDemoCruise } from '../../src/domain/demo.ts';
import { deformationOf } from '../../src/domain/iceTypes.ts';
import { STAGE_KEYS, type Deformation, type IceCategory } from '../../src/domain/model.ts';
import { equivalentThickness } from '../../src/domain/ridges.ts';
import { equivalentThicknessCm } from '../../src/domain/stats.ts';

const ref = (c: IceCategory, d: Deformation | undefined): number | null => equivalentThickness({ ...c, ...d })?.equivalentCm ?? null;

describe('lean equivalent thickness', () => {
  it('equals equivalentThickness on every demo category', () => {
    for (const o of makeDemoCruise().observations) {
      o.categories.forEach((c, i) => expect(equivalentThicknessCm(c, deformationOf(o, i))).toBe(ref(c, deformationOf(o, i))));
    }
  });

  it('equals equivalentThickness on random categories (fast-check)', () => {
    const opt = <T,>(a: fc.Arbitrary<T>) => fc.option(a, { nil: undefined });
    fc.assert(
      fc.property(
        fc.record({
          partialConcentration: fc.integer({ min: 0, max: 10 }),
          stage: fc.constantFrom(...STAGE_KEYS),
          thicknessCm: opt(fc.double({ min: -10, max: 500, noNaN: true })),
        }) as fc.Arbitrary<IceCategory>,
        fc.option(
          fc.record({
            ridgedTenths: opt(fc.integer({ min: -1, max: 11 })),
            raftedTenths: opt(fc.integer({ min: -1, max: 11 })),
            sailHeightM: opt(fc.double({ min: -1, max: 8, noNaN: true })),
          }) as fc.Arbitrary<Deformation>,
          { nil: undefined },
        ),
        (c, d) => {
          expect(equivalentThicknessCm(c, d)).toBe(ref(c, d));
        },
      ),
      { numRuns: 5000, seed: 3 },
    );
  });
});
