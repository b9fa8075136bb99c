import { describe, expect, it } from 'vitest';
import { VESSEL_ICE_CLASSES, type VesselIceClass } from '../../src/domain/model.ts';
import {
  POLARIS_ICE_TYPES, RIV_TABLE, computeRio, elevatedRiskSpeedLimitKn, outcomeFor, polarisForObservation,
  polarisIceType, riskIndexValue, type PolarisIceType,
} from '../../src/domain/polaris.ts';

// IMO MSC.1/Circ.1519, Table 1.3 "Risk index values", typed again here from the circular so the
// test does not read the table it checks. Columns: ice free, new, grey, grey-white, thin FY 1st
// stage, thin FY 2nd stage, medium FY < 1 m, medium FY, thick FY, second-year, light MY, heavy MY.
// IA Super x thick FY: -2 in two transcriptions, -3 in a third; we follow the two (-2).
const CIRCULAR_TABLE_1_3 = `
PC1        3  3  3  3  2  2  2  2  2  2  1  1
PC2        3  3  3  3  2  2  2  2  2  1  1  0
PC3        3  3  3  3  2  2  2  2  2  1  0 -1
PC4        3  3  3  3  2  2  2  2  1  0 -1 -2
PC5        3  3  3  3  2  2  1  1  0 -1 -2 -2
PC6        3  2  2  2  2  1  1  0 -1 -2 -3 -3
PC7        3  2  2  2  1  1  0 -1 -2 -3 -3 -3
IA-Super   3  2  2  2  2  1  0 -1 -2 -3 -4 -4
IA         3  2  2  2  1  0 -1 -2 -3 -4 -5 -5
IB         3  2  2  1  0 -1 -2 -3 -4 -5 -6 -6
IC         3  2  1  0 -1 -2 -3 -4 -5 -6 -7 -8
none       3  1  0 -1 -2 -3 -4 -5 -6 -7 -8 -8
`;

const cells: [VesselIceClass, PolarisIceType, number][] = CIRCULAR_TABLE_1_3.trim().split('\n').flatMap((line) => {
  const [cls, ...vals] = line.trim().split(/\s+/);
  return vals.map((v, i) => [cls as VesselIceClass, POLARIS_ICE_TYPES[i] as PolarisIceType, Number(v)] as [VesselIceClass, PolarisIceType, number]);
});

describe('RIV table (IMO MSC.1/Circ.1519 Table 1.3)', () => {
  it('has 12 classes x 12 ice types', () => {
    expect(cells).toHaveLength(144);
    expect(Object.keys(RIV_TABLE).sort()).toEqual([...VESSEL_ICE_CLASSES].sort());
  });

  it.each(cells)('%s x %s = %d (IMO MSC.1/Circ.1519 Table 1.3)', (cls, type, riv) => {
    expect(riskIndexValue(cls, type)).toBe(riv);
  });
});

describe('outcome bands and speed limits', () => {
  // IMO MSC.1/Circ.1519 Table 1.1.
  it.each([
    ['PC5', 0, 'normal'], ['PC5', -1, 'elevated'], ['PC5', -10, 'elevated'], ['PC5', -11, 'special'],
    ['PC7', -10, 'elevated'], ['PC1', 5, 'normal'],
    ['IA-Super', 0, 'normal'], ['IA-Super', -1, 'special'], ['IA', -5, 'special'], ['none', -1, 'special'],
  ] as const)('%s with RIO %d is %s (Table 1.1)', (cls, rio, outcome) => {
    expect(outcomeFor(cls, rio)).toBe(outcome);
  });

  // IMO MSC.1/Circ.1519 Table 1.2: PC1 11 kn, PC2 8 kn, PC3-PC5 5 kn, below PC5 3 kn.
  it.each([
    ['PC1', 11], ['PC2', 8], ['PC3', 5], ['PC4', 5], ['PC5', 5], ['PC6', 3], ['PC7', 3], ['IA', null], ['none', null],
  ] as const)('%s elevated-risk limit %s kn (Table 1.2)', (cls, kn) => {
    expect(elevatedRiskSpeedLimitKn(cls)).toBe(kn);
  });
});

