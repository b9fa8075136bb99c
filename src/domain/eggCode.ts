// The egg code (WMO-No. 259 and the ice chart standards): an observation's concentrations,
// stages and forms in the oval symbol of ice charts.
//   Ct          total concentration
//   Ca Cb Cc    partial concentrations of the thickest, second and third thickest ice
//   So Sa Sb Sc Sd  stage of a trace of thicker ice, the three stages thickest first, and the
//               stage of any remaining thinner ice
//   Fa Fb Fc    form (floe size) of Sa Sb Sc
// Where only one ice type is present, Ca is left blank (its concentration is Ct); a category with
// a remaining stage Sd is two ice types, so Ca is written.
// The egg code holds three categories; a fourth and thinner one (from a draft, a preview or a
// file before the rules refuse it) becomes Sd, the stage of the remaining ice, never dropped.
// Dotted stage codes (1. medium first-year ... 9. multi-year) are written with their dot here.
// When reading, the chart convention that a dot also applies to every code to its left can be
// applied (`dotRule: 'inherit'`), see readEggCode.

import type { FloeSizeKey, IceCategory, Observation, StageKey } from './model.ts';
import { FLOE_SIZE_KEYS, STAGE_KEYS } from './model.ts';
import { FLOE_SIZES, STAGES } from './nomenclature.ts';
import { isStageSurelyThicker, sortCategoriesThickestFirst } from './ordering.ts';
import { err, ok, type Result } from './result.ts';

/** The egg code fields as text; an empty string is a blank field. */
export interface EggCode {
  ct: string;
  ca: string; cb: string; cc: string;
  so: string; sa: string; sb: string; sc: string; sd: string;
  fa: string; fb: string; fc: string;
}

export type EggCodeField = keyof EggCode;

const C_FIELDS = ['ca', 'cb', 'cc'] as const;
const S_FIELDS = ['sa', 'sb', 'sc'] as const;
const F_FIELDS = ['fa', 'fb', 'fc'] as const;
/** Field order of the one-line text form. */
const TEXT_GROUPS: readonly (readonly EggCodeField[])[] = [
  ['ct', 'ca', 'cb', 'cc'],
  ['so', 'sa', 'sb', 'sc', 'sd'],
  ['fa', 'fb', 'fc'],
];

/** The concentration symbol for "not judged" (e.g. in darkness). */
export const EGG_UNKNOWN = 'X';

const blankCode = (): EggCode => ({
  ct: '', ca: '', cb: '', cc: '', so: '', sa: '', sb: '', sc: '', sd: '', fa: '', fb: '', fc: '',
});

/** What deriveEggCode needs from an observation (so drafts can be shown too). */
export type EggCodeInput = Pick<Observation, 'totalConcentration' | 'categories'> &
  Partial<Pick<Observation, 'traceStage' | 'remainingStage'>>;

/** The categories the egg code shows (Sa, Sb, Sc) and its remaining stage (Sd). */
export interface EggCodeLayout {
  /** At most three, thickest first. */
  categories: IceCategory[];
  remainingStage?: StageKey;
  /** Categories beyond the third, thickest first: their stages are folded into Sd. */
  folded: IceCategory[];
}

/**
 * Thickest first, three categories at most; whatever is beyond the third is remaining ice, and Sd
 * is the thickest stage of the remaining ice (a fourth category, or the recorded Sd if that is
 * surely thicker).
 */
export function eggCodeLayout(obs: Pick<EggCodeInput, 'categories' | 'remainingStage'>): EggCodeLayout {
  const sorted = sortCategoriesThickestFirst(obs.categories).categories;
  const categories = sorted.slice(0, 3);
  const folded = sorted.slice(3);
  const out: EggCodeLayout = { categories, folded };
  const fourth = folded[0];
  if (fourth && obs.remainingStage && isStageSurelyThicker(obs.remainingStage, fourth.stage)) out.remainingStage = obs.remainingStage;
  else if (fourth) out.remainingStage = fourth.stage;
  else if (obs.remainingStage) out.remainingStage = obs.remainingStage;
  return out;
}

/**
 * The egg code of an observation. Categories are put thickest first (whatever order they were
 * entered in); a fourth and thinner category becomes Sd (see eggCodeLayout).
 */
