// Reading a gridded sea-ice concentration product: GeoTIFF (`geotiff`), NetCDF-4 / HDF5
// (`h5wasm`, loaded by the caller because its WebAssembly differs between Node and the browser)
// or classic NetCDF (`netcdfjs`). The grid must be on one of the NSIDC planes of
// projections.ts; its flags are honoured (gridCells.ts); a grid larger than the limits is
// refused before its cells are decoded.
import { fromArrayBuffer } from 'geotiff';
import { NetCDFReader } from 'netcdfjs';
import type { ConcentrationGrid } from '../domain/collocation/chartModel.ts';
import { encodeCells, flagFromMeaning, presetEncoding, type CellEncoding, type EncodedCells, type GeoTiffPreset } from './gridCells.ts';
import { ICEINFO_LIMITS } from './limits.ts';
import { refuse } from './problems.ts';
import { KNOWN_GRID_CRS } from './projections.ts';

export interface GridMeta {
  id: string;
  sourceName: string;
  /** The product time typed by the user (ISO 8601 UTC); a NetCDF time variable is used when absent. */
  gridTime?: string;
  fileName: string;
  importedAt: string;
  /** How a GeoTIFF's values read (NetCDF says it in its attributes). */
  preset?: GeoTiffPreset;
  /** The concentration variable of a NetCDF file, when it cannot be found by its names. */
  variable?: string;
}

export interface GridReadResult {
  grid: ConcentrationGrid;
  counts: EncodedCells['counts'];
  warnings: string[];
}

/** The part of h5wasm the reader uses: open a file that the caller has put at `path`. */
export interface Hdf5Opener {
  open(bytes: Uint8Array): Promise<Hdf5FileLike>;
}
export interface Hdf5AttrLike {
  value: unknown;
}
export interface Hdf5EntityLike {
  shape?: number[] | null;
  attrs: Record<string, Hdf5AttrLike>;
  value?: unknown;
  keys?: () => string[];
}
export interface Hdf5FileLike {
  keys(): string[];
  get(name: string): Hdf5EntityLike | null;
  close(): unknown;
}

export type GridKind = 'geotiff' | 'hdf5' | 'netcdf-classic';

export function sniffGrid(b: Uint8Array): GridKind | null {
  if (b.length >= 8 && b[0] === 0x89 && b[1] === 0x48 && b[2] === 0x44 && b[3] === 0x46) return 'hdf5';
  if (b.length >= 4 && b[0] === 0x43 && b[1] === 0x44 && b[2] === 0x46 && (b[3] === 1 || b[3] === 2)) return 'netcdf-classic';
  if (b.length >= 4 && ((b[0] === 0x49 && b[1] === 0x49 && (b[2] === 42 || b[2] === 43)) || (b[0] === 0x4d && b[1] === 0x4d && (b[3] === 42 || b[3] === 43)))) return 'geotiff';
  return null;
}

export async function readGridFile(bytes: Uint8Array, meta: GridMeta, hdf5?: Hdf5Opener): Promise<GridReadResult> {
  if (!meta.sourceName.trim()) refuse('type the source of the grid (e.g. the product name)');
  if (bytes.byteLength > ICEINFO_LIMITS.maxFileBytes) refuse(`${meta.fileName} has ${bytes.byteLength} bytes, more than the limit of ${ICEINFO_LIMITS.maxFileBytes} bytes for a grid`);
  const kind = sniffGrid(bytes);
  if (kind === 'geotiff') return readGeoTiff(bytes, meta);
  if (kind === 'netcdf-classic') return readCf(classicContainer(bytes, meta.fileName), meta);
  if (kind === 'hdf5') {
    if (!hdf5) refuse(`${meta.fileName} is NetCDF-4 / HDF5, which this program cannot read here`);
    const file = await hdf5.open(bytes);
    try {
      return readCf(hdf5Container(file), meta);
    } finally {
      file.close();
    }
  }
  refuse(`${meta.fileName} is not a GeoTIFF, NetCDF or HDF5 file`);
}

function checkSize(width: number, height: number, fileName: string): void {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 2 || height < 2) refuse(`${fileName}: a grid of ${width} x ${height} cells is not a concentration grid`);
  if (width > ICEINFO_LIMITS.maxGridSide || height > ICEINFO_LIMITS.maxGridSide || width * height > ICEINFO_LIMITS.maxGridCells) {
    refuse(`${fileName}: the grid has ${width} x ${height} cells, more than this program reads (at most ${ICEINFO_LIMITS.maxGridCells.toLocaleString('en')} cells and ${ICEINFO_LIMITS.maxGridSide} on a side)`);
  }
}

