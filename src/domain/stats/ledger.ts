// The cruise review kept up to date one observation at a time. `reviewCruise` (review.ts) walks
// every observation; the ledger keeps each observation's figures and its share of the sums, so a
// new, edited or deleted observation only takes back and adds the shares it changes: its own,
// its neighbours' in time (their attributed time depends on the next observation) and the pairs
// it is part of (gaps, handovers). When distances come from the observation positions (no track),
// the distance timeline is rebuilt (typed arrays, no figures) and only observations whose time
// overlaps the stretch where it changed get new distances.
//
// The figures equal a full pass up to floating-point rounding of the sums
// (test/domain/stats-ledger.test.ts checks that with random edit sequences).
import type { Cruise, Observation } from '../model.ts';
import { ATTRIBUTION_CAP_FACTOR } from './attribution.ts';
import { EMPTY_TIMELINE, type DistanceTimeline } from './distanceTimeline.ts';
import { legDistanceM } from './legDistance.ts';
import { emptyFigures, observationFigures, type ObservationFigures, type RidgeThicknessEstimate } from './observationFigures.ts';
import {
  attributedNm, compareObservations, defaultRidgeEstimate, trackTimeline, type CruiseReview, type TrackColumns,
} from './review.ts';
import { packSeries, unpackSeries, type PackedSeries } from './series.ts';
import { ReviewTotals } from './totals.ts';

const HOUR_MS = 3_600_000;

/** The fixes of the observation timeline, with room to grow. */
interface FixColumns {
  t: Float64Array;
  lat: Float64Array;
  lon: Float64Array;
  cum: Float64Array;
  n: number;
}

const NO_FIXES: FixColumns = { t: new Float64Array(0), lat: new Float64Array(0), lon: new Float64Array(0), cum: new Float64Array(0), n: 0 };

interface Entry {
  o: Observation;
  t: number;
  fig: ObservationFigures;
  included: boolean;
  /** The share last added for this observation (taken back with exactly these numbers). */
  hours: number;
  nm: number;
  inSums: boolean;
  /** The leg to this observation's position from the previous fix, remembered with its start. */
  legFromLat?: number;
  legFromLon?: number;
  legM?: number;
}

export interface ReviewLedgerOptions {
  cruise: Pick<Cruise, 'iceClass' | 'intervalMinutes' | 'observers'>;
  /** Which observations the figures are about (see ReviewInput.include). */
  include?: (o: Observation) => boolean;
  ridgeEstimate?: RidgeThicknessEstimate | null;
}

export class ReviewLedger {
  private readonly cruise: ReviewLedgerOptions['cruise'];
  private readonly include: (o: Observation) => boolean;
  private readonly ridgeEstimate: RidgeThicknessEstimate | null;
  private readonly intervalMs: number;
  private readonly capMs: number;
  private totals: ReviewTotals;
  /** Live observations in time order (compareObservations). */
  private entries: Entry[] = [];
  private readonly byId = new Map<string, Entry>();
  private track: DistanceTimeline | null = null;
  private timeline: DistanceTimeline = EMPTY_TIMELINE;
  private fixes: FixColumns = NO_FIXES;

  constructor(options: ReviewLedgerOptions) {
    this.cruise = options.cruise;
    this.include = options.include ?? (() => true);
    this.ridgeEstimate = options.ridgeEstimate === undefined ? defaultRidgeEstimate : options.ridgeEstimate;
    // The same rule as attributeTime (attribution.ts).
    this.intervalMs = Math.max(1, options.cruise.intervalMinutes) * 60_000;
    this.capMs = ATTRIBUTION_CAP_FACTOR * this.intervalMs;
    this.totals = new ReviewTotals(this.cruise);
  }

  get size(): number {
    return this.entries.length;
  }

  /** Replaces everything with these observations and this track: one full pass. */
  reset(observations: readonly Observation[], track?: TrackColumns | null): void {
    this.totals = new ReviewTotals(this.cruise);
    this.byId.clear();
    const entries: Entry[] = [];
    for (const o of observations) {
      if (o.deleted) continue;
      const e = this.entryFor(o);
      entries.push(e);
      this.byId.set(o.id, e);
    }
    entries.sort((a, b) => compareObservations(a.o, b.o));
    this.entries = entries;
    this.track = trackTimeline(track ?? undefined);
    this.fixes = NO_FIXES;
    this.timeline = this.track ?? this.observationTimeline();
    for (let i = 0; i < entries.length; i++) {
      this.addNode(i);
      if (i > 0) this.pairShare(i, 1);
    }
  }

  /** Takes in a new or changed observation (a deleted one is taken out). */
  upsert(o: Observation): void {
    this.upsertMany([o]);
  }

  /** Takes in several saves at once (one timeline update for all of them). */
  upsertMany(observations: readonly Observation[]): void {
    // The earliest time where a fix of the observation timeline may have changed.
    let fromMs = Number.POSITIVE_INFINITY;
    for (const o of observations) {
      const old = this.byId.get(o.id);
      if (old) this.removeEntry(old);
      const e = o.deleted ? null : this.entryFor(o);
      if (e) this.insertEntry(e);
      // Most edits (a concentration corrected, a finding reviewed) move no fix.
      if (old && e && sameFix(old.o, o)) continue;
      fromMs = Math.min(fromMs, old?.t ?? Number.POSITIVE_INFINITY, e?.t ?? Number.POSITIVE_INFINITY);
    }
    if (this.track === null && fromMs !== Number.POSITIVE_INFINITY) this.refreshTimeline(this.observationTimeline(fromMs));
  }

