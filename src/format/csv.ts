// CSV for spreadsheets and R: RFC 4180 (comma, CRLF, fields with comma, quote or line break
// quoted, quotes doubled), a header row of FLAT_COLUMNS, one row per observation.
// Spreadsheets run a text cell that starts with = + - @ (or tab / carriage return) as a formula
// (OWASP "CSV injection"); such text cells get a leading apostrophe. Some spreadsheets also skip
// leading spaces and line breaks before the sign, and read the full-width forms (＝ ＋ － ＠)
// as the ASCII ones, so those count too. Numbers are never altered, so negative temperatures and
// western longitudes stay numbers.
import type { Cell } from './flat';
import { exportedObservations, flatColumns, flatContext, flatRow, type FlatOptions } from './flat';
import type { LogBundle } from './types';

const NEEDS_QUOTES = /[",\r\n]/;
const FORMULA_START = /^[\t\r\n]|^[\s\u00a0\u3000]*[=+\-@\uff1d\uff0b\uff0d\uff20]/;

export function csvCell(c: Cell): string {
  if (c === null) return '';
  if (typeof c === 'number') return Number.isFinite(c) ? String(c) : '';
  if (typeof c === 'boolean') return c ? 'true' : 'false';
  const s = FORMULA_START.test(c) ? `'${c}` : c;
  return NEEDS_QUOTES.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvLine(cells: readonly Cell[]): string {
  return cells.map(csvCell).join(',') + '\r\n';
}

export function writeCsv(bundle: LogBundle, opts: FlatOptions = {}): string[] {
  const ctx = flatContext(bundle.cruise, opts.collocation);
  const parts = [csvLine(flatColumns(ctx))];
  for (const o of exportedObservations(bundle.observations, opts)) parts.push(csvLine(flatRow(o, ctx)));
  return parts;
}
