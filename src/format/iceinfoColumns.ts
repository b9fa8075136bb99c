// The block of columns appended at the end of a flat record (CSV, NDJSON, GeoJSON properties)
// when an export is made with ice charts or concentration grids: values derived from those
// products at the observation's place and time, never part of the observation itself (the JSON
// log does not carry them). docs/format.md documents them.
import type { Collocation } from '../domain/collocation/collocate';
import { STAGES } from '../domain/nomenclature';
import type { Cell } from './flat';

export const ICEINFO_COLUMNS: readonly string[] = [
  'chart_source',
  'chart_time_utc',
  'chart_hours_apart',
  'chart_poly_type',
  'chart_ct_sigrid3',
  'chart_total_concentration_tenths',
  'chart_total_concentration_min_tenths',
  'chart_total_concentration_max_tenths',
  'chart_sa_sigrid3',
  'chart_stage_a',
  'grid_source',
  'grid_time_utc',
  'grid_hours_apart',
  'grid_flag',
  'grid_concentration_nearest_percent',
  'grid_concentration_bilinear_percent',
];

const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits;

export function iceinfoCells(c: Collocation | undefined): Cell[] {
  const ch = c?.chart ?? null;
  const g = c?.grid ?? null;
  const s = g?.sample;
  return [
    ch?.sourceName ?? null,
    ch?.chartTime ?? null,
    ch ? round(ch.hoursApart, 2) : null,
    ch?.polyType ?? null,
    ch?.ctCode ?? null,
    ch?.concentration?.tenths ?? null,
    ch?.concentration?.lo ?? null,
    ch?.concentration?.hi ?? null,
    ch?.saCode ?? null,
    ch?.stage ? STAGES[ch.stage].label : null,
    g?.sourceName ?? null,
    g?.gridTime ?? null,
    g ? round(g.hoursApart, 2) : null,
    s === undefined ? null : s.kind === 'flag' ? s.flag : s.kind === 'outside' ? 'outside' : null,
    s?.kind === 'value' ? s.nearestPercent : null,
    s?.kind === 'value' ? round(s.bilinearPercent, 1) : null,
  ];
}
