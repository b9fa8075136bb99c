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

/** Below this a summed weight (tenths) is a rounding residue, not ice. */
const WEIGHT_EPSILON = 1e-9;

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

  /** Observations pooled so far. */
  get count(): number {
    return this.n;
  }

  /** Adds an observation, or with sign -1 takes back one added before (the incremental review). */
  add(obs: Observation, f: ObservationFigures, sign: 1 | -1 = 1): void {
    this.n += sign;
    const c = obs.totalConcentration;
    if (c !== null && Number.isFinite(c)) {
      this.judged += sign;
      this.concSum += sign * c;
    }
    this.tSum += sign * f.thicknessWeightedSum;
    this.tW += sign * f.thicknessWeight;
    this.rtSum += sign * f.ridgedThicknessWeightedSum;
    this.rtW += sign * f.ridgedThicknessWeight;
    this.rSum += sign * f.ridgedWeightedSum;
    this.rW += sign * f.ridgedWeight;
    const cats = obs.categories;
    for (let k = 0; k < cats.length; k++) {
      const w = categoryWeight(obs, k);
      const i = w > 0 ? STAGE_INDEX.get((cats[k] as Observation['categories'][number]).stage) : undefined;
      if (i === undefined) continue;
      this.stageW[i] = (this.stageW[i] as number) + sign * w;
      this.stageTotal += sign * w;
    }
  }

  result(): IceFigures {
    const stageShares: StageShare[] = [];
    // Weights are tenths; what is left after taking observations back may be a rounding residue.
    if (this.stageTotal > WEIGHT_EPSILON) {
      STAGE_KEYS.forEach((stage, i) => {
        const w = this.stageW[i] as number;
        if (w > WEIGHT_EPSILON) stageShares.push({ stage, share: w / this.stageTotal });
      });
    }
    return {
      observations: this.n,
      judged: this.judged,
      meanConcentration: this.judged > 0 ? this.concSum / this.judged : null,
      meanThicknessCm: this.tW > WEIGHT_EPSILON ? this.tSum / this.tW : null,
      meanThicknessWithRidgesCm: this.rtW > WEIGHT_EPSILON ? this.rtSum / this.rtW : null,
      ridgedShare: this.rW > WEIGHT_EPSILON ? this.rSum / this.rW : null,
      stageShares,
    };
  }
}