describe('RIO worked examples (hand computed from Table 1.3)', () => {
  const rio = (cls: VesselIceClass, shares: [PolarisIceType, number][], decayConfirmed = false) => {
    const r = computeRio(cls, shares.map(([iceType, tenths]) => ({ iceType, tenths })), { decayConfirmed });
    if (!r.ok) throw new Error(r.error);
    return r.value;
  };

  it('PC5, 6/10 thick FY + 3/10 second-year: 6x0 + 3x(-1) + 1x3 (ice free) = 0, normal', () => {
    const r = rio('PC5', [['thick-first-year', 6], ['second-year', 3]]);
    expect(r.rio).toBe(0);
    expect(r.outcome).toBe('normal');
    expect(r.regime).toEqual([
      { iceType: 'thick-first-year', tenths: 6, riv: 0 },
      { iceType: 'second-year', tenths: 3, riv: -1 },
      { iceType: 'ice-free', tenths: 1, riv: 3 },
    ]);
    expect(r.speedLimitKn).toBeNull();
  });

  it('PC7, 5/10 medium FY + 4/10 thick FY: 5x(-1) + 4x(-2) + 1x3 = -10, elevated, 3 kn', () => {
    const r = rio('PC7', [['medium-first-year', 5], ['thick-first-year', 4]]);
    expect(r.rio).toBe(-10);
    expect(r.outcome).toBe('elevated');
    expect(r.speedLimitKn).toBe(3);
  });

  it('PC3, 10/10 heavy MY: 10x(-1) = -10, elevated at 5 kn; PC2 same ice 10x0 = 0 normal', () => {
    expect(rio('PC3', [['heavy-multi-year', 10]])).toMatchObject({ rio: -10, outcome: 'elevated', speedLimitKn: 5 });
    expect(rio('PC2', [['heavy-multi-year', 10]])).toMatchObject({ rio: 0, outcome: 'normal' });
  });

  it('IA, 9/10 medium FY + ice free: 9x(-2) + 1x3 = -15, special (no elevated band below PC7)', () => {
    expect(rio('IA', [['medium-first-year', 9]])).toMatchObject({ rio: -15, outcome: 'special', speedLimitKn: null });
  });

  it('IA Super, 2/10 grey-white + 8/10 ice free: 2x2 + 8x3 = 28, normal', () => {
    expect(rio('IA-Super', [['grey-white', 2]]).rio).toBe(28);
  });

  it('not ice-strengthened, 10/10 grey: 10x0 = 0 normal; 10/10 grey-white: -10 special', () => {
    expect(rio('none', [['grey', 10]])).toMatchObject({ rio: 0, outcome: 'normal' });
    expect(rio('none', [['grey-white', 10]])).toMatchObject({ rio: -10, outcome: 'special' });
  });

  it('an explicit ice-free share is filled up to 10, not duplicated', () => {
    const r = rio('PC5', [['ice-free', 2], ['new', 3]]);
    expect(r.regime).toEqual([{ iceType: 'ice-free', tenths: 7, riv: 3 }, { iceType: 'new', tenths: 3, riv: 3 }]);
    expect(r.rio).toBe(30);
  });

  it('rejects shares over 10 and negative shares, naming them', () => {
    const over = computeRio('PC5', [{ iceType: 'new', tenths: 6 }, { iceType: 'grey', tenths: 5 }]);
    expect(over).toEqual({ ok: false, error: 'the shares add up to 11 tenths, more than 10' });
    const neg = computeRio('PC5', [{ iceType: 'new', tenths: -1 }]);
    expect(neg.ok).toBe(false);
    if (!neg.ok) expect(neg.error).toContain('-1 of new');
  });

  it('always carries the cautions deferring to the Polar Code, the PWOM, the master and local regulations', () => {
    const text = rio('PC5', [['new', 1]]).cautions.join(' ');
    for (const word of ['Polar Code', 'Polar Water Operational Manual', 'master', 'local regulations']) expect(text).toContain(word);
  });
});

