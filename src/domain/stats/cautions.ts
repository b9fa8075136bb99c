// The cautions that go with the cruise review wherever it is shown: the Review screen, the
// printed report and the machine output of `summary --json`. One list, so no copy can lose one.
import { POLARIS_CAUTIONS } from '../polaris.ts';

export const MAP_CAUTION = 'The map and positions in this report are an overview of observed ice, not a navigation chart.';

export const RIDGE_ESTIMATE_CAUTION =
  'Thickness with ridges is an estimate from the sail height (keel and area ratios of Timco and Burden 1997).';

export const VISUAL_ESTIMATE_CAUTION = 'Concentrations, stages and thicknesses are visual estimates from the bridge.';

/** Every caution of the review, in the order the screen lists them. */
export const REVIEW_CAUTIONS: readonly string[] = [MAP_CAUTION, ...POLARIS_CAUTIONS, RIDGE_ESTIMATE_CAUTION, VISUAL_ESTIMATE_CAUTION];

/** The review's ridge-based figures (fields of IceFigures) and why each is an estimate. */
export const RIDGE_FIGURE_ESTIMATES = {
  meanThicknessWithRidgesCm:
    'Estimate: equivalent thickness with ridges, keel depth and area from the sail height by the ratios of Timco and Burden (1997); voids not subtracted, so an upper estimate.',
  ridgedShare: 'Estimate: the ridged share of the ice area as the observers judged it by eye from the bridge.',
} as const;

export type RidgeFigure = keyof typeof RIDGE_FIGURE_ESTIMATES;
