// Sea-ice nomenclature tables: the single place where stage, form, concentration, deformation,
// snow and open-water terms, ranges and codes are defined. The UI, the egg code, POLARIS and the
// exchange format all read their labels and codes from here, so nobody invents their own.
//
// Sources: WMO Sea-Ice Nomenclature (WMO-No. 259) for terms and thickness/size ranges; the egg
// code symbols as WMO-No. 259 and the ice chart standards give them; SIGRID-3 (WMO/TD-No. 1214)
// for the interchange codes. Snow kinds are our own plain-language names.

import type { FloeSizeKey, MeltPonds, OpenWaterKind, PositionSource, SnowCoverKey, SnowWetness, StageKey, Tenths } from './model.ts';

/** Where a stage sits in the "thickest first" order of the egg code (see `ordering.ts`). */
export interface StageRank {
  /** Lowest fine rank the stage can stand for. */
  lo: number;
  /** Highest fine rank the stage can stand for; equal to `lo` for a fine stage. */
  hi: number;
}

export interface StageInfo {
  key: StageKey;
  /** WMO-No. 259 term, as shown on screen. */
  label: string;
  /** Shorter label for narrow table columns. */
  shortLabel: string;
  /** Nominal thickness range in cm, [min, max); `null` where WMO gives no bound. */
  minCm: number | null;
  maxCm: number | null;
  /** A representative thickness (cm) for estimates when none was observed. */
  typicalCm: number | null;
  /**
   * Fine rank in the thickest-first order: 1 new ice ... 9 thick first-year, 10 second-year,
   * 11 multi-year, 12 ice of land origin. Coarse stages span the ranks of their subdivisions.
   * `null` for `undetermined`.
   */
  rank: StageRank | null;
  /** Egg code stage symbol (So, Sa..Sd), dotted codes with their dot, e.g. `1.` or `7.`. */
  eggCode: string;
  /** SIGRID-3 stage of development code (two digits). */
  sigrid3: string;
  /** The stage family used by rules (pancake check, POLARIS mapping). */
  family: 'new' | 'nilas' | 'young' | 'first-year' | 'old' | 'land' | 'undetermined';
}

// Ranks: fine stages in increasing thickness. Kept as named numbers so the table reads clearly.
const R = {
  new: 1, darkNilas: 2, lightNilas: 3, grey: 4, greyWhite: 5,
  thinFy1: 6, thinFy2: 7, mediumFy: 8, thickFy: 9, secondYear: 10, multiYear: 11, land: 12,
} as const;
const fine = (r: number): StageRank => ({ lo: r, hi: r });
const span = (lo: number, hi: number): StageRank => ({ lo, hi });

