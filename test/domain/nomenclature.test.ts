import { describe, expect, it } from 'vitest';
import { FLOE_SIZE_KEYS, OPEN_WATER_KINDS, POSITION_SOURCES, SNOW_COVERS, SNOW_WETNESS_CLASSES, STAGE_KEYS } from '../../src/domain/model.ts';
import {
  CONCENTRATION_TERMS, DEFORMATION_KINDS, DEFORMATION_LABELS, FLOE_SIZES, OPEN_WATER_LABELS,
  POSITION_SOURCE_LABELS, SNOW_COVER_LABELS, SNOW_WETNESS, STAGES, concentrationTerm, sigrid3Concentration, sigrid3ConcentrationRange,
} from '../../src/domain/nomenclature.ts';

describe('stages of development', () => {
  // WMO-No. 259, stages of development: thickness ranges in cm.
  it.each([
    ['new', 0, 10], ['nilas', 0, 10], ['dark-nilas', 0, 5], ['light-nilas', 5, 10], ['ice-rind', 0, 5],
    ['young', 10, 30], ['grey', 10, 15], ['grey-white', 15, 30],
    ['first-year', 30, 200], ['thin-first-year', 30, 70], ['thin-first-year-1', 30, 50],
    ['thin-first-year-2', 50, 70], ['medium-first-year', 70, 120],
  ] as const)('%s is %d-%d cm (WMO-No. 259)', (key, min, max) => {
    expect(STAGES[key].minCm).toBe(min);
    expect(STAGES[key].maxCm).toBe(max);
  });

  it('thick first-year starts at 120 cm (WMO-No. 259 "over 120 cm"); old ice has no thickness bound', () => {
    expect(STAGES['thick-first-year'].minCm).toBe(120);
    // Upper bound 200 cm: WMO-No. 259 gives first-year ice as 30 cm to 2 m.
    expect(STAGES['thick-first-year'].maxCm).toBe(200);
    for (const k of ['old', 'second-year', 'multi-year'] as const) {
      expect(STAGES[k].minCm).toBeNull();
      expect(STAGES[k].maxCm).toBeNull();
    }
  });

  // Egg code stage symbols (WMO-No. 259 egg code; dotted codes from the ice chart standards).
  it.each([
    ['new', '1'], ['frazil', '1'], ['nilas', '2'], ['ice-rind', '2'], ['young', '3'], ['grey', '4'],
    ['grey-white', '5'], ['first-year', '6'], ['thin-first-year', '7'], ['thin-first-year-1', '8'],
    ['thin-first-year-2', '9'], ['medium-first-year', '1.'], ['thick-first-year', '4.'], ['old', '7.'],
    ['second-year', '8.'], ['multi-year', '9.'], ['glacier', '▲'], ['undetermined', 'X'],
  ] as const)('egg code symbol of %s is %s', (key, code) => {
    expect(STAGES[key].eggCode).toBe(code);
  });

  // SIGRID-3 (WMO/TD-No. 1214) stage of development codes.
  it.each([
    ['new', '81'], ['nilas', '82'], ['young', '83'], ['grey', '84'], ['grey-white', '85'],
    ['first-year', '86'], ['thin-first-year', '87'], ['thin-first-year-1', '88'], ['thin-first-year-2', '89'],
    ['medium-first-year', '91'], ['thick-first-year', '93'], ['old', '95'], ['second-year', '96'],
    ['multi-year', '97'], ['glacier', '98'], ['undetermined', '99'],
  ] as const)('SIGRID-3 code of %s is %s', (key, code) => {
    expect(STAGES[key].sigrid3).toBe(code);
  });

  it('every stage key has a table entry with its own key and a label', () => {
    for (const k of STAGE_KEYS) {
      expect(STAGES[k].key).toBe(k);
      expect(STAGES[k].label.length).toBeGreaterThan(2);
    }
  });

  it('fine ranks increase with the WMO thickness ranges (thickest-first order)', () => {
    // WMO-No. 259 ordering by thickness, new ice up to thick first-year.
    const order = ['new', 'dark-nilas', 'light-nilas', 'grey', 'grey-white', 'thin-first-year-1',
      'thin-first-year-2', 'medium-first-year', 'thick-first-year', 'second-year', 'multi-year'] as const;
    for (let i = 1; i < order.length; i++) {
      const a = STAGES[order[i - 1] ?? 'new'].rank;
      const b = STAGES[order[i] ?? 'new'].rank;
      expect(b?.lo).toBeGreaterThan(a?.hi ?? Infinity);
    }
  });
});

