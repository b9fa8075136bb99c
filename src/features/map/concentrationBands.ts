// Total-concentration bands and their colours from the ice chart colour standard for total
// concentration (WMO/TD-No. 1215). Used by the observation symbols and the legend alike.
import type { Observation } from '../../domain/model';

export type BandKey = 'ice-free' | 'open-water' | 'c1-3' | 'c4-6' | 'c7-8' | 'c9-10' | 'fast-ice' | 'not-judged';

export interface Band {
  key: BandKey;
  label: string;
  rgb: readonly [number, number, number];
}

/** In legend order. RGB values from WMO/TD-No. 1215; fast ice from a 2001 draft (unconfirmed). */
export const BANDS: readonly Band[] = [
  { key: 'ice-free', label: 'Ice free', rgb: [0, 100, 255] },
  { key: 'open-water', label: 'Open water (< 1/10)', rgb: [150, 200, 255] },
  { key: 'c1-3', label: 'Very open ice 1-3/10', rgb: [140, 255, 160] },
  { key: 'c4-6', label: 'Open ice 4-6/10', rgb: [255, 255, 0] },
  { key: 'c7-8', label: 'Close ice 7-8/10', rgb: [255, 125, 7] },
  { key: 'c9-10', label: 'Very close and compact ice 9-10/10', rgb: [255, 0, 0] },
  { key: 'fast-ice', label: 'Fast ice', rgb: [150, 150, 150] },
  // Not part of the standard: our own neutral mark for an observation without a total yet.
  { key: 'not-judged', label: 'Total not judged', rgb: [255, 255, 255] },
];

const BY_KEY = new Map(BANDS.map((b) => [b.key, b]));

export function band(key: BandKey): Band {
  return BY_KEY.get(key) as Band;
}

export function hexColour(rgb: readonly [number, number, number]): string {
  return '#' + rgb.map((c) => c.toString(16).padStart(2, '0')).join('');
}

/** The colour band of a total concentration in tenths (null: not judged). */
export function bandOfTenths(tenths: number | null, iceTracePresent = false): BandKey {
  if (tenths === null || !Number.isFinite(tenths)) return 'not-judged';
  if (tenths <= 0) return iceTracePresent ? 'open-water' : 'ice-free';
  if (tenths <= 3) return 'c1-3';
  if (tenths <= 6) return 'c4-6';
  if (tenths <= 8) return 'c7-8';
  return 'c9-10';
}

/**
 * An observation's band. Zero tenths with some ice noted (a category or a trace stage) is open
 * water, less than 1/10; zero with none is ice free. Fast ice noted in any category wins.
 */
export function bandOfObservation(o: Pick<Observation, 'totalConcentration' | 'categories' | 'traceStage'>): BandKey {
  if (o.categories.some((c) => c.floeSize === 'fast-ice')) return 'fast-ice';
  const trace = o.traceStage !== undefined || o.categories.length > 0;
  return bandOfTenths(o.totalConcentration, trace);
}

/**
 * The marginal ice zone, by the common definition of 15 to 80 per cent ice concentration
 * (common practice). In whole tenths that is 2/10 to 8/10: 15 % is 1.5 tenths, the first whole
 * tenth at or above it is 2; 80 % is 8 tenths.
 */
export const MIZ_MIN_TENTHS = 2;
export const MIZ_MAX_TENTHS = 8;
export const MIZ_LEGEND = 'Marginal ice zone: 15-80 % ice (2-8/10 in whole tenths)';

export function inMarginalIceZone(tenths: number | null): boolean {
  return tenths !== null && tenths >= MIZ_MIN_TENTHS && tenths <= MIZ_MAX_TENTHS;
}
