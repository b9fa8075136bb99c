// The cruise review: every figure of the Review screen (and the CLI summary) in one pass over
// the observations. See docs/dev/review.md for the definitions.
import { METRES_PER_NM } from '../geodesy.ts';
import type { Cruise, IsoUtc, Observation, Observer, TrackPoint, VesselIceClass } from '../model.ts';
import { POLARIS_OUTCOME_LABELS, type PolarisOutcome } from '../polaris.ts';
import { equivalentThicknessCm } from './ridgeEstimate.ts';
import { attributeTime, type ObservationGap } from './attribution.ts';
import { LatitudeBandBuilder, type LatitudeBandTable } from './bands.ts';
import { buildDistanceTimelineFromColumns, distanceBetween, EMPTY_TIMELINE, type DistanceSource, type DistanceTimeline } from './distanceTimeline.ts';
import { HandoverBuilder, type HandoverTable } from './handover.ts';
import { IcePool, type IceFigures } from './icePool.ts';
import { emptyFigures, observationFigures, type RidgeThicknessEstimate } from './observationFigures.ts';
import { ICE_REGIMES, ICE_REGIME_LABELS, iceRegime, isInIce, type IceRegime } from './regimes.ts';
import { SeriesBuilder, type ReviewSeries } from './series.ts';

export const POLARIS_OUTCOMES: readonly PolarisOutcome[] = ['normal', 'elevated', 'special'];

export interface ReviewInput {
  cruise: Pick<Cruise, 'iceClass' | 'intervalMinutes' | 'observers'>;
  /** Any order; deleted observations are left out. */
  observations: readonly Observation[];
  /** The ship's track; when it has two fixes or more, distances come from it. */
  track?: readonly TrackPoint[];
  /**
   * Which observations the figures are about (e.g. an observer filter). Time attribution and the
   * handover table always use every observation, so a filter never turns a watch change into a gap.
   */
  include?: (o: Observation) => boolean;
  /**
   * Thickness of a category with its ridges. Default: the equivalent thickness of ridges.ts
   * (ridged and rafted shares, keel from the sail height; an estimate). Null: no ridge figures.
   */
  ridgeEstimate?: RidgeThicknessEstimate | null;
}

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
  distanceSource: DistanceSource;
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
    iceClass: VesselIceClass;
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

export interface CruiseReview {
  summary: CruiseSummary;
  bands: LatitudeBandTable;
  handover: HandoverTable;
  series: ReviewSeries;
}

const tad = (): TimeAndDistance => ({ hours: 0, distanceNm: 0, observations: 0 });
const HOUR_MS = 3_600_000;

function addTo(t: TimeAndDistance, hours: number, nm: number): void {
  t.hours += hours;
  t.distanceNm += nm;
  t.observations++;
}

/** Observations without the deleted ones, in time order (stable for equal times). */
function liveInTimeOrder(observations: readonly Observation[]): { obs: Observation[]; times: Float64Array } {
  const obs = observations.filter((o) => !o.deleted);
  let sorted = true;
  for (let i = 1; i < obs.length; i++) {
    if ((obs[i] as Observation).time < (obs[i - 1] as Observation).time) {
      sorted = false;
      break;
    }
  }
  if (!sorted) obs.sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
  const times = new Float64Array(obs.length);
  for (let i = 0; i < obs.length; i++) times[i] = Date.parse((obs[i] as Observation).time);
  return { obs, times };
}

function timelineFor(obs: readonly Observation[], times: Float64Array, track: readonly TrackPoint[] | undefined): DistanceTimeline {
  if (track && track.length >= 2) {
    let sorted = true;
    for (let i = 1; i < track.length; i++) if ((track[i] as TrackPoint).time < (track[i - 1] as TrackPoint).time) sorted = false;
    const pts = sorted ? track : [...track].sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
    const n = pts.length;
    const t = new Float64Array(n);
    const lat = new Float64Array(n);
    const lon = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const p = pts[i] as TrackPoint;
      t[i] = Date.parse(p.time);
      lat[i] = p.lat;
      lon[i] = p.lon;
    }
    const tl = buildDistanceTimelineFromColumns(t, lat, lon, n, 'track');
    if (tl.source !== 'none') return tl;
  }
  const n = obs.length;
  const t = new Float64Array(n);
  const lat = new Float64Array(n);
  const lon = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < n; i++) {
    const pos = (obs[i] as Observation).position;
    if (!pos) continue;
    t[k] = times[i] as number;
    lat[k] = pos.lat;
    lon[k] = pos.lon;
    k++;
  }
  const tl = buildDistanceTimelineFromColumns(t, lat, lon, k, 'observations');
  return tl.source === 'none' ? EMPTY_TIMELINE : tl;
}

/** ridges.ts equivalent thickness (an estimate, see there). */
export const defaultRidgeEstimate: RidgeThicknessEstimate = equivalentThicknessCm;

const observerName = (observers: readonly Observer[], id: string): Observer =>
  observers.find((o) => o.id === id) ?? { id, name: `Unknown observer (${id.slice(0, 8)})`, initials: '?' };

