// Time-series charts of the cruise (uPlot): total concentration, thickness, RIO and temperatures
// against UTC time. The series carry a null row at every gap (src/domain/stats/series.ts), and
// uPlot breaks the line at nulls, so gaps show as breaks.
import { useMemo, useRef } from 'react';
import type uPlot from 'uplot';
import type { ReviewSeries } from '../../domain/stats';
import { useThemeStore, effectiveTheme } from '../../state/theme';
import { plotAxis, useUPlot, utcTickLabels } from './uplotPlot';

interface LineSpec {
  label: string;
  values: (number | null)[];
  colour: string;
  dash?: number[];
}

interface ChartSpec {
  id: string;
  title: string;
  unit: string;
  lines: LineSpec[];
  range?: [number, number];
}

function summaryText(lines: LineSpec[], unit: string): string {
  return lines
    .map((l) => {
      const v = l.values.filter((x): x is number => x !== null);
      if (v.length === 0) return `${l.label}: no values`;
      let lo = Infinity;
      let hi = -Infinity;
      for (const x of v) {
        if (x < lo) lo = x;
        if (x > hi) hi = x;
      }
      return `${l.label}: ${v.length} values from ${Math.round(lo * 10) / 10} to ${Math.round(hi * 10) / 10} ${unit}`;
    })
    .join('; ');
}

function Chart({ spec, time, theme }: { spec: ChartSpec; time: number[]; theme: string }) {
  const box = useRef<HTMLDivElement>(null);
  useUPlot(
    box,
    (UPlot, c) => ({
      opts: {
        // Times are UTC, as stored; uPlot would otherwise label in the browser's zone.
        tzDate: (ts) => UPlot.tzDate(new Date(ts * 1000), 'Etc/UTC'),
        scales: { x: { time: true }, y: spec.range ? { range: spec.range } : {} },
        axes: [{ ...plotAxis(c), values: utcTickLabels, size: 50 }, { ...plotAxis(c), label: spec.unit, size: 60 }],
        series: [
          { label: 'Time (UTC)' },
          ...spec.lines.map((l) => ({
            label: l.label,
            stroke: theme === 'red' ? c.text : l.colour,
            width: 1.5,
            spanGaps: false,
            points: { show: false },
            ...(l.dash ? { dash: l.dash } : {}),
          })),
        ],
      },
      data: [time, ...spec.lines.map((l) => l.values)] as uPlot.AlignedData,
    }),
    [spec, time, theme],
  );
  return (
    <figure className="review-chart" data-testid={`chart-${spec.id}`}>
      <figcaption>{spec.title}</figcaption>
      <div ref={box} className="review-chart-canvas" />
      <p className="sr-only review-chart-summary">{summaryText(spec.lines, spec.unit)}</p>
    </figure>
  );
}

export function ReviewCharts({ series }: { series: ReviewSeries }) {
  const mode = useThemeStore((s) => s.mode);
  const autoTheme = useThemeStore((s) => s.autoTheme);
  const theme = effectiveTheme({ mode, autoTheme });
  const specs = useMemo((): ChartSpec[] => [
    { id: 'concentration', title: 'Total concentration', unit: 'tenths', range: [0, 10], lines: [{ label: 'Total concentration', values: series.totalConcentration, colour: '#0b5cad' }] },
    {
      id: 'thickness', title: 'Mean ice thickness (weighted by concentration)', unit: 'cm',
      lines: [
        { label: 'Level ice', values: series.levelThicknessCm, colour: '#1b6e35' },
        { label: 'With ridges (estimate)', values: series.thicknessWithRidgesCm, colour: '#8a5a00', dash: [6, 4] },
      ],
    },
    { id: 'rio', title: 'POLARIS RIO (decision support only)', unit: 'RIO', lines: [{ label: 'RIO', values: series.rio, colour: '#b00020' }] },
    {
      id: 'temperature', title: 'Air and water temperature', unit: '°C',
      lines: [
        { label: 'Air', values: series.airTempC, colour: '#6a3d9a' },
        { label: 'Water', values: series.waterTempC, colour: '#0b7a8a', dash: [6, 4] },
      ],
    },
  ], [series]);
  const gaps = series.observationId.filter((id) => id === null).length;
  return (
    <section aria-labelledby="review-charts-title" className="review-section">
      <h3 id="review-charts-title">Through the cruise</h3>
      <p className="muted small">Times in UTC. Breaks in the lines are the {gaps} gaps between observations.</p>
      <div className="review-charts">
        {specs.map((s) => (
          <Chart key={s.id} spec={s} time={series.time} theme={theme} />
        ))}
      </div>
    </section>
  );
}
