// Ridge estimates from what the bridge sees: the sail. Everything here is an ESTIMATE and is
// labelled so wherever it is shown.
//
// Ratios from Timco and Burden (1997), "An analysis of the shapes of sea ice ridges", Cold
// Regions Science and Technology 25, 65-77: keel depth / sail height 4.4 for first-year ridges and
// 3.3 for multi-year ridges; keel area / sail area 8.0 (first-year) and 8.8 (multi-year).
//
// Equivalent thickness of a category (our formula, documented in docs/dev/domain.md):
//   h_eq = (1 - R - F) h  +  F 2h  +  R max(h, h_r)
// with h the level-ice thickness, R the ridged share and F the rafted share of the category
// (tenths / 10), rafted ice taken as two layers (common practice), and h_r the mean ice thickness
// over a ridge's keel width, for triangular sail and keel cross-sections:
//   A = w h / 2 for sail and keel, so w_k = 2 A_k / h_k and
//   h_r = (A_s + A_k) / w_k = (h_k / 2) (1 + A_s / A_k),  h_k = (keel/sail ratio) x sail height.
// First-year: h_r = 2.2 x 1.125 = 2.475 x sail height; multi-year: 1.65 x 1.1136 = 1.8375 x sail.
// Voids in the ridge rubble are not subtracted unless a porosity is given, so by default h_r is
// an upper estimate.

import { deformationOf } from './iceTypes.ts';
import type { Deformation, IceCategory, Observation, StageKey } from './model.ts';
import { STAGES } from './nomenclature.ts';

export type RidgeKind = 'first-year' | 'multi-year';

/** Keel depth / sail height (Timco and Burden 1997). */
export const KEEL_TO_SAIL_RATIO = { firstYear: 4.4, multiYear: 3.3 } as const;
/** Keel cross-section area / sail cross-section area (Timco and Burden 1997). */
export const KEEL_TO_SAIL_AREA_RATIO = { firstYear: 8.0, multiYear: 8.8 } as const;
/** Deepest keels reach about 50 m below sea level (common practice). */
export const MAX_KEEL_DEPTH_M = 50;

export const ESTIMATE_LABEL = 'estimate';

/** Old ice (second-year, multi-year) has multi-year ridges; everything else first-year ones. */
export function ridgeKindForStage(stage: StageKey): RidgeKind {
  return STAGES[stage].family === 'old' ? 'multi-year' : 'first-year';
}

const ratios = (kind: RidgeKind) =>
  kind === 'multi-year'
    ? { depth: KEEL_TO_SAIL_RATIO.multiYear, area: KEEL_TO_SAIL_AREA_RATIO.multiYear }
    : { depth: KEEL_TO_SAIL_RATIO.firstYear, area: KEEL_TO_SAIL_AREA_RATIO.firstYear };

/** Estimated keel depth below the waterline, metres, from the sail height (Timco and Burden 1997). */
export function keelDepthFromSailM(sailHeightM: number, kind: RidgeKind = 'first-year'): number {
  return sailHeightM * ratios(kind).depth;
}

/**
 * Estimated mean ice thickness over a ridge's keel width, metres (triangular sail and keel).
 * `porosity` 0..1 is the void fraction of the rubble; 0 (default) gives an upper estimate.
 */
export function ridgeMeanThicknessM(sailHeightM: number, kind: RidgeKind = 'first-year', porosity = 0): number {
  const r = ratios(kind);
  const keel = sailHeightM * r.depth;
  return (keel / 2) * (1 + 1 / r.area) * (1 - porosity);
}

export interface EquivalentThickness {
  /** Always 'estimate': show it beside the number. */
  label: typeof ESTIMATE_LABEL;
  levelCm: number;
  equivalentCm: number;
  /** Estimated keel depth where a sail height was given. */
  keelDepthM: number | null;
  ridgeKind: RidgeKind;
  /** Assumptions made, for display beside the estimate. */
  notes: string[];
}

/**
 * Equivalent thickness of one category including its ridged and rafted shares (formula at the
 * top of this file). Null when the category has no level-ice thickness.
 */
export function equivalentThickness(c: IceCategory & Deformation, opts: { porosity?: number } = {}): EquivalentThickness | null {
  if (c.thicknessCm === undefined || !Number.isFinite(c.thicknessCm) || c.thicknessCm < 0) return null;
  const h = c.thicknessCm;
  const kind = ridgeKindForStage(c.stage);
  const notes: string[] = [];
  const R = clampShare((c.ridgedTenths ?? 0) / 10);
  const F = clampShare(Math.min((c.raftedTenths ?? 0) / 10, 1 - R));
  const sail = c.sailHeightM !== undefined && Number.isFinite(c.sailHeightM) && c.sailHeightM >= 0 ? c.sailHeightM : null;
  let ridgeCm = h;
  if (R > 0) {
    if (sail === null) notes.push('Ridged share without a sail height: ridged ice counted at the level thickness.');
    else ridgeCm = Math.max(h, ridgeMeanThicknessM(sail, kind, opts.porosity ?? 0) * 100);
  }
  if (F > 0) notes.push('Rafted ice counted as two layers of level ice.');
  if (R > 0 && sail !== null && !opts.porosity) notes.push('Ridge voids not subtracted: an upper estimate.');
  const equivalentCm = (1 - R - F) * h + F * 2 * h + R * ridgeCm;
  return {
    label: ESTIMATE_LABEL,
    levelCm: h,
    equivalentCm: Math.round(equivalentCm * 10) / 10,
    keelDepthM: sail === null ? null : Math.round(keelDepthFromSailM(sail, kind) * 100) / 100,
    ridgeKind: kind,
    notes,
  };
}

function clampShare(v: number): number {
  return Number.isFinite(v) ? Math.min(Math.max(v, 0), 1) : 0;
}

export interface MeanThickness {
  label: typeof ESTIMATE_LABEL;
  /** Mean over the ice-covered part (categories weighted by partial concentration). */
  meanOverIceCm: number;
  /** Mean over the whole area, open water counted as 0 cm. */
  meanOverAreaCm: number;
  /** Share of the ice (tenths) whose thickness was known and used. */
  coveredTenths: number;
}

/** Area-weighted equivalent thickness of an observation; null when no category has a thickness. */
export function meanEquivalentThickness(obs: Pick<Observation, 'categories' | 'deformation'>): MeanThickness | null {
  let weighted = 0;
  let tenths = 0;
  for (let i = 0; i < obs.categories.length; i++) {
    const c = obs.categories[i] as IceCategory;
    const eq = equivalentThickness({ ...c, ...deformationOf(obs, i) });
    if (!eq || !(c.partialConcentration > 0)) continue;
    weighted += eq.equivalentCm * c.partialConcentration;
    tenths += c.partialConcentration;
  }
  if (tenths === 0) return null;
  return {
    label: ESTIMATE_LABEL,
    meanOverIceCm: Math.round((weighted / tenths) * 10) / 10,
    meanOverAreaCm: Math.round((weighted / 10) * 10) / 10,
    coveredTenths: tenths,
  };
}