export function deriveEggCode(obs: EggCodeInput): EggCode {
  const code = blankCode();
  code.ct = obs.totalConcentration === null ? EGG_UNKNOWN : String(obs.totalConcentration);
  const layout = eggCodeLayout(obs);
  const cats = layout.categories;
  // Ca is blank only for a single ice type: one category and no remaining stage.
  const writePartials = cats.length > 1 || layout.remainingStage !== undefined;
  cats.forEach((c, i) => {
    code[S_FIELDS[i] as EggCodeField] = stageSymbol(c.stage);
    code[F_FIELDS[i] as EggCodeField] = c.floeSize ? (FLOE_SIZES[c.floeSize] as (typeof FLOE_SIZES)[FloeSizeKey] | undefined)?.eggCode ?? EGG_UNKNOWN : '';
    if (writePartials) code[C_FIELDS[i] as EggCodeField] = String(c.partialConcentration);
  });
  if (obs.traceStage) code.so = stageSymbol(obs.traceStage);
  if (layout.remainingStage) code.sd = stageSymbol(layout.remainingStage);
  return code;
}

/** The stage's symbol; an unknown stage (bad data from a file) shows as X, undetermined. */
function stageSymbol(stage: StageKey): string {
  return (STAGES[stage] as (typeof STAGES)[StageKey] | undefined)?.eggCode ?? EGG_UNKNOWN;
}

/**
 * One-line form for lists and files: `Ct Ca Cb Cc / So Sa Sb Sc Sd / Fa Fb Fc`, `-` for blank.
 * A dotted stage symbol is followed by two spaces instead of one, so that "1.  7 5" cannot be
 * read as the number 1.75 (show it with white space kept, e.g. CSS `white-space: pre`).
 */
export function eggCodeText(code: EggCode): string {
  return TEXT_GROUPS.map((g) => g.map((f) => code[f] || '-').reduce((line, sym, i) => (i === 0 ? sym : line + (line.endsWith('.') ? '  ' : ' ') + sym), '')).join(' / ');
}

/** The first stage of our table that carries each egg code symbol: the key a code reads back as. */
const STAGE_FOR_CODE: ReadonlyMap<string, StageKey> = (() => {
  const m = new Map<string, StageKey>();
  // Preferred readings where several stages share a symbol (frazil, grease ... all read as new).
  const preferred: StageKey[] = ['new', 'nilas'];
  for (const k of [...preferred, ...STAGE_KEYS]) if (!m.has(STAGES[k].eggCode)) m.set(STAGES[k].eggCode, k);
  return m;
})();

const FORM_FOR_CODE: ReadonlyMap<string, FloeSizeKey> = (() => {
  const m = new Map<string, FloeSizeKey>();
  const preferred: FloeSizeKey[] = ['small-ice-cake'];
  for (const k of [...preferred, ...FLOE_SIZE_KEYS]) if (!m.has(FLOE_SIZES[k].eggCode)) m.set(FLOE_SIZES[k].eggCode, k);
  return m;
})();

/** The stage an egg code symbol reads back as (`1` is new ice, `2` nilas, `7.` old ice ...). */
export function stageForEggCode(symbol: string): StageKey | undefined {
  return STAGE_FOR_CODE.get(symbol);
}

/** The form an egg code form symbol reads back as (`1` reads as small ice cake). */
export function floeSizeForEggCode(symbol: string): FloeSizeKey | undefined {
  return FORM_FOR_CODE.get(symbol);
}

export interface EggCodeCategoryReading {
  /** Partial concentration in tenths; for a single ice type it is Ct. */
  partialConcentration: number | null;
  stage: StageKey;
  floeSize?: FloeSizeKey;
}

export interface EggCodeReading {
  code: EggCode;
  totalConcentration: number | null;
  categories: EggCodeCategoryReading[];
  traceStage?: StageKey;
  remainingStage?: StageKey;
}

export interface ReadEggCodeOptions {
  /**
   * `inherit` (default): the chart convention, a plain digit to the left of a dotted stage code
   * is read as dotted too where that dotted code exists (so `7 1.` reads as old ice, medium
   * first-year). `explicit`: only a written dot counts.
   */
  dotRule?: 'inherit' | 'explicit';
}

function parseText(text: string): Result<EggCode> {
  const groups = text.split('/').map((g) => g.trim().split(/\s+/).filter((t) => t !== ''));
  if (groups.length !== TEXT_GROUPS.length) {
    return err(`expected 3 groups "Ct Ca Cb Cc / So Sa Sb Sc Sd / Fa Fb Fc", found ${groups.length} in "${text}"`);
  }
  const code = blankCode();
  for (let g = 0; g < TEXT_GROUPS.length; g++) {
    const fields = TEXT_GROUPS[g] ?? [];
    const tokens = groups[g] ?? [];
    if (tokens.length !== fields.length) {
      return err(`group ${g + 1} needs ${fields.length} fields (${fields.join(' ')}), found ${tokens.length}: "${tokens.join(' ')}"`);
    }
    fields.forEach((f, i) => {
      const t = tokens[i] ?? '-';
      code[f] = t === '-' ? '' : t;
    });
  }
  return ok(code);
}