/** Stages of development (WMO-No. 259) keyed by `StageKey`. */
export const STAGES: Readonly<Record<StageKey, StageInfo>> = {
  new: { key: 'new', label: 'New ice', shortLabel: 'New', minCm: 0, maxCm: 10, typicalCm: 5, rank: fine(R.new), eggCode: '1', sigrid3: '81', family: 'new' },
  frazil: { key: 'frazil', label: 'Frazil ice', shortLabel: 'Frazil', minCm: 0, maxCm: 10, typicalCm: 1, rank: fine(R.new), eggCode: '1', sigrid3: '81', family: 'new' },
  grease: { key: 'grease', label: 'Grease ice', shortLabel: 'Grease', minCm: 0, maxCm: 10, typicalCm: 2, rank: fine(R.new), eggCode: '1', sigrid3: '81', family: 'new' },
  slush: { key: 'slush', label: 'Slush', shortLabel: 'Slush', minCm: 0, maxCm: 10, typicalCm: 3, rank: fine(R.new), eggCode: '1', sigrid3: '81', family: 'new' },
  shuga: { key: 'shuga', label: 'Shuga', shortLabel: 'Shuga', minCm: 0, maxCm: 10, typicalCm: 5, rank: fine(R.new), eggCode: '1', sigrid3: '81', family: 'new' },
  nilas: { key: 'nilas', label: 'Nilas', shortLabel: 'Nilas', minCm: 0, maxCm: 10, typicalCm: 5, rank: span(R.darkNilas, R.lightNilas), eggCode: '2', sigrid3: '82', family: 'nilas' },
  'dark-nilas': { key: 'dark-nilas', label: 'Dark nilas', shortLabel: 'Dark nilas', minCm: 0, maxCm: 5, typicalCm: 3, rank: fine(R.darkNilas), eggCode: '2', sigrid3: '82', family: 'nilas' },
  'light-nilas': { key: 'light-nilas', label: 'Light nilas', shortLabel: 'Light nilas', minCm: 5, maxCm: 10, typicalCm: 7, rank: fine(R.lightNilas), eggCode: '2', sigrid3: '82', family: 'nilas' },
  'ice-rind': { key: 'ice-rind', label: 'Ice rind', shortLabel: 'Ice rind', minCm: 0, maxCm: 5, typicalCm: 3, rank: fine(R.darkNilas), eggCode: '2', sigrid3: '82', family: 'nilas' },
  young: { key: 'young', label: 'Young ice', shortLabel: 'Young', minCm: 10, maxCm: 30, typicalCm: 20, rank: span(R.grey, R.greyWhite), eggCode: '3', sigrid3: '83', family: 'young' },
  grey: { key: 'grey', label: 'Grey ice', shortLabel: 'Grey', minCm: 10, maxCm: 15, typicalCm: 12, rank: fine(R.grey), eggCode: '4', sigrid3: '84', family: 'young' },
  'grey-white': { key: 'grey-white', label: 'Grey-white ice', shortLabel: 'Grey-white', minCm: 15, maxCm: 30, typicalCm: 22, rank: fine(R.greyWhite), eggCode: '5', sigrid3: '85', family: 'young' },
  'first-year': { key: 'first-year', label: 'First-year ice', shortLabel: 'FY', minCm: 30, maxCm: 200, typicalCm: 100, rank: span(R.thinFy1, R.thickFy), eggCode: '6', sigrid3: '86', family: 'first-year' },
  'thin-first-year': { key: 'thin-first-year', label: 'Thin first-year ice', shortLabel: 'Thin FY', minCm: 30, maxCm: 70, typicalCm: 50, rank: span(R.thinFy1, R.thinFy2), eggCode: '7', sigrid3: '87', family: 'first-year' },
  'thin-first-year-1': { key: 'thin-first-year-1', label: 'Thin first-year ice, first stage', shortLabel: 'Thin FY 1', minCm: 30, maxCm: 50, typicalCm: 40, rank: fine(R.thinFy1), eggCode: '8', sigrid3: '88', family: 'first-year' },
  'thin-first-year-2': { key: 'thin-first-year-2', label: 'Thin first-year ice, second stage', shortLabel: 'Thin FY 2', minCm: 50, maxCm: 70, typicalCm: 60, rank: fine(R.thinFy2), eggCode: '9', sigrid3: '89', family: 'first-year' },
  'medium-first-year': { key: 'medium-first-year', label: 'Medium first-year ice', shortLabel: 'Medium FY', minCm: 70, maxCm: 120, typicalCm: 95, rank: fine(R.mediumFy), eggCode: '1.', sigrid3: '91', family: 'first-year' },
  // WMO gives thick first-year ice as "over 120 cm"; the first-year stage as a whole ends at 2 m.
  'thick-first-year': { key: 'thick-first-year', label: 'Thick first-year ice', shortLabel: 'Thick FY', minCm: 120, maxCm: 200, typicalCm: 150, rank: fine(R.thickFy), eggCode: '4.', sigrid3: '93', family: 'first-year' },
  // Old ice is defined by age (summers survived), not thickness: no thickness bounds.
  old: { key: 'old', label: 'Old ice', shortLabel: 'Old', minCm: null, maxCm: null, typicalCm: 250, rank: span(R.secondYear, R.multiYear), eggCode: '7.', sigrid3: '95', family: 'old' },
  'second-year': { key: 'second-year', label: 'Second-year ice', shortLabel: 'SY', minCm: null, maxCm: null, typicalCm: 220, rank: fine(R.secondYear), eggCode: '8.', sigrid3: '96', family: 'old' },
  'multi-year': { key: 'multi-year', label: 'Multi-year ice', shortLabel: 'MY', minCm: null, maxCm: null, typicalCm: 300, rank: fine(R.multiYear), eggCode: '9.', sigrid3: '97', family: 'old' },
  glacier: { key: 'glacier', label: 'Ice of land origin', shortLabel: 'Land ice', minCm: null, maxCm: null, typicalCm: null, rank: fine(R.land), eggCode: '▲', sigrid3: '98', family: 'land' },
  undetermined: { key: 'undetermined', label: 'Undetermined or unknown', shortLabel: 'Unknown', minCm: null, maxCm: null, typicalCm: null, rank: null, eggCode: 'X', sigrid3: '99', family: 'undetermined' },
};

