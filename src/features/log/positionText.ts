// Typed positions, read and shown through the domain's coordinate parser and formatter, so the
// form accepts every format the domain reads (decimal degrees, degrees and decimal minutes,
// degrees minutes seconds, with hemisphere letters or signs).
import { formatPosition, parsePosition } from '../../domain/position';

export type PositionReading = { ok: true; lat: number; lon: number } | { ok: false; message: string };

export function readPosition(text: string): PositionReading {
  const r = parsePosition(text);
  return r.ok ? { ok: true, lat: r.value.lat, lon: r.value.lon } : { ok: false, message: r.error };
}

/** Degrees and decimal minutes, as the list and the bridge read positions. */
export function showPosition(p: { lat: number; lon: number } | null | undefined): string {
  return p ? formatPosition(p, 'ddm') : '—';
}
