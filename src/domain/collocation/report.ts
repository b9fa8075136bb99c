// The agreement report shown in the Review and printed by `summary --json --chart/--grid`: the
// products used (time, resolution), the figures for chart and grid, and the cautions that go
// beside them.
import type { IsoUtc, Observation } from '../model.ts';
import { agreement, chartPairs, gridPairs, type Agreement } from './agreement.ts';
import type { Collocation, CollocationOptions, GridMethod } from './collocate.ts';

export interface ProductNote {
  kind: 'chart' | 'grid';
  sourceName: string;
  time: IsoUtc;
  /** Grid cell size in km; null for a chart (drawn at the scale its service issued it). */
  resolutionKm: number | null;
  fileName: string;
}

export interface IceInfoReport {
  products: ProductNote[];
  limits: CollocationOptions;
  gridMethod: GridMethod;
  /** Observed minus chart total concentration (the middle of a range code), tenths. */
  chart: Agreement;
  /** Observed minus grid concentration (percent / 10), tenths. */
  grid: Agreement;
  cautions: readonly string[];
}

/** Shown beside every agreement figure (issue 14; the coast/thin ice/melt pond bias is common practice). */
export const AGREEMENT_CAUTIONS: readonly string[] = [
  'Each product describes its own time and resolution (listed above); ice moves between its time and the observation.',
  'Satellite concentration is known to be biased near coasts, over thin ice and over melt ponds (common practice).',
  'Neither the ice chart nor the satellite grid is a navigation product: the ship\u2019s own ice information service and local regulations prevail.',
];

export function iceInfoReport(
  observations: readonly Pick<Observation, 'id' | 'time' | 'observerId' | 'totalConcentration' | 'deleted'>[],
  collocation: ReadonlyMap<string, Collocation>,
  products: readonly ProductNote[],
  limits: CollocationOptions,
  gridMethod: GridMethod,
  largestCount = 10,
): IceInfoReport {
  return {
    products: [...products],
    limits,
    gridMethod,
    chart: agreement(chartPairs(observations, collocation), largestCount),
    grid: agreement(gridPairs(observations, collocation, gridMethod), largestCount),
    cautions: AGREEMENT_CAUTIONS,
  };
}