/** The SIGRID-3 stage code for "no stage of development" (an empty egg-code slot). */
export const SIGRID3_NO_STAGE = '80';

export interface FloeSizeInfo {
  key: FloeSizeKey;
  /** WMO-No. 259 term. */
  label: string;
  /** Horizontal extent in metres, [min, max); `null` where unbounded or not a size class. */
  minM: number | null;
  maxM: number | null;
  /** Egg code form symbol (Fa, Fb, Fc). */
  eggCode: string;
  /** SIGRID-3 form of ice code. */
  sigrid3: string;
}

/** Forms of ice by floe size (WMO-No. 259) keyed by `FloeSizeKey`. */
export const FLOE_SIZES: Readonly<Record<FloeSizeKey, FloeSizeInfo>> = {
  pancake: { key: 'pancake', label: 'Pancake ice', minM: 0.3, maxM: 3, eggCode: '0', sigrid3: '22' },
  brash: { key: 'brash', label: 'Brash ice', minM: 0, maxM: 2, eggCode: '1', sigrid3: '01' },
  'small-ice-cake': { key: 'small-ice-cake', label: 'Small ice cake', minM: 0, maxM: 2, eggCode: '1', sigrid3: '01' },
  'ice-cake': { key: 'ice-cake', label: 'Ice cake', minM: 2, maxM: 20, eggCode: '2', sigrid3: '02' },
  'small-floe': { key: 'small-floe', label: 'Small floe', minM: 20, maxM: 100, eggCode: '3', sigrid3: '03' },
  'medium-floe': { key: 'medium-floe', label: 'Medium floe', minM: 100, maxM: 500, eggCode: '4', sigrid3: '04' },
  'big-floe': { key: 'big-floe', label: 'Big floe', minM: 500, maxM: 2000, eggCode: '5', sigrid3: '05' },
  'vast-floe': { key: 'vast-floe', label: 'Vast floe', minM: 2000, maxM: 10000, eggCode: '6', sigrid3: '06' },
  'giant-floe': { key: 'giant-floe', label: 'Giant floe', minM: 10000, maxM: null, eggCode: '7', sigrid3: '07' },
  'fast-ice': { key: 'fast-ice', label: 'Fast ice', minM: null, maxM: null, eggCode: '8', sigrid3: '08' },
  // The egg code has one form symbol (9) for ice of this kind; SIGRID-3 (WMO/TD-No. 1214) tells
  // icebergs (10) from growlers and floebergs (09), so the observer chooses which.
  icebergs: { key: 'icebergs', label: 'Icebergs', minM: null, maxM: null, eggCode: '9', sigrid3: '10' },
  'growlers-floebergs': { key: 'growlers-floebergs', label: 'Growlers or floebergs', minM: null, maxM: null, eggCode: '9', sigrid3: '09' },
  undetermined: { key: 'undetermined', label: 'Undetermined or unknown', minM: null, maxM: null, eggCode: 'X', sigrid3: '99' },
};

