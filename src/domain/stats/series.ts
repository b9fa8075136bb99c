// Time series for the review charts, in the column layout uPlot takes: one array of times (Unix
// seconds) and one array per figure, with null where a value is missing. Where two consecutive
// observations are further apart than the attribution cap, a row of nulls is put at the end of
// the earlier observation's attributed time, so every chart shows the gap as a break in the line.

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

export interface SeriesRow {
  timeMs: number;
  id: string;
  totalConcentration: number | null;
  levelThicknessCm: number | null;
  thicknessWithRidgesCm: number | null;
  rio: number | null;
  airTempC: number | null;
  waterTempC: number | null;
}

export class SeriesBuilder {
  readonly series: ReviewSeries = {
    time: [], totalConcentration: [], levelThicknessCm: [], thicknessWithRidgesCm: [], rio: [], airTempC: [], waterTempC: [], observationId: [],
  };
  private lastMs: number | null = null;

  constructor(private readonly capMs: number) {}

  add(r: SeriesRow): void {
    if (this.lastMs !== null && r.timeMs - this.lastMs > this.capMs) this.push((this.lastMs + this.capMs) / 1000, null, null);
    this.push(r.timeMs / 1000, r, r.id);
    this.lastMs = r.timeMs;
  }

  private push(t: number, r: SeriesRow | null, id: string | null): void {
    const s = this.series;
    s.time.push(t);
    s.totalConcentration.push(r ? r.totalConcentration : null);
    s.levelThicknessCm.push(r ? r.levelThicknessCm : null);
    s.thicknessWithRidgesCm.push(r ? r.thicknessWithRidgesCm : null);
    s.rio.push(r ? r.rio : null);
    s.airTempC.push(r ? r.airTempC : null);
    s.waterTempC.push(r ? r.waterTempC : null);
    s.observationId.push(id);
  }
}
