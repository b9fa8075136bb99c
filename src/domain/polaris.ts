// POLARIS, the Polar Operational Limit Assessment Risk Indexing System of IMO
// MSC.1/Circ.1519 ("Guidance on methodologies for assessing operational capabilities and
// limitations in ice"). Decision support only: the outcome never replaces the Polar Code, the
// ship's Polar Water Operational Manual (PWOM), the master's judgement or local regulations.
//
//   RIO = sum over the ice regime of C x RIV    (C in tenths, the ice-free share included)
//
// Table 1.3 gives the risk index values (RIV), Table 1.1 the outcome bands, Table 1.2 the speed
// limits at elevated risk.

import type { IceCategory, Observation, StageKey, VesselIceClass } from './model.ts';
import { VESSEL_ICE_CLASSES } from './model.ts';
import { STAGES } from './nomenclature.ts';
import { err, ok, type Result } from './result.ts';

/** The ice-type columns of Table 1.3, in the circular's order. */
export const POLARIS_ICE_TYPES = [
  'ice-free', 'new', 'grey', 'grey-white', 'thin-first-year-1', 'thin-first-year-2',
  'medium-first-year-thin', 'medium-first-year', 'thick-first-year', 'second-year',
  'light-multi-year', 'heavy-multi-year',
] as const;
export type PolarisIceType = (typeof POLARIS_ICE_TYPES)[number];

export const POLARIS_ICE_TYPE_LABELS: Readonly<Record<PolarisIceType, string>> = {
  'ice-free': 'Ice free',
  new: 'New ice',
  grey: 'Grey ice',
  'grey-white': 'Grey-white ice',
  'thin-first-year-1': 'Thin first-year ice, first stage',
  'thin-first-year-2': 'Thin first-year ice, second stage',
  'medium-first-year-thin': 'Medium first-year ice less than 1 m thick',
  'medium-first-year': 'Medium first-year ice',
  'thick-first-year': 'Thick first-year ice',
  'second-year': 'Second-year ice',
  'light-multi-year': 'Light multi-year ice (less than 2.5 m thick)',
  'heavy-multi-year': 'Heavy multi-year ice',
};

export const VESSEL_ICE_CLASS_LABELS: Readonly<Record<VesselIceClass, string>> = {
  PC1: 'PC 1', PC2: 'PC 2', PC3: 'PC 3', PC4: 'PC 4', PC5: 'PC 5', PC6: 'PC 6', PC7: 'PC 7',
  'IA-Super': 'IA Super', IA: 'IA', IB: 'IB', IC: 'IC', none: 'Not ice-strengthened',
};

type RivRow = readonly [number, number, number, number, number, number, number, number, number, number, number, number];

/**
 * IMO MSC.1/Circ.1519 Table 1.3, risk index values, rows by ice class, columns as
 * POLARIS_ICE_TYPES. IA Super x thick first-year: -2 (two of three transcriptions; see the test).
 */
export const RIV_TABLE: Readonly<Record<VesselIceClass, RivRow>> = {
  PC1: [3, 3, 3, 3, 2, 2, 2, 2, 2, 2, 1, 1],
  PC2: [3, 3, 3, 3, 2, 2, 2, 2, 2, 1, 1, 0],
  PC3: [3, 3, 3, 3, 2, 2, 2, 2, 2, 1, 0, -1],
  PC4: [3, 3, 3, 3, 2, 2, 2, 2, 1, 0, -1, -2],
  PC5: [3, 3, 3, 3, 2, 2, 1, 1, 0, -1, -2, -2],
  PC6: [3, 2, 2, 2, 2, 1, 1, 0, -1, -2, -3, -3],
  PC7: [3, 2, 2, 2, 1, 1, 0, -1, -2, -3, -3, -3],
  'IA-Super': [3, 2, 2, 2, 2, 1, 0, -1, -2, -3, -4, -4],
  IA: [3, 2, 2, 2, 1, 0, -1, -2, -3, -4, -5, -5],
  IB: [3, 2, 2, 1, 0, -1, -2, -3, -4, -5, -6, -6],
  IC: [3, 2, 1, 0, -1, -2, -3, -4, -5, -6, -7, -8],
  none: [3, 1, 0, -1, -2, -3, -4, -5, -6, -7, -8, -8],
};

/** Polar Class ships have the elevated-risk band; the Baltic classes and below do not. */
const POLAR_CLASSES: ReadonlySet<VesselIceClass> = new Set(['PC1', 'PC2', 'PC3', 'PC4', 'PC5', 'PC6', 'PC7']);

/**
 * Decayed ice (circular Table 1.4, section 1.1.3). Only from a single transcription: Table 1.3
 * with +1 for medium first-year (< 1 m and full) and thick first-year, PC5 and every lower class.
 * Use only when decay is confirmed by ice information or by qualified personnel.
 */
