// Track files in, TrackPoint[] out: the shared result shape, format detection, and the chunked
// loop that keeps the page responsive (and a progress bar moving) on a file of a whole cruise.
import type { IsoUtc, TrackPoint } from '../domain/model';

export type TrackFormat = 'gpx' | 'nmea' | 'csv';

/** A line of the file that could not be imported, and why. Lines count from 1. */
export interface BadLine {
  line: number;
  reason: string;
}

export interface TrackImportResult {
  format: TrackFormat;
  /** Imported points, sorted by time, one per distinct time. */
  points: TrackPoint[];
  bad: BadLine[];
  counts: {
    /** Records looked at (lines, rows or track points, depending on the format). */
    records: number;
    imported: number;
    bad: number;
    /** Records that are fine but carry no track point (headers, other sentence types, waypoints). */
    skipped: number;
    /** Points dropped because another point had the same time. */
    duplicates: number;
  };
}

/** Progress in [0, 1], with a word on what is happening. */
export type ProgressCallback = (fraction: number, phase: string) => void;

export interface TrackImportOptions {
  cruiseId: string;
  onProgress?: ProgressCallback;
  /** Records handled between yields to the event loop (default 5000). */
  chunkSize?: number;
  /** Stop early: the import rejects with an AbortError and returns nothing. */
  signal?: AbortSignal;
  /** UTC date (YYYY-MM-DD) for NMEA logs whose GGA sentences carry only a time of day and no RMC gives the date. */
  defaultDate?: string;
  /** XML parser for GPX; the browser's DOMParser when omitted. */
  domParser?: { parseFromString(text: string, type: DOMParserSupportedType): Document };
}

/** At most this many bad lines are listed (all are counted). */
export const MAX_LISTED_BAD_LINES = 1000;

export class BadLineList {
  readonly list: BadLine[] = [];
  count = 0;
  add(line: number, reason: string): void {
    this.count++;
    if (this.list.length < MAX_LISTED_BAD_LINES) this.list.push({ line, reason });
  }
}

const yieldToEventLoop = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 0));

/** Run `work(i)` for i in [0, n), yielding and reporting progress every chunk. */
export async function inChunks(n: number, opts: TrackImportOptions, phase: string, from: number, to: number, work: (i: number) => void): Promise<void> {
  const size = Math.max(1, opts.chunkSize ?? 5000);
  for (let start = 0; start < n; start += size) {
    opts.signal?.throwIfAborted();
    const end = Math.min(n, start + size);
    for (let i = start; i < end; i++) work(i);
    opts.onProgress?.(from + ((to - from) * end) / n, phase);
    if (end < n) await yieldToEventLoop();
  }
  opts.signal?.throwIfAborted();
}

/** Sort by time and keep one point per time (the first seen), counting the rest. */
export function finishPoints(points: TrackPoint[]): { points: TrackPoint[]; duplicates: number } {
  const withMs = points.map((p, i) => ({ p, ms: Date.parse(p.time), i }));
  withMs.sort((a, b) => a.ms - b.ms || a.i - b.i);
  const out: TrackPoint[] = [];
  let last = Number.NaN;
  for (const { p, ms } of withMs) {
    if (ms === last) continue;
    out.push(p);
    last = ms;
  }
  return { points: out, duplicates: points.length - out.length };
}

export function isoUtc(ms: number): IsoUtc {
  const s = new Date(ms).toISOString();
  return s.endsWith('.000Z') ? s.replace('.000Z', 'Z') : s;
}

/** Latitude and longitude in range, or a reason they are not. */
export function checkLatLon(lat: number, lon: number): string | null {
  if (!Number.isFinite(lat) || !Number.isFinite(lon)) return 'latitude or longitude is not a number';
  if (lat < -90 || lat > 90) return `latitude ${lat} is outside -90..90`;
  if (lon < -180 || lon > 180) return `longitude ${lon} is outside -180..180`;
  return null;
}

/** Split text into lines (CR LF, LF or CR), without the terminators. */
export function splitLines(text: string): string[] {
  return text.split(/\r\n|\n|\r/);
}

/** Guess the format from the file name, then from the content. */
export function detectTrackFormat(fileName: string, text: string): TrackFormat | null {
  const ext = /\.([a-z0-9]+)$/i.exec(fileName)?.[1]?.toLowerCase();
  if (ext === 'gpx') return 'gpx';
  if (ext === 'nmea' || ext === 'nma' || (ext === 'log' && /\$[A-Z]{2}(GGA|RMC)/.test(text.slice(0, 20_000)))) return 'nmea';
  if (ext === 'csv' || ext === 'tsv') return 'csv';
  const head = text.slice(0, 20_000).trimStart();
  if (head.startsWith('<?xml') || head.startsWith('<gpx')) return /<gpx[\s>]/.test(head) ? 'gpx' : null;
  if (/(^|[\s,])\$[A-Z]{2}(GGA|RMC)\b/m.test(head)) return 'nmea';
  const first = head.split(/\r?\n/, 1)[0] ?? '';
  if (/[,;\t]/.test(first) && /lat/i.test(first)) return 'csv';
  return null;
}
