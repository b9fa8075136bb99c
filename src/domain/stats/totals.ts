// The sums behind the review's figures, kept so that each observation's share can be added and
// taken back again: the full pass (review.ts) adds every observation once, the incremental review
// (ledger.ts) takes back the shares an edit changes and adds the new ones. Both then read the
// same figures through `summary()`.
import { METRES_PER_NM } from '../geodesy.ts';
import type { Cruise, IsoUtc, Observation, Observer } from '../model.ts';
import { POLARIS_OUTCOME_LABELS, type PolarisOutcome } from '../polaris.ts';
import type { ObservationGap } from './attribution.ts';
import { LatitudeBandBuilder } from './bands.ts';
import type { DistanceTimeline } from './distanceTimeline.ts';
import { HandoverBuilder } from './handover.ts';
import { IcePool, type IceFigures } from './icePool.ts';
import type { ObservationFigures } from './observationFigures.ts';
import { ICE_REGIMES, ICE_REGIME_LABELS, iceRegime, isInIce, type IceRegime } from './regimes.ts';

export const POLARIS_OUTCOMES: readonly PolarisOutcome[] = ['normal', 'elevated', 'special'];

export interface TimeAndDistance {
  hours: number;
  distanceNm: number;
  observations: number;
}

export interface ObserverSummary extends TimeAndDistance {
  observerId: string;
  name: string;
  initials: string;
}

export interface RegimeSummary extends TimeAndDistance {
  regime: IceRegime;
  label: string;
}

export interface OutcomeSummary extends TimeAndDistance {
  outcome: PolarisOutcome;
  label: string;
}

export interface CruiseSummary {
  /** Observations the figures are about (after `include`). */
  observations: number;
  firstTime: IsoUtc | null;
  lastTime: IsoUtc | null;
  /** From the first to the last observation of the whole cruise, hours. */
  spanHours: number;
  /** Hours the included observations stand for. */
  observedHours: number;
  /** Hours of the whole cruise no observation stands for (the gaps). */
  unobservedHours: number;
  gaps: ObservationGap[];
  observers: ObserverSummary[];
  distanceSource: DistanceTimeline['source'];
  /** Distance sailed over the whole track (or between the observation positions), nm. */
  sailedNm: number;
  /** Distance sailed while no observation stood for the time (gaps, before and after), nm. */
  unobservedNm: number;
  inIce: TimeAndDistance;
  marginal: TimeAndDistance;
  pack: TimeAndDistance;
  regimes: RegimeSummary[];
  ice: IceFigures;
  polaris: {
    iceClass: Cruise['iceClass'];
    /** Observations with a RIO. */
    assessed: number;
    minRio: number | null;
    minRioObservationId: string | null;
    minRioTime: IsoUtc | null;
    meanRio: number | null;
    outcomes: OutcomeSummary[];
    /** Time of observations with no RIO (nothing to assess). */
    notAssessed: TimeAndDistance;
  };
}

const HOUR_MS = 3_600_000;
const tad = (): TimeAndDistance => ({ hours: 0, distanceNm: 0, observations: 0 });

function addTo(t: TimeAndDistance, hours: number, nm: number, sign: 1 | -1): void {
  t.hours += sign * hours;
  t.distanceNm += sign * nm;
  t.observations += sign;
}

const observerName = (observers: readonly Observer[], id: string): Observer =>
  observers.find((o) => o.id === id) ?? { id, name: `Unknown observer (${id.slice(0, 8)})`, initials: '?' };

/** What the summary needs beyond the sums: the ends of the cruise and the first lowest RIO. */
export interface SummaryFrame {
  first: Observation | undefined;
  last: Observation | undefined;
  firstMs: number;
  lastMs: number;
  timeline: DistanceTimeline;
  /** The earliest included observation whose RIO is `rio`. */
  firstWithRio: (rio: number) => Observation | null;
}

export class ReviewTotals {
  readonly pool = new IcePool();
  readonly bands = new LatitudeBandBuilder();
  readonly handover = new HandoverBuilder();
  private readonly regimes = new Map<IceRegime, TimeAndDistance>(ICE_REGIMES.map((r) => [r, tad()]));
  private readonly outcomes = new Map<PolarisOutcome, TimeAndDistance>(POLARIS_OUTCOMES.map((o) => [o, tad()]));
  private readonly notAssessed = tad();
  private readonly inIce = tad();
  private readonly perObserver = new Map<string, TimeAndDistance>();
  /** Keyed by the observation before the gap (each has at most one gap after it). */
  private readonly gaps = new Map<string, ObservationGap>();
  /** How many included observations have each RIO: the lowest is the smallest key. */
  private readonly rioCounts = new Map<number, number>();
  private included = 0;
  private observedHours = 0;
  private attributedNmAll = 0;
  private unobservedMs = 0;
  private rioSum = 0;
  private rioN = 0;