function timeOf(meta: GridMeta, fromFile: string | null): string {
  const raw = meta.gridTime?.trim() || fromFile;
  if (!raw) refuse(`${meta.fileName} carries no time: type the product's date and time`);
  const s = /^\d{4}-\d\d-\d\d$/.test(raw) ? `${raw}T00:00:00Z` : raw;
  const t = Date.parse(s);
  if (!/^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d(\.\d+)?)?(Z|[+-]\d\d:?\d\d)$/.test(s) || !Number.isFinite(t)) refuse(`the grid time "${raw}" is not an ISO 8601 date and time (e.g. 2026-03-04T12:00:00Z)`);
  return new Date(t).toISOString().replace('.000Z', 'Z');
}

// --- GeoTIFF ------------------------------------------------------------------------------------

async function readGeoTiff(bytes: Uint8Array, meta: GridMeta): Promise<GridReadResult> {
  const tiff = await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  const img = await tiff.getImage();
  const width = img.getWidth();
  const height = img.getHeight();
  checkSize(width, height, meta.fileName);
  const keys = (img.getGeoKeys() ?? {}) as Record<string, unknown>;
  const epsg = Number(keys.ProjectedCSTypeGeoKey);
  const crs = KNOWN_GRID_CRS[epsg];
  if (!crs) refuse(`${meta.fileName}: the GeoTIFF's projection ${Number.isFinite(epsg) && epsg > 0 ? `EPSG:${epsg}` : '(none given)'} is not one of the supported grids (EPSG ${Object.keys(KNOWN_GRID_CRS).join(', ')})`);
  let origin: number[];
  let res: number[];
  try {
    origin = img.getOrigin();
    res = img.getResolution();
  } catch {
    refuse(`${meta.fileName}: the GeoTIFF has no georeferencing (tie point and pixel scale)`);
  }
  const [ox, oy] = origin as [number, number];
  const [rx, ry] = res as [number, number];
  if (!(Math.abs(rx) > 0) || !(Math.abs(ry) > 0)) refuse(`${meta.fileName}: the GeoTIFF's cell size is not usable (${rx} x ${ry})`);
  const nodata = img.getGDALNoData();
  const raster = (await img.readRasters({ samples: [0], interleave: true })) as unknown as ArrayLike<number>;
  const enc = presetEncoding(meta.preset ?? 'percent', nodata ?? null);
  const { cells, counts } = encodeCells(raster, width, height, enc, ry > 0);
  const warnings = counts.outOfRange > 0 ? [`${counts.outOfRange} cells held values outside 0..${enc.full} that are no known flag; they are left out`] : [];
  return {
    grid: {
      id: meta.id,
      sourceName: meta.sourceName.trim(),
      gridTime: timeOf(meta, null),
      importedAt: meta.importedAt,
      fileName: meta.fileName,
      crs: crs.proj4,
      epsg,
      width,
      height,
      x0: ox + rx / 2,
      // Rows are turned north-first when the file stores them south-first (positive y scale).
      y0: ry > 0 ? oy + ry * (height - 0.5) : oy + ry / 2,
      dx: rx,
      dy: -Math.abs(ry),
      cells,
    },
    counts,
    warnings,
  };
}

// --- NetCDF (CF Conventions) ----------------------------------------------------------------------

interface CfVar {
  name: string;
  shape: number[];
  attrs: Record<string, unknown>;
  read(): ArrayLike<number>;
}
interface CfContainer {
  vars: CfVar[];
  global: Record<string, unknown>;
}

const scalar = (v: unknown): unknown => {
  if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
    const a = v as unknown as ArrayLike<number | bigint>;
    if (a.length === 1) return Number(a[0]);
    return Array.from({ length: a.length }, (_, i) => Number(a[i]));
  }
  if (Array.isArray(v) && v.length === 1) return scalar(v[0]);
  return v;
};

function hdf5Container(file: Hdf5FileLike): CfContainer {
  const vars: CfVar[] = [];
  for (const name of file.keys()) {
    const e = file.get(name);
    if (!e || typeof e.keys === 'function' || !('shape' in e)) continue;
    const attrs: Record<string, unknown> = {};
    for (const [k, a] of Object.entries(e.attrs)) attrs[k] = scalar(a.value);
    vars.push({
      name,
      shape: e.shape ?? [],
      attrs,
      read: () => {
        const v = e.value;
        if (ArrayBuffer.isView(v)) return v as unknown as ArrayLike<number>;
        if (Array.isArray(v)) return v as number[];
        return [Number(v)];
      },
    });
  }
  return { vars, global: {} };
}