describe('forms of ice (floe size)', () => {
  // WMO-No. 259 forms of ice: sizes in metres.
  it.each([
    ['pancake', 0.3, 3], ['ice-cake', 2, 20], ['small-floe', 20, 100], ['medium-floe', 100, 500],
    ['big-floe', 500, 2000], ['vast-floe', 2000, 10000], ['giant-floe', 10000, null],
  ] as const)('%s spans %s-%s m (WMO-No. 259)', (key, min, max) => {
    expect(FLOE_SIZES[key].minM).toBe(min);
    expect(FLOE_SIZES[key].maxM).toBe(max);
  });

  // Egg code form symbols (WMO-No. 259) and SIGRID-3 form codes (WMO/TD-No. 1214: 09 growlers,
  // floebergs or floebits; 10 icebergs). The egg code has the single symbol 9 for both.
  it.each([
    ['pancake', '0', '22'], ['brash', '1', '01'], ['small-ice-cake', '1', '01'], ['ice-cake', '2', '02'],
    ['small-floe', '3', '03'], ['medium-floe', '4', '04'], ['big-floe', '5', '05'], ['vast-floe', '6', '06'],
    ['giant-floe', '7', '07'], ['fast-ice', '8', '08'], ['icebergs', '9', '10'], ['growlers-floebergs', '9', '09'],
    ['undetermined', 'X', '99'],
  ] as const)('%s: egg %s, SIGRID-3 %s', (key, egg, sigrid) => {
    expect(FLOE_SIZES[key].eggCode).toBe(egg);
    expect(FLOE_SIZES[key].sigrid3).toBe(sigrid);
  });

  it('every floe size key has an entry', () => {
    for (const k of FLOE_SIZE_KEYS) expect(FLOE_SIZES[k].key).toBe(k);
  });

  it('icebergs and growlers/floebergs are two choices with two SIGRID-3 codes (WMO/TD-No. 1214)', () => {
    // Before the fix one key "Icebergs, growlers or floebergs" wrote 10 (icebergs) for growlers too.
    const bergy = FLOE_SIZE_KEYS.filter((k) => FLOE_SIZES[k].eggCode === '9');
    expect(bergy).toEqual(['icebergs', 'growlers-floebergs']);
    expect(new Set(bergy.map((k) => FLOE_SIZES[k].sigrid3))).toEqual(new Set(['10', '09']));
    expect(FLOE_SIZES.icebergs.label).not.toMatch(/growler|floeberg/i);
  });
});

describe('concentration terms', () => {
  // WMO-No. 259 concentration terms by tenths.
  it.each([
    [0, 'ice-free'], [1, 'very-open'], [3, 'very-open'], [4, 'open'], [6, 'open'], [7, 'close'],
    [8, 'close'], [9, 'very-close'], [10, 'compact'],
  ] as const)('%d/10 is %s', (tenths, key) => {
    expect(concentrationTerm(tenths).key).toBe(key);
  });

  it('a trace is open water and frozen-together 10/10 is consolidated (WMO-No. 259)', () => {
    expect(concentrationTerm(0, { icePresent: true }).label).toBe('Open water');
    expect(concentrationTerm(10, { consolidated: true }).label).toBe('Consolidated ice');
    expect(CONCENTRATION_TERMS).toHaveLength(8);
  });

  // SIGRID-3 (WMO/TD-No. 1214) concentration codes.
  it.each([
    [0, {}, '00'], [0, { trace: true }, '01'], [1, {}, '10'], [5, {}, '50'], [9, {}, '90'],
    [9, { ninePlus: true }, '91'], [10, {}, '92'], [null, {}, '99'], [11, {}, '99'], [2.5, {}, '99'],
  ] as const)('SIGRID-3 concentration of %s %o is %s', (tenths, opts, code) => {
    expect(sigrid3Concentration(tenths, opts)).toBe(code);
  });

  it('SIGRID-3 range code "ab": 4-6/10 is 46 (WMO/TD-No. 1214)', () => {
    expect(sigrid3ConcentrationRange(4, 6)).toBe('46');
    expect(sigrid3ConcentrationRange(7, 7)).toBe('70');
    expect(sigrid3ConcentrationRange(6, 4)).toBe('99');
  });
});

