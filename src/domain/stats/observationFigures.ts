// The figures the review derives from one observation, computed once and shared by the summary,
// the latitude bands, the handover table and the charts.
import type { IceCategory, Observation, StageKey, VesselIceClass } from '../model.ts';
import { polarisForObservation, type PolarisOutcome } from '../polaris.ts';

/**
 * The weight (tenths) of each category: its partial concentration; where the observation has a
 * single category, the total concentration (the egg code leaves Ca blank for a single ice type,
 * so the partial may be missing or 0), falling back to the partial if no total was judged.
 */
export function categoryWeights(obs: Pick<Observation, 'totalConcentration' | 'categories'>): number[] {
  const cats = obs.categories;
  if (cats.length === 1) {
    const only = cats[0] as IceCategory;
    return [obs.totalConcentration ?? only.partialConcentration];
  }
  return cats.map((c) => c.partialConcentration);
}

export interface ObservationFigures {
  /** Mean level-ice thickness of the ice present, weighted by concentration (cm); null if none given. */
  levelThicknessCm: number | null;
  /** Σ weight x thickness and Σ weight over categories with a thickness, for pooled means. */
  thicknessWeightedSum: number;
  thicknessWeight: number;
  /** As above with the ridge estimate; null sums when no estimate could be made. */
  ridgedThicknessCm: number | null;
  ridgedThicknessWeightedSum: number;
  ridgedThicknessWeight: number;
  /** Σ weight x ridged fraction and Σ weight over categories with a ridged share recorded. */
  ridgedWeightedSum: number;
  ridgedWeight: number;
  /** Stage weights (tenths) of the categories, for stage shares. */
  stages: { stage: StageKey; weight: number }[];
  rio: number | null;
  outcome: PolarisOutcome | null;
}

/** Thickness of a category including its ridges (cm), or null when no estimate can be made. */
export type RidgeThicknessEstimate = (category: IceCategory) => number | null;

export function observationFigures(
  obs: Observation,
  iceClass: VesselIceClass,
  ridgeEstimate: RidgeThicknessEstimate | null,
): ObservationFigures {
  const weights = categoryWeights(obs);
  let tSum = 0;
  let tW = 0;
  let rtSum = 0;
  let rtW = 0;
  let rSum = 0;
  let rW = 0;
  const stages: { stage: StageKey; weight: number }[] = [];
  obs.categories.forEach((c, i) => {
    const w = weights[i] ?? 0;
    if (!(w > 0)) return;
    stages.push({ stage: c.stage, weight: w });
    if (c.thicknessCm !== undefined && Number.isFinite(c.thicknessCm)) {
      tSum += w * c.thicknessCm;
      tW += w;
    }
    if (ridgeEstimate) {
      const h = ridgeEstimate(c);
      if (h !== null && Number.isFinite(h)) {
        rtSum += w * h;
        rtW += w;
      }
    }
    if (c.ridgedTenths !== undefined && Number.isFinite(c.ridgedTenths)) {
      rSum += (w * c.ridgedTenths) / 10;
      rW += w;
    }
  });
  const polaris = polarisForObservation(obs, iceClass);
  return {
    levelThicknessCm: tW > 0 ? tSum / tW : null,
    thicknessWeightedSum: tSum,
    thicknessWeight: tW,
    ridgedThicknessCm: rtW > 0 ? rtSum / rtW : null,
    ridgedThicknessWeightedSum: rtSum,
    ridgedThicknessWeight: rtW,
    ridgedWeightedSum: rSum,
    ridgedWeight: rW,
    stages,
    rio: polaris.ok ? polaris.value.rio : null,
    outcome: polaris.ok ? polaris.value.outcome : null,
  };
}
