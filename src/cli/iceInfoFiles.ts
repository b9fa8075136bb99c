// The ice information options of the commands (`--chart`, `--grid` and their settings): the
// files are read with the app's readers (src/iceinfo), NetCDF-4 through h5wasm's Node build.
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { collocate, DEFAULT_COLLOCATION, type ChartLocator, type Collocation, type CollocationOptions, type GridLocator, type GridMethod, type ProductNote } from '../domain/collocation/index.ts';
import type { Observation } from '../domain/model.ts';
import { GEOTIFF_PRESET_NAMES, type GeoTiffPreset } from '../iceinfo/gridCells.ts';
import { IceInfoError } from '../iceinfo/problems.ts';
import { stringOption, type OptionSpec, type ParsedArgs } from './args.ts';
import { UsageError, type CliIO } from './command.ts';

export const ICEINFO_OPTIONS: OptionSpec = {
  chart: { type: 'string' },
  'chart-time': { type: 'string' },
  grid: { type: 'string' },
  'grid-time': { type: 'string' },
  'grid-preset': { type: 'string' },
  'grid-method': { type: 'string' },
  'chart-hours': { type: 'string' },
  'grid-hours': { type: 'string' },
};

export const ICEINFO_USAGE = `  --chart FILE        a SIGRID-3 ice chart: zipped shapefile (.shp .shx .dbf .prj) or GeoJSON
  --chart-time TIME   the chart's valid time (ISO 8601 UTC) when the file carries none
  --grid FILE         a sea-ice concentration grid: GeoTIFF, NetCDF-4/HDF5 or classic NetCDF on
                      EPSG:3413, 3976, 3411, 3412 (NSIDC polar stereographic) or 6931, 6932 (EASE-Grid 2.0)
  --grid-time TIME    the grid's valid time (ISO 8601 UTC) when the file carries none
  --grid-preset P     how a GeoTIFF's values read: ${GEOTIFF_PRESET_NAMES.join(', ')} (default percent)
  --grid-method M     nearest or bilinear (default bilinear: flagged neighbours left out)
  --chart-hours N     largest time between observation and chart, hours (default ${DEFAULT_COLLOCATION.chartMaxHours})
  --grid-hours N      largest time between observation and grid, hours (default ${DEFAULT_COLLOCATION.gridMaxHours})`;

export interface LoadedIceInfo {
  charts: ChartLocator[];
  grids: GridLocator[];
  products: ProductNote[];
  limits: CollocationOptions;
  method: GridMethod;
}

function hours(values: ParsedArgs['values'], name: string, fallback: number): number {
  const s = stringOption(values, name);
  if (s === undefined) return fallback;
  const n = Number(s);
  if (!Number.isFinite(n) || n <= 0 || n > 24 * 365) throw new UsageError(`--${name} "${s}" is not a number of hours between 0 and 8760`);
  return n;
}

/** Reads the files named by the options; null (message printed) when one is refused. */
export async function loadIceInfo(values: ParsedArgs['values'], io: CliIO): Promise<LoadedIceInfo | null> {
  const method = stringOption(values, 'grid-method') ?? 'bilinear';
  if (method !== 'nearest' && method !== 'bilinear') throw new UsageError(`--grid-method "${method}" is not nearest or bilinear`);
  const preset = stringOption(values, 'grid-preset') ?? 'percent';
  if (!(GEOTIFF_PRESET_NAMES as string[]).includes(preset)) throw new UsageError(`--grid-preset "${preset}" is not one of ${GEOTIFF_PRESET_NAMES.join(', ')}`);
  const out: LoadedIceInfo = {
    charts: [],
    grids: [],
    products: [],
    limits: { chartMaxHours: hours(values, 'chart-hours', DEFAULT_COLLOCATION.chartMaxHours), gridMaxHours: hours(values, 'grid-hours', DEFAULT_COLLOCATION.gridMaxHours) },
    method,
  };
  const read = (file: string): Uint8Array => {
    try {
      return new Uint8Array(readFileSync(file));
    } catch (e) {
      throw new UsageError(`cannot read ${file}: ${e instanceof Error ? e.message.replace(/^[A-Z]+: /, '') : String(e)}`);
    }
  };
  const now = new Date().toISOString();
  // The readers (shapefile, geotiff, proj4, h5wasm's 4 MB of WebAssembly) load only when a file
  // is given, so every other command starts as fast as before.
  const [{ readChartFile }, { readGridFile }, { planeOf }, { nodeHdf5 }] = await Promise.all([
    import('../iceinfo/chartRead.ts'),
    import('../iceinfo/gridRead.ts'),
    import('../iceinfo/projections.ts'),
    import('./hdf5Node.ts'),
  ]);
  try {
    const chartFile = stringOption(values, 'chart');
    if (chartFile) {
      const time = stringOption(values, 'chart-time');
      const { chart, warnings } = await readChartFile(read(chartFile), { id: 'chart', sourceName: basename(chartFile), fileName: basename(chartFile), importedAt: now, ...(time ? { chartTime: time } : {}) });
      for (const w of warnings) io.stderr(`${chartFile}: ${w}`);
      out.charts.push({ chart, toPlane: planeOf(chart.crs).toPlane });
      out.products.push({ kind: 'chart', sourceName: chart.sourceName, time: chart.chartTime, resolutionKm: null, fileName: chart.fileName });
    }
    const gridFile = stringOption(values, 'grid');
    if (gridFile) {
      const time = stringOption(values, 'grid-time');
      const { grid, warnings } = await readGridFile(read(gridFile), { id: 'grid', sourceName: basename(gridFile), fileName: basename(gridFile), importedAt: now, preset: preset as GeoTiffPreset, ...(time ? { gridTime: time } : {}) }, nodeHdf5);
      for (const w of warnings) io.stderr(`${gridFile}: ${w}`);
      out.grids.push({ grid, toPlane: planeOf(grid.crs).toPlane });
      out.products.push({ kind: 'grid', sourceName: grid.sourceName, time: grid.gridTime, resolutionKm: Math.abs(grid.dx) / 1000, fileName: grid.fileName });
    }
  } catch (e) {
    if (e instanceof IceInfoError) {
      io.stderr(e.message);
      return null;
    }
    throw e;
  }
  return out;
}

export function collocateLoaded(observations: readonly Observation[], info: LoadedIceInfo): Map<string, Collocation> {
  return collocate(observations.filter((o) => !o.deleted), info.charts, info.grids, info.limits);
}
