// The "thickest first" order of ice categories, as the egg code needs it (Sa thickest).
// Order is by stage of development first (older ice is thicker ice in the egg code's sense), and
// by observed thickness only where the stages cannot tell (same stage, or a coarse stage that
// overlaps a fine one). A coarse stage with an observed thickness is narrowed to the fine stage
// that thickness falls in, so "first-year 150 cm" ranks with thick first-year ice.

import type { IceCategory, StageKey } from './model.ts';
import { STAGES, type StageRank } from './nomenclature.ts';

const ALL_RANKS: StageRank = { lo: 1, hi: 12 };

/** Fine rank for a level-ice thickness, used to narrow coarse stages (WMO-No. 259 ranges). */
function rankForThickness(cm: number): StageRank {
  if (cm < 10) return { lo: 1, hi: 3 };
  if (cm < 15) return { lo: 4, hi: 4 };
  if (cm < 30) return { lo: 5, hi: 5 };
  if (cm < 50) return { lo: 6, hi: 6 };
  if (cm < 70) return { lo: 7, hi: 7 };
  if (cm < 120) return { lo: 8, hi: 8 };
  return { lo: 9, hi: 12 };
}

/**
 * The rank interval a category stands for: its stage's rank, narrowed by the observed thickness
 * where the stage is coarse (nilas, young, thin first-year, first-year, undetermined).
 */
export function effectiveRank(stage: StageKey, thicknessCm?: number): StageRank {
  // `?.`: data from a file may carry an unknown stage; it ranks as undetermined.
  const info = STAGES[stage] as (typeof STAGES)[StageKey] | undefined;
  const base = info?.rank ?? ALL_RANKS;
  if (base.lo === base.hi || thicknessCm === undefined || !Number.isFinite(thicknessCm)) return base;
  if (info?.family === 'nilas') {
    const r = thicknessCm < 5 ? 2 : 3;
    return { lo: r, hi: r };
  }
  const t = rankForThickness(thicknessCm);
  // Clamp into the stage's own span: a coarse stage never leaves its family.
  const lo = Math.min(Math.max(t.lo, base.lo), base.hi);
  const hi = Math.max(Math.min(t.hi, base.hi), base.lo);
  return { lo: Math.min(lo, hi), hi: Math.max(lo, hi) };
}

/**
 * True when category `b` is surely thicker than category `a`: its stage ranks above, or both are
 * the same fine rank and `b` has the greater observed thickness.
 */
export function isSurelyThicker(b: IceCategory, a: IceCategory): boolean {
  const rb = effectiveRank(b.stage, b.thicknessCm);
  const ra = effectiveRank(a.stage, a.thicknessCm);
  if (rb.lo > ra.hi) return true;
  if (rb.lo === rb.hi && ra.lo === ra.hi && rb.lo === ra.lo) {
    return a.thicknessCm !== undefined && b.thicknessCm !== undefined && b.thicknessCm > a.thicknessCm;
  }
  return false;
}

/** Same test for two stages with no thickness (trace stage So, remaining stage Sd). */
export function isStageSurelyThicker(b: StageKey, a: StageKey): boolean {
  const rb = effectiveRank(b);
  const ra = effectiveRank(a);
  return rb.lo > ra.hi;
}

function sortKey(c: IceCategory): [number, number] {
  const r = effectiveRank(c.stage, c.thicknessCm);
  return [(r.lo + r.hi) / 2, c.thicknessCm ?? -1];
}

/**
 * Categories in thickest-first order (stable for ties), and whether that changed the order.
 * After sorting, no pair is reported by `isSurelyThicker(next, previous)`.
 */
export function sortCategoriesThickestFirst(categories: readonly IceCategory[]): {
  categories: IceCategory[];
  reordered: boolean;
} {
  const indexed = categories.map((c, i) => ({ c, i, k: sortKey(c) }));
  indexed.sort((x, y) => y.k[0] - x.k[0] || y.k[1] - x.k[1] || x.i - y.i);
  return { categories: indexed.map((e) => e.c), reordered: indexed.some((e, i) => e.i !== i) };
}