const DECAY_COLUMNS: readonly PolarisIceType[] = ['medium-first-year-thin', 'medium-first-year', 'thick-first-year'];
const DECAY_CLASSES: ReadonlySet<VesselIceClass> = new Set(['PC5', 'PC6', 'PC7', 'IA-Super', 'IA', 'IB', 'IC', 'none']);

export interface RivOptions {
  /** Decay confirmed by ice information or by qualified personnel (Polar Code chapter 12). */
  decayConfirmed?: boolean;
}

export function isVesselIceClass(s: string): s is VesselIceClass {
  return (VESSEL_ICE_CLASSES as readonly string[]).includes(s);
}

/** Letters and digits only, lower case: "IA Super", "ia-super" and "IASUPER" compare equal. */
const classSpelling = (s: string): string => s.toLowerCase().replace(/[^a-z0-9]/g, '');

/**
 * Every accepted spelling of each class: our key, the circular's label (Table 1.3 writes "PC 5",
 * "IA Super", "Not ice-strengthened") and the Finnish-Swedish rules' own "1A Super", "1A", "1B",
 * "1C" (from memory of those rules).
 */
const CLASS_SPELLINGS: ReadonlyMap<string, VesselIceClass> = (() => {
  const m = new Map<string, VesselIceClass>();
  for (const c of VESSEL_ICE_CLASSES) {
    m.set(classSpelling(c), c);
    m.set(classSpelling(VESSEL_ICE_CLASS_LABELS[c]), c);
    if (c.startsWith('I')) m.set(classSpelling(`1${c.slice(1)}`), c);
  }
  m.set('notstrengthened', 'none');
  return m;
})();

/** A vessel ice class as people write it, any case, spaces or hyphens ("pc 5", "IA Super"). */
export function parseVesselIceClass(text: string): Result<VesselIceClass> {
  const found = CLASS_SPELLINGS.get(classSpelling(text));
  if (found) return ok(found);
  return err(`unknown ice class "${text}" (use one of ${VESSEL_ICE_CLASSES.map((c) => VESSEL_ICE_CLASS_LABELS[c]).join(', ')}; case, spaces and hyphens do not matter)`);
}

export function isPolarisIceType(s: string): s is PolarisIceType {
  return (POLARIS_ICE_TYPES as readonly string[]).includes(s);
}

/** The risk index value for a class and ice type (Table 1.3, or the decayed-ice variant). */
export function riskIndexValue(iceClass: VesselIceClass, iceType: PolarisIceType, opts: RivOptions = {}): number {
  const riv = RIV_TABLE[iceClass][POLARIS_ICE_TYPES.indexOf(iceType)] ?? 0;
  const decayed = opts.decayConfirmed === true && DECAY_CLASSES.has(iceClass) && DECAY_COLUMNS.includes(iceType);
  return decayed ? riv + 1 : riv;
}

export type PolarisOutcome = 'normal' | 'elevated' | 'special';

export const POLARIS_OUTCOME_LABELS: Readonly<Record<PolarisOutcome, string>> = {
  normal: 'Normal operation',
  elevated: 'Elevated operational risk',
  special: 'Operation subject to special consideration',
};

/** Table 1.1: PC1-PC7 normal >= 0, elevated -10..<0, special < -10; other classes no elevated band. */
export function outcomeFor(iceClass: VesselIceClass, rio: number): PolarisOutcome {
  if (rio >= 0) return 'normal';
  if (POLAR_CLASSES.has(iceClass) && rio >= -10) return 'elevated';
  return 'special';
}

/** Table 1.2: recommended speed limit in knots at elevated operational risk (Polar Classes only). */
export function elevatedRiskSpeedLimitKn(iceClass: VesselIceClass): number | null {
  switch (iceClass) {
    case 'PC1': return 11;
    case 'PC2': return 8;
    case 'PC3': case 'PC4': case 'PC5': return 5;
    case 'PC6': case 'PC7': return 3;
    default: return null;
  }
}

/** Cautions shown with every POLARIS result. */
export const POLARIS_CAUTIONS: readonly string[] = [
  'POLARIS output is decision support only (IMO MSC.1/Circ.1519). It does not replace the Polar Code, the ship\'s Polar Water Operational Manual, the master\'s judgement or local regulations.',
  'The result is only as good as the ice observation it is computed from: concentrations, stages and thicknesses are visual estimates.',
];

export const DECAY_CAUTION =
  'Decayed-ice values are used because decay was confirmed. The decayed-ice table is taken from a single transcription of the circular; confirm it against the ship\'s own POLARIS documentation.';

export interface RegimeShare {
  iceType: PolarisIceType;
  tenths: number;
}

