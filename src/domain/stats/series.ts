// Time series for the review charts, in the column layout uPlot takes: one array of times (Unix
// seconds) and one array per figure, with null where a value is missing. Where two consecutive
// observations are further apart than the attribution cap, a row of nulls is put at the end of
// the earlier observation's attributed time, so every chart shows the gap as a break in the line.
import type { Observation } from '../model.ts';
import type { ObservationFigures } from './observationFigures.ts';

export interface ReviewSeries {
  /** Unix seconds. */
  time: number[];
  totalConcentration: (number | null)[];
  levelThicknessCm: (number | null)[];
  thicknessWithRidgesCm: (number | null)[];
  rio: (number | null)[];
  airTempC: (number | null)[];
  waterTempC: (number | null)[];
  /** Observation id per row; null for the gap rows. */
  observationId: (string | null)[];
}

export class SeriesBuilder {
  readonly series: ReviewSeries = {
    time: [], totalConcentration: [], levelThicknessCm: [], thicknessWithRidgesCm: [], rio: [], airTempC: [], waterTempC: [], observationId: [],
  };
  private lastMs: number | null = null;

  constructor(private readonly capMs: number) {}

  add(timeMs: number, o: Observation, f: ObservationFigures): void {
    const s = this.series;
    if (this.lastMs !== null && timeMs - this.lastMs > this.capMs) {
      s.time.push((this.lastMs + this.capMs) / 1000);
      s.totalConcentration.push(null);
      s.levelThicknessCm.push(null);
      s.thicknessWithRidgesCm.push(null);
      s.rio.push(null);
      s.airTempC.push(null);
      s.waterTempC.push(null);
      s.observationId.push(null);
    }
    s.time.push(timeMs / 1000);
    s.totalConcentration.push(o.totalConcentration);
    s.levelThicknessCm.push(f.levelThicknessCm);
    s.thicknessWithRidgesCm.push(f.ridgedThicknessCm);
    s.rio.push(f.rio);
    s.airTempC.push(o.weather?.airTempC ?? null);
    s.waterTempC.push(o.weather?.waterTempC ?? null);
    s.observationId.push(o.id);
    this.lastMs = timeMs;
  }
}

/**
 * The same columns as typed arrays (NaN where a value is missing), built in one go from the rows
 * and handed from a worker to the page without a copy. `gapRow` is 1 on the null rows at gaps.
 */
export interface PackedSeries {
  time: Float64Array;
  totalConcentration: Float64Array;
  levelThicknessCm: Float64Array;
  thicknessWithRidgesCm: Float64Array;
  rio: Float64Array;
  airTempC: Float64Array;
  waterTempC: Float64Array;
  gapRow: Uint8Array;
  /** Observation ids of the rows that are not gap rows, in order. */
  observationIds: string[];
}

export const PACKED_SERIES_COLUMNS = ['time', 'totalConcentration', 'levelThicknessCm', 'thicknessWithRidgesCm', 'rio', 'airTempC', 'waterTempC'] as const;

/** One row of the series: an observation's time (ms) and figures. */
export interface SeriesRow {
  t: number;
  o: Observation;
  fig: ObservationFigures;
}

const orNaN = (v: number | null | undefined): number => (v === null || v === undefined ? Number.NaN : v);

/** Packs rows in time order, with a gap row wherever consecutive rows are more than capMs apart. */
export function packSeries(rows: readonly SeriesRow[], capMs: number): PackedSeries {
  let gaps = 0;
  for (let i = 1; i < rows.length; i++) if ((rows[i] as SeriesRow).t - (rows[i - 1] as SeriesRow).t > capMs) gaps++;
  const n = rows.length + gaps;
  const p: PackedSeries = {
    time: new Float64Array(n), totalConcentration: new Float64Array(n), levelThicknessCm: new Float64Array(n),
    thicknessWithRidgesCm: new Float64Array(n), rio: new Float64Array(n), airTempC: new Float64Array(n),
    waterTempC: new Float64Array(n), gapRow: new Uint8Array(n), observationIds: new Array<string>(rows.length),
  };
  let k = 0;
  for (let i = 0; i < rows.length; i++) {
    const { t, o, fig } = rows[i] as SeriesRow;
    if (i > 0) {
      const lastMs = (rows[i - 1] as SeriesRow).t;
      if (t - lastMs > capMs) {
        p.time[k] = (lastMs + capMs) / 1000;
        for (const c of PACKED_SERIES_COLUMNS) if (c !== 'time') p[c][k] = Number.NaN;
        p.gapRow[k] = 1;
        k++;
      }
    }
    p.time[k] = t / 1000;
    p.totalConcentration[k] = orNaN(o.totalConcentration);
    p.levelThicknessCm[k] = orNaN(fig.levelThicknessCm);
    p.thicknessWithRidgesCm[k] = orNaN(fig.ridgedThicknessCm);
    p.rio[k] = orNaN(fig.rio);
    p.airTempC[k] = orNaN(o.weather?.airTempC);
    p.waterTempC[k] = orNaN(o.weather?.waterTempC);
    p.observationIds[i] = o.id;
    k++;
  }
  return p;
}

const nullIfNaN = (col: Float64Array): (number | null)[] => {
  const out = new Array<number | null>(col.length);
  for (let i = 0; i < col.length; i++) {
    const v = col[i] as number;
    out[i] = Number.isNaN(v) ? null : v;
  }
  return out;
};

/** The packed columns back in the layout the charts take (null for missing values). */
export function unpackSeries(p: PackedSeries): ReviewSeries {
  const ids = new Array<string | null>(p.time.length);
  let j = 0;
  for (let i = 0; i < ids.length; i++) ids[i] = p.gapRow[i] === 1 ? null : (p.observationIds[j++] as string);
  return {
    time: Array.from(p.time),
    totalConcentration: nullIfNaN(p.totalConcentration),
    levelThicknessCm: nullIfNaN(p.levelThicknessCm),
    thicknessWithRidgesCm: nullIfNaN(p.thicknessWithRidgesCm),
    rio: nullIfNaN(p.rio),
    airTempC: nullIfNaN(p.airTempC),
    waterTempC: nullIfNaN(p.waterTempC),
    observationId: ids,
  };
}