// The labels shown on screen and written to the exports, checked against the terms of the WMO
// Sea-Ice Nomenclature (WMO-No. 259) typed here from the nomenclature, not read from the table.
// Comparison ignores case and commas. Where our label is not the WMO term, the line says why.
const norm = (s: string) => s.toLowerCase().replace(/,/g, '').replace(/\s+/g, ' ').trim();

describe('labels are the WMO-No. 259 terms', () => {
  it.each([
    ['new', 'New ice'], ['frazil', 'Frazil ice'], ['grease', 'Grease ice'], ['slush', 'Slush'], ['shuga', 'Shuga'],
    ['nilas', 'Nilas'], ['dark-nilas', 'Dark nilas'], ['light-nilas', 'Light nilas'], ['ice-rind', 'Ice rind'],
    ['young', 'Young ice'], ['grey', 'Grey ice'], ['grey-white', 'Grey-white ice'],
    ['first-year', 'First-year ice'],
    // WMO-No. 259 gives "thin first-year ice/white ice" with a first and a second stage; the
    // synonym "white ice" is left out of our label.
    ['thin-first-year', 'Thin first-year ice'], ['thin-first-year-1', 'Thin first-year ice first stage'],
    ['thin-first-year-2', 'Thin first-year ice second stage'],
    ['medium-first-year', 'Medium first-year ice'], ['thick-first-year', 'Thick first-year ice'],
    ['old', 'Old ice'], ['second-year', 'Second-year ice'], ['multi-year', 'Multi-year ice'],
    ['glacier', 'Ice of land origin'],
  ] as const)('stage %s is "%s" (WMO-No. 259, stages of development)', (key, term) => {
    expect(norm(STAGES[key].label)).toBe(norm(term));
  });

  it('the undetermined stage is our own wording for the egg code\'s X (no WMO-No. 259 term)', () => {
    expect(STAGES.undetermined.label).toBe('Undetermined or unknown');
  });

  it.each([
    ['pancake', 'Pancake ice'], ['brash', 'Brash ice'], ['small-ice-cake', 'Small ice cake'], ['ice-cake', 'Ice cake'],
    ['small-floe', 'Small floe'], ['medium-floe', 'Medium floe'], ['big-floe', 'Big floe'], ['vast-floe', 'Vast floe'],
    ['giant-floe', 'Giant floe'], ['fast-ice', 'Fast ice'], ['icebergs', 'Icebergs'],
    // WMO-No. 259 has "growler" and "floeberg" as two terms; SIGRID-3 codes them together (09).
    ['growlers-floebergs', 'Growlers or floebergs'],
  ] as const)('form %s is "%s" (WMO-No. 259, forms of ice)', (key, term) => {
    expect(norm(FLOE_SIZES[key].label)).toBe(norm(term));
  });

  it.each([
    ['ice-free', 'Ice free'], ['open-water', 'Open water'], ['very-open', 'Very open ice'], ['open', 'Open ice'],
    ['close', 'Close ice'], ['very-close', 'Very close ice'], ['compact', 'Compact ice'], ['consolidated', 'Consolidated ice'],
  ] as const)('concentration %s is "%s" (WMO-No. 259, concentration)', (key, term) => {
    expect(norm(CONCENTRATION_TERMS.find((t) => t.key === key)?.label ?? '')).toBe(norm(term));
  });

  it.each([
    ['crack', 'Crack'], ['lead', 'Lead'], ['shore-lead', 'Shore lead'], ['flaw-lead', 'Flaw lead'], ['polynya', 'Polynya'],
    // "Refrozen lead": a lead covered by new ice; the term is from memory, not checked against the text.
    ['refrozen-lead', 'Refrozen lead'],
  ] as const)('opening %s is "%s" (WMO-No. 259, openings in the ice)', (key, term) => {
    expect(norm(OPEN_WATER_LABELS[key])).toBe(norm(term));
  });

  it.each([
    ['level', 'Level ice'], ['rafted', 'Rafted ice'], ['ridged', 'Ridged ice'], ['hummocked', 'Hummocked ice'],
  ] as const)('deformation %s is "%s" (WMO-No. 259, deformed ice)', (key, term) => {
    expect(norm(DEFORMATION_LABELS[key])).toBe(norm(term));
  });
});

