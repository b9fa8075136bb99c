// Concentration grids for the tests, written with the formats' own writers: geotiff's
// writeArrayBuffer and h5wasm (a NetCDF-4 file is HDF5 with the CF attributes). An invented grid
// on the EPSG:3413 plane: 6 x 5 cells of 25 km, the pole in the middle of it.
import { writeArrayBuffer } from 'geotiff';
import h5wasm from 'h5wasm/node';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeClassicNetcdf, type NcVariable } from './netcdfClassic';

export const W = 6;
export const H = 5;
export const CELL = 25_000;
/** Top-left corner of the grid (outer edge) in the EPSG:3413 plane, metres. */
export const LEFT = -75_000;
export const TOP = 62_500;

// Row 0 is the northern row (largest y). 251 pole hole, 253 coast, 254 land, 255 missing.
export const PERCENT: number[] = [
  0, 15, 30, 45, 60, 75,
  90, 100, 100, 254, 254, 253,
  80, 251, 251, 70, 60, 50,
  40, 30, 255, 10, 5, 0,
  100, 100, 100, 100, 100, 100,
];

/** Centre of a cell in the plane. */
export const centre = (row: number, col: number): [number, number] => [LEFT + CELL * (col + 0.5), TOP - CELL * (row + 0.5)];

export async function gridTiff(values: ArrayLike<number> = PERCENT, over: Record<string, unknown> = {}): Promise<Uint8Array> {
  const buf = await writeArrayBuffer(Uint8Array.from(values), {
    width: W,
    height: H,
    ModelPixelScale: [CELL, CELL, 0],
    ModelTiepoint: [0, 0, 0, LEFT, TOP, 0],
    GTModelTypeGeoKey: 1,
    GTRasterTypeGeoKey: 1,
    ProjectedCSTypeGeoKey: 3413,
    ...over,
  } as never);
  return new Uint8Array(buf);
}

export interface Nc4Options {
  /** Leave out the x/y coordinate variables. */
  noCoordinates?: boolean;
  /** Store the rows south first (y increasing), as some products do. */
  southFirst?: boolean;
  /** A declared shape much larger than the data (a hostile file). */
  hugeShape?: [number, number];
}

/** The grid's values as the NetCDF files store them: percent x 100, flags 2510/2530/2540, fill -32767. */
function storedRows(opts: Nc4Options): number[] {
  const raw = PERCENT.map((p) => (p === 251 ? 2510 : p === 253 ? 2530 : p === 254 ? 2540 : p === 255 ? -32767 : p * 100));
  return opts.southFirst ? Array.from({ length: H }, (_, r) => raw.slice((H - 1 - r) * W, (H - r) * W)).flat() : raw;
}

/** Cell-centre coordinates in km, y in the file's row order. */
function axesKm(opts: Nc4Options): { xs: Float64Array; ys: Float64Array } {
  return {
    xs: Float64Array.from({ length: W }, (_, c) => centre(0, c)[0] / 1000),
    ys: Float64Array.from({ length: H }, (_, r) => centre(opts.southFirst ? H - 1 - r : r, 0)[1] / 1000),
  };
}

/**
 * The same grid as a classic NetCDF file (CDF-1, or CDF-2 with 64-bit offsets), written by our
 * writer after Unidata's NetCDF Classic Format Specification, with the same CF attributes as the
 * NetCDF-4 file below. `hugeShape` declares dimensions far larger than the data that follows.
 */
