// CSV track files (papaparse): a header row, then one point a row. Columns are found by their
// usual spellings (time/timestamp/datetime/utc, or separate date and time; lat/latitude;
// lon/long/lng/longitude; optional speed, course and heading). Times are ISO 8601 (a time with
// no zone is read as UTC, as a ship's log is kept in UTC) or epoch seconds / milliseconds;
// positions in decimal degrees or any notation the domain's coordinate parser reads.
// The delimiter (comma, semicolon, tab) is detected.
import Papa from 'papaparse';
import type { TrackPoint } from '../domain/model';
import { parseCoordinate } from '../domain/position';
import {
  BadLineList, checkLatLon, finishPoints, inChunks, isoUtc, type TrackImportOptions, type TrackImportResult,
} from './trackImport';

const norm = (h: string): string => h.trim().toLowerCase().replace(/[^a-z0-9]/g, '');

/** Header spellings, compared after lower-casing and dropping everything but letters and digits. */
const COLUMN_NAMES = {
  time: ['time', 'timestamp', 'datetime', 'datetimeutc', 'utc', 'timeutc', 'utctime', 'isotime', 'gpstime', 'fixtime', 'epoch', 'unixtime', 'epochs', 'epochms'],
  date: ['date', 'dateutc', 'utcdate', 'day'],
  lat: ['lat', 'latitude', 'latdeg', 'latitudedeg', 'latdd', 'latitudedecimal', 'latitudewgs84', 'gpslat', 'shiplat'],
  lon: ['lon', 'long', 'lng', 'longitude', 'londeg', 'longitudedeg', 'londd', 'longitudedecimal', 'longitudewgs84', 'gpslon', 'shiplon'],
  sog: ['sog', 'sogkn', 'sogkt', 'sogknots', 'speedkn', 'speedkt', 'speedknots', 'speedoverground'],
  cog: ['cog', 'cogdeg', 'course', 'coursedeg', 'courseoverground'],
  heading: ['heading', 'headingdeg', 'hdg', 'hdt', 'gyro', 'headingtrue'],
} as const;
type Column = keyof typeof COLUMN_NAMES;

/** Find the columns; null with a reason when time, latitude or longitude is missing. */
export function detectCsvColumns(header: readonly string[]): { columns: Partial<Record<Column, number>> } | { error: string } {
  // "SOG [kn]" and "Timestamp (UTC)" are matched with and without their bracketed unit.
  const names = header.map((h) => [norm(h), norm(h.replace(/\([^)]*\)|\[[^\]]*\]/g, ''))]);
  const columns: Partial<Record<Column, number>> = {};
  for (const key of Object.keys(COLUMN_NAMES) as Column[]) {
    const i = names.findIndex((n) => n.some((x) => (COLUMN_NAMES[key] as readonly string[]).includes(x)));
    if (i >= 0) columns[key] = i;
  }
  // A lone "date" column that holds full timestamps is the time column.
  if (columns.time === undefined && columns.date !== undefined) {
    columns.time = columns.date;
    delete columns.date;
  }
  const missing = (['time', 'lat', 'lon'] as const).filter((k) => columns[k] === undefined);
  if (missing.length > 0) {
    return { error: `no ${missing.join(', ')} column found in the header (${header.join(', ')}); expected e.g. time, lat, lon` };
  }
  return { columns };
}

const ISO_DATE_TIME = /^\d{4}-\d\d-\d\d[T ]\d\d:\d\d(:\d\d(\.\d+)?)?(Z|[+-]\d\d(:?\d\d)?)?$/i;

/** ISO 8601 or epoch seconds/milliseconds to epoch ms; NaN with no guess when it is neither. */
export function parseTrackTime(value: string, datePart?: string): number {
  let v = value.trim();
  if (datePart !== undefined && /^\d\d:\d\d/.test(v)) v = `${datePart.trim()}T${v}`;
  if (/^\d+(\.\d+)?$/.test(v)) {
    const n = Number(v);
    // Epoch milliseconds pass 1e11 in 1973; seconds will not reach it for thousands of years.
    return n > 1e11 ? Math.round(n) : Math.round(n * 1000);
  }
  if (!ISO_DATE_TIME.test(v)) return Number.NaN;
  const withZone = /(Z|[+-]\d\d(:?\d\d)?)$/i.test(v) ? v : `${v}Z`;
  return Date.parse(withZone.replace(' ', 'T'));
}