export type ConcentrationTermKey =
  | 'ice-free' | 'open-water' | 'very-open' | 'open' | 'close' | 'very-close' | 'compact' | 'consolidated';

export interface ConcentrationTerm {
  key: ConcentrationTermKey;
  /** WMO-No. 259 term. */
  label: string;
  /** Range in tenths as the term is defined (inclusive); `open-water` is "less than 1/10". */
  minTenths: number;
  maxTenths: number;
  definition: string;
}

/** Concentration terms (WMO-No. 259), from no ice to consolidated. */
export const CONCENTRATION_TERMS: readonly ConcentrationTerm[] = [
  { key: 'ice-free', label: 'Ice free', minTenths: 0, maxTenths: 0, definition: 'No ice present.' },
  { key: 'open-water', label: 'Open water', minTenths: 0, maxTenths: 0, definition: 'Less than 1/10 ice; no ice of land origin.' },
  { key: 'very-open', label: 'Very open ice', minTenths: 1, maxTenths: 3, definition: '1/10 to 3/10 ice.' },
  { key: 'open', label: 'Open ice', minTenths: 4, maxTenths: 6, definition: '4/10 to 6/10 ice, many leads and polynyas, floes generally not in contact.' },
  { key: 'close', label: 'Close ice', minTenths: 7, maxTenths: 8, definition: '7/10 to 8/10 ice, floes mostly in contact.' },
  { key: 'very-close', label: 'Very close ice', minTenths: 9, maxTenths: 9, definition: '9/10 to less than 10/10 ice.' },
  { key: 'compact', label: 'Compact ice', minTenths: 10, maxTenths: 10, definition: '10/10 ice, no water visible.' },
  { key: 'consolidated', label: 'Consolidated ice', minTenths: 10, maxTenths: 10, definition: '10/10 ice, floes frozen together.' },
];

function term(key: ConcentrationTermKey): ConcentrationTerm {
  const t = CONCENTRATION_TERMS.find((c) => c.key === key);
  if (!t) throw new Error(`no concentration term ${key}`); // unreachable: keys are the table's
  return t;
}

/**
 * The WMO concentration term for a total concentration in tenths. Integer tenths cannot tell
 * "ice free" from "a trace": pass `icePresent` for 0/10 with some ice, `consolidated` for 10/10
 * with the floes frozen together.
 */
export function concentrationTerm(
  tenths: Tenths,
  opts: { icePresent?: boolean; consolidated?: boolean } = {},
): ConcentrationTerm {
  if (tenths <= 0) return term(opts.icePresent ? 'open-water' : 'ice-free');
  if (tenths <= 3) return term('very-open');
  if (tenths <= 6) return term('open');
  if (tenths <= 8) return term('close');
  if (tenths < 10) return term('very-close');
  return term(opts.consolidated ? 'consolidated' : 'compact');
}

/**
 * SIGRID-3 concentration code for a concentration in tenths: `00` ice free, `01` less than 1/10
 * (pass `trace`), `10`..`90` for 1/10..9/10, `91` for 9+/10 (pass `ninePlus` with 9), `92` for
 * 10/10, `99` unknown (null).
 */
export function sigrid3Concentration(
  tenths: Tenths | null,
  opts: { trace?: boolean; ninePlus?: boolean } = {},
): string {
  if (tenths === null || !Number.isInteger(tenths) || tenths < 0 || tenths > 10) return '99';
  if (tenths === 0) return opts.trace ? '01' : '00';
  if (tenths === 10) return '92';
  if (tenths === 9 && opts.ninePlus) return '91';
  return `${tenths}0`;
}

/**
 * SIGRID-3 two-digit range code "ab" for a range a/10..b/10 with 1 <= a < b <= 9 (e.g. 4-6/10 is
 * `46`). Equal bounds give the single value code.
 */
