// Ice charts and concentration grids as the app and the CLI hold them once read: plain data, in
// the product's own plane (projected metres, or degrees for a geographic chart), with the
// projection kept as a proj4 definition. The readers are in src/iceinfo/.
import type { IsoUtc } from '../model.ts';

/** The SIGRID-3 attributes of one chart polygon (WMO/TD-No. 1214), as text codes. */
export interface ChartAttributes {
  POLY_TYPE: string | null;
  CT: string | null;
  CA: string | null;
  SA: string | null;
  FA: string | null;
  CB: string | null;
  SB: string | null;
  FB: string | null;
  CC: string | null;
  SC: string | null;
  FC: string | null;
  CN: string | null;
  CD: string | null;
}

export const CHART_ATTRIBUTE_NAMES = ['POLY_TYPE', 'CT', 'CA', 'SA', 'FA', 'CB', 'SB', 'FB', 'CC', 'SC', 'FC', 'CN', 'CD'] as const satisfies readonly (keyof ChartAttributes)[];

/** One polygon: rings of [x, y] pairs flattened, the outer ring first, then holes. */
export interface ChartPolygon {
  rings: number[][];
  /** [minX, minY, maxX, maxY] of the outer ring in the chart plane. */
  bbox: [number, number, number, number];
  attributes: ChartAttributes;
}

export interface IceChart {
  id: string;
  /** What the user typed, e.g. the issuing service and chart name. */
  sourceName: string;
  /** The chart's valid time (UTC). */
  chartTime: IsoUtc;
  importedAt: IsoUtc;
  fileName: string;
  /** proj4 definition of the plane the rings are in; `EPSG:4326` for degrees. */
  crs: string;
  /** True when the rings are longitude/latitude degrees (antimeridian handling applies). */
  geographic: boolean;
  polygons: ChartPolygon[];
}

/**
 * The meaning of a grid cell byte. 0..100 is a concentration in percent; the flags follow the
 * byte values of the NSIDC polar stereographic passive-microwave products (251 pole hole, 253
 * coast, 254 land, 255 missing: NSIDC-0051 user guide, from memory) so a reader can say what a
 * cell was. 252 marks a cell our reader could not classify (an unknown flag value).
 */
export const GRID_FLAG = { poleHole: 251, unknownFlag: 252, coast: 253, land: 254, missing: 255 } as const;
export type GridFlagName = keyof typeof GRID_FLAG;
export const GRID_MAX_PERCENT = 100;

export interface ConcentrationGrid {
  id: string;
  sourceName: string;
  /** The product's valid time (UTC). */
  gridTime: IsoUtc;
  importedAt: IsoUtc;
  fileName: string;
  /** proj4 definition of the grid plane, and the EPSG code it was recognised as. */
  crs: string;
  epsg: number;
  width: number;
  height: number;
  /** Centre of the first cell (row 0, column 0) in the grid plane, metres. */
  x0: number;
  y0: number;
  /** Cell size in metres; dy is negative when row 0 is the northern (top) row. */
  dx: number;
  dy: number;
  /** width x height bytes, row by row: percent 0..100 or a GRID_FLAG value. */
  cells: Uint8Array;
}

// The flag name of every byte above 100, looked up once (sampling meets a flag per coast cell).
const FLAG_BY_BYTE = new Map<number, GridFlagName>((Object.entries(GRID_FLAG) as [GridFlagName, number][]).map(([k, v]) => [v, k]));

export function flagName(cell: number): GridFlagName | null {
  if (cell <= GRID_MAX_PERCENT) return null;
  return FLAG_BY_BYTE.get(cell) ?? 'unknownFlag';
}
