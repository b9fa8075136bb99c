// One entry point for track files: detect the format and import.
import { importCsvTrack } from './csvTrack';
import { importGpxTrack } from './gpxTrack';
import { importNmeaLog } from './nmeaLog';
import { detectTrackFormat, type TrackFormat, type TrackImportOptions, type TrackImportResult } from './trackImport';

export type { BadLine, TrackFormat, TrackImportOptions, TrackImportResult } from './trackImport';

export class TrackFormatError extends Error {}

export async function importTrackText(fileName: string, text: string, opts: TrackImportOptions & { format?: TrackFormat }): Promise<TrackImportResult> {
  const format = opts.format ?? detectTrackFormat(fileName, text);
  switch (format) {
    case 'gpx':
      return importGpxTrack(text, opts);
    case 'nmea':
      return importNmeaLog(text, opts);
    case 'csv':
      return importCsvTrack(text, opts);
    case null:
      throw new TrackFormatError(`${fileName}: not a track file this program reads (GPX, NMEA 0183 log, or CSV with time, lat and lon columns)`);
  }
}

/** Read a picked file and import it. */
export async function importTrackFile(file: Blob & { name: string }, opts: TrackImportOptions & { format?: TrackFormat }): Promise<TrackImportResult> {
  opts.onProgress?.(0, 'reading the file');
  const text = await file.text();
  return importTrackText(file.name, text, opts);
}
