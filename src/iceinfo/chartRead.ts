// Reading a SIGRID-3 ice chart (WMO/TD-No. 1214): a zipped shapefile (.shp, .shx, .dbf, .prj;
// fflate for the zip, `shapefile` for .shp/.dbf) or GeoJSON with the SIGRID-3 attributes. The
// rings stay in the chart's plane; the .prj becomes a proj4 definition (projections.ts).
import { unzipSync } from 'fflate';
import * as shapefile from 'shapefile';
import type { Feature, FeatureCollection, Geometry } from 'geojson';
import { CHART_ATTRIBUTE_NAMES, type ChartAttributes, type ChartPolygon, type IceChart } from '../domain/collocation/chartModel.ts';
import { ringBbox, unwrapLongitudes } from '../domain/collocation/polygon.ts';
import { isConcentrationCode, isStageCode, normaliseCode, readPolyType } from '../domain/collocation/sigrid3.ts';
import { ICEINFO_LIMITS } from './limits.ts';
import { refuse } from './problems.ts';
import { GEOGRAPHIC, KNOWN_GRID_CRS, wktToProj4 } from './projections.ts';
import { checkShapefileIndex } from './shxCheck.ts';

export interface ChartMeta {
  sourceName: string;
  /** The chart time typed by the user (ISO 8601 UTC); a date in the file is used when absent. */
  chartTime?: string;
  fileName: string;
  importedAt: string;
  id: string;
}

export interface ChartReadResult {
  chart: IceChart;
  warnings: string[];
}

/** True when the bytes start like a zip file ("PK\x03\x04"). */
const isZip = (b: Uint8Array) => b.length >= 4 && b[0] === 0x50 && b[1] === 0x4b && b[2] === 0x03 && b[3] === 0x04;

export async function readChartFile(bytes: Uint8Array, meta: ChartMeta): Promise<ChartReadResult> {
  if (bytes.byteLength > ICEINFO_LIMITS.maxFileBytes) refuse(`${meta.fileName} has ${bytes.byteLength} bytes, more than the limit of ${ICEINFO_LIMITS.maxFileBytes} bytes for a chart`);
  if (isZip(bytes)) return readChartZip(bytes, meta);
  let json: unknown;
  try {
    json = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch (e) {
    refuse(`${meta.fileName} is neither a zipped shapefile nor GeoJSON (${e instanceof Error ? e.message : String(e)})`);
  }
  return readChartGeoJson(json, meta);
}

async function readChartZip(bytes: Uint8Array, meta: ChartMeta): Promise<ChartReadResult> {
  let files: Record<string, Uint8Array>;
  try {
    files = unzipSync(bytes, { filter: (f) => /\.(shp|shx|dbf|prj|cpg)$/i.test(f.name) && !f.name.startsWith('__MACOSX/') });
  } catch (e) {
    refuse(`${meta.fileName}: the zip file cannot be opened (${e instanceof Error ? e.message : String(e)})`);
  }
  const byExt = (ext: string) => Object.keys(files).filter((n) => n.toLowerCase().endsWith(ext));
  const shps = byExt('.shp');
  if (shps.length === 0) refuse(`${meta.fileName} holds no .shp file`);
  if (shps.length > 1) refuse(`${meta.fileName} holds ${shps.length} shapefiles (${shps.join(', ')}); put one chart in each zip`);
  const base = (shps[0] as string).slice(0, -4);
  const part = (ext: string): [string, Uint8Array] => {
    const name = Object.keys(files).find((n) => n.toLowerCase() === `${base}${ext}`.toLowerCase());
    if (!name) refuse(`${meta.fileName} holds ${base}.shp but no ${base}${ext}`);
    return [name, files[name] as Uint8Array];
  };
  const [shpName, shp] = part('.shp');
  const [shxName, shx] = part('.shx');
  const [, dbf] = part('.dbf');
  const [prjName, prj] = part('.prj');
  checkShapefileIndex(shp, shx, shxName, shpName);
  const crs = wktToProj4(new TextDecoder().decode(prj));
  const cpgName = Object.keys(files).find((n) => n.toLowerCase() === `${base}.cpg`.toLowerCase());
  const encoding = cpgName ? new TextDecoder().decode(files[cpgName]).trim() || undefined : undefined;
  let fc: FeatureCollection;
  try {
    fc = await shapefile.read(toArrayBuffer(shp), toArrayBuffer(dbf), encoding ? { encoding } : {});
  } catch (e) {
    refuse(`${meta.fileName}: ${shpName} or its .dbf cannot be read (${e instanceof Error ? e.message : String(e)}); ${prjName} was read`);
  }
  return buildChart(fc.features, meta, crs.def, crs.geographic);
}

function toArrayBuffer(b: Uint8Array): ArrayBuffer {
  return b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength) as ArrayBuffer;
}

