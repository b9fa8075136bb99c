// Model -> file: a LogBundle becomes a version-1 log file (SIGRID-3 codes added beside the WMO
// terms, revisions grouped under their observation, the track as rows).
import type { IceCategory, Observation, TrackPoint } from '../domain/model';
import { concentrationCode, floeSizeCode, stageCode } from './codes';
import {
  FORMAT_NAME,
  SCHEMA_V1_PATH,
  TRACK_COLUMNS,
  UNITS_V1,
  type FileCategory,
  type FileObservation,
  type FileObservationVersion,
  type FilePhoto,
  type LogBundle,
  type LogFileV1,
  type PhotoMeta,
  type TrackRow,
} from './types';

export const GENERATOR = { name: 'Floe Ledger', version: '0.1.0' } as const;

export interface EncodeOptions {
  /** When the file is written; defaults to now. */
  exportedAt?: string;
}

export function encodeCategory(c: IceCategory): FileCategory {
  const out: FileCategory = {
    ...c,
    partialConcentrationSigrid3: concentrationCode(c.partialConcentration),
    stageSigrid3: stageCode(c.stage),
  };
  if (c.floeSize !== undefined) out.floeSizeSigrid3 = floeSizeCode(c.floeSize);
  return out;
}

export function encodeVersion(o: Observation): FileObservationVersion {
  const out: FileObservationVersion = {
    ...o,
    totalConcentrationSigrid3: concentrationCode(o.totalConcentration),
    categories: o.categories.map(encodeCategory),
  };
  if (o.traceStage !== undefined) out.traceStageSigrid3 = stageCode(o.traceStage);
  if (o.remainingStage !== undefined) out.remainingStageSigrid3 = stageCode(o.remainingStage);
  return out;
}

export function encodeTrackPoint(p: TrackPoint): TrackRow {
  return [p.time, p.lat, p.lon, p.source, p.sogKn ?? null, p.cogDeg ?? null, p.headingDeg ?? null];
}

export function photoArchivePath(p: PhotoMeta): string {
  const ext = /^image\/(jpeg|png|webp|gif|heic|avif)$/.exec(p.mediaType)?.[1];
  const safeId = p.id.replace(/[^A-Za-z0-9._-]/g, '_');
  return `photos/${safeId}${ext ? `.${ext === 'jpeg' ? 'jpg' : ext}` : ''}`;
}

function groupById(versions: Observation[]): Map<string, Observation[]> {
  const m = new Map<string, Observation[]>();
  for (const v of versions) {
    const list = m.get(v.id);
    if (list) list.push(v);
    else m.set(v.id, [v]);
  }
  return m;
}

const byTime = (a: { time: string }, b: { time: string }) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0);

export function encodeLog(bundle: LogBundle, opts: EncodeOptions = {}): LogFileV1 {
  const { cruise } = bundle;
  const history = groupById(bundle.history);
  const conflicts = groupById(bundle.conflicts);
  const observations = [...bundle.observations].sort((a, b) => byTime(a, b) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const fileObservations: FileObservation[] = observations.map((o) => {
    const out: FileObservation = encodeVersion(o);
    const h = history.get(o.id);
    if (h) out.history = [...h].sort((a, b) => a.revision - b.revision).map(encodeVersion);
    const c = conflicts.get(o.id);
    if (c) out.conflicts = [...c].sort((a, b) => a.revision - b.revision || (a.savedAt < b.savedAt ? -1 : 1)).map(encodeVersion);
    return out;
  });
  const track = bundle.track.length > 1 && !isSortedByTime(bundle.track) ? [...bundle.track].sort(byTime) : bundle.track;
  const photos: FilePhoto[] = bundle.photos.map((p) => ({ ...p, archivePath: photoArchivePath(p) }));
  return {
    $schema: SCHEMA_V1_PATH,
    format: FORMAT_NAME,
    formatVersion: 1,
    exportedAt: opts.exportedAt ?? new Date().toISOString(),
    generator: { ...GENERATOR },
    units: { ...UNITS_V1 },
    cruise: {
      id: cruise.id,
      name: cruise.name,
      intervalMinutes: cruise.intervalMinutes,
      maxSpeedKn: cruise.maxSpeedKn,
      displayTimeZone: cruise.displayTimeZone,
      createdAt: cruise.createdAt,
      updatedAt: cruise.updatedAt,
    },
    vessel: { name: cruise.vesselName, iceClass: cruise.iceClass },
    observers: cruise.observers.map((o) => ({ id: o.id, name: o.name, initials: o.initials })),
    observations: fileObservations,
    track: { columns: [...TRACK_COLUMNS] as unknown as typeof TRACK_COLUMNS, points: track.map(encodeTrackPoint) },
    photos,
  };
}

function isSortedByTime(xs: readonly { time: string }[]): boolean {
  for (let i = 1; i < xs.length; i++) if ((xs[i] as { time: string }).time < (xs[i - 1] as { time: string }).time) return false;
  return true;
}

/**
 * The file text, in parts (one per line) so a large log never has to exist as one string: a
 * Blob or a write stream takes the parts as they are. One observation and one track row per
 * line keeps the file readable and makes line numbers in error messages point at a record.
 */
export function writeLogJson(file: LogFileV1): string[] {
  const parts: string[] = ['{\n'];
  const { observations, track, photos, ...head } = file;
  for (const [k, v] of Object.entries(head)) parts.push(`  ${JSON.stringify(k)}: ${JSON.stringify(v)},\n`);
  pushArray(parts, '  "observations": [', observations, '  ],\n');
  parts.push(`  "track": {\n    "columns": ${JSON.stringify(track.columns)},\n`);
  pushArray(parts, '    "points": [', track.points, '    ]\n  },\n');
  pushArray(parts, '  "photos": [', photos, '  ]\n');
  parts.push('}\n');
  return parts;
}

function pushArray(parts: string[], open: string, items: readonly unknown[], close: string) {
  if (items.length === 0) {
    parts.push(open + close.trimStart());
    return;
  }
  parts.push(`${open}\n`);
  const last = items.length - 1;
  for (let i = 0; i < last; i++) parts.push(`    ${JSON.stringify(items[i])},\n`);
  parts.push(`    ${JSON.stringify(items[last])}\n`);
  parts.push(close);
}
