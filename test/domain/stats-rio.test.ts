// The review's lean RIO must equal polarisForObservation (IMO MSC.1/Circ.1519 as polaris.ts
// implements it) for every observation: the demo cruise and random observations.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { makeDemoCruise } from '../../src/domain/demo.ts';
import { STAGE_KEYS, VESSEL_ICE_CLASSES, type IceCategory } from '../../src/domain/model.ts';
import { polarisForObservation } from '../../src/domain/polaris.ts';
import { rioForObservation } from '../../src/domain/stats.ts';

function reference(obs: Parameters<typeof polarisForObservation>[0], iceClass: (typeof VESSEL_ICE_CLASSES)[number]) {
  const r = polarisForObservation(obs, iceClass);
  return r.ok ? { rio: r.value.rio, outcome: r.value.outcome } : null;
}

const categoryArb = (minPartial: number): fc.Arbitrary<IceCategory> => fc.record({
  partialConcentration: fc.integer({ min: minPartial, max: 10 }),
  stage: fc.constantFrom(...STAGE_KEYS),
  thicknessCm: fc.option(fc.integer({ min: 0, max: 400 }), { nil: undefined }),
}) as fc.Arbitrary<IceCategory>;

describe('lean RIO', () => {
  it('equals polarisForObservation on every demo observation for every ice class', () => {
    const demo = makeDemoCruise();
    for (const iceClass of VESSEL_ICE_CLASSES) {
      for (const o of demo.observations) expect(rioForObservation(o, iceClass)).toEqual(reference(o, iceClass));
    }
  });

  it('equals polarisForObservation on random observations (fast-check)', () => {
    const category = categoryArb(-1);
    fc.assert(
      fc.property(
        fc.option(fc.integer({ min: 0, max: 10 }), { nil: null }),
        // Up to four categories: a fourth reaches POLARIS only from data the rules refuse.
        fc.array(category, { maxLength: 4 }),
        fc.option(fc.constantFrom(...STAGE_KEYS), { nil: undefined }),
        fc.option(fc.constantFrom(...STAGE_KEYS), { nil: undefined }),
        fc.constantFrom(...VESSEL_ICE_CLASSES),
        (totalConcentration, categories, remainingStage, traceStage, iceClass) => {
          const obs = { totalConcentration, categories, remainingStage, traceStage };
          expect(rioForObservation(obs, iceClass)).toEqual(reference(obs, iceClass));
        },
      ),
      { numRuns: 4000, seed: 11 },
    );
  });

  it('equals polarisForObservation for one category with a remaining stage (Sd), the case of issue 11', () => {
    const category = categoryArb(1);
    fc.assert(
      fc.property(
        fc.option(fc.integer({ min: 0, max: 10 }), { nil: null }),
        category,
        fc.constantFrom(...STAGE_KEYS),
        fc.constantFrom(...VESSEL_ICE_CLASSES),
        (totalConcentration, c, remainingStage, iceClass) => {
          const obs = { totalConcentration, categories: [c], remainingStage };
          expect(rioForObservation(obs, iceClass)).toEqual(reference(obs, iceClass));
        },
      ),
      { numRuns: 2000, seed: 12 },
    );
  });
});
