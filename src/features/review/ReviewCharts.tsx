// Time-series charts of the cruise (uPlot): total concentration, thickness, RIO and temperatures
// against UTC time. The series carry a null row at every gap (src/domain/stats/series.ts), and
// uPlot breaks the line at nulls, so gaps show as breaks.
import { useEffect, useMemo, useRef } from 'react';
import type uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { ReviewSeries } from '../../domain/stats';
import { useThemeStore, effectiveTheme } from '../../state/theme';

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

/** Canvas drawing needs a real browser; the component tests run in jsdom, which has none. */
function canDraw(): boolean {
  return typeof window !== 'undefined' && typeof window.matchMedia === 'function' && !/jsdom/i.test(navigator.userAgent);
}

/** Chart width in CSS pixels on an A4 or Letter page with the usual margins. */
const PRINT_WIDTH = 680;

/** Tick labels in UTC, 24-hour: "03-10 06:00" (the day only at midnight ticks). */
function utcTickLabels(_u: uPlot, splits: number[]): string[] {
  return splits.map((ts) => {
    const iso = new Date(ts * 1000).toISOString();
    const hm = iso.slice(11, 16);
    return hm === '00:00' ? iso.slice(5, 10) : hm;
  });
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
  useEffect(() => {
    const el = box.current;
    if (!el || !canDraw()) return;
    const width = Math.max(320, Math.min(1100, el.clientWidth || 800));
    // A printed page is narrower than the screen: redraw at the page's width while printing.
    const print = window.matchMedia('print');
    let plot: uPlot | null = null;
    let cancelled = false;
    const fitTo = (printing: boolean): void => {
      plot?.setSize({ width: printing ? PRINT_WIDTH : width, height: 200 });
    };
    const onPrint = (e: MediaQueryListEvent): void => fitTo(e.matches);
    print.addEventListener('change', onPrint);
    // uPlot reads matchMedia when it loads, so it is loaded only where it can draw (and it stays
    // out of the first bundle).
    void import('uplot').then(({ default: UPlot }) => {
      if (cancelled) return;
      const css = getComputedStyle(document.documentElement);
      const text = css.getPropertyValue('--text').trim() || '#000';
      const grid = css.getPropertyValue('--border').trim() || '#ccc';
      const axis = { stroke: text, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid } };
      const opts: uPlot.Options = {
        width,
        height: 200,
        // Times are UTC, as stored; uPlot would otherwise label in the browser's zone.
        tzDate: (ts) => UPlot.tzDate(new Date(ts * 1000), 'Etc/UTC'),
        scales: { x: { time: true }, y: spec.range ? { range: spec.range } : {} },
        axes: [{ ...axis, values: utcTickLabels, size: 50 }, { ...axis, label: spec.unit, size: 60 }],
        series: [
          { label: 'Time (UTC)' },
          ...spec.lines.map((l) => ({
            label: l.label,
            stroke: theme === 'red' ? text : l.colour,
            width: 1.5,
            spanGaps: false,
            points: { show: false },
            ...(l.dash ? { dash: l.dash } : {}),
          })),
        ],
      };
      plot = new UPlot(opts, [time, ...spec.lines.map((l) => l.values)] as uPlot.AlignedData, el);
      fitTo(print.matches);
    });
    return () => {
      print.removeEventListener('change', onPrint);
      cancelled = true;
      plot?.destroy();
    };
  }, [spec, time, theme]);
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