  /** Takes out observations by id (as a hard delete would). */
  remove(ids: readonly string[]): void {
    let fromMs = Number.POSITIVE_INFINITY;
    for (const id of ids) {
      const e = this.byId.get(id);
      if (!e) continue;
      this.removeEntry(e);
      fromMs = Math.min(fromMs, e.t);
    }
    if (this.track === null && fromMs !== Number.POSITIVE_INFINITY) this.refreshTimeline(this.observationTimeline(fromMs));
  }

  /** A new track (e.g. more fixes): only observations where the distances changed are redone. */
  setTrack(track: TrackColumns | null): void {
    this.track = trackTimeline(track ?? undefined);
    this.fixes = NO_FIXES;
    this.refreshTimeline(this.track ?? this.observationTimeline());
  }

  /** The figures now, as `reviewCruise` gives them for the same observations and track. */
  result(): CruiseReview {
    return { ...this.tables(), series: unpackSeries(this.packedSeries()) };
  }

  /** The chart columns as typed arrays (what the review worker hands to the page). */
  packedSeries(): PackedSeries {
    return packSeries(this.entries.filter((e) => e.included), this.capMs);
  }

  /** Everything but the chart columns. */
  tables(): Omit<CruiseReview, 'series'> {
    const entries = this.entries;
    const n = entries.length;
    const summary = this.totals.summary({
      first: entries[0]?.o,
      last: entries[n - 1]?.o,
      firstMs: entries[0]?.t ?? 0,
      lastMs: entries[n - 1]?.t ?? 0,
      timeline: this.timeline,
      firstWithRio: (rio) => entries.find((e) => e.included && e.fig.rio === rio)?.o ?? null,
    });
    return { summary, bands: this.totals.bands.result(), handover: this.totals.handover.result() };
  }

  private entryFor(o: Observation): Entry {
    return {
      o, t: Date.parse(o.time), fig: observationFigures(o, this.cruise.iceClass, this.ridgeEstimate, emptyFigures()),
      included: this.include(o), hours: 0, nm: 0, inSums: false,
    };
  }

  private durationMs(i: number): number {
    const e = this.entries[i] as Entry;
    const next = this.entries[i + 1];
    if (!next) return this.intervalMs;
    const dt = next.t - e.t;
    return dt > this.capMs ? this.capMs : Math.max(0, dt);
  }

  private addNode(i: number): void {
    const e = this.entries[i];
    if (!e || e.inSums) return;
    const dur = this.durationMs(i);
    e.hours = dur / HOUR_MS;
    e.nm = attributedNm(this.timeline, e.t, dur);
    e.inSums = true;
    this.totals.node(e.o, e.fig, e.hours, e.nm, e.included, 1);
  }

  private takeNode(i: number): void {
    const e = this.entries[i];
    if (!e || !e.inSums) return;
    e.inSums = false;
    this.totals.node(e.o, e.fig, e.hours, e.nm, e.included, -1);
  }

  /** The share of the pair (i - 1, i). */
  private pairShare(i: number, sign: 1 | -1): void {
    const a = this.entries[i - 1];
    const b = this.entries[i];
    if (!a || !b) return;
    this.totals.pair(a.o, a.t, a.fig.levelThicknessCm, b.o, b.t, b.fig.levelThicknessCm, this.capMs, sign);
  }