export function gridNcClassic(opts: Nc4Options & { version?: 1 | 2 } = {}): Uint8Array {
  const [rows, cols] = opts.hugeShape ?? [H, W];
  const { xs, ys } = axesKm(opts);
  const vars: NcVariable[] = [
    {
      name: 'ice_conc',
      dims: ['y', 'x'],
      type: 'short',
      data: opts.hugeShape ? [0, 0] : storedRows(opts),
      attrs: [
        { name: 'standard_name', type: 'char', value: 'sea_ice_area_fraction' },
        { name: 'units', type: 'char', value: '%' },
        { name: 'scale_factor', type: 'double', value: [0.01] },
        { name: '_FillValue', type: 'short', value: [-32767] },
        { name: 'flag_values', type: 'short', value: [2510, 2530, 2540] },
        { name: 'flag_meanings', type: 'char', value: 'pole_hole coast land' },
        { name: 'grid_mapping', type: 'char', value: 'crs' },
      ],
    },
    ...(opts.noCoordinates || opts.hugeShape
      ? []
      : [
          { name: 'x', dims: ['x'], type: 'double', data: xs, attrs: [{ name: 'units', type: 'char', value: 'km' }] } satisfies NcVariable,
          { name: 'y', dims: ['y'], type: 'double', data: ys, attrs: [{ name: 'units', type: 'char', value: 'km' }] } satisfies NcVariable,
        ]),
    { name: 'time', dims: ['time'], type: 'double', data: [20516.5], attrs: [{ name: 'units', type: 'char', value: 'days since 1970-01-01 00:00:00' }] },
    {
      name: 'crs',
      dims: [],
      type: 'int',
      data: [0],
      attrs: [
        { name: 'grid_mapping_name', type: 'char', value: 'polar_stereographic' },
        { name: 'latitude_of_projection_origin', type: 'double', value: [90] },
        { name: 'straight_vertical_longitude_from_pole', type: 'double', value: [-45] },
        { name: 'standard_parallel', type: 'double', value: [70] },
      ],
    },
  ];
  return writeClassicNetcdf({
    version: opts.version ?? 1,
    dims: [
      { name: 'y', size: rows },
      { name: 'x', size: cols },
      { name: 'time', size: 1 },
    ],
    attrs: [{ name: 'Conventions', type: 'char', value: 'CF-1.7' }],
    vars,
  });
}

/**
 * A NetCDF-4 file as h5wasm writes it: `ice_conc` (short, scale 0.01 -> percent, _FillValue -32767,
 * flag_values 2510 2530 2540 for pole hole / coast / land as CF flag_meanings), `x`, `y` in km,
 * `time` in days since 1970-01-01 and a `crs` grid-mapping variable (CF polar_stereographic).
 */
export async function gridNc4(opts: Nc4Options = {}): Promise<Uint8Array> {
  await h5wasm.ready;
  const dir = mkdtempSync(join(tmpdir(), 'floe-ledger-test-nc4-'));
  const path = join(dir, 'grid.nc');
  try {
    const f = new h5wasm.File(path, 'w');
    const rows = storedRows(opts);
    const shape = opts.hugeShape ?? [H, W];
    const conc = opts.hugeShape
      ? f.create_dataset({ name: 'ice_conc', data: new Int16Array(4), shape: [2, 2], maxshape: [null, null], chunks: [2, 2], dtype: '<h' })
      : f.create_dataset({ name: 'ice_conc', data: Int16Array.from(rows), shape, dtype: '<h' });
    if (opts.hugeShape) conc.resize(shape);
    conc.create_attribute('standard_name', 'sea_ice_area_fraction');
    conc.create_attribute('units', '%');
    conc.create_attribute('scale_factor', new Float64Array([0.01]), [], '<d');
    conc.create_attribute('_FillValue', new Int16Array([-32767]), [], '<h');
    conc.create_attribute('flag_values', new Int16Array([2510, 2530, 2540]), [3], '<h');
    conc.create_attribute('flag_meanings', 'pole_hole coast land');
    conc.create_attribute('grid_mapping', 'crs');
    if (!opts.noCoordinates) {
      const { xs, ys } = axesKm(opts);
      f.create_dataset({ name: 'x', data: xs }).create_attribute('units', 'km');
      f.create_dataset({ name: 'y', data: ys }).create_attribute('units', 'km');
    }
    const t = f.create_dataset({ name: 'time', data: new Float64Array([20516.5]) });
    t.create_attribute('units', 'days since 1970-01-01 00:00:00');
    const crs = f.create_dataset({ name: 'crs', data: new Int32Array([0]) });
    crs.create_attribute('grid_mapping_name', 'polar_stereographic');
    crs.create_attribute('latitude_of_projection_origin', new Float64Array([90]), [], '<d');
    crs.create_attribute('straight_vertical_longitude_from_pole', new Float64Array([-45]), [], '<d');
    crs.create_attribute('standard_parallel', new Float64Array([70]), [], '<d');
    f.close();
    return new Uint8Array(readFileSync(path));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