describe('labels for the UI', () => {
  it('deformation kinds use the WMO-No. 259 terms', () => {
    expect(DEFORMATION_KINDS).toEqual(['level', 'rafted', 'ridged', 'hummocked']);
    expect(DEFORMATION_LABELS.hummocked).toBe('Hummocked ice');
  });

  it('every snow cover and open-water kind has a label', () => {
    for (const k of SNOW_COVERS) expect(SNOW_COVER_LABELS[k]).toMatch(/\w/);
    for (const k of OPEN_WATER_KINDS) expect(OPEN_WATER_LABELS[k]).toMatch(/\w/);
    for (const k of POSITION_SOURCES) expect(POSITION_SOURCE_LABELS[k]).toMatch(/\w/);
    // WMO-No. 259 term.
    expect(OPEN_WATER_LABELS.polynya).toBe('Polynya');
  });
});

describe('snow wetness classes', () => {
  // International Classification for Seasonal Snow on the Ground (Fierz, C., Armstrong, R.L.,
  // Durand, Y., Etchevers, P., Greene, E., McClung, D.M., Nishimura, K., Satyawali, P.K. and
  // Sokratov, S.A. 2009, IHP-VII Technical Documents in Hydrology No. 83, IACS Contribution No. 1,
  // UNESCO-IHP, Paris), liquid water content: five classes, driest first, with the codes D, M, W,
  // V, S. The volume ranges (0, 0-3, 3-8, 8-15, > 15 per cent) are the same as in its predecessor
  // (Colbeck et al. 1990); checked against a published transcription of that table, the 2009
  // values themselves are given from memory.
  it('are the five classes of the classification, in order, with their codes', () => {
    expect(SNOW_WETNESS_CLASSES).toEqual(['dry', 'moist', 'wet', 'very-wet', 'soaked']);
    expect(SNOW_WETNESS_CLASSES.map((k) => SNOW_WETNESS[k].code)).toEqual(['D', 'M', 'W', 'V', 'S']);
    expect(SNOW_WETNESS_CLASSES.map((k) => SNOW_WETNESS[k].label)).toEqual(['Dry', 'Moist', 'Wet', 'Very wet', 'Soaked']);
  });

  it('have the liquid-water ranges by volume, adjoining and increasing', () => {
    expect(SNOW_WETNESS_CLASSES.map((k) => [SNOW_WETNESS[k].lwcMinPercent, SNOW_WETNESS[k].lwcMaxPercent])).toEqual([
      [0, 0], [0, 3], [3, 8], [8, 15], [15, null],
    ]);
    for (let i = 2; i < SNOW_WETNESS_CLASSES.length; i++) {
      const prev = SNOW_WETNESS[SNOW_WETNESS_CLASSES[i - 1]!];
      expect(SNOW_WETNESS[SNOW_WETNESS_CLASSES[i]!].lwcMinPercent).toBe(prev.lwcMaxPercent);
    }
  });

  it('snow cover is our own three steps (common practice, no source)', () => {
    expect(SNOW_COVERS).toEqual(['none', 'partial', 'complete']);
  });
});
