// Builds each export file of a cruise from the store, with the format's writers.
import { exportLogPieces, getCruise, readCruiseExport } from '../../db';
import { writeArchive } from '../../format/archive';
import { writeCsv } from '../../format/csv';
import { writeGeoJson } from '../../format/geojson';
import { writeNdjson } from '../../format/ndjson';
import { MEDIA_TYPE, type LogBundle } from '../../format/types';
import type { FlatOptions } from '../../format/flat';
import { collocateProducts } from '../../iceinfo/collocateProducts';
import { readIceInfoProducts } from '../iceinfo/useIceInfo';
import { slug, stamp } from './download';

export const EXPORT_KINDS = ['log', 'geojson', 'csv', 'ndjson', 'zip'] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

export const EXPORT_LABELS: Record<ExportKind, { label: string; hint: string }> = {
  log: { label: 'Full log (JSON)', hint: 'Everything, with revisions and conflict copies; readable by Floe Ledger and any JSON tool.' },
  geojson: { label: 'GeoJSON', hint: 'Observations as points, the track as a line, for GIS.' },
  csv: { label: 'CSV', hint: 'One row per observation, columns a/b/c per ice type, then deformation and snow blocks, for spreadsheets and R. With ice charts or grids switched on, their values at each observation come last (derived, not observed).' },
  ndjson: { label: 'NDJSON', hint: 'One observation record per line, for streaming tools.' },
  zip: { label: 'Archive with photos (zip)', hint: 'The full log and every photo, to hand over or archive.' },
};

const EXT: Record<ExportKind, string> = { log: 'floe-log.json', geojson: 'geojson', csv: 'csv', ndjson: 'ndjson', zip: 'floe-log.zip' };
const TYPE: Record<ExportKind, string> = {
  log: MEDIA_TYPE,
  geojson: 'application/geo+json',
  csv: 'text/csv;charset=utf-8',
  ndjson: 'application/x-ndjson',
  zip: 'application/zip',
};

/**
 * Gathers text pieces into a Blob a few megabytes at a time, so the pieces already handed over
 * can be let go (the browser keeps large Blobs out of the script's memory).
 */
export async function piecesToBlob(pieces: AsyncIterable<string>, type: string, foldChars = 8_000_000): Promise<Blob> {
  let blob = new Blob([], { type });
  let pending: string[] = [];
  let size = 0;
  for await (const piece of pieces) {
    pending.push(piece);
    size += piece.length;
    if (size >= foldChars) {
      blob = new Blob([blob, ...pending], { type });
      pending = [];
      size = 0;
    }
  }
  return new Blob([blob, ...pending], { type });
}

/**
 * The flat exports' options: with the switched-on charts and grids collocated (the map's and the
 * Review's values), so their derived columns follow every other column, as `convert --chart/--grid`
 * writes them; without any switched on, the columns are left out altogether.
 */
async function flatOptions(bundle: LogBundle, includeDeleted: boolean): Promise<FlatOptions> {
  const { charts, grids, settings } = await readIceInfoProducts();
  if (charts.length === 0 && grids.length === 0) return { includeDeleted };
  return { includeDeleted, collocation: collocateProducts(bundle.observations, charts, grids, settings) };
}

export async function buildExport(cruiseId: string, kind: ExportKind, opts: { includeDeleted?: boolean } = {}): Promise<{ blob: Blob; fileName: string }> {
  if (kind === 'log') {
    // The full log streams out of the store; the other forms still read the cruise whole.
    const cruise = await getCruise(cruiseId);
    const blob = await piecesToBlob(exportLogPieces(cruiseId), TYPE.log);
    return { blob, fileName: `${slug(cruise?.name ?? 'cruise')}-${stamp()}.${EXT.log}` };
  }
  const { bundle, photos } = await readCruiseExport(cruiseId, { photoBytes: kind === 'zip' });
  const flat = kind === 'zip' ? {} : await flatOptions(bundle, opts.includeDeleted === true);
  let parts: BlobPart[];
  if (kind === 'geojson') parts = writeGeoJson(bundle, flat);
  else if (kind === 'csv') parts = writeCsv(bundle, flat);
  else if (kind === 'ndjson') parts = writeNdjson(bundle, flat);
  else parts = [writeArchive(bundle, photos) as Uint8Array<ArrayBuffer>];
  return { blob: new Blob(parts, { type: TYPE[kind] }), fileName: `${slug(bundle.cruise.name)}-${stamp()}.${EXT[kind]}` };
}
