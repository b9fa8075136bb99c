import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { FLOE_SIZE_KEYS, STAGE_KEYS, type IceCategory, type StageKey } from '../../src/domain/model.ts';
import {
  deriveEggCode, type EggCode, type EggText, eggCodeDrawing, eggCodeLayout, eggCodeText, floeSizeForEggCode, readEggCode, stageForEggCode,
  type EggCodeInput,
} from '../../src/domain/eggCode.ts';
import { FLOE_SIZES, STAGES } from '../../src/domain/nomenclature.ts';
import { isStageSurelyThicker, sortCategoriesThickestFirst } from '../../src/domain/ordering.ts';

const cat = (partialConcentration: number, stage: StageKey, extra: Partial<IceCategory> = {}): IceCategory => ({
  partialConcentration, stage, ...extra,
});

describe('deriveEggCode (WMO-No. 259 egg code)', () => {
  it('a single ice type leaves Ca blank: 9/10 thick first-year in medium floes', () => {
    const code = deriveEggCode({ totalConcentration: 9, categories: [cat(9, 'thick-first-year', { floeSize: 'medium-floe' })] });
    expect(code).toMatchObject({ ct: '9', ca: '', sa: '4.', fa: '4', sb: '', fb: '' });
    expect(eggCodeText(code)).toBe('9 - - - / - 4.  - - - / 4 - -');
  });

  it('orders the categories thickest first, whatever order they were entered in', () => {
    const code = deriveEggCode({
      totalConcentration: 9,
      categories: [
        cat(1, 'grey', { floeSize: 'ice-cake' }),
        cat(5, 'medium-first-year', { floeSize: 'big-floe' }),
        cat(3, 'thin-first-year', { floeSize: 'small-floe' }),
      ],
    });
    // Ca 5 medium FY (1.) big floes (5); Cb 3 thin FY (7) small floes (3); Cc 1 grey (4) ice cakes (2).
    expect(eggCodeText(code)).toBe('9 5 3 1 / - 1.  7 4 - / 5 3 2');
  });

  it('writes So (trace of thicker ice) and Sd (remaining thinner ice)', () => {
    const code = deriveEggCode({
      totalConcentration: 10, traceStage: 'multi-year', remainingStage: 'new',
      categories: [cat(6, 'thick-first-year'), cat(4, 'grey-white')],
    });
    expect(code).toMatchObject({ so: '9.', sa: '4.', sb: '5', sd: '1', ca: '6', cb: '4' });
  });

  it('an unknown stage or form from a damaged file shows as X instead of failing', () => {
    const code = deriveEggCode({ totalConcentration: 5, categories: [cat(5, 'mush' as StageKey, { floeSize: 'huge' as IceCategory['floeSize'] })] });
    expect(code).toMatchObject({ sa: 'X', fa: 'X' });
  });

  it('an unjudged total is X and blank forms stay blank', () => {
    const code = deriveEggCode({ totalConcentration: null, categories: [] });
    expect(eggCodeText(code)).toBe('X - - - / - - - - - / - - -');
  });
});

