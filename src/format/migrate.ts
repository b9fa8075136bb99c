// Older versions of our own format are lifted to the current one on import, one step at a time:
// a file of version n is validated against schema n, migrated to n + 1, and so on, and the
// result is validated against the current schema. Adding version 3 means: a schema source in
// src/format/schema/, one entry in VALIDATORS and one function in MIGRATIONS (from 2 to 3).
import { liftLegacyObservation } from '../domain/legacyIceTypes';
import type { Observation } from '../domain/model';
import validateV0 from './generated/validate-log-0.js';
import validateV1 from './generated/validate-log-1.js';
import validateV2 from './generated/validate-log-2.js';
import type { CompiledValidator } from './generated/validate-log-1.js';
import { encodeTrackPoint, encodeVersion, GENERATOR } from './encode';
import type { LogFileV0 } from './schema/schemaV0';
import {
  CURRENT_VERSION,
  FORMAT_NAME,
  SCHEMA_V1_PATH,
  SCHEMA_V2_PATH,
  TRACK_COLUMNS,
  UNITS_V1,
  UNITS_V2,
  type FileObservation,
  type FileObservationV1,
  type FileObservationVersion,
  type FileObservationVersionV1,
  type LogFileV1,
  type LogFileV2,
} from './types';

export const VALIDATORS: Readonly<Record<number, CompiledValidator>> = {
  0: validateV0,
  1: validateV1,
  2: validateV2,
};

/** Implied-speed limit given to cruises from version-0 files, which had none (common practice for icebreakers in ice). */
export const V0_DEFAULT_MAX_SPEED_KN = 20;
/** Device id recorded for revisions that came from a version-0 file, which kept none. */
export const V0_DEVICE_ID = 'format-v0';

function v0ToV1(doc: LogFileV0): LogFileV1 {
  const c = doc.cruise;
  return {
    $schema: SCHEMA_V1_PATH,
    format: FORMAT_NAME,
    formatVersion: 1,
    exportedAt: doc.exported,
    generator: { ...GENERATOR },
    units: { ...UNITS_V1 },
    cruise: {
      id: c.id,
      name: c.name,
      intervalMinutes: c.intervalMinutes,
      maxSpeedKn: V0_DEFAULT_MAX_SPEED_KN,
      displayTimeZone: 'UTC',
      createdAt: c.created,
      updatedAt: c.created,
    },
    vessel: { name: c.vessel, iceClass: c.iceClass },
    observers: c.observers.map((o) => ({ id: o.id, name: o.name, initials: o.initials })),
    observations: doc.observations.map((o) => {
      const obs: Observation = {
        id: o.id,
        cruiseId: c.id,
        time: o.time,
        // Version 0 kept latitude and longitude apart; half a position is no position.
        position: o.lat !== null && o.lon !== null ? { lat: o.lat, lon: o.lon, source: o.positionSource } : null,
        observerId: o.observer,
        totalConcentration: o.total,
        categories: o.ice.map((k) => ({
          partialConcentration: k.conc,
          stage: k.stage,
          ...(k.thicknessCm !== undefined ? { thicknessCm: k.thicknessCm } : {}),
          ...(k.floeSize !== undefined ? { floeSize: k.floeSize } : {}),
        })),
        notes: o.notes,
        photoIds: [],
        revision: o.revision,
        savedAt: o.savedAt,
        savedBy: o.observer,
        deviceId: V0_DEVICE_ID,
        deleted: o.deleted,
      };
      return encodeVersion(obs);
    }),
    track: {
      columns: [...TRACK_COLUMNS] as unknown as typeof TRACK_COLUMNS,
      points: doc.track.map((p) => encodeTrackPoint({ cruiseId: c.id, time: p.time, lat: p.lat, lon: p.lon, source: p.source })),
    },
    photos: [],
  };
}

const liftVersion = (v: FileObservationVersionV1): FileObservationVersion => liftLegacyObservation(v) as FileObservationVersion;

/**
 * Version 1 to 2: deformation and snow leave the ice types for groups of their own, the ice
 * types' fields take the egg code's order, and the old snow kinds become the new snow fields
 * (src/domain/legacyIceTypes.ts; what has no equal is kept in the notes after a marker). Every
 * revision and conflicting copy is lifted the same way, so merges still see equal versions.
 */
function v1ToV2(doc: LogFileV1): LogFileV2 {
  const observations = doc.observations.map((fo: FileObservationV1): FileObservation => {
    const { history, conflicts, ...current } = fo;
    const out: FileObservation = liftVersion(current);
    if (history) out.history = history.map(liftVersion);
    if (conflicts) out.conflicts = conflicts.map(liftVersion);
    return out;
  });
  return { ...doc, $schema: SCHEMA_V2_PATH, formatVersion: 2, units: { ...UNITS_V2 }, observations };
}

/** MIGRATIONS[n] turns a valid file of version n into a file of version n + 1. */
export const MIGRATIONS: Readonly<Record<number, (doc: never) => unknown>> = {
  0: v0ToV1,
  1: v1ToV2,
};

export const OLDEST_VERSION = 0;

/** Runs the chain from `version` to the current version. The input must be valid for its version. */
export function migrateToCurrent(doc: unknown, version: number): LogFileV2 {
  let d = doc;
  for (let v = version; v < CURRENT_VERSION; v++) {
    const step = MIGRATIONS[v];
    if (!step) throw new Error(`no migration from format version ${v}`);
    d = step(d as never);
  }
  return d as LogFileV2;
}