function parseConcentration(field: string, value: string, allowUnknown: boolean): Result<number | null> {
  if (allowUnknown && value === EGG_UNKNOWN) return ok(null);
  if (!/^\d{1,2}$/.test(value) || Number(value) > 10) {
    return err(`${field} "${value}" is not a concentration in tenths (0 to 10${allowUnknown ? ' or X' : ''})`);
  }
  return ok(Number(value));
}

const DOTTABLE = new Set(['1', '4', '7', '8', '9']);

/**
 * Read an egg code, from its one-line text form or its fields, back into concentrations,
 * stages and forms. Bad input gives a message naming the field.
 */
export function readEggCode(input: string | EggCode, opts: ReadEggCodeOptions = {}): Result<EggCodeReading> {
  let code: EggCode;
  if (typeof input === 'string') {
    const parsed = parseText(input);
    if (!parsed.ok) return parsed;
    code = parsed.value;
  } else {
    code = { ...input };
  }

  // Stage symbols left to right with the dot convention applied.
  const stageFields = ['so', 'sa', 'sb', 'sc', 'sd'] as const;
  const symbols = stageFields.map((f) => code[f]);
  if ((opts.dotRule ?? 'inherit') === 'inherit') {
    let dotToTheRight = false;
    for (let i = symbols.length - 1; i >= 0; i--) {
      const s = symbols[i] ?? '';
      if (s.endsWith('.')) dotToTheRight = true;
      else if (dotToTheRight && DOTTABLE.has(s)) symbols[i] = `${s}.`;
    }
  }
  const stages: (StageKey | undefined)[] = [];
  for (let i = 0; i < stageFields.length; i++) {
    const s = symbols[i] ?? '';
    if (s === '') { stages.push(undefined); continue; }
    const st = stageForEggCode(s);
    if (!st) return err(`${stageFields[i]} "${code[stageFields[i] ?? 'sa']}" is not an egg code stage symbol`);
    stages.push(st);
  }

  if (code.ct === '') return err('Ct (total concentration) is blank');
  const total = parseConcentration('Ct', code.ct, true);
  if (!total.ok) return total;

  const categories: EggCodeCategoryReading[] = [];
  const present = S_FIELDS.filter((f) => code[f] !== '').length;
  // A single ice type: one of Sa..Sc and no Sd. With Sd there are two, and Ca is written.
  const single = present === 1 && stages[4] === undefined;
  for (let i = 0; i < 3; i++) {
    const sf = S_FIELDS[i] ?? 'sa';
    const cf = C_FIELDS[i] ?? 'ca';
    const ff = F_FIELDS[i] ?? 'fa';
    const stage = stages[i + 1];
    if (stage === undefined) {
      if (code[cf] !== '') return err(`${cf} "${code[cf]}" is given but ${sf} is blank`);
      if (code[ff] !== '') return err(`${ff} "${code[ff]}" is given but ${sf} is blank`);
      continue;
    }
    if (categories.length !== i) return err(`${sf} is set but the stage before it is blank`);
    let partial: number | null;
    if (single) {
      if (code[cf] !== '') return err(`${cf} "${code[cf]}" must be blank for a single ice type (its concentration is Ct)`);
      partial = total.value;
    } else {
      if (code[cf] === '') {
        return err(present === 1
          ? `${cf} is blank but Sd is given: with a remaining stage there are two ice types, so ${cf} needs its partial concentration`
          : `${cf} is blank but ${present} ice types are given: each needs its partial concentration`);
      }
      const p = parseConcentration(cf, code[cf], false);
      if (!p.ok) return p;
      partial = p.value;
    }
    const cat: EggCodeCategoryReading = { partialConcentration: partial, stage };
    if (code[ff] !== '') {
      const form = floeSizeForEggCode(code[ff]);
      if (!form) return err(`${ff} "${code[ff]}" is not an egg code form symbol`);
      cat.floeSize = form;
    }
    categories.push(cat);
  }

  const reading: EggCodeReading = { code, totalConcentration: total.value, categories };
  if (stages[0]) reading.traceStage = stages[0];
  if (stages[4]) reading.remainingStage = stages[4];
  return ok(reading);
}

// ---------------------------------------------------------------------------------------------
// The symbol as drawing data: React (or any renderer) draws these shapes and texts; no markup.

