// Pooled ice figures over a set of observations: the whole cruise, a latitude band, an observer.
// Each observation counts once; within it, categories weigh by (partial) concentration, so a
// mean thickness is the mean over every tenth of ice seen, not a mean of observation means.
import { STAGE_KEYS, type Observation, type StageKey } from '../model.ts';
import { categoryWeight, type ObservationFigures } from './observationFigures.ts';

export interface StageShare {
  stage: StageKey;
  /** Share of the ice (all categories' weights), 0..1. */
  share: number;
}

export interface IceFigures {
  observations: number;
  /** Observations with a total concentration judged. */
  judged: number;
  /** Mean total concentration in tenths over the judged observations; null if none. */
  meanConcentration: number | null;
  /** Concentration-weighted mean level-ice thickness (cm). */
  meanThicknessCm: number | null;
  /** The same with the ridge estimate (cm); null when no category allowed an estimate. */
  meanThicknessWithRidgesCm: number | null;
  /** Ridged share of the ice area (0..1) over categories with a ridged share recorded. */
  ridgedShare: number | null;
  /** Stage shares, thinnest stage first (the order of STAGE_KEYS); only stages seen. */
  stageShares: StageShare[];
}

const STAGE_INDEX: ReadonlyMap<StageKey, number> = new Map(STAGE_KEYS.map((k, i) => [k, i]));

export class IcePool {
  private n = 0;
  private judged = 0;
  private concSum = 0;
  private tSum = 0;
  private tW = 0;
  private rtSum = 0;
  private rtW = 0;
  private rSum = 0;
  private rW = 0;
  private readonly stageW = new Float64Array(STAGE_KEYS.length);
  private stageTotal = 0;

  add(obs: Observation, f: ObservationFigures): void {
    this.n++;
    const c = obs.totalConcentration;
    if (c !== null && Number.isFinite(c)) {
      this.judged++;
      this.concSum += c;
    }
    this.tSum += f.thicknessWeightedSum;
    this.tW += f.thicknessWeight;
    this.rtSum += f.ridgedThicknessWeightedSum;
    this.rtW += f.ridgedThicknessWeight;
    this.rSum += f.ridgedWeightedSum;
    this.rW += f.ridgedWeight;
    const cats = obs.categories;
    for (let k = 0; k < cats.length; k++) {
      const w = categoryWeight(obs, k);
      const i = w > 0 ? STAGE_INDEX.get((cats[k] as Observation['categories'][number]).stage) : undefined;
      if (i === undefined) continue;
      this.stageW[i] = (this.stageW[i] as number) + w;
      this.stageTotal += w;
    }
  }

  result(): IceFigures {
    const stageShares: StageShare[] = [];
    if (this.stageTotal > 0) {
      STAGE_KEYS.forEach((stage, i) => {
        const w = this.stageW[i] as number;
        if (w > 0) stageShares.push({ stage, share: w / this.stageTotal });
      });
    }
    return {
      observations: this.n,
      judged: this.judged,
      meanConcentration: this.judged > 0 ? this.concSum / this.judged : null,
      meanThicknessCm: this.tW > 0 ? this.tSum / this.tW : null,
      meanThicknessWithRidgesCm: this.rtW > 0 ? this.rtSum / this.rtW : null,
      ridgedShare: this.rW > 0 ? this.rSum / this.rW : null,
      stageShares,
    };
  }
}