/** Decimal degrees, or any notation the domain's coordinate parser reads (82°30.5'N, 82 30.5 N ...); a reason otherwise. */
function coordinateCell(cell: string, axis: 'lat' | 'lon'): number | string {
  const s = cell.trim();
  if (/^[+-]?(\d+\.?\d*|\.\d+)$/.test(s)) return Number(s);
  const r = parseCoordinate(s, axis);
  return r.ok ? r.value : r.error;
}

function optionalNumber(row: readonly string[], i: number | undefined): number | undefined {
  if (i === undefined) return undefined;
  const s = (row[i] ?? '').trim();
  if (s === '') return undefined;
  const n = Number(s);
  return Number.isFinite(n) ? n : undefined;
}

export async function importCsvTrack(input: string, opts: TrackImportOptions): Promise<TrackImportResult> {
  // One kind of line break, so papaparse does not read a stray LF in a CR LF file as data.
  const text = input.replace(/\r\n?/g, '\n');
  // Parse rows with their line numbers: papaparse's step gives the cursor at the end of each row.
  const lineStarts = [0];
  for (let j = 0; j < text.length; j++) {
    if (text.charCodeAt(j) === 10) lineStarts.push(j + 1);
  }
  const lineOf = (offset: number): number => {
    let lo = 0;
    let hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if ((lineStarts[mid] as number) <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  };
  const rows: { line: number; cells: string[] }[] = [];
  const bad = new BadLineList();
  let lastCursor = 0;
  Papa.parse<string[]>(text, {
    header: false,
    newline: '\n',
    skipEmptyLines: 'greedy',
    step: (r) => {
      let k = lastCursor;
      while (k < text.length && /\s/.test(text[k] as string)) k++;
      lastCursor = r.meta.cursor;
      const line = lineOf(k);
      rows.push({ line, cells: r.data });
      for (const e of r.errors) bad.add(line, `CSV: ${e.message}`);
    },
  });
  opts.onProgress?.(0.3, 'reading rows');
  const [header, ...data] = rows;
  if (!header) return empty(bad, 'the file is empty');
  const found = detectCsvColumns(header.cells);
  if ('error' in found) return empty(bad, found.error, header.line);
  const c = found.columns;
  const points: TrackPoint[] = [];
  await inChunks(data.length, opts, 'building the track', 0.3, 1, (i) => {
    const { line, cells } = data[i] as { line: number; cells: string[] };
    // A decimal comma in a comma-separated file shows up as one field too many.
    if (cells.length !== header.cells.length) {
      bad.add(line, `row has ${cells.length} fields, the header has ${header.cells.length} (a decimal comma, or a missing separator?)`);
      return;
    }
    const timeRaw = cells[c.time as number] ?? '';
    const ms = parseTrackTime(timeRaw, c.date === undefined ? undefined : cells[c.date]);
    if (Number.isNaN(ms)) {
      bad.add(line, `time "${timeRaw}" is neither ISO 8601 nor epoch seconds or milliseconds`);
      return;
    }
    const lat = coordinateCell(cells[c.lat as number] ?? '', 'lat');
    const lon = coordinateCell(cells[c.lon as number] ?? '', 'lon');
    if (typeof lat === 'string' || typeof lon === 'string') {
      bad.add(line, [lat, lon].filter((x) => typeof x === 'string').join('; '));
      return;
    }
    const why = checkLatLon(lat, lon);
    if (why) {
      bad.add(line, why);
      return;
    }
    const p: TrackPoint = { cruiseId: opts.cruiseId, time: isoUtc(ms), lat, lon, source: 'track-file' };
    const sog = optionalNumber(cells, c.sog);
    const cog = optionalNumber(cells, c.cog);
    const hdg = optionalNumber(cells, c.heading);
    if (sog !== undefined && sog >= 0) p.sogKn = sog;
    if (cog !== undefined && cog >= 0 && cog <= 360) p.cogDeg = cog;
    if (hdg !== undefined && hdg >= 0 && hdg <= 360) p.headingDeg = hdg;
    points.push(p);
  });
  const done = finishPoints(points);
  return {
    format: 'csv', points: done.points, bad: bad.list,
    counts: { records: data.length, imported: done.points.length, bad: bad.count, skipped: 1, duplicates: done.duplicates },
  };
}

function empty(bad: BadLineList, reason: string, line = 1): TrackImportResult {
  bad.add(line, reason);
  return { format: 'csv', points: [], bad: bad.list, counts: { records: 0, imported: 0, bad: bad.count, skipped: 0, duplicates: 0 } };
}