/** GeoJSON: RFC 7946 longitude/latitude, or a projected plane named by an old-style `crs` member. */
export function readChartGeoJson(json: unknown, meta: ChartMeta): ChartReadResult {
  if (typeof json !== 'object' || json === null || (json as { type?: unknown }).type !== 'FeatureCollection' || !Array.isArray((json as { features?: unknown }).features)) {
    refuse(`${meta.fileName} is not a GeoJSON FeatureCollection`);
  }
  const fc = json as FeatureCollection & { crs?: { properties?: { name?: string } }; chartDate?: unknown };
  let def = GEOGRAPHIC;
  let geographic = true;
  const crsName = fc.crs?.properties?.name;
  if (typeof crsName === 'string' && !/CRS84$|EPSG:{1,2}4326$/.test(crsName)) {
    const code = Number(/EPSG:{1,2}(\d+)$/.exec(crsName)?.[1]);
    const known = KNOWN_GRID_CRS[code];
    if (!known) refuse(`${meta.fileName} names the coordinate system "${crsName}", which is not supported (longitude/latitude, or EPSG ${Object.keys(KNOWN_GRID_CRS).join(', ')})`);
    def = known.proj4;
    geographic = false;
  }
  const withDate = typeof fc.chartDate === 'string' && !meta.chartTime ? { ...meta, chartTime: fc.chartDate } : meta;
  return buildChart(fc.features, withDate, def, geographic);
}

const DATE_FIELDS = ['CHART_DATE', 'DATE', 'VALID_TIME'];

function chartTimeOf(features: readonly Feature[], meta: ChartMeta): string {
  let raw: unknown = meta.chartTime;
  if (!raw) {
    const props = features[0]?.properties ?? {};
    const key = Object.keys(props).find((k) => DATE_FIELDS.includes(k.toUpperCase()));
    raw = key ? props[key] : undefined;
  }
  if (raw instanceof Date) raw = raw.toISOString();
  if (typeof raw !== 'string' || raw.trim() === '') refuse(`${meta.fileName} carries no chart date: type the chart's date and time`);
  const s = /^\d{4}-\d\d-\d\d$/.test(raw.trim()) ? `${raw.trim()}T00:00:00Z` : raw.trim();
  const t = Date.parse(s);
  if (!/^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d(\.\d+)?)?(Z|[+-]\d\d:?\d\d)$/.test(s) || !Number.isFinite(t)) refuse(`the chart date "${raw}" is not an ISO 8601 date and time (e.g. 2026-03-04T18:00:00Z)`);
  return new Date(t).toISOString().replace('.000Z', 'Z');
}

function attributesOf(props: Record<string, unknown> | null, index: number, problems: string[]): ChartAttributes {
  const upper = new Map(Object.entries(props ?? {}).map(([k, v]) => [k.toUpperCase(), v]));
  const out = {} as ChartAttributes;
  for (const name of CHART_ATTRIBUTE_NAMES) {
    const raw = upper.get(name);
    const text = raw === null || raw === undefined ? null : String(raw).trim() || null;
    if (name === 'POLY_TYPE') {
      if (text !== null && readPolyType(text) === null) problems.push(`polygon ${index + 1}: POLY_TYPE "${text}" is not a SIGRID-3 polygon type (I, W, L, N, S)`);
      out.POLY_TYPE = text === null ? null : text.toUpperCase();
      continue;
    }
    const code = text === null ? null : normaliseCode(text);
    if (text !== null && code === null && text !== '-9') problems.push(`polygon ${index + 1}: ${name} "${text}" is not a two-digit SIGRID-3 code`);
    else if (code !== null && (name === 'CT' || name === 'CA' || name === 'CB' || name === 'CC') && !isConcentrationCode(code)) problems.push(`polygon ${index + 1}: ${name} "${text}" is not a SIGRID-3 concentration code`);
    else if (code !== null && (name === 'SA' || name === 'SB' || name === 'SC' || name === 'CN' || name === 'CD') && !isStageCode(code)) problems.push(`polygon ${index + 1}: ${name} "${text}" is not a SIGRID-3 stage of development code`);
    out[name] = code;
  }
  return out;
}

