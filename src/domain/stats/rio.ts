// POLARIS RIO for many observations at once. polarisForObservation (polaris.ts) builds the full
// result with its notes and cautions for the bridge, a few microseconds an observation; for a
// review of tens of thousands of observations only the number and the outcome are needed. This
// follows polarisForObservation's rules exactly (same shares, same mapping of stages through
// polarisIceType, same rounding) with the ice type of each (stage, thickness) remembered;
// test/domain/stats-rio.test.ts checks it equals polarisForObservation on the demo cruise and on
// random observations.
import type { Observation, StageKey, VesselIceClass } from '../model.ts';
import { outcomeFor, polarisIceType, riskIndexValue, type PolarisIceType, type PolarisOutcome } from '../polaris.ts';

type RioObservation = Pick<Observation, 'totalConcentration' | 'categories'> & Partial<Pick<Observation, 'remainingStage'>>;

const typeMemo = new Map<StageKey, Map<number | undefined, PolarisIceType>>();

function iceTypeOf(stage: StageKey, thicknessCm: number | undefined): PolarisIceType {
  let byThickness = typeMemo.get(stage);
  if (!byThickness) {
    byThickness = new Map();
    typeMemo.set(stage, byThickness);
  }
  const t = thicknessCm !== undefined && Number.isFinite(thicknessCm) ? thicknessCm : undefined;
  let type = byThickness.get(t);
  if (type === undefined) {
    type = polarisIceType(stage, t).iceType;
    // Thickness typed by people takes few distinct values; keep the memo bounded anyway.
    if (byThickness.size < 5000) byThickness.set(t, type);
  }
  return type;
}

const round = (v: number): number => Math.round(v * 1e6) / 1e6;

export interface RioOnly {
  rio: number;
  outcome: PolarisOutcome;
}

/** RIO and outcome of an observation, or null where polarisForObservation gives an error. */
export function rioForObservation(obs: RioObservation, iceClass: VesselIceClass): RioOnly | null {
  const cats = obs.categories;
  const total = obs.totalConcentration;
  if (total === null && cats.length === 0) return null;
  // Written out without closures: this runs once per observation of a whole cruise.
  let sum = 0;
  let acc = 0;
  // One category without Sd takes the total; with Sd the rest of the total is Sd's (polaris.ts).
  if (cats.length === 1 && !obs.remainingStage) {
    const c = cats[0]!;
    const tenths = total ?? c.partialConcentration;
    if (!Number.isFinite(tenths) || tenths < 0) return null;
    sum = tenths;
    acc = tenths * riskIndexValue(iceClass, iceTypeOf(c.stage, c.thicknessCm));
  } else {
    let worst = Number.POSITIVE_INFINITY;
    for (const c of cats) {
      const tenths = c.partialConcentration;
      if (!Number.isFinite(tenths) || tenths < 0) return null;
      const r = riskIndexValue(iceClass, iceTypeOf(c.stage, c.thicknessCm));
      sum += tenths;
      acc += tenths * r;
      if (r < worst) worst = r;
    }
    const unassigned = total === null ? 0 : total - sum;
    if (unassigned > 0) {
      let r: number;
      if (obs.remainingStage) r = riskIndexValue(iceClass, iceTypeOf(obs.remainingStage, undefined));
      else if (cats.length > 0) r = worst;
      else r = riskIndexValue(iceClass, iceTypeOf('undetermined', undefined));
      sum += unassigned;
      acc += unassigned * r;
    }
  }
  if (sum > 10 + 1e-9) return null;
  const rest = round(10 - sum);
  if (rest > 0) acc += rest * riskIndexValue(iceClass, 'ice-free');
  const rio = round(acc);
  return { rio, outcome: outcomeFor(iceClass, rio) };
}
