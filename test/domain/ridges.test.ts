import { describe, expect, it } from 'vitest';
import {
  KEEL_TO_SAIL_AREA_RATIO, KEEL_TO_SAIL_RATIO, equivalentThickness, keelDepthFromSailM,
  meanEquivalentThickness, ridgeKindForStage, ridgeMeanThicknessM,
} from '../../src/domain/ridges.ts';

describe('keel depth from sail height (Timco and Burden 1997, Cold Reg. Sci. Technol. 25, 65-77)', () => {
  it('uses keel/sail 4.4 for first-year and 3.3 for multi-year ridges', () => {
    expect(KEEL_TO_SAIL_RATIO).toEqual({ firstYear: 4.4, multiYear: 3.3 });
    expect(KEEL_TO_SAIL_AREA_RATIO).toEqual({ firstYear: 8.0, multiYear: 8.8 });
    expect(keelDepthFromSailM(2)).toBeCloseTo(8.8, 10);
    expect(keelDepthFromSailM(2, 'multi-year')).toBeCloseTo(6.6, 10);
  });

  it('old-ice stages have multi-year ridges, everything else first-year ridges', () => {
    expect(ridgeKindForStage('second-year')).toBe('multi-year');
    expect(ridgeKindForStage('old')).toBe('multi-year');
    expect(ridgeKindForStage('thick-first-year')).toBe('first-year');
    expect(ridgeKindForStage('grey')).toBe('first-year');
  });
});

describe('ridge mean thickness (triangular sail and keel with the Timco and Burden 1997 ratios)', () => {
  it('first-year: (4.4/2)(1 + 1/8) = 2.475 x sail; multi-year: (3.3/2)(1 + 1/8.8) = 1.8375 x sail', () => {
    expect(ridgeMeanThicknessM(1)).toBeCloseTo(2.475, 10);
    expect(ridgeMeanThicknessM(1, 'multi-year')).toBeCloseTo(1.8375, 10);
    // 30 % voids (an example value, not a published one) scale it by 0.7.
    expect(ridgeMeanThicknessM(2, 'first-year', 0.3)).toBeCloseTo(2 * 2.475 * 0.7, 10);
  });
});

describe('equivalent thickness including ridges (our formula, labelled an estimate)', () => {
  it('level ice only is its own thickness', () => {
    expect(equivalentThickness({ partialConcentration: 5, stage: 'thick-first-year', thicknessCm: 140 })).toMatchObject({ label: 'estimate', equivalentCm: 140, keelDepthM: null, notes: [] });
  });

  it('hand-computed: 100 cm FY, 2/10 ridged with 1.5 m sails, 1/10 rafted', () => {
    // h_r = 2.475 x 1.5 m = 371.25 cm; h_eq = 0.7 x 100 + 0.1 x 200 + 0.2 x 371.25 = 164.25 cm.
    const e = equivalentThickness({ partialConcentration: 6, stage: 'medium-first-year', thicknessCm: 100, ridgedTenths: 2, raftedTenths: 1, sailHeightM: 1.5 });
    expect(e?.equivalentCm).toBeCloseTo(164.3, 1);
    expect(e?.keelDepthM).toBeCloseTo(6.6, 10);
    expect(e?.notes.join(' ')).toContain('upper estimate');
  });

  it('ridged share without a sail height counts at level thickness and says so; no thickness gives null', () => {
    const e = equivalentThickness({ partialConcentration: 6, stage: 'medium-first-year', thicknessCm: 100, ridgedTenths: 3 });
    expect(e?.equivalentCm).toBe(100);
    expect(e?.notes.join(' ')).toContain('without a sail height');
    expect(equivalentThickness({ partialConcentration: 6, stage: 'medium-first-year' })).toBeNull();
  });

  it('a low sail on thick ice never makes the ridged part thinner than the level ice', () => {
    const e = equivalentThickness({ partialConcentration: 6, stage: 'multi-year', thicknessCm: 300, ridgedTenths: 5, sailHeightM: 0.5 });
    expect(e?.equivalentCm).toBe(300);
  });

  it('mean over the ice and over the whole area, weighted by partial concentration', () => {
    // (5 x 100 + 3 x 40) / 8 = 77.5 cm over the ice; 620 / 10 = 62 cm over the area.
    const m = meanEquivalentThickness({ categories: [
      { partialConcentration: 5, stage: 'medium-first-year', thicknessCm: 100 },
      { partialConcentration: 3, stage: 'thin-first-year', thicknessCm: 40 },
      { partialConcentration: 1, stage: 'new' },
    ] });
    expect(m).toEqual({ label: 'estimate', meanOverIceCm: 77.5, meanOverAreaCm: 62, coveredTenths: 8 });
    expect(meanEquivalentThickness({ categories: [] })).toBeNull();
  });
});