  constructor(private readonly cruise: Pick<Cruise, 'iceClass' | 'intervalMinutes' | 'observers'>) {}

  /** One observation's share: `hours` and `nm` it stands for, `included` by the filter. */
  node(o: Observation, fig: ObservationFigures, hours: number, nm: number, included: boolean, sign: 1 | -1): void {
    this.attributedNmAll += sign * nm;
    if (!included) return;
    this.included += sign;
    this.observedHours += sign * hours;
    const regime = iceRegime(o.totalConcentration);
    addTo(this.regimes.get(regime) as TimeAndDistance, hours, nm, sign);
    if (isInIce(regime)) addTo(this.inIce, hours, nm, sign);
    let who = this.perObserver.get(o.observerId);
    if (!who) {
      who = tad();
      this.perObserver.set(o.observerId, who);
    }
    addTo(who, hours, nm, sign);
    if (who.observations === 0) this.perObserver.delete(o.observerId);
    if (fig.rio !== null && fig.outcome !== null) {
      addTo(this.outcomes.get(fig.outcome) as TimeAndDistance, hours, nm, sign);
      this.rioSum += sign * fig.rio;
      this.rioN += sign;
      const c = (this.rioCounts.get(fig.rio) ?? 0) + sign;
      if (c === 0) this.rioCounts.delete(fig.rio);
      else this.rioCounts.set(fig.rio, c);
    } else {
      addTo(this.notAssessed, hours, nm, sign);
    }
    this.pool.add(o, fig, sign);
    this.bands.add(o, fig, hours, sign);
  }

  /**
   * The share of two consecutive observations (`a` before `b`, times in ms): a gap when they are
   * further apart than the cap, else a watch handover (or a same-observer pair).
   */
  pair(a: Observation, aMs: number, aLevel: number | null, b: Observation, bMs: number, bLevel: number | null, capMs: number, sign: 1 | -1): void {
    if (bMs - aMs > capMs) {
      this.unobservedMs += sign * (bMs - aMs - capMs);
      if (sign < 0) {
        this.gaps.delete(a.id);
      } else {
        const interval = this.cruise.intervalMinutes * 60_000;
        this.gaps.set(a.id, {
          beforeId: a.id, afterId: b.id, fromMs: aMs, toMs: bMs,
          missedObservations: Math.max(0, Math.round((bMs - aMs) / interval) - 1),
          unobservedHours: (bMs - aMs - capMs) / HOUR_MS,
        });
      }
    } else {
      this.handover.add(a, aLevel, b, bLevel, sign);
    }
  }

  summary(frame: SummaryFrame): CruiseSummary {
    const { cruise } = this;
    const { first, last, timeline } = frame;
    let minRio: number | null = null;
    for (const rio of this.rioCounts.keys()) if (minRio === null || rio < minRio) minRio = rio;
    const minObs = minRio === null ? null : frame.firstWithRio(minRio);
    const sailedNm = timeline.totalM / METRES_PER_NM;
    return {
      observations: this.included,
      firstTime: first?.time ?? null,
      lastTime: last?.time ?? null,
      spanHours: first && last ? (frame.lastMs - frame.firstMs) / HOUR_MS : 0,
      observedHours: this.observedHours,
      unobservedHours: this.unobservedMs / HOUR_MS,
      gaps: [...this.gaps.values()].sort((x, y) => x.fromMs - y.fromMs).map((g) => ({ ...g })),
      observers: [...this.perObserver.entries()]
        .map(([id, t]) => {
          const who = observerName(cruise.observers, id);
          return { observerId: id, name: who.name, initials: who.initials, ...t };
        })
        .sort((a, b) => b.observations - a.observations || a.name.localeCompare(b.name)),
      distanceSource: timeline.source,
      sailedNm,
      unobservedNm: Math.max(0, sailedNm - this.attributedNmAll),
      inIce: { ...this.inIce },
      marginal: { ...(this.regimes.get('marginal') as TimeAndDistance) },
      pack: { ...(this.regimes.get('pack') as TimeAndDistance) },
      regimes: ICE_REGIMES.map((regime) => ({ regime, label: ICE_REGIME_LABELS[regime], ...(this.regimes.get(regime) as TimeAndDistance) })),
      ice: this.pool.result(),
      polaris: {
        iceClass: cruise.iceClass,
        assessed: this.rioN,
        minRio,
        minRioObservationId: minObs?.id ?? null,
        minRioTime: minObs?.time ?? null,
        meanRio: this.rioN > 0 ? this.rioSum / this.rioN : null,
        outcomes: POLARIS_OUTCOMES.map((outcome) => ({ outcome, label: POLARIS_OUTCOME_LABELS[outcome], ...(this.outcomes.get(outcome) as TimeAndDistance) })),
        notAssessed: { ...this.notAssessed },
      },
    };
  }
}