function flatRing(ring: unknown, where: string): number[] {
  if (!Array.isArray(ring) || ring.length < 4) refuse(`${where}: a ring has fewer than 4 positions`);
  const out: number[] = [];
  for (const p of ring as unknown[]) {
    const x = Array.isArray(p) ? p[0] : undefined;
    const y = Array.isArray(p) ? p[1] : undefined;
    if (typeof x !== 'number' || typeof y !== 'number' || !Number.isFinite(x) || !Number.isFinite(y)) refuse(`${where}: a position is not a pair of numbers`);
    out.push(x, y);
  }
  return out;
}

function buildChart(features: readonly Feature[], meta: ChartMeta, crs: string, geographic: boolean): ChartReadResult {
  const warnings: string[] = [];
  const problems: string[] = [];
  const polygons: ChartPolygon[] = [];
  let vertices = 0;
  if (features.length > ICEINFO_LIMITS.maxChartPolygons) refuse(`${meta.fileName} has ${features.length} features, more than the limit of ${ICEINFO_LIMITS.maxChartPolygons}`);
  const keys = new Set(features.flatMap((f) => Object.keys(f.properties ?? {}).map((k) => k.toUpperCase())));
  if (features.length > 0 && !keys.has('CT')) refuse(`${meta.fileName} has no CT attribute (total concentration): it is not a SIGRID-3 chart`);
  features.forEach((f, i) => {
    const g = f.geometry as Geometry | null;
    if (!g) {
      warnings.push(`feature ${i + 1} has no geometry and was left out`);
      return;
    }
    const parts = g.type === 'Polygon' ? [g.coordinates] : g.type === 'MultiPolygon' ? g.coordinates : null;
    if (!parts) refuse(`${meta.fileName}: feature ${i + 1} is a ${g.type}, not a polygon`);
    const attributes = attributesOf(f.properties as Record<string, unknown> | null, i, problems);
    for (const part of parts) {
      let rings = part.map((r) => flatRing(r, `${meta.fileName}: feature ${i + 1}`));
      if (geographic) {
        rings = rings.map(unwrapLongitudes);
        const ref = rings[0]?.[0] ?? 0;
        // Holes next to their outer ring, whole turns apart at most.
        rings = rings.map((r, k) => (k === 0 ? r : shiftRing(r, Math.round((ref - (r[0] ?? 0)) / 360) * 360)));
      }
      vertices += rings.reduce((n, r) => n + r.length / 2, 0);
      polygons.push({ rings, bbox: ringBbox(rings[0] ?? []), attributes });
    }
  });
  if (vertices > ICEINFO_LIMITS.maxChartVertices) refuse(`${meta.fileName} has ${vertices} vertices, more than the limit of ${ICEINFO_LIMITS.maxChartVertices}`);
  if (problems.length > 0) refuse(`${meta.fileName} has attribute codes that SIGRID-3 does not define: ${problems.slice(0, 5).join('; ')}${problems.length > 5 ? `; and ${problems.length - 5} more` : ''}`);
  if (polygons.length === 0) refuse(`${meta.fileName} holds no polygons`);
  const chart: IceChart = {
    id: meta.id,
    sourceName: meta.sourceName.trim(),
    chartTime: chartTimeOf(features, meta),
    importedAt: meta.importedAt,
    fileName: meta.fileName,
    crs,
    geographic,
    polygons,
  };
  if (!chart.sourceName) refuse('type the source of the chart (e.g. the issuing service and the chart name)');
  return { chart, warnings };
}

function shiftRing(r: number[], dx: number): number[] {
  if (dx === 0) return r;
  return r.map((v, i) => (i % 2 === 0 ? v + dx : v));
}
