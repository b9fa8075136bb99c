// The thickness-with-ridges figure of the review: ridges.ts's equivalent thickness of a category
// (ridged and rafted shares, ridge thickness from the sail height with the Timco and Burden 1997
// ratios), computed without building the notes and result object that the form shows, since the
// review runs it for every category of a whole cruise. test/domain/stats-ridges.test.ts checks it
// equals equivalentThickness({ ...c, ...d }).equivalentCm.
import type { Deformation, IceCategory } from '../model.ts';
import { ridgeKindForStage, ridgeMeanThicknessM } from '../ridges.ts';

const share = (v: number): number => (Number.isFinite(v) ? Math.min(Math.max(v, 0), 1) : 0);

/** Equivalent thickness of a category in cm (rounded to 0.1 as ridges.ts does), or null without a thickness. */
export function equivalentThicknessCm(c: IceCategory, d: Deformation | undefined): number | null {
  const h = c.thicknessCm;
  if (h === undefined || !Number.isFinite(h) || h < 0) return null;
  const r = share((d?.ridgedTenths ?? 0) / 10);
  const f = share(Math.min((d?.raftedTenths ?? 0) / 10, 1 - r));
  let ridgeCm = h;
  const sail = d?.sailHeightM;
  if (r > 0 && sail !== undefined && Number.isFinite(sail) && sail >= 0) ridgeCm = Math.max(h, ridgeMeanThicknessM(sail, ridgeKindForStage(c.stage)) * 100);
  return Math.round(((1 - r - f) * h + f * 2 * h + r * ridgeCm) * 10) / 10;
}
