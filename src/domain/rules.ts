// Validation and quality control: what is impossible (severity 'error', blocks saving) and what
// is doubtful (severity 'warning', may be saved, a reviewer looks at it). The rules themselves
// live in rules/; this module is the entry point everyone imports.

import type { Cruise, Finding, Observation } from './model.ts';
import { OBSERVATION_RULES, type RuleContext } from './rules/observationRules.ts';

export { FINDING_CODES, blocksSaving, finding, type FindingCode, type FindingCodeInfo } from './rules/catalogue.ts';
export { OBSERVATION_RULES, isIsoUtc, type ObservationRule, type RuleContext } from './rules/observationRules.ts';
export { checkSequence, DEFAULT_GAP_GRACE_FRACTION, type SequenceOptions } from './rules/sequenceRules.ts';
export { sortCategoriesThickestFirst } from './ordering.ts';

/** Every finding for one observation, in rule order. Pass the cruise for the cruise-aware checks. */
export function validateObservation(obs: Observation, cruise?: Cruise): Finding[] {
  const ctx: RuleContext = cruise ? { cruise } : {};
  return OBSERVATION_RULES.flatMap((rule) => rule.check(obs, ctx));
}