function classicContainer(bytes: Uint8Array, fileName: string): CfContainer {
  let r: NetCDFReader;
  try {
    r = new NetCDFReader(bytes);
  } catch (e) {
    refuse(`${fileName}: the NetCDF file cannot be read (${e instanceof Error ? e.message : String(e)})`);
  }
  const dims = r.dimensions;
  return {
    global: Object.fromEntries(r.globalAttributes.map((a) => [a.name, a.value])),
    vars: r.variables.map((v) => ({
      name: v.name,
      shape: v.dimensions.map((d) => (v.record && d === r.recordDimension.id ? r.recordDimension.length : (dims[d]?.size ?? 0))),
      attrs: Object.fromEntries((v.attributes as { name: string; value: unknown }[]).map((a) => [a.name, scalar(a.value)])),
      read: () => r.getDataVariable(v.name).flat() as number[],
    })),
  };
}

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : typeof v === 'bigint' ? Number(v) : null);
const text = (v: unknown): string => (typeof v === 'string' ? v : '');

function findConcentration(c: CfContainer, meta: GridMeta): CfVar {
  if (meta.variable) {
    const v = c.vars.find((x) => x.name === meta.variable);
    if (!v) refuse(`${meta.fileName} has no variable "${meta.variable}" (it has ${c.vars.map((x) => x.name).join(', ') || 'none'})`);
    return v;
  }
  const grids = c.vars.filter((v) => v.shape.filter((n) => n > 1).length === 2);
  const byStd = grids.find((v) => text(v.attrs.standard_name) === 'sea_ice_area_fraction');
  const byName = grids.find((v) => /^(ice_conc|sic|seaice_conc|sea_ice_concentration|conc|cdr_seaice_conc)$/i.test(v.name));
  const v = byStd ?? byName;
  if (!v) refuse(`${meta.fileName}: no sea-ice concentration variable found (standard_name sea_ice_area_fraction, or name ice_conc / sic); variables: ${c.vars.map((x) => x.name).join(', ') || 'none'}`);
  return v;
}

function axis(c: CfContainer, names: readonly string[], std: string, length: number, fileName: string, label: string): { start: number; step: number } {
  const v = c.vars.find((x) => text(x.attrs.standard_name) === std && x.shape.length === 1) ?? c.vars.find((x) => names.includes(x.name) && x.shape.length === 1);
  if (!v) refuse(`${fileName} has no ${label} coordinate variable (standard_name ${std}, or ${names.join(' / ')}): the grid cannot be placed`);
  if (v.shape[0] !== length) refuse(`${fileName}: the coordinate ${v.name} has ${v.shape[0]} values for ${length} cells`);
  const units = text(v.attrs.units).toLowerCase();
  const k = units === 'km' || units === 'kilometers' || units === 'kilometres' ? 1000 : 1;
  const vals = v.read();
  const a = Number(vals[0]) * k;
  const b = Number(vals[length - 1]) * k;
  const step = (b - a) / (length - 1);
  for (let i = 1; i < length; i++) {
    const d = (Number(vals[i]) - Number(vals[i - 1])) * k;
    if (!(Math.abs(d - step) <= Math.abs(step) * 1e-3)) refuse(`${fileName}: the coordinate ${v.name} is not evenly spaced (at index ${i})`);
  }
  return { start: a, step };
}

