// The quality-control list of the review: every finding of the field rules (validateObservation)
// and the sequence rules (checkSequence) in one list, each tied to its observation, with the
// review a chief scientist has recorded for it (Observation.reviews, matched by code and path).
import type { Cruise, Finding, FindingReview, IsoUtc, Observation, Severity } from '../model.ts';
import { checkSequence, FINDING_CODES, validateObservation, type FindingCode } from '../rules.ts';

export interface ReviewFinding extends Finding {
  observationId: string;
  time: IsoUtc;
  observerId: string;
  scope: 'observation' | 'sequence';
  /** Stable key within the cruise (observation, code, path). */
  key: string;
  review: FindingReview | null;
}

const SEVERITY_ORDER: Readonly<Record<Severity, number>> = { error: 0, warning: 1, info: 2 };

const isKnownCode = (code: string): code is FindingCode => Object.prototype.hasOwnProperty.call(FINDING_CODES, code);

/** The review stored for a finding, if any (the latest when several match). */
export function reviewFor(obs: Pick<Observation, 'reviews'>, f: Pick<Finding, 'code' | 'path'>): FindingReview | null {
  let found: FindingReview | null = null;
  for (const r of obs.reviews ?? []) if (r.code === f.code && r.path === f.path && (!found || r.at >= found.at)) found = r;
  return found;
}

/** Every finding of the cruise's live observations, in time order, errors first within a time. */
export function collectFindings(observations: readonly Observation[], cruise: Cruise): ReviewFinding[] {
  const live = observations.filter((o) => !o.deleted);
  const byId = new Map(live.map((o) => [o.id, o]));
  const out: ReviewFinding[] = [];
  const push = (o: Observation, f: Finding): void => {
    out.push({
      ...f,
      observationId: o.id,
      time: o.time,
      observerId: o.observerId,
      scope: isKnownCode(f.code) ? FINDING_CODES[f.code].scope : 'observation',
      key: `${o.id}|${f.code}|${f.path}`,
      review: reviewFor(o, f),
    });
  };
  for (const o of live) for (const f of validateObservation(o, cruise)) push(o, f);
  for (const f of checkSequence(live, cruise)) {
    const o = f.observationId ? byId.get(f.observationId) : undefined;
    if (o) push(o, f);
  }
  return out.sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] || a.code.localeCompare(b.code)));
}

/**
 * The observation with a review of one finding added (an earlier review of the same finding is
 * replaced, so the revision history keeps the old comment). Pure: the caller saves it.
 */
export function withFindingReview(obs: Observation, f: Pick<Finding, 'code' | 'path'>, comment: string, by: string, at: IsoUtc): Observation {
  const kept = (obs.reviews ?? []).filter((r) => !(r.code === f.code && r.path === f.path));
  return { ...obs, reviews: [...kept, { code: f.code, path: f.path, comment: comment.trim(), by, at }] };
}

/** The observation with the review of one finding taken back. */
export function withoutFindingReview(obs: Observation, f: Pick<Finding, 'code' | 'path'>): Observation {
  return { ...obs, reviews: (obs.reviews ?? []).filter((r) => !(r.code === f.code && r.path === f.path)) };
}