export function reviewCruise(input: ReviewInput): CruiseReview {
  const { cruise } = input;
  const include = input.include ?? (() => true);
  const ridgeEstimate = input.ridgeEstimate === undefined ? defaultRidgeEstimate : input.ridgeEstimate;
  const { obs, times } = liveInTimeOrder(input.observations);
  const n = obs.length;
  const att = attributeTime(times, cruise.intervalMinutes);
  const tl = timelineFor(obs, times, input.track);

  const pool = new IcePool();
  const bands = new LatitudeBandBuilder();
  const handover = new HandoverBuilder();
  const series = new SeriesBuilder(att.capMs);
  const regimes = new Map<IceRegime, TimeAndDistance>(ICE_REGIMES.map((r) => [r, tad()]));
  const outcomes = new Map<PolarisOutcome, TimeAndDistance>(POLARIS_OUTCOMES.map((o) => [o, tad()]));
  const notAssessed = tad();
  const inIce = tad();
  const perObserver = new Map<string, TimeAndDistance>();
  const gaps: ObservationGap[] = [];
  let included = 0;
  let observedHours = 0;
  let attributedNmAll = 0;
  let unobservedMs = 0;
  let rioSum = 0;
  let rioN = 0;
  let minRio: number | null = null;
  let minRioIdx = -1;
  // One figures object reused for every observation: nothing below keeps it.
  const fig = emptyFigures();
  let prevLevel: number | null = null;

  for (let i = 0; i < n; i++) {
    const o = obs[i] as Observation;
    const t = times[i] as number;
    const durMs = att.durationsMs[i] as number;
    const hours = durMs / HOUR_MS;
    const nm = tl.source === 'none' ? 0 : distanceBetween(tl, t, t + durMs) / METRES_PER_NM;
    attributedNmAll += nm;
    observationFigures(o, cruise.iceClass, ridgeEstimate, fig);

    if (i > 0) {
      const prev = obs[i - 1] as Observation;
      if (att.gapAfter[i - 1] === 1) {
        const fromMs = times[i - 1] as number;
        const interval = cruise.intervalMinutes * 60_000;
        unobservedMs += t - fromMs - att.capMs;
        gaps.push({
          beforeId: prev.id, afterId: o.id, fromMs, toMs: t,
          missedObservations: Math.max(0, Math.round((t - fromMs) / interval) - 1),
          unobservedHours: (t - fromMs - att.capMs) / HOUR_MS,
        });
      } else {
        handover.add(prev, prevLevel, o, fig.levelThicknessCm);
      }
    }
    prevLevel = fig.levelThicknessCm;

    if (!include(o)) continue;
    included++;
    observedHours += hours;
    const regime = iceRegime(o.totalConcentration);
    addTo(regimes.get(regime) as TimeAndDistance, hours, nm);
    if (isInIce(regime)) addTo(inIce, hours, nm);
    let who = perObserver.get(o.observerId);
    if (!who) {
      who = tad();
      perObserver.set(o.observerId, who);
    }
    addTo(who, hours, nm);
    if (fig.rio !== null && fig.outcome !== null) {
      addTo(outcomes.get(fig.outcome) as TimeAndDistance, hours, nm);
      rioSum += fig.rio;
      rioN++;
      if (minRio === null || fig.rio < minRio) {
        minRio = fig.rio;
        minRioIdx = i;
      }
    } else {
      addTo(notAssessed, hours, nm);
    }
    pool.add(o, fig);
    bands.add(o, fig, hours);
    series.add(t, o, fig);
  }

  const first = obs[0];
  const last = obs[n - 1];
  const regimeRows: RegimeSummary[] = ICE_REGIMES.map((regime) => ({ regime, label: ICE_REGIME_LABELS[regime], ...(regimes.get(regime) as TimeAndDistance) }));
  const minObs = minRioIdx >= 0 ? (obs[minRioIdx] as Observation) : null;
  const summary: CruiseSummary = {
    observations: included,
    firstTime: first?.time ?? null,
    lastTime: last?.time ?? null,
    spanHours: n > 0 ? ((times[n - 1] as number) - (times[0] as number)) / HOUR_MS : 0,
    observedHours,
    unobservedHours: unobservedMs / HOUR_MS,
    gaps,
    observers: [...perObserver.entries()]
      .map(([id, t]) => {
        const who = observerName(cruise.observers, id);
        return { observerId: id, name: who.name, initials: who.initials, ...t };
      })
      .sort((a, b) => b.observations - a.observations || a.name.localeCompare(b.name)),
    distanceSource: tl.source,
    sailedNm: tl.totalM / METRES_PER_NM,
    unobservedNm: Math.max(0, tl.totalM / METRES_PER_NM - attributedNmAll),
    inIce,
    marginal: regimes.get('marginal') as TimeAndDistance,
    pack: regimes.get('pack') as TimeAndDistance,
    regimes: regimeRows,
    ice: pool.result(),
    polaris: {
      iceClass: cruise.iceClass,
      assessed: rioN,
      minRio,
      minRioObservationId: minObs?.id ?? null,
      minRioTime: minObs?.time ?? null,
      meanRio: rioN > 0 ? rioSum / rioN : null,
      outcomes: POLARIS_OUTCOMES.map((outcome) => ({ outcome, label: POLARIS_OUTCOME_LABELS[outcome], ...(outcomes.get(outcome) as TimeAndDistance) })),
      notAssessed,
    },
  };
  return { summary, bands: bands.result(), handover: handover.result(), series: series.series };
}