describe('readEggCode', () => {
  it('reads the text form back into concentrations, stages and forms', () => {
    const r = readEggCode('9 5 3 1 / - 1. 7 4 - / 5 3 2');
    expect(r).toMatchObject({
      ok: true,
      value: {
        totalConcentration: 9,
        categories: [
          { partialConcentration: 5, stage: 'medium-first-year', floeSize: 'big-floe' },
          { partialConcentration: 3, stage: 'thin-first-year', floeSize: 'small-floe' },
          { partialConcentration: 1, stage: 'grey', floeSize: 'ice-cake' },
        ],
      },
    });
  });

  it('dot rule (Environment Canada ice symbols): a dot also applies to every stage code to its left', () => {
    // "7 1." is old ice (7.) then medium first-year (1.); with explicit dots only, 7 is thin first-year.
    const inherit = readEggCode('8 5 3 - / - 7 1. - - / 4 4 -');
    expect(inherit.ok && inherit.value.categories.map((c) => c.stage)).toEqual(['old', 'medium-first-year']);
    const explicit = readEggCode('8 5 3 - / - 7 1. - - / 4 4 -', { dotRule: 'explicit' });
    expect(explicit.ok && explicit.value.categories.map((c) => c.stage)).toEqual(['thin-first-year', 'medium-first-year']);
    // 6 (first-year) has no dotted form, so it stays first-year.
    const six = readEggCode('8 5 3 - / - 6 1. - - / - - -');
    expect(six.ok && six.value.categories[0]?.stage).toBe('first-year');
  });

  it.each([
    ['9 - - - / - 4. - -', 'expected 3 groups'],
    ['9 - - - / - 4. - - / 4 - -', 'group 2 needs 5 fields'],
    ['11 - - - / - 4. - - - / 4 - -', 'Ct "11"'],
    ['9 - - - / - 6. - - - / 4 - -', 'sa "6."'],
    ['9 9 - - / - 4. - - - / 4 - -', 'ca "9" must be blank for a single ice type'],
    ['9 - - - / - 4. 7 - - / 4 - -', 'ca is blank but 2 ice types'],
    ['9 5 4 - / - 4. 7 - - / Q - -', 'fa "Q"'],
    ['9 - - - / - 4. - - - / - 3 -', 'fb "3" is given but sb is blank'],
    ['- - - - / - 4. - - - / - - -', 'Ct (total concentration) is blank'],
  ])('rejects %s with a message naming the field', (text, msg) => {
    const r = readEggCode(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toContain(msg);
  });
});

// Round trip derive -> text -> read. Several stages share a symbol (frazil, grease ... are all
// "1"), so what reads back is the stage that symbol stands for.
const canonicalStage = (s: StageKey): StageKey => stageForEggCode(STAGES[s].eggCode) ?? s;

const stageArb = fc.constantFrom(...STAGE_KEYS);
const categoryArb = fc.record({
  partialConcentration: fc.integer({ min: 1, max: 9 }),
  stage: stageArb,
  thicknessCm: fc.option(fc.integer({ min: 0, max: 400 }), { nil: undefined }),
  floeSize: fc.option(fc.constantFrom(...FLOE_SIZE_KEYS), { nil: undefined }),
}, { requiredKeys: ['partialConcentration', 'stage'] });
const obsArb: fc.Arbitrary<EggCodeInput> = fc.record({
  totalConcentration: fc.option(fc.integer({ min: 0, max: 10 }), { nil: null }),
  categories: fc.array(categoryArb, { minLength: 0, maxLength: 3 }),
  traceStage: fc.option(stageArb, { nil: undefined }),
  remainingStage: fc.option(stageArb, { nil: undefined }),
}, { requiredKeys: ['totalConcentration', 'categories'] });

function expectedReading(obs: EggCodeInput) {
  const sorted = sortCategoriesThickestFirst(obs.categories).categories;
  return {
    totalConcentration: obs.totalConcentration,
    categories: sorted.map((c) => ({
      // WMO-No. 259: Ca is blank (it is Ct) only where a single ice type is present; Sd is a second.
      partialConcentration: sorted.length === 1 && !obs.remainingStage ? obs.totalConcentration : c.partialConcentration,
      stage: canonicalStage(c.stage),
      ...(c.floeSize ? { floeSize: floeSizeForEggCode(FLOE_SIZES[c.floeSize].eggCode) } : {}),
    })),
    ...(obs.traceStage ? { traceStage: canonicalStage(obs.traceStage) } : {}),
    ...(obs.remainingStage ? { remainingStage: canonicalStage(obs.remainingStage) } : {}),
  };
}

/** True when no plain dottable digit stands left of a dotted code (what a valid, ordered code gives). */
function dotsConsistent(text: string): boolean {
  const s = (text.split('/')[1] ?? '').trim().split(/\s+/);
  let dotSeen = false;
  for (let i = s.length - 1; i >= 0; i--) {
    const t = s[i] ?? '';
    if (t.endsWith('.')) dotSeen = true;
    else if (dotSeen && ['1', '4', '7', '8', '9'].includes(t)) return false;
  }
  return true;
}

describe('egg code round trip (fast-check)', () => {
  it('derive -> text -> read with explicit dots gives back every observation', () => {
    fc.assert(fc.property(obsArb, (obs) => {
      const code = deriveEggCode(obs);
      const r = readEggCode(eggCodeText(code), { dotRule: 'explicit' });
      expect(r.ok).toBe(true);
      if (!r.ok) return;
      const { code: readCode, ...reading } = r.value;
      expect(readCode).toEqual(code);
      expect(reading).toEqual(expectedReading(obs));
    }), { numRuns: 500 });
  });

  it('derive -> read with the inherited-dot convention gives back every consistently ordered code', () => {
    fc.assert(fc.property(obsArb, (obs) => {
      const text = eggCodeText(deriveEggCode(obs));
      fc.pre(dotsConsistent(text));
      const r = readEggCode(text);
      expect(r.ok).toBe(true);
      if (r.ok) expect({ ...r.value, code: undefined }).toEqual({ ...expectedReading(obs), code: undefined });
    }), { numRuns: 500 });
  });

  it('the categories of a derived code never break the dot convention (only So/Sd can)', () => {
    fc.assert(fc.property(obsArb, (obs) => {
      const text = eggCodeText(deriveEggCode({ ...obs, traceStage: undefined, remainingStage: undefined }));
      expect(dotsConsistent(text)).toBe(true);
    }), { numRuns: 500 });
  });
});

describe('eggCodeDrawing', () => {
  it('draws an oval with three dividers and one text per filled field, all inside the oval', () => {
    const code = deriveEggCode({
      totalConcentration: 9, traceStage: 'multi-year', remainingStage: 'new',
      categories: [cat(5, 'medium-first-year', { floeSize: 'big-floe' }), cat(3, 'thin-first-year', { floeSize: 'small-floe' }), cat(1, 'grey')],
    });
    const d = eggCodeDrawing(code);
    const ellipse = d.shapes.find((s) => s.kind === 'ellipse');
    expect(ellipse).toBeDefined();
    expect(d.shapes.filter((s) => s.kind === 'line')).toHaveLength(3);
    const filled = Object.entries(code).filter(([, v]) => v !== '').map(([k]) => k).sort();
    expect(d.texts.map((t) => t.field).sort()).toEqual(filled);
    // The dot of "1." is a shape of its own beside the digit (see the spacing tests below).
    expect(d.texts.find((t) => t.field === 'sa')?.text).toBe('1');
    expect(d.shapes.filter((s) => s.kind === 'dot').map((s) => (s.kind === 'dot' ? s.field : ''))).toEqual(['so', 'sa']);
    if (ellipse?.kind !== 'ellipse') return;
    for (const t of d.texts) {
      expect(((t.x - ellipse.cx) / ellipse.rx) ** 2 + ((t.y - ellipse.cy) / ellipse.ry) ** 2).toBeLessThan(1);
    }
    for (const s of d.shapes) {
      if (s.kind !== 'line') continue;
      // Divider ends lie on the oval.
      expect(((s.x1 - ellipse.cx) / ellipse.rx) ** 2 + ((s.y1 - ellipse.cy) / ellipse.ry) ** 2).toBeCloseTo(1, 2);
    }
    expect(d.title).toBe('Egg code 9 5 3 1 / 9.  1.  7 4 1 / 5 3 -');
  });
});

// A dotted stage symbol ("1." medium first-year, "4." thick first-year, "7." old ice: WMO-No. 259
// stage codes) must never run into the next symbol, so "1. 7 5" cannot be read as "1.75".
describe('egg code spacing after a dotted stage symbol', () => {
  // From memory: the digits of common sans-serif faces are about 0.55-0.6 em wide, so half a
  // digit's ink is at most 0.3 em either side of its centre.
  const HALF_DIGIT_EM = 0.3;
  const oldMediumGrey = deriveEggCode({
    totalConcentration: 9,
    categories: [cat(4, 'old'), cat(3, 'medium-first-year'), cat(2, 'grey-white')],
  });

  it('the text form leaves two spaces after a dot, and reads back', () => {
    expect(eggCodeText(oldMediumGrey)).toBe('9 4 3 2 / - 7.  1.  5 - / - - -');
    expect(eggCodeText(oldMediumGrey)).not.toMatch(/\. ?[^ ]/);
    const r = readEggCode(eggCodeText(oldMediumGrey), { dotRule: 'explicit' });
    expect(r.ok && r.value.categories.map((c) => c.stage)).toEqual(['old', 'medium-first-year', 'grey-white']);
  });

  function gapsAfterDots(code: EggCode): number[] {
    const d = eggCodeDrawing(code);
    const row = d.texts.filter((t) => ['so', 'sa', 'sb', 'sc', 'sd'].includes(t.field)).sort((a, b) => a.x - b.x);
    const gaps: number[] = [];
    for (const s of d.shapes) {
      if (s.kind !== 'dot') continue;
      const next = row.find((t) => t.x > s.cx);
      if (next) gaps.push((next.x - HALF_DIGIT_EM * next.size - (s.cx + s.r)) / next.size);
    }
    return gaps;
  }

  it('three stage columns: the dot sits at its digit and at least 0.6 em from the next symbol', () => {
    const gaps = gapsAfterDots(oldMediumGrey);
    expect(gaps).toHaveLength(2);
    for (const g of gaps) expect(g).toBeGreaterThanOrEqual(0.6);
    const d = eggCodeDrawing(oldMediumGrey);
    for (const s of d.shapes) {
      if (s.kind !== 'dot') continue;
      const digit = d.texts.find((t) => t.field === s.field) as EggText;
      // Closer to its own digit (about 0.1 em of air) than to anything else.
      expect(s.cx - s.r - (digit.x + HALF_DIGIT_EM * digit.size)).toBeLessThan(0.15 * digit.size);
      expect(s.cy).toBeGreaterThan(digit.y); // at the foot of the digit, as a full stop sits
    }
  });

  it('five stage columns (So and Sd present): still at least 0.4 em', () => {
    const crowded = deriveEggCode({
      totalConcentration: 9, traceStage: 'multi-year', remainingStage: 'new',
      categories: [cat(4, 'thick-first-year'), cat(3, 'medium-first-year'), cat(2, 'grey-white')],
    });
    expect(eggCodeText(crowded)).toBe('9 4 3 2 / 9.  4.  1.  5 1 / - - -');
    const gaps = gapsAfterDots(crowded);
    expect(gaps).toHaveLength(3);
    for (const g of gaps) expect(g).toBeGreaterThanOrEqual(0.4);
  });
});

// WMO-No. 259 (the egg code): Ca, Cb, Cc are the partial concentrations of Sa, Sb, Sc; Sd is the
// stage of the remaining ice; "where only one ice type is present, Ca is left blank". One category
// with a remaining stage is two ice types, so Ca carries its share and Sd has the rest of Ct.
describe('the remaining stage Sd beside a single category', () => {
  it('writes Ca when Sd is present: Ct 9, 5/10 thick FY in big floes, Sd grey -> "9 5 - - / - 4. - - 4 / 5 - -"', () => {
    const code = deriveEggCode({ totalConcentration: 9, remainingStage: 'grey', categories: [cat(5, 'thick-first-year', { floeSize: 'big-floe' })] });
    // Before the fix Ca was blank here ("9 - - - / ..."), reading back 9/10 thick FY.
    expect(eggCodeText(code)).toBe('9 5 - - / - 4.  - - 4 / 5 - -');
  });

  it('reads Ca back as the partial, not Ct, when Sd is given', () => {
    const r = readEggCode('9 5 - - / - 4. - - 4 / 5 - -');
    expect(r).toMatchObject({ ok: true, value: { totalConcentration: 9, categories: [{ partialConcentration: 5, stage: 'thick-first-year', floeSize: 'big-floe' }], remainingStage: 'grey' } });
  });

  it('refuses a blank Ca beside Sd, naming both fields', () => {
    const r = readEggCode('9 - - - / - 4. - - 4 / 5 - -');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/ca is blank but Sd is given/);
  });

  it('still leaves Ca blank for a single ice type with a trace (So is less than 1/10, not an ice type)', () => {
    const code = deriveEggCode({ totalConcentration: 8, traceStage: 'multi-year', categories: [cat(8, 'thick-first-year')] });
    expect(eggCodeText(code)).toBe('8 - - - / 9.  4.  - - - / - - -');
  });

  it('derive -> read gives back the same partials for one category and Sd (fast-check)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 2, max: 10 }), fc.integer({ min: 1, max: 9 }), stageArb, stageArb,
      (total, partial, stage, sd) => {
        fc.pre(partial < total);
        const obs: EggCodeInput = { totalConcentration: total, remainingStage: sd, categories: [cat(partial, stage)] };
        const r = readEggCode(eggCodeText(deriveEggCode(obs)), { dotRule: 'explicit' });
        expect(r.ok).toBe(true);
        if (!r.ok) return;
        expect(r.value.categories.map((c) => c.partialConcentration)).toEqual([partial]);
        expect(r.value.remainingStage).toBe(canonicalStage(sd));
      },
    ), { numRuns: 500 });
  });
});

