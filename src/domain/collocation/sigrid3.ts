// Reading the SIGRID-3 attribute codes of an ice chart polygon (WMO/TD-No. 1214, SIGRID-3: a
// vector archive format for sea ice charts). The writing side (our own codes for exports) lives
// in nomenclature.ts; this is the inverse, for charts made by an ice service.
import { STAGE_KEYS, type StageKey } from '../model.ts';
import { STAGES } from '../nomenclature.ts';

/** A concentration read from a SIGRID-3 code: a range in tenths and the value we compare with. */
export interface ChartConcentration {
  /** Lowest and highest tenths the code allows (inclusive). */
  lo: number;
  hi: number;
  /** The figure compared with an observation: the middle of the range. */
  tenths: number;
}

/**
 * SIGRID-3 concentration codes (WMO/TD-No. 1214): `00` ice free, `01` less than 1/10, `02` bergy
 * water, `10`..`90` one value, `91` 9+/10, `92` 10/10, `99` unknown, and two-digit ranges "ab" with
 * a < b (`46` is 4/10 to 6/10). Codes with a second digit 1 and a first digit 2..8 (`81`) are read
 * as a/10 to 10/10 (from memory of the code table; unconfirmed). Anything else, or `99`, is null.
 */
export function readConcentrationCode(raw: unknown): ChartConcentration | null {
  const code = normaliseCode(raw);
  if (code === null) return null;
  if (code === '00' || code === '02') return { lo: 0, hi: 0, tenths: 0 };
  // Less than 1/10 is reported as 0/10 in whole tenths (the trade's habit; the range says "< 1").
  if (code === '01') return { lo: 0, hi: 1, tenths: 0 };
  if (code === '91') return { lo: 9, hi: 10, tenths: 9.5 };
  if (code === '92') return { lo: 10, hi: 10, tenths: 10 };
  if (code === '99') return null;
  const a = Number(code[0]);
  const b = Number(code[1]);
  if (b === 0 && a >= 1 && a <= 9) return { lo: a, hi: a, tenths: a };
  if (b === 1 && a >= 2 && a <= 8) return { lo: a, hi: 10, tenths: (a + 10) / 2 };
  if (a >= 1 && b > a && b <= 9) return { lo: a, hi: b, tenths: (a + b) / 2 };
  return null;
}

/** Two-digit code text from a shapefile or GeoJSON attribute ("92", 92, " 9"); null when empty. */
export function normaliseCode(raw: unknown): string | null {
  if (raw === null || raw === undefined) return null;
  const s = typeof raw === 'number' ? (Number.isInteger(raw) && raw >= 0 && raw <= 99 ? String(raw).padStart(2, '0') : '') : String(raw).trim();
  if (s === '' || s === '-9' || s === '-09') return null;
  return /^\d\d$/.test(s) ? s : /^\d$/.test(s) ? `0${s}` : null;
}

/** Whether a code is a well-formed SIGRID-3 concentration code (for the checks of an import). */
export function isConcentrationCode(raw: unknown): boolean {
  const c = normaliseCode(raw);
  return c === '99' || readConcentrationCode(raw) !== null;
}

const STAGE_BY_CODE: ReadonlyMap<string, StageKey> = (() => {
  const m = new Map<string, StageKey>();
  // The first key in STAGE_KEYS order with a code is its general term ("new" before "frazil").
  for (const k of STAGE_KEYS) if (!m.has(STAGES[k].sigrid3)) m.set(STAGES[k].sigrid3, k);
  return m;
})();

/**
 * The stage of development of a SIGRID-3 stage code (`81` new ice ... `97` multi-year, `98`
 * glacier ice; WMO/TD-No. 1214), or null for `80` (no stage), `99` (unknown), empty or unknown.
 */
export function readStageCode(raw: unknown): StageKey | null {
  const c = normaliseCode(raw);
  if (c === null || c === '80' || c === '99') return null;
  const k = STAGE_BY_CODE.get(c);
  return k === undefined || k === 'undetermined' ? null : k;
}

/** Whether a stage code is one SIGRID-3 defines (80..99 as the table has them). */
export function isStageCode(raw: unknown): boolean {
  const c = normaliseCode(raw);
  return c === '80' || c === '99' || (c !== null && STAGE_BY_CODE.has(c));
}

/**
 * POLY_TYPE of SIGRID-3: `I` ice, `W` water, `L` land, `N` no data, `S` ice shelf (from memory of
 * WMO/TD-No. 1214; only I and W carry a concentration we compare with).
 */
export const POLY_TYPES = ['I', 'W', 'L', 'N', 'S'] as const;
export type PolyType = (typeof POLY_TYPES)[number];

export function readPolyType(raw: unknown): PolyType | null {
  const s = typeof raw === 'string' ? raw.trim().toUpperCase() : '';
  return (POLY_TYPES as readonly string[]).includes(s) ? (s as PolyType) : null;
}
