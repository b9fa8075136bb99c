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
