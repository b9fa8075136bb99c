// The agreement pairs laid out for the Review's two plots: observed against the product's total
// concentration (a scatter, both in tenths), and observed minus product along the cruise (a time
// series). Rows are shared by both products so one plot holds both; a row carries a value only
// in its own product's column (null elsewhere, which the plot leaves out).
import type { AgreementPair } from './agreement.ts';

export interface AgreementScatter {
  /** Product total concentration, tenths, ascending. */
  product: number[];
  /** Observed total concentration where the row is a chart pair, else null. */
  chartObserved: (number | null)[];
  gridObserved: (number | null)[];
}

export interface AgreementSeries {
  /** Observation time, seconds since 1970 (UTC), ascending. */
  time: number[];
  /** Observed minus chart, tenths, where the row is a chart pair, else null. */
  chartDifference: (number | null)[];
  gridDifference: (number | null)[];
}

type Row = { kind: 'chart' | 'grid'; p: AgreementPair };

const rowsOf = (chart: readonly AgreementPair[], grid: readonly AgreementPair[]): Row[] => [
  ...chart.map((p) => ({ kind: 'chart' as const, p })),
  ...grid.map((p) => ({ kind: 'grid' as const, p })),
];

export function agreementScatter(chart: readonly AgreementPair[], grid: readonly AgreementPair[]): AgreementScatter {
  const rows = rowsOf(chart, grid).sort((a, b) => a.p.product - b.p.product);
  return {
    product: rows.map((r) => r.p.product),
    chartObserved: rows.map((r) => (r.kind === 'chart' ? r.p.observed : null)),
    gridObserved: rows.map((r) => (r.kind === 'grid' ? r.p.observed : null)),
  };
}

export function agreementSeries(chart: readonly AgreementPair[], grid: readonly AgreementPair[]): AgreementSeries {
  const rows = rowsOf(chart, grid)
    .map((r) => ({ ...r, t: Date.parse(r.p.time) / 1000 }))
    .sort((a, b) => a.t - b.t);
  return {
    time: rows.map((r) => r.t),
    chartDifference: rows.map((r) => (r.kind === 'chart' ? r.p.difference : null)),
    gridDifference: rows.map((r) => (r.kind === 'grid' ? r.p.difference : null)),
  };
}
