// One observation as a flat record: the columns of the CSV file, the properties of a GeoJSON
// point and the fields of an NDJSON line. One column group per ice type (a, b, c: thickest
// first, as the egg code orders them, each in the egg code's order: concentration, stage, form,
// then thickness), then a block of deformation columns for a, b, c and a block of snow columns
// for a, b, c. WMO terms with SIGRID-3 codes beside them, UTC times, decimal degrees. Names carry
// their units so a spreadsheet or R user need not look them up.
import { deformationOf, snowOf } from '../domain/iceTypes';
import { ICE_TYPE_LETTERS, type Cruise, type Deformation, type IceCategory, type Observation, type SnowCover } from '../domain/model';
import { concentrationCode, floeSizeCode, stageCode, stageTermLabel, totalConcentrationCode, totalConcentrationTermLabel } from './codes';
import type { Collocation } from '../domain/collocation/collocate';
import { ICEINFO_COLUMNS, iceinfoCells } from './iceinfoColumns';

export type Cell = string | number | boolean | null;

const CATEGORY_FIELDS = [
  'partial_concentration_tenths',
  'partial_concentration_sigrid3',
  'stage',
  'stage_term',
  'stage_sigrid3',
  'floe_size',
  'floe_size_sigrid3',
  'thickness_cm',
] as const;

const DEFORMATION_FIELDS = ['ridged_tenths', 'rafted_tenths', 'sail_height_m'] as const;
const SNOW_FIELDS = ['snow_cover', 'snow_wetness', 'snow_crust', 'snow_drifts', 'snow_depth_cm'] as const;

export const CATEGORY_LETTERS = ICE_TYPE_LETTERS;

export const FLAT_COLUMNS: readonly string[] = [
  'observation_id',
  'cruise_id',
  'time_utc',
  'lat',
  'lon',
  'position_source',
  'position_accuracy_m',
  'observer_id',
  'observer_initials',
  'total_concentration_tenths',
  'total_concentration_sigrid3',
  'total_concentration_term',
  ...CATEGORY_LETTERS.flatMap((l) => CATEGORY_FIELDS.map((f) => `${l}_${f}`)),
  'trace_stage',
  'trace_stage_sigrid3',
  'remaining_stage',
  'remaining_stage_sigrid3',
  ...CATEGORY_LETTERS.flatMap((l) => DEFORMATION_FIELDS.map((f) => `${l}_${f}`)),
  ...CATEGORY_LETTERS.flatMap((l) => SNOW_FIELDS.map((f) => `${l}_${f}`)),
  'open_water_kind',
  'open_water_width_m',
  'open_water_orientation_deg',
  'melt_pond_cover_tenths',
  'melt_pond_state',
  'icebergs',
  'bergy_bits',
  'growlers',
  'air_temp_c',
  'water_temp_c',
  'salinity_psu',
  'wind_speed_kn',
  'wind_from_deg',
  'visibility_km',
  'cloud_oktas',
  'notes',
  'photo_count',
  'revision',
  'saved_at_utc',
  'saved_by',
  'device_id',
  'deleted',
];

const v = <T>(x: T | undefined | null): T | null => (x === undefined ? null : x);

function categoryCells(c: IceCategory | undefined): Cell[] {
  if (!c) return CATEGORY_FIELDS.map(() => null);
  return [
    c.partialConcentration,
    concentrationCode(c.partialConcentration),
    c.stage,
    stageTermLabel(c.stage),
    stageCode(c.stage),
    v(c.floeSize),
    c.floeSize === undefined ? null : floeSizeCode(c.floeSize),
    v(c.thicknessCm),
  ];
}

function deformationCells(d: Deformation | undefined): Cell[] {
  return [v(d?.ridgedTenths), v(d?.raftedTenths), v(d?.sailHeightM)];
}

function snowCells(s: SnowCover | undefined): Cell[] {
  return [v(s?.cover), v(s?.wetness), v(s?.crust), v(s?.drifts), v(s?.depthCm)];
}

