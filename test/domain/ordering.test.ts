import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { STAGE_KEYS, type IceCategory } from '../../src/domain/model.ts';
import { effectiveRank, isSurelyThicker, sortCategoriesThickestFirst } from '../../src/domain/ordering.ts';

// Thickest-first order of the egg code (WMO-No. 259: Sa is the thickest ice, Sb, Sc thinner),
// with the stage ranges of WMO-No. 259 narrowing coarse stages.
const c = (stage: IceCategory['stage'], thicknessCm?: number, partialConcentration = 3): IceCategory =>
  thicknessCm === undefined ? { stage, partialConcentration } : { stage, partialConcentration, thicknessCm };

describe('effectiveRank', () => {
  it('narrows coarse stages by thickness (WMO-No. 259 ranges), never outside the family', () => {
    expect(effectiveRank('first-year', 150)).toEqual({ lo: 9, hi: 9 });
    expect(effectiveRank('first-year', 60)).toEqual({ lo: 7, hi: 7 });
    expect(effectiveRank('first-year')).toEqual({ lo: 6, hi: 9 });
    expect(effectiveRank('young', 5)).toEqual({ lo: 4, hi: 4 });
    expect(effectiveRank('nilas', 7)).toEqual({ lo: 3, hi: 3 });
    expect(effectiveRank('grey', 80)).toEqual({ lo: 4, hi: 4 });
    expect(effectiveRank('undetermined')).toEqual({ lo: 1, hi: 12 });
  });
});

describe('sortCategoriesThickestFirst', () => {
  it('puts older and thicker stages first and reports the change', () => {
    const r = sortCategoriesThickestFirst([c('grey'), c('multi-year'), c('medium-first-year')]);
    expect(r.categories.map((x) => x.stage)).toEqual(['multi-year', 'medium-first-year', 'grey']);
    expect(r.reordered).toBe(true);
  });

  it('orders the same stage by observed thickness and keeps an already ordered list', () => {
    const r = sortCategoriesThickestFirst([c('thick-first-year', 130), c('thick-first-year', 180)]);
    expect(r.categories.map((x) => x.thicknessCm)).toEqual([180, 130]);
    const same = sortCategoriesThickestFirst(r.categories);
    expect(same.reordered).toBe(false);
  });

  it('ranks an old stage above a thicker first-year category (egg code orders by stage)', () => {
    const r = sortCategoriesThickestFirst([c('thick-first-year', 190), c('second-year', 150)]);
    expect(r.categories.map((x) => x.stage)).toEqual(['second-year', 'thick-first-year']);
  });

  it('after sorting, no category is surely thicker than the one before it (fast-check)', () => {
    const cat = fc.record({
      stage: fc.constantFrom(...STAGE_KEYS),
      partialConcentration: fc.integer({ min: 1, max: 9 }),
      thicknessCm: fc.option(fc.integer({ min: 0, max: 400 }), { nil: undefined }),
    }, { requiredKeys: ['stage', 'partialConcentration'] });
    fc.assert(fc.property(fc.array(cat, { maxLength: 4 }), (cats) => {
      const sorted = sortCategoriesThickestFirst(cats).categories;
      expect(sorted).toHaveLength(cats.length);
      for (let i = 1; i < sorted.length; i++) {
        expect(isSurelyThicker(sorted[i] as IceCategory, sorted[i - 1] as IceCategory)).toBe(false);
      }
    }), { numRuns: 1000 });
  });
});