export interface RegimeTerm extends RegimeShare {
  riv: number;
}

export interface PolarisResult {
  iceClass: VesselIceClass;
  /** Every share, ice free included, in the order given; shares add up to 10. */
  regime: RegimeTerm[];
  rio: number;
  outcome: PolarisOutcome;
  outcomeLabel: string;
  /** Table 1.2 limit when the outcome is elevated, else null. */
  speedLimitKn: number | null;
  decayConfirmed: boolean;
  cautions: string[];
  /** How observed categories were mapped, and any assumption made. */
  notes: string[];
}

/**
 * RIO for an ice regime given as shares in tenths. Whatever the shares leave of 10 is ice free.
 * Errors (negative, non-finite, over 10 in total) name the bad share.
 */
export function computeRio(
  iceClass: VesselIceClass,
  shares: readonly RegimeShare[],
  opts: RivOptions = {},
): Result<PolarisResult> {
  let sum = 0;
  for (const s of shares) {
    if (!Number.isFinite(s.tenths) || s.tenths < 0) return err(`share ${s.tenths} of ${s.iceType} must be a number of tenths, 0 or more`);
    sum += s.tenths;
  }
  // Tolerate rounding in shares given as decimals.
  if (sum > 10 + 1e-9) return err(`the shares add up to ${round(sum)} tenths, more than 10`);
  const all: RegimeShare[] = shares.filter((s) => s.tenths > 0).map((s) => ({ ...s }));
  const rest = round(10 - sum);
  if (rest > 0) {
    const free = all.find((s) => s.iceType === 'ice-free');
    if (free) free.tenths = round(free.tenths + rest);
    else all.push({ iceType: 'ice-free', tenths: rest });
  }
  const regime = all.map((s) => ({ ...s, riv: riskIndexValue(iceClass, s.iceType, opts) }));
  const rio = round(regime.reduce((acc, t) => acc + t.tenths * t.riv, 0));
  const outcome = outcomeFor(iceClass, rio);
  const cautions = [...POLARIS_CAUTIONS];
  if (opts.decayConfirmed) cautions.push(DECAY_CAUTION);
  return ok({
    iceClass,
    regime,
    rio,
    outcome,
    outcomeLabel: POLARIS_OUTCOME_LABELS[outcome],
    speedLimitKn: outcome === 'elevated' ? elevatedRiskSpeedLimitKn(iceClass) : null,
    decayConfirmed: opts.decayConfirmed === true,
    cautions,
    notes: [],
  });
}

function round(v: number): number {
  return Math.round(v * 1e6) / 1e6;
}

export interface IceTypeMapping {
  iceType: PolarisIceType;
  /** Empty when stage (and thickness) fix the type; otherwise the assumption made. */
  note: string;
}

/**
 * The POLARIS ice type of an observed category. Where the stage is coarse (young, thin
 * first-year, first-year, old, multi-year, undetermined) the thickness decides if observed;
 * otherwise we take the more severe column (lower RIV in every row), and say so in `note`.
 * Thickness limits follow WMO-No. 259 and the circular: medium first-year under or over 1 m,
 * light or heavy multi-year at 2.5 m.
 */
export function polarisIceType(stage: StageKey, thicknessCm?: number): IceTypeMapping {
  const t = thicknessCm !== undefined && Number.isFinite(thicknessCm) ? thicknessCm : undefined;
  const assumed = (iceType: PolarisIceType, why: string): IceTypeMapping => ({
    iceType,
    note: `${STAGES[stage].label}${t === undefined ? ' without thickness' : ''}: taken as ${POLARIS_ICE_TYPE_LABELS[iceType].toLowerCase()} (${why}).`,
  });
  const fixed = (iceType: PolarisIceType): IceTypeMapping => ({ iceType, note: '' });
  switch (stage) {
    case 'new': case 'frazil': case 'grease': case 'slush': case 'shuga':
    case 'nilas': case 'dark-nilas': case 'light-nilas': case 'ice-rind':
      return fixed('new');
    case 'grey': return fixed('grey');
    case 'grey-white': return fixed('grey-white');
    case 'young':
      if (t === undefined) return assumed('grey-white', 'the more severe young-ice column');
      return fixed(t < 15 ? 'grey' : 'grey-white');
    case 'thin-first-year-1': return fixed('thin-first-year-1');
    case 'thin-first-year-2': return fixed('thin-first-year-2');
    case 'thin-first-year':
      if (t === undefined) return assumed('thin-first-year-2', 'the more severe thin first-year column');
      return fixed(t < 50 ? 'thin-first-year-1' : 'thin-first-year-2');
    case 'medium-first-year':
      if (t === undefined) return assumed('medium-first-year', 'thickness unknown, so not less than 1 m');
      return fixed(t < 100 ? 'medium-first-year-thin' : 'medium-first-year');
    case 'thick-first-year': return fixed('thick-first-year');
    case 'first-year':
      if (t === undefined) return assumed('thick-first-year', 'the most severe first-year column');
      if (t < 50) return fixed('thin-first-year-1');
      if (t < 70) return fixed('thin-first-year-2');
      if (t < 100) return fixed('medium-first-year-thin');
      if (t < 120) return fixed('medium-first-year');
      return fixed('thick-first-year');
    case 'second-year': return fixed('second-year');
    case 'multi-year':
      if (t === undefined) return assumed('heavy-multi-year', 'thickness unknown, so not less than 2.5 m');
      return fixed(t < 250 ? 'light-multi-year' : 'heavy-multi-year');
    case 'old':
      // Old ice may be second-year or multi-year; light multi-year is more severe than second-year.
      if (t === undefined) return assumed('heavy-multi-year', 'the most severe old-ice column');
      return assumed(t < 250 ? 'light-multi-year' : 'heavy-multi-year', 'second-year or multi-year not told, the more severe at this thickness');
    case 'glacier':
      return assumed('heavy-multi-year', 'ice of land origin has no column of its own; the most severe column is used');
    case 'undetermined':
      return assumed('heavy-multi-year', 'stage unknown; the most severe column is used');
  }
}

