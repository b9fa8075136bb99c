// The shapes stored in each table, beside the model types they hold. Model records (Cruise,
// Observation, TrackPoint) are stored exactly as src/domain/model.ts defines them.
import type { ConcentrationGrid, IceChart } from '../domain/collocation/chartModel';
import type { Cruise, IsoUtc, Observation } from '../domain/model';

/** An earlier version of an observation, kept when an edit, delete or restore replaces it. */
export interface ObservationRevision {
  observationId: string;
  /** The revision number of the stored snapshot (equal to `observation.revision`). */
  revision: number;
  /** When the snapshot stopped being the current version. */
  supersededAt: IsoUtc;
  observation: Observation;
}

/**
 * A copy of an observation with the same id and revision as a stored version but other content
 * (two laptops edited the same revision). Both are kept; the copy waits here for a reviewer.
 */
export interface ConflictRecord {
  /** `observationId:revision:` and a hash of the copy's content, so the same copy is kept once. */
  id: string;
  observationId: string;
  cruiseId: string;
  revision: number;
  /** When an import found it, and from which file. */
  detectedAt: IsoUtc;
  source: string;
  observation: Observation;
  /** Set when a reviewer settled it: which version they kept. The copy itself stays. */
  resolution?: { at: IsoUtc; by: string; kept: 'stored' | 'copy' };
}

export interface PhotoRecord {
  id: string;
  observationId: string;
  cruiseId: string;
  /** File name as the observer picked it, for the export archive. */
  fileName: string;
  mimeType: string;
  sizeBytes: number;
  addedAt: IsoUtc;
  /** When the picture was taken, if known (e.g. from the file's date). */
  takenAt?: IsoUtc;
  blob: Blob;
}

/** Photo record without its bytes, for lists. */
export type PhotoMeta = Omit<PhotoRecord, 'blob'>;

/** The form in progress, saved as the observer types so nothing is lost in a crash. */
export interface DraftRecord<T = unknown> {
  cruiseId: string;
  /** Which form this draft belongs to, e.g. `observation` or `observation:<id>` for an edit. */
  form: string;
  data: T;
  savedAt: IsoUtc;
}

/**
 * Settings with typed values. Add a key here (optional values only) when a screen needs to
 * keep a preference; the settings table holds `{ key, value }` rows.
 */
export interface SettingValues {
  activeCruiseId: string | null;
  /** The observer who is on watch on this laptop. */
  currentObserverId: string | null;
  /** Minutes before the hour at which the next-observation reminder shows. */
  reminderLeadMinutes: number;
  /** The folder automatic backups go to (File System Access API), as the browser gave it. */
  backupFolder: FileSystemDirectoryHandle | null;
  /** When the last automatic backup was written, and the last export downloaded. */
  lastBackupAt: IsoUtc | null;
  lastExportAt: IsoUtc | null;
  /** Collocation with ice charts and grids: time limits (hours) and the grid sampling method. */
  iceInfoCollocation: { chartMaxHours: number; gridMaxHours: number; gridMethod: 'nearest' | 'bilinear' };
  /** The ship server this laptop syncs with (src/sync); the password is never kept. */
  syncServer: SyncServerSetting | null;
}

export interface SyncServerSetting {
  /** The server's base address, e.g. http://192.168.1.10:5984/ */
  url: string;
  user: string;
  enabled: boolean;
  /** A cruise to receive from the server while this laptop has no active cruise (joining mid-cruise). */
  joinCruiseId?: string;
}

/** A document the ship server is known to hold: sent by this laptop or pulled from it. */
export interface SyncMark {
  /** The server database's address (server base + database name). */
  server: string;
  docId: string;
  cruiseId: string;
  /** For an observation revision; '' and 0 for other documents. */
  observationId: string;
  revision: number;
  at: IsoUtc;
}

export interface SyncRefusal {
  docId: string;
  reason: string;
  at: IsoUtc;
}

/** Pull state per server database. */
export interface SyncStateRow {
  /** The server database's address. */
  key: string;
  cruiseId: string;
  /** The `_changes` sequence everything up to which is merged here. */
  since: string;
  /** The checkpoint before `since` (the server's copy may lag one step behind). */
  previousSince?: string;
  /** Pulled documents refused, newest last (kept to the last 200). */
  refused: SyncRefusal[];
  lastPullAt: IsoUtc | null;
  lastPushAt: IsoUtc | null;
}
export type SettingKey = keyof SettingValues;

export interface SettingRow<K extends SettingKey = SettingKey> {
  key: K;
  value: SettingValues[K];
}

/** Facts about this browser profile's store, not user settings. */
export interface MetaValues {
  /** Random id of this browser profile, created once, stamped on every saved revision. */
  deviceId: string;
  /** When persistent storage was requested and what the browser answered. */
  persistenceRequest: { askedAt: IsoUtc; granted: boolean };
}
export type MetaKey = keyof MetaValues;
export interface MetaRow<K extends MetaKey = MetaKey> {
  key: K;
  value: MetaValues[K];
}

/** What a screen hands to saveObservation: the model minus the fields the store stamps. */
export type ObservationInput = Omit<Observation, 'revision' | 'savedAt' | 'savedBy' | 'deviceId' | 'deleted'> &
  Partial<Pick<Observation, 'revision' | 'savedAt' | 'savedBy' | 'deviceId' | 'deleted'>>;

/** What createCruise takes: the cruise minus the fields the store sets. */
export type CruiseInput = Omit<Cruise, 'id' | 'createdAt' | 'updatedAt'> & { id?: string };

/** An imported ice chart, as read (src/iceinfo), with whether the map shows it. */
export interface IceChartRow extends IceChart {
  visible: boolean;
}

/** An imported concentration grid, as read (src/iceinfo), with whether the map shows it. */
export interface IceGridRow extends ConcentrationGrid {
  visible: boolean;
}

/** What the lists show without loading polygons or cells. */
export interface IceInfoSummary {
  kind: 'chart' | 'grid';
  id: string;
  sourceName: string;
  time: IsoUtc;
  fileName: string;
  importedAt: IsoUtc;
  visible: boolean;
  /** Polygons of a chart, cells of a grid. */
  size: number;
}
