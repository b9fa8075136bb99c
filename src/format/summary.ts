// Cruise statistics of a log: what `summary` prints and the import preview shows. Every figure
// is computed by src/domain (distances by its WGS 84 geodesics, findings by its rules); this
// module only counts and collects.
import { alongTrackDistanceM, METRES_PER_NM } from '../domain/geodesy';
import type { Observation, StageKey } from '../domain/model';
import { checkSequence, validateObservation } from '../domain/rules';
import { REVIEW_CAUTIONS, RIDGE_FIGURE_ESTIMATES, reviewCruise, type CruiseReview, type RidgeFigure } from '../domain/stats';
import type { LogBundle } from './types';

export interface CruiseSummary {
  cruise: { id: string; name: string; vesselName: string; iceClass: string };
  observations: { total: number; deleted: number; withoutPosition: number; notJudged: number };
  revisions: { earlier: number; conflicts: number };
  timeSpan: { first: string; last: string; hours: number } | null;
  observers: { id: string; name: string; initials: string; observations: number }[];
  track: { points: number; first: string | null; last: string | null; distanceNm: number };
  /** Mean total concentration over observations with a judged total, tenths. */
  meanTotalConcentration: number | null;
  /** Observations in which each stage appears as one of the categories. */
  stages: Partial<Record<StageKey, number>>;
  photos: number;
  findings: { errors: number; warnings: number; byCode: Record<string, number> };
  /** The chief scientist's figures (ice hours and distances, thickness, POLARIS), as the Review screen shows them. */
  review: CruiseReview['summary'];
  /** The review's cautions (overview not chart, POLARIS is decision support, estimates), as `polaris --json` carries its own. */
  cautions: string[];
  /** Figures that are estimates, by their dotted path in this object, each with its basis. */
  estimates: EstimatedFigure[];
}

export interface EstimatedFigure {
  /** Dotted path of the figure in the summary, e.g. `review.ice.meanThicknessWithRidgesCm`. */
  path: string;
  estimate: true;
  basis: string;
}

/** Every ridge-based figure of the summary is an estimate. */
const ESTIMATES: readonly EstimatedFigure[] = (Object.keys(RIDGE_FIGURE_ESTIMATES) as RidgeFigure[]).map((k) => ({
  path: `review.ice.${k}`,
  estimate: true,
  basis: RIDGE_FIGURE_ESTIMATES[k],
}));

const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits;

export function summarise(bundle: LogBundle): CruiseSummary {
  const live: Observation[] = bundle.observations.filter((o) => !o.deleted);
  const times = live.map((o) => o.time).sort();
  const first = times[0];
  const last = times[times.length - 1];
  const judged = live.filter((o) => o.totalConcentration !== null);
  const stages: Partial<Record<StageKey, number>> = {};
  for (const o of live) for (const s of new Set(o.categories.map((c) => c.stage))) stages[s] = (stages[s] ?? 0) + 1;
  const track = [...bundle.track].sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
  const findings = [...live.flatMap((o) => validateObservation(o, bundle.cruise)), ...checkSequence(live, bundle.cruise)];
  const byCode: Record<string, number> = {};
  for (const f of findings) byCode[f.code] = (byCode[f.code] ?? 0) + 1;
  return {
    cruise: { id: bundle.cruise.id, name: bundle.cruise.name, vesselName: bundle.cruise.vesselName, iceClass: bundle.cruise.iceClass },
    observations: {
      total: live.length,
      deleted: bundle.observations.length - live.length,
      withoutPosition: live.filter((o) => o.position === null).length,
      notJudged: live.length - judged.length,
    },
    revisions: { earlier: bundle.history.length, conflicts: bundle.conflicts.length },
    timeSpan: first && last ? { first, last, hours: round((Date.parse(last) - Date.parse(first)) / 3_600_000, 2) } : null,
    observers: bundle.cruise.observers.map((o) => ({ ...o, observations: live.filter((x) => x.observerId === o.id).length })),
    track: {
      points: track.length,
      first: track[0]?.time ?? null,
      last: track[track.length - 1]?.time ?? null,
      distanceNm: round(alongTrackDistanceM(track) / METRES_PER_NM, 1),
    },
    meanTotalConcentration: judged.length === 0 ? null : round(judged.reduce((s, o) => s + (o.totalConcentration ?? 0), 0) / judged.length, 2),
    stages,
    photos: bundle.photos.length,
    findings: { errors: findings.filter((f) => f.severity === 'error').length, warnings: findings.filter((f) => f.severity === 'warning').length, byCode },
    review: reviewCruise({ cruise: bundle.cruise, observations: bundle.observations, track: bundle.track }).summary,
    cautions: [...REVIEW_CAUTIONS],
    estimates: ESTIMATES.map((e) => ({ ...e })),
  };
}

