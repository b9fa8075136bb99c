// Shared pieces for benchmark suites: timing, repetition and the result table.

export interface BenchRow {
  /** What was measured, e.g. "save one observation (median)". */
  figure: string;
  value: number;
  /** What the same work costs done the bare way, measured in the same run. */
  baseline: number | null;
  unit: string;
  /** value / baseline; null when there is no baseline (absolute figures). */
  ratio: number | null;
  /** Human-readable target, e.g. "<= 1.5x" or "<= 450 KB". */
  target: string;
  /** Whether the figure meets its target. */
  met: boolean;
}

export interface BenchSuite {
  name: string;
  run: () => Promise<BenchRow[]>;
}

export function ratioRow(figure: string, value: number, baseline: number, unit: string, maxRatio: number): BenchRow {
  const ratio = baseline > 0 ? value / baseline : Number.POSITIVE_INFINITY;
  return { figure, value, baseline, unit, ratio, target: `<= ${maxRatio}x`, met: ratio <= maxRatio };
}

export function absoluteRow(figure: string, value: number, unit: string, max: number): BenchRow {
  return { figure, value, baseline: null, unit, ratio: null, target: `<= ${max} ${unit}`, met: value <= max };
}

/** A figure beside a floor or a reference, shown for reading the others: it has no target. */
export function contextRow(figure: string, value: number, baseline: number, unit: string): BenchRow {
  return { figure, value, baseline, unit, ratio: baseline > 0 ? value / baseline : null, target: 'context', met: true };
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length === 0 ? NaN : s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

/** Runs `fn` `n` times after `warmup` runs and returns each run's milliseconds. */
export async function timeRuns(fn: () => unknown, n: number, warmup = 2): Promise<number[]> {
  for (let i = 0; i < warmup; i++) await fn();
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    await fn();
    out.push(performance.now() - t0);
  }
  return out;
}

/**
 * Times the subject and its baseline interleaved (A B A B ...) so that machine noise hits both
 * alike, and returns the medians.
 */
export async function compare(
  subject: () => unknown,
  baseline: () => unknown,
  n: number,
): Promise<{ subject: number; baseline: number }> {
  const a: number[] = [];
  const b: number[] = [];
  for (let i = 0; i < n; i++) {
    a.push(...(await timeRuns(subject, 1, i === 0 ? 1 : 0)));
    b.push(...(await timeRuns(baseline, 1, i === 0 ? 1 : 0)));
  }
  return { subject: median(a), baseline: median(b) };
}

function fmt(x: number | null): string {
  if (x === null) return '-';
  if (!Number.isFinite(x)) return String(x);
  return Math.abs(x) >= 100 ? x.toFixed(0) : Math.abs(x) >= 1 ? x.toFixed(2) : x.toPrecision(3);
}

export function formatTable(rows: BenchRow[]): string {
  const head = ['figure', 'value', 'baseline', 'unit', 'ratio', 'target', 'met'];
  const body = rows.map((r) => [r.figure, fmt(r.value), fmt(r.baseline), r.unit, r.ratio === null ? '-' : `${fmt(r.ratio)}x`, r.target, r.target === 'context' ? '-' : r.met ? 'yes' : 'NO']);
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((row) => (row[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i] ?? 0)).join('  ');
  return [line(head), line(widths.map((w) => '-'.repeat(w))), ...body.map(line)].join('\n');
}