  private indexOf(e: Entry): number {
    let lo = 0;
    let hi = this.entries.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (compareObservations((this.entries[mid] as Entry).o, e.o) < 0) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  private removeEntry(e: Entry): void {
    const k = this.indexOf(e);
    if (this.entries[k] !== e) throw new Error(`review ledger: observation ${e.o.id} is not where its time puts it`);
    this.takeNode(k - 1);
    this.takeNode(k);
    this.pairShare(k, -1);
    this.pairShare(k + 1, -1);
    this.entries.splice(k, 1);
    this.byId.delete(e.o.id);
    this.pairShare(k, 1);
    this.addNode(k - 1);
  }

  private insertEntry(e: Entry): void {
    const j = this.indexOf(e);
    this.takeNode(j - 1);
    this.pairShare(j, -1);
    this.entries.splice(j, 0, e);
    this.byId.set(e.o.id, e);
    this.pairShare(j, 1);
    this.pairShare(j + 1, 1);
    this.addNode(j - 1);
    this.addNode(j);
  }

  /**
   * The distance timeline between the observation positions, as observationTimeline (review.ts)
   * builds it, redone only from `fromMs` on: fixes before it are kept, and the running sum goes on
   * from the last kept one, so the numbers are the ones the full build adds up. Legs come from a
   * cache on the entries (an entry's position never changes: an edit makes a new entry).
   */
  private observationTimeline(fromMs = Number.NEGATIVE_INFINITY): DistanceTimeline {
    const entries = this.entries;
    const old = this.fixes;
    let p = 0;
    while (p < old.n && (old.t[p] as number) < fromMs) p++;
    const cap = Math.max(entries.length, p);
    const f: FixColumns = { t: new Float64Array(cap), lat: new Float64Array(cap), lon: new Float64Array(cap), cum: new Float64Array(cap), n: p };
    f.t.set(old.t.subarray(0, p));
    f.lat.set(old.lat.subarray(0, p));
    f.lon.set(old.lon.subarray(0, p));
    f.cum.set(old.cum.subarray(0, p));
    let sum = p > 0 ? (old.cum[p - 1] as number) : 0;
    let pt = p > 0 ? (old.t[p - 1] as number) : Number.NEGATIVE_INFINITY;
    let plat = p > 0 ? (old.lat[p - 1] as number) : 0;
    let plon = p > 0 ? (old.lon[p - 1] as number) : 0;
    // The same rules as buildDistanceTimelineFromColumns: finite fixes, strictly later times.
    for (let i = fromMs === Number.NEGATIVE_INFINITY ? 0 : lowerBoundTime(entries, fromMs); i < entries.length; i++) {
      const e = entries[i] as Entry;
      const pos = e.o.position;
      if (!pos) continue;
      const ti = e.t;
      const la = pos.lat;
      const lo = pos.lon;
      if (!Number.isFinite(ti) || !Number.isFinite(la) || !Number.isFinite(lo)) continue;
      if (f.n > 0) {
        if (ti <= pt) continue;
        if (e.legM === undefined || e.legFromLat !== plat || e.legFromLon !== plon) {
          e.legFromLat = plat;
          e.legFromLon = plon;
          e.legM = legDistanceM(plat, plon, la, lo);
        }
        sum += e.legM;
      }
      f.t[f.n] = ti;
      f.lat[f.n] = la;
      f.lon[f.n] = lo;
      f.cum[f.n] = sum;
      f.n++;
      pt = ti;
      plat = la;
      plon = lo;
    }
    this.fixes = f;
    if (f.n < 2) return EMPTY_TIMELINE;
    return { source: 'observations', timesMs: f.t.subarray(0, f.n), cumulativeM: f.cum.subarray(0, f.n), totalM: sum };
  }

  /**
   * Switches to a new distance timeline and redoes the distance of every observation whose time
   * overlaps the stretch where the two timelines differ (before it they are equal; after it the
   * running distance is shifted by a constant, so differences of it are unchanged).
   */
  private refreshTimeline(next: DistanceTimeline): void {
    const prev = this.timeline;
    this.timeline = next;
    const stretch = changedStretch(prev, next);
    if (stretch === null) return;
    const [fromMs, toMs] = stretch;
    const entries = this.entries;
    // Observations stand for at most the cap, so the first one that can reach fromMs starts after fromMs - cap.
    let i = lowerBoundTime(entries, fromMs - this.capMs);
    for (; i < entries.length; i++) {
      const e = entries[i] as Entry;
      if (e.t > toMs) break;
      this.takeNode(i);
      this.addNode(i);
    }
  }
}

const sameFix = (a: Observation, b: Observation): boolean =>
  a.time === b.time && a.position?.lat === b.position?.lat && a.position?.lon === b.position?.lon;

function lowerBoundTime(entries: readonly Entry[], t: number): number {
  let lo = 0;
  let hi = entries.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((entries[mid] as Entry).t < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Metres: legs that differ by less are the same leg summed in another order. */
const LEG_TOLERANCE_M = 1e-6;

/**
 * The time stretch [from, to] where two distance timelines differ, widened to the fixes around it;
 * null when they are the same; the whole time line when the source changed.
 */
export function changedStretch(a: DistanceTimeline, b: DistanceTimeline): [number, number] | null {
  if (a.source !== b.source) return [Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY];
  const at = a.timesMs;
  const bt = b.timesMs;
  const ac = a.cumulativeM;
  const bc = b.cumulativeM;
  const na = at.length;
  const nb = bt.length;
  let f = 0;
  while (f < na && f < nb && at[f] === bt[f] && ac[f] === bc[f]) f++;
  if (f === na && f === nb) return null;
  let ea = na - 1;
  let eb = nb - 1;
  while (ea > f && eb > f && at[ea] === bt[eb]) {
    const legA = (ac[ea] as number) - (ac[ea - 1] as number);
    const legB = (bc[eb] as number) - (bc[eb - 1] as number);
    if (Math.abs(legA - legB) > LEG_TOLERANCE_M || at[ea - 1] !== bt[eb - 1]) break;
    ea--;
    eb--;
  }
  const from = Math.min(at[f - 1] ?? Number.NEGATIVE_INFINITY, bt[f - 1] ?? Number.NEGATIVE_INFINITY);
  // From at[ea] (= bt[eb]) on, every leg is the same: the running distances differ by a constant.
  const to = Math.max(at[ea] ?? Number.NEGATIVE_INFINITY, bt[eb] ?? Number.NEGATIVE_INFINITY);
  return [from, to];
}