// WMO-No. 259: the egg code has three category columns (a, b, c) and Sd for "any remaining" ice.
// That Sd then takes the thickest of what remains is our reading of that definition (the egg
// code gives no rule for several remaining stages; from memory, not quoted).
describe('more than three categories: the fourth goes to Sd, never dropped', () => {
  it('Ct 10, 4 MY + 3 thick FY + 2 grey-white + 1 grey -> Sa 9. Sb 4. Sc 5, Sd 4 (grey)', () => {
    const obs: EggCodeInput = {
      totalConcentration: 10,
      categories: [cat(1, 'grey'), cat(4, 'multi-year'), cat(2, 'grey-white'), cat(3, 'thick-first-year')],
    };
    // Before the fix the grey ice vanished: "10 4 3 2 / - 9. 4. 5 - / - - -".
    expect(eggCodeText(deriveEggCode(obs))).toBe('10 4 3 2 / - 9.  4.  5 4 / - - -');
    const layout = eggCodeLayout(obs);
    expect(layout.folded.map((c) => c.stage)).toEqual(['grey']);
    expect(layout.remainingStage).toBe('grey');
  });

  it('a recorded Sd thinner than the fourth category gives way to the fourth (the thickest remaining)', () => {
    const obs: EggCodeInput = {
      totalConcentration: 10, remainingStage: 'new',
      categories: [cat(3, 'thick-first-year'), cat(3, 'medium-first-year'), cat(2, 'grey-white'), cat(1, 'grey')],
    };
    expect(deriveEggCode(obs).sd).toBe('4');
  });

  it('every stage of an observation with four or five categories appears in the code (fast-check)', () => {
    fc.assert(fc.property(
      fc.array(categoryArb, { minLength: 4, maxLength: 5 }), fc.option(stageArb, { nil: undefined }),
      (categories, remainingStage) => {
        const layout = eggCodeLayout({ categories, remainingStage });
        expect(layout.categories).toHaveLength(3);
        expect(layout.categories.length + layout.folded.length).toBe(categories.length);
        // Sd is the fourth category's stage unless a recorded Sd is surely thicker.
        const fourth = layout.folded[0]!.stage;
        const want = remainingStage && isStageSurelyThicker(remainingStage, fourth) ? remainingStage : fourth;
        expect(deriveEggCode({ totalConcentration: 10, categories, remainingStage }).sd).toBe(STAGES[want].eggCode);
      },
    ), { numRuns: 300 });
  });
});
