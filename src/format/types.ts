// The shapes of a Floe Ledger log file, version 2, as written to disk (and of version 1, which
// the migration reads), and of the decoded bundle the rest of the program works with.
// docs/format.md explains every field; the JSON Schema
// (src/format/schema/floe-ledger-log-2.schema.json) is generated from schemaV2.ts.
import type { LegacyIceTypeFields } from '../domain/legacyIceTypes';
import type {
  Cruise,
  FloeSizeKey,
  IceCategory,
  IsoUtc,
  Observation,
  Observer,
  PositionSource,
  StageKey,
  TrackPoint,
  VesselIceClass,
} from '../domain/model';

export const FORMAT_NAME = 'floe-ledger-log';
export const CURRENT_VERSION = 2;
export const MEDIA_TYPE = 'application/vnd.floe-ledger.log+json';
/** Where the schema of version 1 is published with the app (public/format/). */
export const SCHEMA_V1_PATH = 'format/floe-ledger-log-1.schema.json';
/** Where the schema of version 2, the current one, is published. */
export const SCHEMA_V2_PATH = 'format/floe-ledger-log-2.schema.json';

/** Units and conventions, stated in every file so that it reads without this program. */
export const UNITS_V1 = {
  time: 'ISO 8601, UTC, trailing Z',
  position: 'WGS 84 decimal degrees, north and east positive',
  concentration: 'tenths (0-10)',
  thickness: 'centimetres',
  snowDepth: 'centimetres',
  sailHeight: 'metres',
  width: 'metres',
  accuracy: 'metres',
  visibility: 'kilometres',
  speed: 'knots',
  temperature: 'degrees Celsius',
  salinity: 'PSU',
  direction: 'degrees true',
  cloud: 'oktas (0-8)',
  terms: 'WMO Sea-Ice Nomenclature (WMO-No. 259)',
  codes: 'SIGRID-3 (WMO/TD-No. 1214), two-digit strings',
} as const;
/** Version 2 states the same units (snow depth and sail height moved into groups, same units). */
export const UNITS_V2 = UNITS_V1;

export const TRACK_COLUMNS = ['time', 'lat', 'lon', 'source', 'sogKn', 'cogDeg', 'headingDeg'] as const;
/** One track point as a row of TRACK_COLUMNS; null where a value is not known. */
export type TrackRow = [IsoUtc, number, number, PositionSource, number | null, number | null, number | null];

export interface FileCategory extends IceCategory {
  partialConcentrationSigrid3: string;
  stageSigrid3: string;
  floeSizeSigrid3?: string;
}

/** One saved version of an observation as written: the model plus SIGRID-3 codes. */
export interface FileObservationVersion extends Omit<Observation, 'categories'> {
  totalConcentrationSigrid3: string;
  categories: FileCategory[];
  traceStageSigrid3?: string;
  remainingStageSigrid3?: string;
}

export interface FileObservation extends FileObservationVersion {
  /** Earlier saved revisions, oldest first. */
  history?: FileObservationVersion[];
  /** Copies with the same revision number but different content, kept for review. */
  conflicts?: FileObservationVersion[];
}

/** A photo, by reference. In an archive the image itself is at `archivePath`. */
export interface PhotoMeta {
  id: string;
  observationId: string;
  fileName: string;
  mediaType: string;
  byteLength: number;
  /** When the photo was attached to the observation. */
  addedAt?: IsoUtc;
  takenAt?: IsoUtc;
}

export interface FilePhoto extends PhotoMeta {
  archivePath: string;
}

export interface FileCruise {
  id: string;
  name: string;
  intervalMinutes: number;
  maxSpeedKn: number;
  displayTimeZone: string;
  createdAt: IsoUtc;
  updatedAt: IsoUtc;
}

export interface FileVessel {
  name: string;
  iceClass: VesselIceClass;
}

/** An ice type of a version-1 file: deformation and snow still inside it. */
export type FileCategoryV1 = FileCategory & LegacyIceTypeFields;

/** An observation version of a version-1 file: no groups, the old ice types. */
export interface FileObservationVersionV1 extends Omit<FileObservationVersion, 'categories' | 'deformation' | 'snow'> {
  categories: FileCategoryV1[];
}

export interface FileObservationV1 extends FileObservationVersionV1 {
  history?: FileObservationVersionV1[];
  conflicts?: FileObservationVersionV1[];
}

export interface LogFileV1 extends Omit<LogFileV2, 'formatVersion' | 'observations'> {
  formatVersion: 1;
  observations: FileObservationV1[];
}

export interface LogFileV2 {
  $schema?: string;
  format: typeof FORMAT_NAME;
  formatVersion: 2;
  exportedAt: IsoUtc;
  generator: { name: string; version: string };
  units: typeof UNITS_V1;
  cruise: FileCruise;
  vessel: FileVessel;
  observers: Observer[];
  observations: FileObservation[];
  track: { columns: typeof TRACK_COLUMNS; points: TrackRow[] };
  photos: FilePhoto[];
}

/** A decoded log: the model objects of one cruise, ready for merging or writing. */
export interface LogBundle {
  cruise: Cruise;
  /** The current version of every observation (deleted ones included, with `deleted: true`). */
  observations: Observation[];
  /** Earlier saved revisions of the observations. */
  history: Observation[];
  /** Conflicting copies (same id and revision, different content) kept for review. */
  conflicts: Observation[];
  track: TrackPoint[];
  photos: PhotoMeta[];
}

/** Photo bytes keyed by photo id, as read from or written to an archive. */
export type PhotoBytes = Map<string, Uint8Array>;

export type { StageKey, FloeSizeKey };
