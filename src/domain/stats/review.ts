// The cruise review: every figure of the Review screen (and the CLI summary) in one pass over
// the observations. See docs/dev/review.md for the definitions.
import { METRES_PER_NM } from '../geodesy.ts';
import type { Cruise, Observation, TrackPoint } from '../model.ts';
import { equivalentThicknessCm } from './ridgeEstimate.ts';
import { attributeTime } from './attribution.ts';
import type { LatitudeBandTable } from './bands.ts';
import { buildDistanceTimelineFromColumns, distanceBetween, EMPTY_TIMELINE, type DistanceTimeline } from './distanceTimeline.ts';
import type { HandoverTable } from './handover.ts';
import { emptyFigures, observationFigures, type RidgeThicknessEstimate } from './observationFigures.ts';
import { SeriesBuilder, type ReviewSeries } from './series.ts';
import { ReviewTotals, type CruiseSummary } from './totals.ts';

const HOUR_MS = 3_600_000;

export { POLARIS_OUTCOMES } from './totals.ts';
export type { CruiseSummary, ObserverSummary, OutcomeSummary, RegimeSummary, TimeAndDistance } from './totals.ts';

/** The ship's track as columns (ms since the epoch, degrees), e.g. handed to a worker as buffers. */
export interface TrackColumns {
  timeMs: Float64Array;
  lat: Float64Array;
  lon: Float64Array;
}

export interface ReviewInput {
  cruise: Pick<Cruise, 'iceClass' | 'intervalMinutes' | 'observers'>;
  /** Any order; deleted observations are left out. */
  observations: readonly Observation[];
  /** The ship's track; when it has two fixes or more, distances come from it. */
  track?: readonly TrackPoint[] | TrackColumns;
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

export interface CruiseReview {
  summary: CruiseSummary;
  bands: LatitudeBandTable;
  handover: HandoverTable;
  series: ReviewSeries;
}

/** Time order of the review: by the stored time, then by id, so equal times have one order. */
export function compareObservations(a: Pick<Observation, 'time' | 'id'>, b: Pick<Observation, 'time' | 'id'>): number {
  return a.time < b.time ? -1 : a.time > b.time ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** Observations without the deleted ones, in time order. */
function liveInTimeOrder(observations: readonly Observation[]): { obs: Observation[]; times: Float64Array } {
  const obs = observations.filter((o) => !o.deleted);
  let sorted = true;
  for (let i = 1; i < obs.length; i++) {
    if (compareObservations(obs[i - 1] as Observation, obs[i] as Observation) > 0) {
      sorted = false;
      break;
    }
  }
  if (!sorted) obs.sort(compareObservations);
  const times = new Float64Array(obs.length);
  for (let i = 0; i < obs.length; i++) times[i] = Date.parse((obs[i] as Observation).time);
  return { obs, times };
}

/** Track points (any order) as columns sorted by time. */
export function trackToColumns(track: readonly TrackPoint[]): TrackColumns {
  let sorted = true;
  for (let i = 1; i < track.length; i++) if ((track[i] as TrackPoint).time < (track[i - 1] as TrackPoint).time) sorted = false;
  const pts = sorted ? track : [...track].sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
  const n = pts.length;
  const timeMs = new Float64Array(n);
  const lat = new Float64Array(n);
  const lon = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = pts[i] as TrackPoint;
    timeMs[i] = Date.parse(p.time);
    lat[i] = p.lat;
    lon[i] = p.lon;
  }
  return { timeMs, lat, lon };
}

/** The distance timeline of the track (columns sorted by time), or null below two fixes. */
export function trackTimeline(track: readonly TrackPoint[] | TrackColumns | undefined): DistanceTimeline | null {
  if (!track) return null;
  const cols = Array.isArray(track) ? trackToColumns(track) : (track as TrackColumns);
  if (cols.timeMs.length < 2) return null;
  const tl = buildDistanceTimelineFromColumns(cols.timeMs, cols.lat, cols.lon, cols.timeMs.length, 'track');
  return tl.source === 'none' ? null : tl;
}

/** The distance timeline between the positions of observations in time order. */
export function observationTimeline(count: number, timeAt: (i: number) => number, obsAt: (i: number) => Observation): DistanceTimeline {
  const t = new Float64Array(count);
  const lat = new Float64Array(count);
  const lon = new Float64Array(count);
  let k = 0;
  for (let i = 0; i < count; i++) {
    const pos = obsAt(i).position;
    if (!pos) continue;
    t[k] = timeAt(i);
    lat[k] = pos.lat;
    lon[k] = pos.lon;
    k++;
  }
  const tl = buildDistanceTimelineFromColumns(t, lat, lon, k, 'observations');
  return tl.source === 'none' ? EMPTY_TIMELINE : tl;
}

/** Nautical miles sailed in the time an observation stands for. */
export function attributedNm(tl: DistanceTimeline, t: number, durMs: number): number {
  return tl.source === 'none' ? 0 : distanceBetween(tl, t, t + durMs) / METRES_PER_NM;
}

/** ridges.ts equivalent thickness (an estimate, see there). */
export const defaultRidgeEstimate: RidgeThicknessEstimate = equivalentThicknessCm;

export function reviewCruise(input: ReviewInput): CruiseReview {
  const { cruise } = input;
  const include = input.include ?? (() => true);
  const ridgeEstimate = input.ridgeEstimate === undefined ? defaultRidgeEstimate : input.ridgeEstimate;
  const { obs, times } = liveInTimeOrder(input.observations);
  const n = obs.length;
  const att = attributeTime(times, cruise.intervalMinutes);
  const tl = trackTimeline(input.track) ?? observationTimeline(n, (i) => times[i] as number, (i) => obs[i] as Observation);

  const totals = new ReviewTotals(cruise);
  const series = new SeriesBuilder(att.capMs);
  // RIO per included observation (NaN for none), to find the first lowest one at the end.
  const rios = new Float64Array(n).fill(Number.NaN);
  // One figures object reused for every observation: nothing below keeps it.
  const fig = emptyFigures();
  let prevLevel: number | null = null;

  for (let i = 0; i < n; i++) {
    const o = obs[i] as Observation;
    const t = times[i] as number;
    const durMs = att.durationsMs[i] as number;
    observationFigures(o, cruise.iceClass, ridgeEstimate, fig);
    if (i > 0) totals.pair(obs[i - 1] as Observation, times[i - 1] as number, prevLevel, o, t, fig.levelThicknessCm, att.capMs, 1);
    prevLevel = fig.levelThicknessCm;
    const included = include(o);
    totals.node(o, fig, durMs / HOUR_MS, attributedNm(tl, t, durMs), included, 1);
    if (!included) continue;
    if (fig.rio !== null) rios[i] = fig.rio;
    series.add(t, o, fig);
  }

  const summary = totals.summary({
    first: obs[0],
    last: obs[n - 1],
    firstMs: times[0] ?? 0,
    lastMs: times[n - 1] ?? 0,
    timeline: tl,
    firstWithRio: (rio) => {
      const i = rios.indexOf(rio);
      return i >= 0 ? (obs[i] as Observation) : null;
    },
  });
  return { summary, bands: totals.bands.result(), handover: totals.handover.result(), series: series.series };
}