export function sigrid3ConcentrationRange(lo: Tenths, hi: Tenths): string {
  if (lo === hi) return sigrid3Concentration(lo);
  if (!Number.isInteger(lo) || !Number.isInteger(hi) || lo < 1 || hi > 9 || lo > hi) return '99';
  return `${lo}${hi}`;
}

export const DEFORMATION_KINDS = ['level', 'rafted', 'ridged', 'hummocked'] as const;
export type DeformationKind = (typeof DEFORMATION_KINDS)[number];

/** Deformation terms (WMO-No. 259). */
export const DEFORMATION_LABELS: Readonly<Record<DeformationKind, string>> = {
  level: 'Level ice',
  rafted: 'Rafted ice',
  ridged: 'Ridged ice',
  hummocked: 'Hummocked ice',
};

/** How much of an ice type snow covers: our own three steps (WMO-No. 259 has no snow scale). */
export const SNOW_COVER_LABELS: Readonly<Record<SnowCoverKey, string>> = {
  none: 'No snow',
  partial: 'Partly snow-covered',
  complete: 'Snow-covered throughout',
};

export interface SnowWetnessInfo {
  label: string;
  /** The class's one-letter code in the classification. */
  code: string;
  /** Liquid water content by volume, per cent: lower and upper bound (null: open-ended). */
  lwcMinPercent: number;
  lwcMaxPercent: number | null;
  /** How it is told in the field, by eye and by hand. */
  test: string;
}

/**
 * Wetness (liquid-water content) classes of the International Classification for Seasonal Snow
 * on the Ground (Fierz et al. 2009, UNESCO-IHP / IACS, IHP-VII Technical Documents in Hydrology
 * No. 83), with its codes, volume ranges and field tests, in our words.
 */
export const SNOW_WETNESS: Readonly<Record<SnowWetness, SnowWetnessInfo>> = {
  dry: { label: 'Dry', code: 'D', lwcMinPercent: 0, lwcMaxPercent: 0, test: 'grains hardly stick together when pressed into a ball' },
  moist: { label: 'Moist', code: 'M', lwcMinPercent: 0, lwcMaxPercent: 3, test: 'sticks together when lightly pressed; no water to be seen' },
  wet: { label: 'Wet', code: 'W', lwcMinPercent: 3, lwcMaxPercent: 8, test: 'water seen between grains under a lens, none pressed out by squeezing' },
  'very-wet': { label: 'Very wet', code: 'V', lwcMinPercent: 8, lwcMaxPercent: 15, test: 'water runs out when squeezed moderately; air still in the pores' },
  soaked: { label: 'Soaked', code: 'S', lwcMinPercent: 15, lwcMaxPercent: null, test: 'flooded with water, little air left' },
};

/** Open-water features (WMO-No. 259 terms). */
export const OPEN_WATER_LABELS: Readonly<Record<OpenWaterKind, string>> = {
  none: 'None',
  crack: 'Crack',
  lead: 'Lead',
  'shore-lead': 'Shore lead',
  'flaw-lead': 'Flaw lead',
  polynya: 'Polynya',
  'refrozen-lead': 'Refrozen lead',
};

/** Where a position came from (our own labels). */
export const POSITION_SOURCE_LABELS: Readonly<Record<PositionSource, string>> = {
  'gps-serial': 'GPS receiver (NMEA 0183)',
  geolocation: 'Device location',
  manual: 'Typed in',
  'track-interpolated': 'Interpolated from the track',
  'track-file': 'Imported track file',
};

/** Melt-pond states (our own labels). */
export const MELT_POND_STATE_LABELS: Readonly<Record<NonNullable<MeltPonds['state']>, string>> = {
  open: 'Open ponds',
  frozen: 'Frozen-over ponds',
  drained: 'Drained ponds',
};

export function stageLabel(key: StageKey): string {
  return STAGES[key].label;
}

export function floeSizeLabel(key: FloeSizeKey): string {
  return FLOE_SIZES[key].label;
}
