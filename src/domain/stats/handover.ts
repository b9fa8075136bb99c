// Watch handovers: where one observer's observation is followed by another observer's, within
// the attribution cap (so a gap is not a handover), the ice has had only one interval to change.
// The mean difference (incoming minus outgoing) per observer pair shows whether one observer
// reads concentration or thickness differently from the others; the same figure between
// consecutive observations of the same observer is the baseline of how much the ice changes in
// one interval anyway.
import type { Observation } from '../model.ts';

export interface DifferenceStats {
  /** Pairs with the figure on both sides. */
  count: number;
  /** Mean of (later - earlier); null when count is 0. */
  meanDiff: number | null;
  /** Mean of |later - earlier|. */
  meanAbsDiff: number | null;
}

export interface HandoverPair {
  fromObserverId: string;
  toObserverId: string;
  handovers: number;
  /** Total concentration, tenths. */
  concentration: DifferenceStats;
  /** Concentration-weighted level-ice thickness, cm. */
  thicknessCm: DifferenceStats;
}

export interface ObserverOffset {
  observerId: string;
  handovers: number;
  /** Mean of (this observer's reading - the other observer's) over handovers in either direction. */
  concentration: DifferenceStats;
  thicknessCm: DifferenceStats;
}

export interface HandoverTable {
  pairs: HandoverPair[];
  observers: ObserverOffset[];
  /** Consecutive observations of the same observer within the cap: the natural change. */
  sameObserver: { pairs: number; concentration: DifferenceStats; thicknessCm: DifferenceStats };
}

class Diff {
  private n = 0;
  private sum = 0;
  private abs = 0;
  add(d: number, sign: 1 | -1): void {
    this.n += sign;
    this.sum += sign * d;
    this.abs += sign * Math.abs(d);
  }
  result(): DifferenceStats {
    return { count: this.n, meanDiff: this.n ? this.sum / this.n : null, meanAbsDiff: this.n ? this.abs / this.n : null };
  }
}

interface Acc {
  count: number;
  conc: Diff;
  thick: Diff;
}
const acc = (): Acc => ({ count: 0, conc: new Diff(), thick: new Diff() });

export class HandoverBuilder {
  // Keyed by outgoing then incoming observer: no key string built per pair.
  private readonly pairs = new Map<string, Map<string, Acc & { from: string; to: string }>>();
  private readonly offsets = new Map<string, Acc>();
  private readonly same = acc();

  /**
   * Adds a consecutive pair of observations a (earlier) and b, with each one's level thickness.
   * Call only for pairs closer in time than the attribution cap. With sign -1 a pair added before
   * is taken back (the incremental review).
   */
  add(a: Observation, ta: number | null, b: Observation, tb: number | null, sign: 1 | -1 = 1): void {
    const ca = a.totalConcentration;
    const cb = b.totalConcentration;
    const dc = ca !== null && cb !== null ? cb - ca : null;
    const dt = ta !== null && tb !== null ? tb - ta : null;
    if (a.observerId === b.observerId) {
      this.same.count += sign;
      if (dc !== null) this.same.conc.add(dc, sign);
      if (dt !== null) this.same.thick.add(dt, sign);
      return;
    }
    let byTo = this.pairs.get(a.observerId);
    if (!byTo) {
      byTo = new Map();
      this.pairs.set(a.observerId, byTo);
    }
    let p = byTo.get(b.observerId);
    if (!p) {
      p = { ...acc(), from: a.observerId, to: b.observerId };
      byTo.set(b.observerId, p);
    }
    p.count += sign;
    if (dc !== null) p.conc.add(dc, sign);
    if (dt !== null) p.thick.add(dt, sign);
    if (p.count === 0) byTo.delete(b.observerId);
    // Each side's offset: own reading minus the other's.
    this.offset(b.observerId, 1, dc, dt, sign);
    this.offset(a.observerId, -1, dc, dt, sign);
  }

  private offset(id: string, side: 1 | -1, dc: number | null, dt: number | null, sign: 1 | -1): void {
    let o = this.offsets.get(id);
    if (!o) {
      o = acc();
      this.offsets.set(id, o);
    }
    o.count += sign;
    if (dc !== null) o.conc.add(side * dc, sign);
    if (dt !== null) o.thick.add(side * dt, sign);
    if (o.count === 0) this.offsets.delete(id);
  }

  result(): HandoverTable {
    const pairs = [...this.pairs.values()]
      .flatMap((byTo) => [...byTo.values()])
      .map((p) => ({ fromObserverId: p.from, toObserverId: p.to, handovers: p.count, concentration: p.conc.result(), thicknessCm: p.thick.result() }))
      .sort((x, y) => y.handovers - x.handovers || x.fromObserverId.localeCompare(y.fromObserverId) || x.toObserverId.localeCompare(y.toObserverId));
    const observers = [...this.offsets.entries()]
      .map(([observerId, o]) => ({ observerId, handovers: o.count, concentration: o.conc.result(), thicknessCm: o.thick.result() }))
      .sort((x, y) => x.observerId.localeCompare(y.observerId));
    return {
      pairs,
      observers,
      sameObserver: { pairs: this.same.count, concentration: this.same.conc.result(), thicknessCm: this.same.thick.result() },
    };
  }
}
