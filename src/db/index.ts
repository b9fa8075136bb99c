// The local store's public surface. Features import from here, never from dexie.
export * from './errors';
export type * from './rows';
export { SCHEMA_VERSIONS, LATEST_SCHEMA_VERSION, type SchemaVersion } from './schema';
export { FloeDatabase, DEFAULT_DB_NAME, type FloeDatabaseOptions } from './database';
export {
  openFloeDb,
  getDb,
  writableDb,
  writeBlockReason,
  onDatabaseEvent,
  selectDatabase,
  closeFloeDb,
  type DatabaseEvent,
} from './connection';
export { getSetting, setSetting, deviceId } from './settings';
export { saveDraft, loadDraft, clearDraft, listDrafts } from './drafts';
export { createCruise, updateCruise, getCruise, listCruises, setActiveCruise, getActiveCruise, type CruisePatch } from './cruises';
export {
  saveObservation,
  softDeleteObservation,
  restoreObservation,
  getObservation,
  listObservations,
  countObservations,
  observationHistory,
  type SaveObservationOptions,
  type SaveResult,
  type DeleteOptions,
  type ListObservationsQuery,
} from './observations';
export {
  addTrackPoints,
  listTrackPoints,
  trackPointsOfHour,
  listTrackChunks,
  countTrackPoints,
  trackPointAtOrBefore,
  DEFAULT_TRACK_CHUNK,
  type AddTrackPointsOptions,
  type AddTrackPointsResult,
  type TrackRange,
} from './trackPoints';
export { decodeChunk, pointAt, type TrackChunkRow } from './trackChunk';
export { attachPhoto, removePhoto, getPhoto, listPhotos, type AttachPhotoInput, type PhotoEdit, type RemovePhotoResult } from './photos';
export { requestPersistence, storageStatus, type StorageStatus } from './persistence';
export { isIsoUtc } from './validate';
export { applyImport, ImportFileChangedError, KEEP_PIECES_MAX_BYTES, previewImport, type ImportPreview, type ImportSummary, type ImportTiming, type OpenPieces } from './importStream';
export { applyMergePlan, loadMergeTarget, listConflicts, markConflictResolved, StaleImportError, type ApplyOptions, type ApplyResult } from './importPlan';
export { markOnServer, heldOnServer, serverMarks, revisionsOnServer, getSyncState, putSyncState, forgetServer, readSyncSource, type SyncSource } from './syncMarks';
export { readCruiseExport, cruiseChangeStamp, type CruiseExport } from './exportBundle';
export { saveIceChart, saveIceGrid, listIceCharts, listIceGrids, listIceInfo, setIceInfoVisible, deleteIceInfo } from './iceProducts';
export { exportLogPieces, type ExportStreamOptions } from './exportStream';