describe('decayed ice (circular Table 1.4; values from a single transcription)', () => {
  it('adds 1 to medium FY (< 1 m and full) and thick FY for PC5 and lower, only when confirmed', () => {
    for (const cls of VESSEL_ICE_CLASSES) {
      for (const type of POLARIS_ICE_TYPES) {
        const base = riskIndexValue(cls, type);
        const raised = ['PC1', 'PC2', 'PC3', 'PC4'].includes(cls) ? false
          : ['medium-first-year-thin', 'medium-first-year', 'thick-first-year'].includes(type);
        expect(riskIndexValue(cls, type, { decayConfirmed: true })).toBe(raised ? base + 1 : base);
        expect(riskIndexValue(cls, type, { decayConfirmed: false })).toBe(base);
      }
    }
  });

  it('PC6, 10/10 thick FY: -10 elevated; decayed 10x0 = 0 normal, with the decay caution', () => {
    expect(computeRio('PC6', [{ iceType: 'thick-first-year', tenths: 10 }])).toMatchObject({ ok: true, value: { rio: -10, outcome: 'elevated' } });
    const d = computeRio('PC6', [{ iceType: 'thick-first-year', tenths: 10 }], { decayConfirmed: true });
    expect(d).toMatchObject({ ok: true, value: { rio: 0, outcome: 'normal', decayConfirmed: true } });
    if (d.ok) expect(d.value.cautions.join(' ')).toContain('single transcription');
  });
});

describe('observed category to POLARIS ice type', () => {
  // Thickness limits: WMO-No. 259 stage ranges; medium FY split at 1 m and multi-year at 2.5 m as
  // IMO MSC.1/Circ.1519 Table 1.3 names the columns.
  it.each([
    ['new', undefined, 'new'], ['nilas', undefined, 'new'], ['grease', undefined, 'new'],
    ['grey', undefined, 'grey'], ['young', 12, 'grey'], ['young', 20, 'grey-white'],
    ['thin-first-year', 40, 'thin-first-year-1'], ['thin-first-year', 60, 'thin-first-year-2'],
    ['medium-first-year', 99, 'medium-first-year-thin'], ['medium-first-year', 100, 'medium-first-year'],
    ['first-year', 45, 'thin-first-year-1'], ['first-year', 65, 'thin-first-year-2'], ['first-year', 80, 'medium-first-year-thin'],
    ['first-year', 110, 'medium-first-year'], ['first-year', 130, 'thick-first-year'],
    ['multi-year', 249, 'light-multi-year'], ['multi-year', 250, 'heavy-multi-year'],
    ['second-year', undefined, 'second-year'], ['thick-first-year', 300, 'thick-first-year'],
  ] as const)('%s at %s cm is %s', (stage, cm, type) => {
    const m = polarisIceType(stage, cm);
    expect(m.iceType).toBe(type);
    expect(m.note).toBe('');
  });

  // Common practice for decision support (our rule, documented): an unresolved coarse stage takes
  // the column with the lowest RIV among those it could be, for every class.
  it.each([
    ['young', ['grey', 'grey-white']],
    ['thin-first-year', ['thin-first-year-1', 'thin-first-year-2']],
    ['medium-first-year', ['medium-first-year-thin', 'medium-first-year']],
    ['first-year', ['thin-first-year-1', 'thin-first-year-2', 'medium-first-year-thin', 'medium-first-year', 'thick-first-year']],
    ['multi-year', ['light-multi-year', 'heavy-multi-year']],
    ['old', ['second-year', 'light-multi-year', 'heavy-multi-year']],
    ['undetermined', [...POLARIS_ICE_TYPES]],
  ] as const)('%s without thickness is mapped conservatively, with a note', (stage, candidates) => {
    const m = polarisIceType(stage);
    expect(m.note).not.toBe('');
    for (const cls of VESSEL_ICE_CLASSES) {
      const worst = Math.min(...candidates.map((c) => riskIndexValue(cls, c)));
      expect(riskIndexValue(cls, m.iceType)).toBe(worst);
    }
  });
});

