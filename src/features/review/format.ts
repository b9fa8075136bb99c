// Number and time formatting for the review (display only; figures come from src/domain/stats).
import type { Observer } from '../../domain/model';

export const DASH = '–';

export function fmtNumber(v: number | null | undefined, digits = 1): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return DASH;
  return v.toFixed(digits);
}

export const fmtHours = (h: number): string => `${fmtNumber(h, 1)} h`;
export const fmtNm = (nm: number): string => `${fmtNumber(nm, 1)} nm`;
export const fmtTenths = (v: number | null): string => (v === null ? DASH : `${fmtNumber(v, 1)}/10`);
export const fmtCm = (v: number | null): string => (v === null ? DASH : `${fmtNumber(v, 0)} cm`);
export const fmtPercent = (share: number | null): string => (share === null ? DASH : `${fmtNumber(share * 100, 0)} %`);
export const fmtSigned = (v: number | null, digits = 1): string => (v === null ? DASH : `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(v).toFixed(digits)}`);

/** "2026-03-09 00:00 UTC" */
export function fmtUtc(iso: string | null): string {
  if (!iso) return DASH;
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

export function fmtUtcMs(ms: number): string {
  return fmtUtc(new Date(ms).toISOString());
}

export function observerLabel(observers: readonly Observer[], id: string): string {
  const o = observers.find((x) => x.id === id);
  return o ? `${o.name} (${o.initials})` : `Unknown observer (${id.slice(0, 8)})`;
}

export function observerInitials(observers: readonly Observer[], id: string): string {
  return observers.find((x) => x.id === id)?.initials ?? '?';
}