/** The summary as lines of text. */
export function summaryLines(s: CruiseSummary): string[] {
  const lines = [
    `Cruise      ${s.cruise.name} (${s.cruise.id})`,
    `Vessel      ${s.cruise.vesselName}, ice class ${s.cruise.iceClass}`,
    `Time span   ${s.timeSpan ? `${s.timeSpan.first} to ${s.timeSpan.last} (${s.timeSpan.hours} h)` : 'no observations'}`,
    `Observations ${s.observations.total} (${s.observations.deleted} deleted, ${s.observations.withoutPosition} without position, ${s.observations.notJudged} total not judged)`,
    `Revisions   ${s.revisions.earlier} earlier, ${s.revisions.conflicts} conflicting copies for review`,
    `Mean total concentration ${s.meanTotalConcentration === null ? '-' : `${s.meanTotalConcentration}/10`}`,
    `Track       ${s.track.points} points, ${s.track.distanceNm} NM along track (WGS 84 geodesic)`,
    `Photos      ${s.photos}`,
    'Observers:',
    ...s.observers.map((o) => `  ${o.initials.padEnd(4)} ${o.name}: ${o.observations}`),
    'Stages (observations in which each appears):',
    ...Object.entries(s.stages)
      .sort((a, b) => (b[1] ?? 0) - (a[1] ?? 0))
      .map(([k, n]) => `  ${k}: ${n}`),
    ...reviewLines(s.review),
    `Findings    ${s.findings.errors} errors, ${s.findings.warnings} warnings`,
    ...Object.entries(s.findings.byCode)
      .sort((a, b) => b[1] - a[1])
      .map(([k, n]) => `  ${k}: ${n}`),
    'Cautions:',
    ...s.cautions.map((c) => `  - ${c}`),
  ];
  return lines;
}

const fixed = (x: number | null, digits: number, unit = '') => (x === null ? '-' : `${x.toFixed(digits)}${unit}`);

/** The review figures: where the ship was in ice and what the risk index said. */
function reviewLines(r: CruiseReview['summary']): string[] {
  const td = (label: string, t: { hours: number; distanceNm: number }) =>
    `${label.padEnd(12)}${t.hours.toFixed(1)} h, ${t.distanceNm.toFixed(1)} NM`;
  const ice = r.ice;
  return [
    td('In ice', r.inIce) + ' (total concentration at least 1/10)',
    td('Marginal', r.marginal) + ' (2-8/10, the common 15-80 % definition)',
    td('Pack ice', r.pack) + ' (9-10/10)',
    `Gaps        ${r.gaps.length}, ${r.unobservedHours.toFixed(1)} h with no observation`,
    `Thickness   ${fixed(ice.meanThicknessCm, 0, ' cm')} level, ${fixed(ice.meanThicknessWithRidgesCm, 0, ' cm')} with ridges (estimate), concentration-weighted`,
    `Ridged      ${ice.ridgedShare === null ? '-' : `${(ice.ridgedShare * 100).toFixed(0)} %`} of the ice area (observers' estimate)`,
    `POLARIS     class ${r.polaris.iceClass}: RIO min ${fixed(r.polaris.minRio, 0)}, mean ${fixed(r.polaris.meanRio, 1)} (decision support only)`,
    ...r.polaris.outcomes.map((o) => `  ${o.label}: ${o.hours.toFixed(1)} h`),
  ];
}
