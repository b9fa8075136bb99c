// Rules over a cruise's series of observations: duplicate times, gaps longer than the
// observation interval, and an implied ship speed above the cruise's limit.

import type { Cruise, Finding, Observation } from '../model.ts';
import { geodesicDistanceM, speedKn } from '../geodesy.ts';
import { isValidLatLon } from '../position.ts';
import { finding } from './catalogue.ts';
import { fmt, isIsoUtc } from './observationRules.ts';

export interface SequenceOptions {
  /**
   * How far past the interval a gap may run before it is flagged, as a fraction of the interval
   * (default 0.25: with an hourly interval, gaps over 75 min are flagged). A late observation is
   * not a missed one (common practice).
   */
  gapGraceFraction?: number;
}

export const DEFAULT_GAP_GRACE_FRACTION = 0.25;

function formatDuration(minutes: number): string {
  const m = Math.round(minutes);
  const h = Math.floor(m / 60);
  const r = m % 60;
  if (h === 0) return `${r} min`;
  return r === 0 ? `${h} h` : `${h} h ${r} min`;
}

/**
 * Findings over a series of observations (any order; deleted ones and ones with an invalid time
 * are left out, the latter are flagged by validateObservation). Each finding carries the id of the
 * later observation of the pair it is about.
 */
export function checkSequence(observations: readonly Observation[], cruise: Cruise, opts: SequenceOptions = {}): Finding[] {
  const live = observations
    .filter((o) => !o.deleted && isIsoUtc(o.time))
    .map((o) => ({ o, t: Date.parse(o.time) }))
    .sort((a, b) => a.t - b.t || (a.o.id < b.o.id ? -1 : a.o.id > b.o.id ? 1 : 0));
  const out: Finding[] = [];
  const grace = opts.gapGraceFraction ?? DEFAULT_GAP_GRACE_FRACTION;
  const interval = cruise.intervalMinutes;
  const gapLimit = interval * (1 + grace);
  let lastFix: { o: Observation; t: number; lat: number; lon: number } | null = null;

  for (let i = 0; i < live.length; i++) {
    const cur = live[i];
    if (!cur) continue;
    const prev = live[i - 1];
    if (prev) {
      const minutes = (cur.t - prev.t) / 60000;
      if (minutes === 0) {
        out.push(finding('duplicate-time', 'time', `Another observation (${prev.o.id}) has the same time ${cur.o.time}`, cur.o.id));
      } else if (interval > 0 && minutes > gapLimit) {
        out.push(finding('observation-gap', 'time',
          `${formatDuration(minutes)} since the previous observation at ${prev.o.time}; the interval is ${formatDuration(interval)}`, cur.o.id));
      }
    }
    const p = cur.o.position;
    if (p && isValidLatLon(p.lat, p.lon)) {
      if (lastFix && cur.t > lastFix.t && cruise.maxSpeedKn > 0) {
        const d = geodesicDistanceM(lastFix, p);
        const kn = speedKn(d, (cur.t - lastFix.t) / 1000);
        if (kn > cruise.maxSpeedKn) {
          out.push(finding('implied-speed', 'position',
            `Moving ${fmt(d / 1852)} NM in ${formatDuration((cur.t - lastFix.t) / 60000)} since ${lastFix.o.time} implies ${kn.toFixed(1)} kn, above the cruise limit of ${fmt(cruise.maxSpeedKn)} kn`, cur.o.id));
        }
      }
      if (!lastFix || cur.t > lastFix.t) lastFix = { o: cur.o, t: cur.t, lat: p.lat, lon: p.lon };
    }
  }
  return out;
}