export type EggShape =
  | { kind: 'ellipse'; cx: number; cy: number; rx: number; ry: number }
  | { kind: 'line'; x1: number; y1: number; x2: number; y2: number }
  /** The dot of a dotted stage symbol ("1." medium first-year ...): a filled disc. */
  | { kind: 'dot'; cx: number; cy: number; r: number; field: EggCodeField };

export interface EggText {
  x: number;
  y: number;
  text: string;
  field: EggCodeField;
  /** Font size in drawing units. */
  size: number;
}

export interface EggCodeDrawing {
  width: number;
  height: number;
  shapes: EggShape[];
  /** Text centred on (x, y): use text-anchor middle and a central baseline. */
  texts: EggText[];
  /** A one-line description for assistive technology (the text form). */
  title: string;
}

const W = 120;
const H = 160;
const CX = W / 2;
const CY = H / 2;
const RX = 56;
const RY = 76;
/** Row centres: Ct, the C row, the S row, the F row. */
const ROWS = [26, 62, 98, 134] as const;
/** Dividing lines between the rows. */
const DIVIDERS = [44, 80, 116] as const;

function halfWidthAt(y: number): number {
  const dy = (y - CY) / RY;
  return RX * Math.sqrt(Math.max(0, 1 - dy * dy));
}

const round1 = (v: number): number => Math.round(v * 10) / 10;

/** Font size of the egg's symbols, in drawing units (the box is 120 wide). */
export const EGG_FONT = 20;
/** The stage row's font when So or Sd is present and the row holds five columns. */
export const EGG_FONT_CROWDED = 18;
/**
 * Where a stage symbol's dot sits, relative to the digit's centre, in ems: just right of the
 * digit at its foot. The dot is drawn as a shape, not as a "." glyph, so its place does not
 * depend on the font, and the gap to the next symbol is fixed by the layout: at least
 * 0.4 em with five stage columns and 0.6 em with three, against a few hundredths of an em
 * between a digit and a full stop in running text, so "1. 7 5" never reads as "1.75".
 */
export const DOT_DX_EM = 0.42;
export const DOT_DY_EM = 0.27;
export const DOT_R_EM = 0.09;

/**
 * The egg symbol as shapes and texts in a 120 x 160 box. Blank fields draw no text. Stage
 * symbols share the C row's three columns (Sa under Ca ...), unless So or Sd is present: then
 * the stage row has five columns, 24 apart, in a slightly smaller font.
 */
export function eggCodeDrawing(code: EggCode): EggCodeDrawing {
  const shapes: EggShape[] = [{ kind: 'ellipse', cx: CX, cy: CY, rx: RX, ry: RY }];
  for (const y of DIVIDERS) {
    const hw = halfWidthAt(y);
    shapes.push({ kind: 'line', x1: round1(CX - hw), y1: y, x2: round1(CX + hw), y2: y });
  }
  const texts: EggText[] = [];
  const put = (field: EggCodeField, x: number, y: number, size = EGG_FONT): void => {
    const value = code[field];
    if (value === '') return;
    const dotted = value.length > 1 && value.endsWith('.');
    texts.push({ x, y, text: dotted ? value.slice(0, -1) : value, field, size });
    if (dotted) shapes.push({ kind: 'dot', cx: round1(x + DOT_DX_EM * size), cy: round1(y + DOT_DY_EM * size), r: round1(DOT_R_EM * size), field });
  };
  put('ct', CX, ROWS[0]);
  const cols = [CX - 30, CX, CX + 30];
  C_FIELDS.forEach((f, i) => put(f, cols[i] ?? CX, ROWS[1]));
  if (code.so === '' && code.sd === '') {
    S_FIELDS.forEach((f, i) => put(f, cols[i] ?? CX, ROWS[2]));
  } else {
    const sCols = [CX - 48, CX - 24, CX, CX + 24, CX + 48];
    (['so', 'sa', 'sb', 'sc', 'sd'] as const).forEach((f, i) => put(f, sCols[i] ?? CX, ROWS[2], EGG_FONT_CROWDED));
  }
  F_FIELDS.forEach((f, i) => put(f, cols[i] ?? CX, ROWS[3]));
  return { width: W, height: H, shapes, texts, title: `Egg code ${eggCodeText(code)}` };
}

/** Convenience for callers that hold categories only (e.g. the form preview). */
export function eggCodeForCategories(totalConcentration: number | null, categories: IceCategory[]): EggCode {
  return deriveEggCode({ totalConcentration, categories });
}