describe('polarisForObservation', () => {
  it('a single category takes the total concentration (egg code blank Ca)', () => {
    const r = polarisForObservation({ totalConcentration: 8, categories: [{ partialConcentration: 8, stage: 'medium-first-year', thicknessCm: 80 }] }, 'PC7');
    // PC7: 8x0 (medium FY < 1 m) + 2x3 = 6.
    expect(r).toMatchObject({ ok: true, value: { rio: 6, outcome: 'normal' } });
  });

  it('unassigned share goes to the most severe type present, and says so', () => {
    // IB: total 9, 4 grey-white (1) + 3 thin FY 2nd stage (-1); 2 unassigned -> thin FY 2 (-1).
    // RIO = 4x1 + 3x(-1) + 2x(-1) + 1x3 = 2.
    const r = polarisForObservation({
      totalConcentration: 9,
      categories: [
        { partialConcentration: 3, stage: 'thin-first-year-2' },
        { partialConcentration: 4, stage: 'grey-white' },
      ],
    }, 'IB');
    expect(r.ok && r.value.rio).toBe(2);
    expect(r.ok && r.value.notes.join(' ')).toContain('2/10 not covered');
  });

  it('unassigned share goes to the remaining stage (Sd) when recorded', () => {
    // PC6: 5 thick FY (-1) + 3 grey (2) + 1 new as Sd (2) + 1 ice free (3) = -5 + 6 + 2 + 3 = 6.
    const r = polarisForObservation({
      totalConcentration: 9, remainingStage: 'new',
      categories: [{ partialConcentration: 5, stage: 'thick-first-year' }, { partialConcentration: 3, stage: 'grey' }],
    }, 'PC6');
    expect(r.ok && r.value.rio).toBe(6);
  });

  it('needs something to assess', () => {
    expect(polarisForObservation({ totalConcentration: null, categories: [] }, 'PC5').ok).toBe(false);
    expect(polarisForObservation({ totalConcentration: 0, categories: [] }, 'PC5')).toMatchObject({ ok: true, value: { rio: 30 } });
  });
});