export interface FlatContext {
  initials: Map<string, string>;
  /** Chart and grid values per observation id; when given, ICEINFO_COLUMNS follow FLAT_COLUMNS. */
  collocation?: ReadonlyMap<string, Collocation>;
}

export function flatContext(cruise: Cruise, collocation?: ReadonlyMap<string, Collocation>): FlatContext {
  return { initials: new Map(cruise.observers.map((o) => [o.id, o.initials])), ...(collocation ? { collocation } : {}) };
}

/** The columns of a flat record: FLAT_COLUMNS, then the derived ice information block if any. */
export function flatColumns(ctx: FlatContext): readonly string[] {
  return ctx.collocation ? [...FLAT_COLUMNS, ...ICEINFO_COLUMNS] : FLAT_COLUMNS;
}

/** The cells of one observation, in FLAT_COLUMNS order. */
export function flatRow(o: Observation, ctx: FlatContext): Cell[] {
  const w = o.weather;
  return [
    o.id,
    o.cruiseId,
    o.time,
    o.position ? o.position.lat : null,
    o.position ? o.position.lon : null,
    o.position ? o.position.source : null,
    v(o.position?.accuracyM),
    o.observerId,
    ctx.initials.get(o.observerId) ?? null,
    o.totalConcentration,
    totalConcentrationCode(o),
    o.totalConcentration === null ? null : totalConcentrationTermLabel(o),
    ...categoryCells(o.categories[0]),
    ...categoryCells(o.categories[1]),
    ...categoryCells(o.categories[2]),
    v(o.traceStage),
    o.traceStage === undefined ? null : stageCode(o.traceStage),
    v(o.remainingStage),
    o.remainingStage === undefined ? null : stageCode(o.remainingStage),
    ...deformationCells(deformationOf(o, 0)),
    ...deformationCells(deformationOf(o, 1)),
    ...deformationCells(deformationOf(o, 2)),
    ...snowCells(snowOf(o, 0)),
    ...snowCells(snowOf(o, 1)),
    ...snowCells(snowOf(o, 2)),
    v(o.openWater?.kind),
    v(o.openWater?.widthM),
    v(o.openWater?.orientationDeg),
    v(o.meltPonds?.coverTenths),
    v(o.meltPonds?.state),
    v(o.icebergs?.icebergs),
    v(o.icebergs?.bergyBits),
    v(o.icebergs?.growlers),
    v(w?.airTempC),
    v(w?.waterTempC),
    v(w?.salinityPsu),
    v(w?.windSpeedKn),
    v(w?.windFromDeg),
    v(w?.visibilityKm),
    v(w?.cloudOktas),
    o.notes,
    o.photoIds.length,
    o.revision,
    o.savedAt,
    o.savedBy,
    o.deviceId,
    o.deleted,
    ...(ctx.collocation ? iceinfoCells(ctx.collocation.get(o.id)) : []),
  ];
}

/** The same cells as an object keyed by column name. */
export function flatRecord(o: Observation, ctx: FlatContext): Record<string, Cell> {
  const row = flatRow(o, ctx);
  const cols = flatColumns(ctx);
  const out: Record<string, Cell> = {};
  for (let i = 0; i < cols.length; i++) out[cols[i] as string] = row[i] as Cell;
  return out;
}

export interface FlatOptions {
  /** Include soft-deleted observations (column `deleted` says which); default false. */
  includeDeleted?: boolean;
  /** Chart and grid values per observation id (src/domain/collocation), appended as ICEINFO_COLUMNS. */
  collocation?: ReadonlyMap<string, Collocation>;
}

export function exportedObservations(observations: readonly Observation[], opts: FlatOptions = {}): Observation[] {
  const list = opts.includeDeleted ? [...observations] : observations.filter((o) => !o.deleted);
  return list.sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
}