function epsgOf(c: CfContainer, v: CfVar, fileName: string): number {
  const gmName = text(v.attrs.grid_mapping);
  const gm = c.vars.find((x) => x.name === gmName) ?? c.vars.find((x) => text(x.attrs.grid_mapping_name) !== '');
  const known = (n: number) => KNOWN_GRID_CRS[n] !== undefined;
  const texts = [...Object.values(gm?.attrs ?? {}), ...Object.values(c.global)].filter((x): x is string => typeof x === 'string');
  for (const t of texts) {
    for (const m of t.matchAll(/EPSG["':,\s]+(\d{4,5})/gi)) if (known(Number(m[1]))) return Number(m[1]);
  }
  if (!gm) refuse(`${fileName}: the concentration variable names no grid mapping (CF grid_mapping), so its projection is unknown`);
  const a = gm.attrs;
  const name = text(a.grid_mapping_name);
  const lat0 = num(a.latitude_of_projection_origin);
  const hughes = num(a.semi_major_axis) === 6378273;
  if (name === 'polar_stereographic') {
    const lon = num(a.straight_vertical_longitude_from_pole);
    const ts = num(a.standard_parallel);
    if (lat0 === 90 && lon === -45 && ts === 70) return hughes ? 3411 : 3413;
    if (lat0 === -90 && lon === 0 && ts === -70) return hughes ? 3412 : 3976;
  }
  if (name === 'lambert_azimuthal_equal_area' && num(a.longitude_of_projection_origin) === 0) {
    if (lat0 === 90) return 6931;
    if (lat0 === -90) return 6932;
  }
  refuse(`${fileName}: the grid mapping "${name || gm.name}" is not one of the supported grids (NSIDC polar stereographic EPSG:3413/3976/3411/3412, EASE-Grid 2.0 EPSG:6931/6932)`);
}

/** CF time: "<unit> since <date>" and the first value of a `time` variable. */
function cfTime(c: CfContainer): string | null {
  const v = c.vars.find((x) => x.name === 'time' || text(x.attrs.standard_name) === 'time');
  if (!v) return null;
  const m = /^\s*(seconds|minutes|hours|days)\s+since\s+(\d{4}-\d\d-\d\d)(?:[ T](\d\d:\d\d(?::\d\d)?))?/i.exec(text(v.attrs.units));
  const first = Number(v.read()[0]);
  if (!m || !Number.isFinite(first)) return null;
  const unitMs = { seconds: 1e3, minutes: 6e4, hours: 3.6e6, days: 8.64e7 }[(m[1] as string).toLowerCase() as 'days'];
  const base = Date.parse(`${m[2]}T${m[3] ?? '00:00:00'}Z`);
  return Number.isFinite(base) ? new Date(base + first * unitMs).toISOString().replace('.000Z', 'Z') : null;
}

function cfEncoding(v: CfVar): CellEncoding {
  const a = v.attrs;
  const flags = new Map<number, ReturnType<typeof flagFromMeaning>>();
  const values = a.flag_values;
  const meanings = text(a.flag_meanings).split(/\s+/).filter(Boolean);
  const list = Array.isArray(values) ? values : values === undefined ? [] : [values];
  list.forEach((fv, i) => {
    const n = num(fv);
    if (n !== null) flags.set(n, flagFromMeaning(meanings[i] ?? ''));
  });
  const scale = num(a.scale_factor) ?? 1;
  const offset = num(a.add_offset) ?? 0;
  const units = text(a.units).trim().toLowerCase();
  const validMax = Array.isArray(a.valid_range) ? num(a.valid_range[1]) : num(a.valid_max);
  const full = units === '%' || units === 'percent' ? 100 : units === '1' || units === 'fraction' || (validMax !== null && validMax * scale + offset <= 1) ? 1 : 100;
  return { flags, fill: num(a._FillValue) ?? num(a.missing_value), scale, offset, full };
}

function readCf(c: CfContainer, meta: GridMeta): GridReadResult {
  const v = findConcentration(c, meta);
  const dims = v.shape.filter((n) => n > 1);
  const height = dims[0] ?? 0;
  const width = dims[1] ?? 0;
  checkSize(width, height, meta.fileName);
  const x = axis(c, ['x', 'xc', 'xgrid'], 'projection_x_coordinate', width, meta.fileName, 'x');
  const y = axis(c, ['y', 'yc', 'ygrid'], 'projection_y_coordinate', height, meta.fileName, 'y');
  const epsg = epsgOf(c, v, meta.fileName);
  const enc = cfEncoding(v);
  const flip = y.step > 0;
  const { cells, counts } = encodeCells(v.read(), width, height, enc, flip);
  const warnings = counts.outOfRange > 0 ? [`${counts.outOfRange} cells held values outside the valid range that are no flag; they are left out`] : [];
  return {
    grid: {
      id: meta.id,
      sourceName: meta.sourceName.trim(),
      gridTime: timeOf(meta, cfTime(c)),
      importedAt: meta.importedAt,
      fileName: meta.fileName,
      crs: (KNOWN_GRID_CRS[epsg] as { proj4: string }).proj4,
      epsg,
      width,
      height,
      x0: x.start,
      y0: flip ? y.start + y.step * (height - 1) : y.start,
      dx: x.step,
      dy: -Math.abs(y.step),
      cells,
    },
    counts,
    warnings,
  };
}
