// The typed Dexie database. Only this folder (src/db) touches IndexedDB.
import { Dexie, type EntityTable, type Table } from 'dexie';
import type { Cruise, Observation } from '../domain/model';
import type { ConflictRecord, DraftRecord, IceChartRow, IceGridRow, MetaRow, ObservationRevision, PhotoRecord, SettingRow, SyncMark, SyncStateRow } from './rows';
import { SCHEMA_VERSIONS, type SchemaVersion } from './schema';
import type { TrackChunkRow } from './trackChunk';

export const DEFAULT_DB_NAME = 'floe-ledger';

export interface FloeDatabaseOptions {
  /** The schema versions to declare; tests pass a prefix (an older app) or an extra version. */
  versions?: readonly SchemaVersion[];
  /** Another IndexedDB implementation, or null to act as a browser without one. */
  indexedDB?: IDBFactory | null;
  IDBKeyRange?: typeof IDBKeyRange;
}

export class FloeDatabase extends Dexie {
  cruises!: EntityTable<Cruise, 'id'>;
  observations!: EntityTable<Observation, 'id'>;
  revisions!: Table<ObservationRevision, [string, number]>;
  /** The track, one row per cruise and UTC hour (schema version 4; `trackPoints` before). */
  trackChunks!: Table<TrackChunkRow, [string, string]>;
  photos!: EntityTable<PhotoRecord, 'id'>;
  drafts!: Table<DraftRecord, [string, string]>;
  settings!: Table<SettingRow, string>;
  meta!: Table<MetaRow, string>;
  conflicts!: EntityTable<ConflictRecord, 'id'>;
  iceCharts!: EntityTable<IceChartRow, 'id'>;
  iceGrids!: EntityTable<IceGridRow, 'id'>;
  syncMarks!: Table<SyncMark, [string, string]>;
  syncState!: EntityTable<SyncStateRow, 'key'>;

  /** The highest schema version this code declares. */
  readonly codeVersion: number;

  constructor(name: string = DEFAULT_DB_NAME, opts: FloeDatabaseOptions = {}) {
    const deps =
      opts.indexedDB === undefined
        ? {}
        : // A stand-in factory whose open() fails, so Dexie reports the missing API the way a
          // browser without IndexedDB does; Dexie treats a missing factory option as "use global".
          { indexedDB: opts.indexedDB ?? missingIndexedDB(), IDBKeyRange: opts.IDBKeyRange ?? globalThis.IDBKeyRange };
    super(name, {
      ...deps,
      // Chromium's default durability became "relaxed" in version 121: a commit could be
      // reported before the data reached the disk. An observation must survive a power cut.
      chromeTransactionDurability: 'strict',
    });
    const versions = opts.versions ?? SCHEMA_VERSIONS;
    for (const v of versions) {
      const declared = this.version(v.version).stores(v.stores);
      const upgrade = v.upgrade;
      if (upgrade) declared.upgrade((tx) => upgrade(tx));
    }
    this.codeVersion = versions[versions.length - 1]?.version ?? 0;
  }
}

function missingIndexedDB(): IDBFactory {
  const fail = (): never => {
    const err = new Error('IndexedDB API missing');
    err.name = 'MissingAPIError';
    throw err;
  };
  return { open: fail, deleteDatabase: fail, cmp: () => 0, databases: fail } as unknown as IDBFactory;
}
