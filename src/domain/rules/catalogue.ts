// Every finding code the rules can report, with its severity and a one-line summary: the
// review screen filters by these, the CLI prints them, and the docs list them. A code is stable
// once released: stored reviews (FindingReview.code) refer to it.

import type { Finding, Severity } from '../model.ts';

export interface FindingCodeInfo {
  severity: Severity;
  summary: string;
  /** 'observation' rules look at one observation, 'sequence' rules at the cruise's series. */
  scope: 'observation' | 'sequence';
}

const o = (severity: Severity, summary: string): FindingCodeInfo => ({ severity, summary, scope: 'observation' });
const s = (severity: Severity, summary: string): FindingCodeInfo => ({ severity, summary, scope: 'sequence' });

export const FINDING_CODES = {
  'time-invalid': o('error', 'Time is not an ISO 8601 UTC time ending in Z'),
  'cruise-mismatch': o('warning', 'Observation belongs to another cruise'),
  'unknown-observer': o('warning', 'Observer is not on the cruise list'),
  'total-out-of-range': o('error', 'Total concentration is not a whole number of tenths 0-10'),
  'total-not-judged': o('warning', 'Total concentration not judged yet'),
  'too-many-categories': o('error', 'More than three ice types'),
  'categories-missing': o('warning', 'Ice reported but no ice type described'),
  'partial-out-of-range': o('error', 'Partial concentration is not a whole number of tenths 1-10'),
  'partial-zero': o('warning', 'An ice type with 0/10 partial concentration'),
  'partials-exceed-total': o('error', 'Partial concentrations add up to more than the total'),
  'partials-below-total': o('warning', 'Partial concentrations add up to less than the total'),
  'categories-not-thickest-first': o('warning', 'Ice types are not ordered thickest first'),
  'stage-unknown': o('error', 'Stage of development is not one of the known stages'),
  'floe-size-unknown': o('error', 'Floe size is not one of the known forms of ice'),
  'thickness-out-of-range': o('error', 'Thickness is negative, not a number, or over 100 m'),
  'thickness-implausible': o('warning', 'Level-ice thickness beyond what sea ice reaches'),
  'stage-thickness-mismatch': o('warning', 'Thickness outside the stage of development\'s range'),
  'pancake-stage-mismatch': o('warning', 'Pancake ice with a stage older than young ice'),
  'deformation-share-out-of-range': o('error', 'Ridged or rafted share is not 0-10 tenths'),
  'deformed-share-exceeds-category': o('error', 'Ridged and rafted shares add up to more than 10 tenths'),
  'sail-height-out-of-range': o('error', 'Sail height is negative or not a number'),
  'sail-height-implausible': o('warning', 'Sail height implies a keel deeper than ridges reach'),
  'sail-height-without-ridges': o('warning', 'Sail height given but no ridged share'),
  'snow-depth-out-of-range': o('error', 'Snow depth is negative or not a number'),
  'snow-depth-implausible': o('warning', 'Snow depth beyond what is seen on sea ice'),
  'snow-depth-without-snow': o('warning', 'Snow depth given with the snow cover "none"'),
  'snow-described-without-snow': o('warning', 'Wetness, crust or drifts given with the snow cover "none"'),
  'snow-term-unknown': o('error', 'Snow cover or wetness is not one of the known terms'),
  'group-without-ice-type': o('error', 'Deformation or snow given for an ice type the observation does not have'),
  'trace-not-thicker': o('warning', 'Trace stage (So) is not thicker than the thickest ice type'),
  'remaining-not-thinner': o('warning', 'Remaining stage (Sd) is not thinner than the thinnest ice type'),
  'remaining-without-share': o('warning', 'Remaining stage (Sd) given but the partial concentrations already make up the total'),
  'position-missing': o('warning', 'No position'),
  'position-invalid': o('error', 'Position outside WGS 84 latitude/longitude ranges'),
  'position-null-island': o('warning', 'Position is exactly 0°, 0°'),
  'position-accuracy-invalid': o('error', 'Position accuracy is negative or not a number'),
  'position-fix-time-invalid': o('error', 'Position fix time is not an ISO 8601 UTC time'),
  'position-fix-stale': o('warning', 'Position fix far from the observation time'),
  'air-temp-out-of-range': o('error', 'Air temperature beyond any recorded on Earth'),
  'air-temp-doubtful': o('warning', 'Air temperature unusual at sea in polar waters'),
  'water-temp-out-of-range': o('error', 'Water temperature impossible for sea water'),
  'water-below-freezing': o('warning', 'Water temperature below the freezing point of sea water'),
  'salinity-out-of-range': o('error', 'Salinity is negative or beyond 50'),
  'salinity-outside-formula-range': o('warning', 'Salinity outside 4-40, where the freezing-point formula holds'),
  'wind-out-of-range': o('error', 'Wind speed negative or direction outside 0-360°'),
  'wind-doubtful': o('warning', 'Wind speed above hurricane force by a wide margin'),
  'visibility-out-of-range': o('error', 'Visibility is negative'),
  'cloud-out-of-range': o('error', 'Cloud cover is not a whole number of oktas 0-8'),
  'melt-ponds-out-of-range': o('error', 'Melt-pond cover is not 0-10 tenths'),
  'iceberg-count-invalid': o('error', 'Iceberg, bergy bit or growler count is not a whole number 0 or more'),
  'open-water-out-of-range': o('error', 'Open-water width negative or orientation outside 0-180°'),
  'duplicate-time': s('warning', 'Two observations at the same time'),
  'observation-gap': s('warning', 'Gap between observations longer than the interval'),
  'implied-speed': s('warning', 'Implied ship speed above the cruise limit'),
} as const satisfies Record<string, FindingCodeInfo>;

export type FindingCode = keyof typeof FINDING_CODES;

/** Build a finding with the catalogue's severity for its code. */
export function finding(code: FindingCode, path: string, message: string, observationId?: string): Finding {
  const f: Finding = { severity: FINDING_CODES[code].severity, code, path, message };
  if (observationId !== undefined) f.observationId = observationId;
  return f;
}

/** True when any finding is an error: the observation cannot be saved as it is. */
export function blocksSaving(findings: readonly Finding[]): boolean {
  return findings.some((f) => f.severity === 'error');
}