export type PolarisObservationOptions = RivOptions;

/**
 * POLARIS for an observation. Shares: a single category with no remaining stage (Sd) takes the
 * total concentration (the egg code's blank Ca). Otherwise each category takes its partial
 * concentration and any part of the total they leave unassigned goes to the remaining stage (Sd)
 * if recorded, else to the most severe category present (noted): with one category and an Sd
 * there are two ice types, and the share not covered by Ca belongs to Sd. A trace (So) is less
 * than 1/10 and adds nothing. Needs a total concentration or at least one category.
 */
export function polarisForObservation(
  obs: Pick<Observation, 'totalConcentration' | 'categories'> & Partial<Pick<Observation, 'remainingStage' | 'traceStage'>>,
  iceClass: VesselIceClass,
  opts: PolarisObservationOptions = {},
): Result<PolarisResult> {
  const notes: string[] = [];
  const cats = obs.categories;
  const total = obs.totalConcentration;
  if (total === null && cats.length === 0) return err('no total concentration and no ice categories: nothing to assess');
  const mapped = cats.map((c: IceCategory) => ({ c, m: polarisIceType(c.stage, c.thicknessCm) }));
  for (const { m } of mapped) if (m.note) notes.push(m.note);

  const shares: RegimeShare[] = [];
  if (mapped.length === 1 && mapped[0] && !obs.remainingStage) {
    shares.push({ iceType: mapped[0].m.iceType, tenths: total ?? mapped[0].c.partialConcentration });
  } else {
    for (const { c, m } of mapped) shares.push({ iceType: m.iceType, tenths: c.partialConcentration });
    const assigned = shares.reduce((a, s) => a + s.tenths, 0);
    const unassigned = total === null ? 0 : total - assigned;
    if (unassigned < 0 && total !== null) {
      notes.push(`The partial concentrations add up to ${round(assigned)}/10, more than the total ${total}/10: the partial concentrations are used.`);
    }
    if (unassigned > 0) {
      if (obs.remainingStage) {
        const m = polarisIceType(obs.remainingStage);
        if (m.note) notes.push(m.note);
        shares.push({ iceType: m.iceType, tenths: unassigned });
        notes.push(`${unassigned}/10 not covered by the partial concentrations is taken as the remaining stage (${STAGES[obs.remainingStage].label.toLowerCase()}).`);
      } else if (shares.length > 0) {
        const worst = shares.reduce((w, s) => (riskIndexValue(iceClass, s.iceType, opts) < riskIndexValue(iceClass, w.iceType, opts) ? s : w));
        shares.push({ iceType: worst.iceType, tenths: unassigned });
        notes.push(`${unassigned}/10 not covered by the partial concentrations is taken as ${POLARIS_ICE_TYPE_LABELS[worst.iceType].toLowerCase()}, the most severe type present.`);
      } else {
        const m = polarisIceType('undetermined');
        shares.push({ iceType: m.iceType, tenths: unassigned });
        notes.push(`${unassigned}/10 of ice with no category recorded: ${m.note}`);
      }
    }
  }
  if (obs.traceStage) notes.push(`The trace of ${STAGES[obs.traceStage].label.toLowerCase()} (less than 1/10) does not enter the RIO.`);
  const result = computeRio(iceClass, shares, opts);
  if (!result.ok) return result;
  result.value.notes = notes;
  return result;
}
