// The figures the review derives from one observation, computed once and shared by the summary,
// the latitude bands, the handover table and the charts.
import { deformationOf } from '../iceTypes.ts';
import type { Deformation, IceCategory, Observation, VesselIceClass } from '../model.ts';
import type { PolarisOutcome } from '../polaris.ts';
import { rioForObservation } from './rio.ts';

/**
 * The weight (tenths) of each category: its partial concentration; where the observation has a
 * single category, the total concentration (the egg code leaves Ca blank for a single ice type,
 * so the partial may be missing or 0), falling back to the partial if no total was judged.
 */
export function categoryWeight(obs: Pick<Observation, 'totalConcentration' | 'categories'>, index: number): number {
  const cats = obs.categories;
  const c = cats[index];
  if (!c) return 0;
  const w = cats.length === 1 ? (obs.totalConcentration ?? c.partialConcentration) : c.partialConcentration;
  return Number.isFinite(w) && w > 0 ? w : 0;
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
  rio: number | null;
  outcome: PolarisOutcome | null;
}

/** Thickness of a category including its ridges (cm), or null when no estimate can be made. */
export type RidgeThicknessEstimate = (category: IceCategory, deformation: Deformation | undefined) => number | null;

export function observationFigures(
  obs: Observation,
  iceClass: VesselIceClass,
  ridgeEstimate: RidgeThicknessEstimate | null,
  /** Filled in and returned instead of a new object (the review reuses one for a whole cruise). */
  into?: ObservationFigures,
): ObservationFigures {
  let tSum = 0;
  let tW = 0;
  let rtSum = 0;
  let rtW = 0;
  let rSum = 0;
  let rW = 0;
  const cats = obs.categories;
  for (let i = 0; i < cats.length; i++) {
    const c = cats[i] as IceCategory;
    const w = categoryWeight(obs, i);
    if (w === 0) continue;
    if (c.thicknessCm !== undefined && Number.isFinite(c.thicknessCm)) {
      tSum += w * c.thicknessCm;
      tW += w;
    }
    const d = deformationOf(obs, i);
    if (ridgeEstimate) {
      const h = ridgeEstimate(c, d);
      if (h !== null && Number.isFinite(h)) {
        rtSum += w * h;
        rtW += w;
      }
    }
    if (d?.ridgedTenths !== undefined && Number.isFinite(d.ridgedTenths)) {
      rSum += (w * d.ridgedTenths) / 10;
      rW += w;
    }
  }
  const polaris = rioForObservation(obs, iceClass);
  const f = into ?? emptyFigures();
  f.levelThicknessCm = tW > 0 ? tSum / tW : null;
  f.thicknessWeightedSum = tSum;
  f.thicknessWeight = tW;
  f.ridgedThicknessCm = rtW > 0 ? rtSum / rtW : null;
  f.ridgedThicknessWeightedSum = rtSum;
  f.ridgedThicknessWeight = rtW;
  f.ridgedWeightedSum = rSum;
  f.ridgedWeight = rW;
  f.rio = polaris ? polaris.rio : null;
  f.outcome = polaris ? polaris.outcome : null;
  return f;
}

export function emptyFigures(): ObservationFigures {
  return {
    levelThicknessCm: null, thicknessWeightedSum: 0, thicknessWeight: 0,
    ridgedThicknessCm: null, ridgedThicknessWeightedSum: 0, ridgedThicknessWeight: 0,
    ridgedWeightedSum: 0, ridgedWeight: 0, rio: null, outcome: null,
  };
}
