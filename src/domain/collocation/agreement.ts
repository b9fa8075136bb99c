// How well the observed total concentration agrees with a chart or a grid: differences observed
// minus product, in tenths. Definitions (ours, stated in the Review and the CLI help):
// - mean difference: the average of observed - product (positive: the observer saw more ice);
// - RMS difference: the square root of the mean squared difference;
// - within 1/10 (2/10): the share of pairs with |observed - product| <= 1 (<= 2) tenths.
import type { IsoUtc, Observation } from '../model.ts';
import { ICE_REGIMES, iceRegime, type IceRegime } from '../stats/regimes.ts';
import { gridTenths, type Collocation, type GridMethod } from './collocate.ts';

export interface AgreementPair {
  observationId: string;
  time: IsoUtc;
  observerId: string;
  observed: number;
  product: number;
  /** observed - product, tenths. */
  difference: number;
}

export interface AgreementFigures {
  count: number;
  meanDifference: number | null;
  rmsDifference: number | null;
  within1Share: number | null;
  within2Share: number | null;
}

export interface Agreement {
  overall: AgreementFigures;
  /** By the ice regime of the observed total concentration. */
  byRegime: Record<IceRegime, AgreementFigures>;
  byObserver: Record<string, AgreementFigures>;
  /** The pairs with the largest |difference|, largest first (ties: earlier first). */
  largest: AgreementPair[];
}

// Rounding slack: grid values are fractions of a tenth.
const EPS = 1e-9;

export function agreementFigures(pairs: readonly AgreementPair[]): AgreementFigures {
  const n = pairs.length;
  if (n === 0) return { count: 0, meanDifference: null, rmsDifference: null, within1Share: null, within2Share: null };
  let sum = 0;
  let sq = 0;
  let w1 = 0;
  let w2 = 0;
  for (const p of pairs) {
    const d = p.difference;
    sum += d;
    sq += d * d;
    if (Math.abs(d) <= 1 + EPS) w1++;
    if (Math.abs(d) <= 2 + EPS) w2++;
  }
  return { count: n, meanDifference: sum / n, rmsDifference: Math.sqrt(sq / n), within1Share: w1 / n, within2Share: w2 / n };
}

export function agreement(pairs: readonly AgreementPair[], largestCount = 10): Agreement {
  const byRegimeLists = Object.fromEntries(ICE_REGIMES.map((r) => [r, [] as AgreementPair[]])) as Record<IceRegime, AgreementPair[]>;
  const byObserverLists = new Map<string, AgreementPair[]>();
  for (const p of pairs) {
    byRegimeLists[iceRegime(p.observed)].push(p);
    const l = byObserverLists.get(p.observerId) ?? [];
    l.push(p);
    byObserverLists.set(p.observerId, l);
  }
  const largest = [...pairs].sort((a, b) => Math.abs(b.difference) - Math.abs(a.difference) || (a.time < b.time ? -1 : a.time > b.time ? 1 : 0)).slice(0, largestCount);
  return {
    overall: agreementFigures(pairs),
    byRegime: Object.fromEntries(ICE_REGIMES.map((r) => [r, agreementFigures(byRegimeLists[r])])) as Record<IceRegime, AgreementFigures>,
    byObserver: Object.fromEntries([...byObserverLists].sort(([a], [b]) => a.localeCompare(b)).map(([k, l]) => [k, agreementFigures(l)])),
    largest,
  };
}

type Obs = Pick<Observation, 'id' | 'time' | 'observerId' | 'totalConcentration' | 'deleted'>;

function pairsOf(observations: readonly Obs[], product: (o: Obs) => number | null): AgreementPair[] {
  const out: AgreementPair[] = [];
  for (const o of observations) {
    if (o.deleted || o.totalConcentration === null) continue;
    const p = product(o);
    if (p === null) continue;
    out.push({ observationId: o.id, time: o.time, observerId: o.observerId, observed: o.totalConcentration, product: p, difference: o.totalConcentration - p });
  }
  return out;
}

/** Observed against the chart's CT (the middle of a range code), where both are known. */
export function chartPairs(observations: readonly Obs[], coll: ReadonlyMap<string, Collocation>): AgreementPair[] {
  return pairsOf(observations, (o) => coll.get(o.id)?.chart?.concentration?.tenths ?? null);
}

/** Observed against the grid value (percent / 10) by the chosen method, where both are known. */
export function gridPairs(observations: readonly Obs[], coll: ReadonlyMap<string, Collocation>, method: GridMethod): AgreementPair[] {
  return pairsOf(observations, (o) => gridTenths(coll.get(o.id)?.grid ?? null, method));
}
