// SIGRID-3 codes beside the WMO terms, read from the domain's nomenclature tables: the format
// keeps no code table of its own.
import type { FloeSizeKey, Observation, StageKey, Tenths } from '../domain/model';
import { FLOE_SIZE_KEYS, STAGE_KEYS } from '../domain/model';
import { CONCENTRATION_TERMS, FLOE_SIZES, STAGES, concentrationTerm, sigrid3Concentration } from '../domain/nomenclature';

export function stageCode(key: StageKey): string {
  return STAGES[key].sigrid3;
}

export function floeSizeCode(key: FloeSizeKey): string {
  return FLOE_SIZES[key].sigrid3;
}

/** SIGRID-3 code of a concentration in whole tenths; `99` (unknown) when not judged. */
export function concentrationCode(tenths: Tenths | null): string {
  return sigrid3Concentration(tenths);
}

type TotalOf = Pick<Observation, 'totalConcentration' | 'categories'> & Partial<Pick<Observation, 'traceStage'>>;

/**
 * True when an observation of 0/10 still notes some ice (a trace stage or a category): that is
 * "open water", less than 1/10 (WMO-No. 259), not "ice free". The map's bands read it the same
 * way (src/features/map/concentrationBands.ts).
 */
function iceNoted(o: TotalOf): boolean {
  return o.traceStage !== undefined || o.categories.length > 0;
}

/**
 * SIGRID-3 code of an observation's total concentration: as concentrationCode, except that 0/10
 * with ice noted is `01` (less than 1/10), not `00` (ice free).
 */
export function totalConcentrationCode(o: TotalOf): string {
  return sigrid3Concentration(o.totalConcentration, { trace: iceNoted(o) });
}

/** The WMO-No. 259 term for a total concentration, e.g. "Very close ice"; empty when not judged. */
export function concentrationTermLabel(tenths: Tenths | null): string {
  return tenths === null ? '' : concentrationTerm(tenths).label;
}

/** The WMO-No. 259 term for an observation's total: 0/10 with ice noted is "Open water". */
export function totalConcentrationTermLabel(o: TotalOf): string {
  return o.totalConcentration === null ? '' : concentrationTerm(o.totalConcentration, { icePresent: iceNoted(o) }).label;
}

export function stageTermLabel(key: StageKey): string {
  return STAGES[key].label;
}

export function floeSizeTermLabel(key: FloeSizeKey): string {
  return FLOE_SIZES[key].label;
}

const unique = (xs: string[]) => [...new Set(xs)].sort();

/** Every code a file may carry, for the schema's enumerations. */
export const STAGE_CODE_LIST: readonly string[] = unique(STAGE_KEYS.map(stageCode));
export const FLOE_SIZE_CODE_LIST: readonly string[] = unique(FLOE_SIZE_KEYS.map(floeSizeCode));
export const CONCENTRATION_CODE_LIST: readonly string[] = unique([
  ...Array.from({ length: 11 }, (_, t) => concentrationCode(t)),
  sigrid3Concentration(0, { trace: true }),
  concentrationCode(null),
]);

/** How many concentration terms the nomenclature knows (documented in docs/format.md). */
export const CONCENTRATION_TERM_COUNT = CONCENTRATION_TERMS.length;
