// Observed against the ice charts and satellite grids, drawn: a scatter of observed against the
// product's total concentration (with the line of equal values), and the differences along the
// cruise. uPlot like the other Review charts (lazy, the display's colours; in the red display every
// mark in the text colour, the grid's points hollow so the two products stay apart).
import { useMemo, useRef } from 'react';
import type uPlot from 'uplot';
import { agreementScatter, agreementSeries, type AgreementPair } from '../../domain/collocation';
import { plotAxis, useUPlot, utcTickLabels, type PlotColours } from './uplotPlot';

const CHART_COLOUR = '#8a5a00';
const GRID_COLOUR = '#0b5cad';

const noLine = () => null;

function points(theme: string, c: PlotColours, colour: string, hollow: boolean): uPlot.Series.Points {
  const stroke = theme === 'red' ? c.text : colour;
  return { show: true, size: 7, width: 1.5, stroke, fill: hollow ? c.surface : stroke };
}

function pairSummary(label: string, pairs: readonly AgreementPair[]): string {
  return `${label}: ${pairs.length} ${pairs.length === 1 ? 'pair' : 'pairs'}`;
}

export function AgreementCharts({ chart, grid, theme }: { chart: readonly AgreementPair[]; grid: readonly AgreementPair[]; theme: string }) {
  const scatterBox = useRef<HTMLDivElement>(null);
  const seriesBox = useRef<HTMLDivElement>(null);
  const scatter = useMemo(() => agreementScatter(chart, grid), [chart, grid]);
  const series = useMemo(() => agreementSeries(chart, grid), [chart, grid]);
  useUPlot(
    scatterBox,
    (_U, c) => ({
      opts: {
        scales: { x: { time: false, range: [0, 10] }, y: { range: [0, 10] } },
        axes: [{ ...plotAxis(c), label: 'product (tenths)', size: 50 }, { ...plotAxis(c), label: 'observed (tenths)', size: 60 }],
        series: [
          { label: 'Product' },
          { label: 'Ice chart', stroke: theme === 'red' ? c.text : CHART_COLOUR, paths: noLine, points: points(theme, c, CHART_COLOUR, false) },
          { label: 'Satellite grid', stroke: theme === 'red' ? c.text : GRID_COLOUR, paths: noLine, points: points(theme, c, GRID_COLOUR, true) },
          { label: 'Equal', stroke: c.grid, width: 1, dash: [4, 4], points: { show: false } },
        ],
      },
      data: [scatter.product, scatter.chartObserved, scatter.gridObserved, scatter.product] as uPlot.AlignedData,
    }),
    [scatter, theme],
  );
  useUPlot(
    seriesBox,
    (UPlot, c) => ({
      opts: {
        tzDate: (ts) => UPlot.tzDate(new Date(ts * 1000), 'Etc/UTC'),
        scales: { x: { time: true } },
        axes: [{ ...plotAxis(c), values: utcTickLabels, size: 50 }, { ...plotAxis(c), label: 'observed minus product (tenths)', size: 60 }],
        series: [
          { label: 'Time (UTC)' },
          { label: 'Ice chart', stroke: theme === 'red' ? c.text : CHART_COLOUR, paths: noLine, points: points(theme, c, CHART_COLOUR, false) },
          { label: 'Satellite grid', stroke: theme === 'red' ? c.text : GRID_COLOUR, paths: noLine, points: points(theme, c, GRID_COLOUR, true) },
        ],
      },
      data: [series.time, series.chartDifference, series.gridDifference] as uPlot.AlignedData,
    }),
    [series, theme],
  );
  const summary = `${pairSummary('Ice chart', chart)}; ${pairSummary('satellite grid', grid)}.`;
  return (
    <div className="review-charts">
      <figure className="review-chart" data-testid="chart-agreement-scatter">
        <figcaption>Observed against the product (total concentration)</figcaption>
        <div ref={scatterBox} className="review-chart-canvas" />
        <p className="sr-only review-chart-summary">{summary}</p>
      </figure>
      <figure className="review-chart" data-testid="chart-agreement-series">
        <figcaption>Observed minus the product along the cruise</figcaption>
        <div ref={seriesBox} className="review-chart-canvas" />
        <p className="sr-only review-chart-summary">{summary}</p>
      </figure>
    </div>
  );
}
