// Browser geolocation as a position source: a watchPosition wrapper that reports accuracy and
// age, and turns the browser's error codes into sentences an observer can act on.
import type { IsoUtc } from '../domain/model';
import { isoFromMs } from './tracker';

export interface GeoFix {
  time: IsoUtc;
  lat: number;
  lon: number;
  /** 95 % radius as the browser estimates it (the W3C spec asks for 95 % confidence), metres. */
  accuracyM: number;
  sogKn: number | null;
  cogDeg: number | null;
  /** Milliseconds between the fix and the moment it was handed to us. */
  ageMs: number;
}

export interface GeoWatchOptions {
  onFix: (fix: GeoFix) => void;
  onError?: (message: string, code: number) => void;
  /** Oldest cached fix the browser may hand back, ms (default 30 s). */
  maximumAgeMs?: number;
  timeoutMs?: number;
  now?: () => number;
}

const MS_TO_KN = 3600 / 1852;

export function describeGeolocationError(code: number): string {
  switch (code) {
    case 1:
      return 'Location permission was refused: allow it in the browser settings, or use the ship\'s GPS or manual entry.';
    case 2:
      return 'No position available: this computer has no location fix (often the case below deck or offline); use the ship\'s GPS.';
    case 3:
      return 'The browser took too long to give a position; still trying.';
    default:
      return `Location failed (code ${code}).`;
  }
}

export function isGeolocationAvailable(nav: Navigator | undefined = globalThis.navigator): boolean {
  return nav !== undefined && 'geolocation' in nav && nav.geolocation !== undefined;
}

/** Convert one browser position into our fix shape. */
export function geoFixFrom(p: GeolocationPosition, nowMs: number): GeoFix {
  const c = p.coords;
  const speed = c.speed;
  const heading = c.heading;
  return {
    time: isoFromMs(p.timestamp),
    lat: c.latitude,
    lon: c.longitude,
    accuracyM: c.accuracy,
    sogKn: speed === null || Number.isNaN(speed) ? null : speed * MS_TO_KN,
    // Heading is NaN when the device is not moving.
    cogDeg: heading === null || Number.isNaN(heading) ? null : heading,
    ageMs: Math.max(0, nowMs - p.timestamp),
  };
}

/** Start watching; returns a function that stops the watch. */
export function watchGeolocation(opts: GeoWatchOptions, geo: Geolocation = navigator.geolocation): () => void {
  const now = opts.now ?? (() => Date.now());
  const id = geo.watchPosition(
    (p) => opts.onFix(geoFixFrom(p, now())),
    (e) => opts.onError?.(describeGeolocationError(e.code), e.code),
    { enableHighAccuracy: true, maximumAge: opts.maximumAgeMs ?? 30_000, timeout: opts.timeoutMs ?? 60_000 },
  );
  return () => geo.clearWatch(id);
}