// The remaining thinner ice (Sd) and the trace (So) in POLARIS. Every RIO below is worked by hand
// from IMO MSC.1/Circ.1519 Table 1.3 (typed above) and the circular's RIO = sum of C x RIV with
// the ice-free share included (section 1.5.1 of the circular's Annex). That Sd is the stage of the
// ice not covered by Ca, Cb, Cc and So is a trace of less than 1/10 is the egg code as WMO-No. 259
// describes it.
describe('polarisForObservation: remaining stage (Sd) and trace (So)', () => {
  it('one category + Sd: Ct 9, 5/10 thick FY, Sd grey, PC7 -> 5x(-2) + 4x2 + 1x3 = 1, normal', () => {
    // The example of issue 11. Before the fix the whole 9/10 went to thick FY: 9x(-2) + 3 = -15.
    const r = polarisForObservation({
      totalConcentration: 9, remainingStage: 'grey',
      categories: [{ partialConcentration: 5, stage: 'thick-first-year' }],
    }, 'PC7');
    expect(r).toMatchObject({ ok: true, value: { rio: 1, outcome: 'normal', speedLimitKn: null } });
    if (!r.ok) return;
    expect(r.value.regime).toEqual([
      { iceType: 'thick-first-year', tenths: 5, riv: -2 },
      { iceType: 'grey', tenths: 4, riv: 2 },
      { iceType: 'ice-free', tenths: 1, riv: 3 },
    ]);
    expect(r.value.notes.join(' ')).toContain('4/10 not covered by the partial concentrations is taken as the remaining stage (grey ice)');
  });

  it('one category + Sd in a Baltic class: IA, Ct 10, 7/10 medium FY 110 cm, Sd new -> 7x(-2) + 3x2 = -8, special', () => {
    // IA: medium FY -2, new 2; below PC7 every RIO < 0 is special consideration (Table 1.1).
    const r = polarisForObservation({
      totalConcentration: 10, remainingStage: 'new',
      categories: [{ partialConcentration: 7, stage: 'medium-first-year', thicknessCm: 110 }],
    }, 'IA');
    expect(r).toMatchObject({ ok: true, value: { rio: -8, outcome: 'special' } });
  });

  it('one category + Sd whose partial already equals Ct: Sd has no share, the category keeps Ct', () => {
    // PC5: 8 thick FY (0) + 2 ice free (3) = 6.
    const r = polarisForObservation({
      totalConcentration: 8, remainingStage: 'new',
      categories: [{ partialConcentration: 8, stage: 'thick-first-year' }],
    }, 'PC5');
    expect(r).toMatchObject({ ok: true, value: { rio: 6 } });
  });

  it('one category without Sd still takes Ct (egg code: a single ice type leaves Ca blank)', () => {
    // PC7, Ct 9 thick FY whatever the partial says: 9x(-2) + 1x3 = -15 < -10, special (Table 1.1).
    const r = polarisForObservation({ totalConcentration: 9, categories: [{ partialConcentration: 5, stage: 'thick-first-year' }] }, 'PC7');
    expect(r).toMatchObject({ ok: true, value: { rio: -15, outcome: 'special' } });
  });

  it('two categories + Sd: PC4, Ct 10, 4 second-year + 4 thick FY, Sd grey-white -> 4x0 + 4x1 + 2x3 = 10', () => {
    const r = polarisForObservation({
      totalConcentration: 10, remainingStage: 'grey-white',
      categories: [{ partialConcentration: 4, stage: 'second-year' }, { partialConcentration: 4, stage: 'thick-first-year' }],
    }, 'PC4');
    expect(r).toMatchObject({ ok: true, value: { rio: 10, outcome: 'normal' } });
  });

  it('three categories + Sd: IB, Ct 9, 3 thin FY 2nd stage + 2 grey-white + 2 grey, Sd new -> 3x(-1) + 2x1 + 2x2 + 2x2 + 1x3 = 10', () => {
    const r = polarisForObservation({
      totalConcentration: 9, remainingStage: 'new',
      categories: [
        { partialConcentration: 3, stage: 'thin-first-year-2' },
        { partialConcentration: 2, stage: 'grey-white' },
        { partialConcentration: 2, stage: 'grey' },
      ],
    }, 'IB');
    expect(r).toMatchObject({ ok: true, value: { rio: 10, outcome: 'normal' } });
  });

  it('Ct less than the sum of the partials: the partials are used, and a note says so', () => {
    // PC6, Ct 7 but 5 thick FY (-1) + 4 grey (2): 5x(-1) + 4x2 + 1x3 = 6.
    const r = polarisForObservation({
      totalConcentration: 7, remainingStage: 'new',
      categories: [{ partialConcentration: 5, stage: 'thick-first-year' }, { partialConcentration: 4, stage: 'grey' }],
    }, 'PC6');
    expect(r).toMatchObject({ ok: true, value: { rio: 6 } });
    expect(r.ok && r.value.notes.join(' ')).toContain('add up to 9/10, more than the total 7/10');
  });

  it('a trace (So) adds nothing: Ct 0 with a trace of multi-year is 10/10 ice free, RIO 30', () => {
    // WMO-No. 259: a trace is less than 1/10; it is not a tenth of the regime.
    const r = polarisForObservation({ totalConcentration: 0, traceStage: 'multi-year', categories: [] }, 'PC7');
    expect(r).toMatchObject({ ok: true, value: { rio: 30, outcome: 'normal' } });
    expect(r.ok && r.value.notes.join(' ')).toContain('trace of multi-year ice (less than 1/10) does not enter the RIO');
  });

  it('a trace beside one category + Sd: IC, Ct 6, So second-year, 3 grey-white, Sd new -> 3x0 + 3x2 + 4x3 = 18', () => {
    const r = polarisForObservation({
      totalConcentration: 6, traceStage: 'second-year', remainingStage: 'new',
      categories: [{ partialConcentration: 3, stage: 'grey-white' }],
    }, 'IC');
    expect(r).toMatchObject({ ok: true, value: { rio: 18, outcome: 'normal' } });
  });
});
