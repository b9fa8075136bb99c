// The one open connection of this tab: opening with clear errors, the "another tab upgraded"
// case, and the refusal to write into a database made by newer code.
import { FloeDatabase, DEFAULT_DB_NAME, type FloeDatabaseOptions } from './database';
import { ConnectionClosedError, DatabaseTooNewError, FloeDbError, StorageUnavailableError, errorNames } from './errors';

export type DatabaseEvent =
  /** Another tab wants to upgrade or delete the database: this tab closed it; the user must reload. */
  | { type: 'versionchange'; newVersion: number | null }
  /** This tab's upgrade waits for other tabs that still hold the old version open. */
  | { type: 'blocked' }
  /** The database was made by newer code: reads work, writes are refused. */
  | { type: 'too-new'; installedVersion: number; codeVersion: number };

type Listener = (ev: DatabaseEvent) => void;

interface ConnectionState {
  db: FloeDatabase;
  /** Set when writes must be refused, with the error to throw. */
  writeBlock: FloeDbError | null;
  opening: Promise<FloeDatabase> | null;
}

let current: ConnectionState | null = null;
const listeners = new Set<Listener>();

/** Subscribes to connection events (for the "reload" banner); returns the unsubscribe function. */
export function onDatabaseEvent(listener: Listener): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function emit(ev: DatabaseEvent): void {
  for (const l of listeners) l(ev);
}

function createState(name: string, opts: FloeDatabaseOptions): ConnectionState {
  const db = new FloeDatabase(name, opts);
  const state: ConnectionState = { db, writeBlock: null, opening: null };
  // Returning false stops Dexie's own handler, which would close with auto-reopen: a silent
  // reopen would run old code against the upgraded schema.
  db.on('versionchange', (ev: IDBVersionChangeEvent) => {
    db.close({ disableAutoOpen: true });
    state.writeBlock = new ConnectionClosedError(
      ev.newVersion === null ? 'the data of this site is being deleted in another tab' : 'Floe Ledger was updated in another tab',
    );
    emit({ type: 'versionchange', newVersion: ev.newVersion });
    return false;
  });
  db.on('blocked', () => emit({ type: 'blocked' }));
  db.on('ready', () => {
    // Dexie 4 opens a database of a higher version than declared instead of failing with
    // VersionError; this code may not understand the newer rows, so it only reads.
    const installed = Math.floor(db.backendDB().version / 10);
    if (installed > db.codeVersion) {
      state.writeBlock = new DatabaseTooNewError(installed, db.codeVersion);
      emit({ type: 'too-new', installedVersion: installed, codeVersion: db.codeVersion });
    }
  });
  return state;
}

function state(): ConnectionState {
  current ??= createState(DEFAULT_DB_NAME, {});
  return current;
}

/**
 * The database of this tab, for queries (it opens itself on first use). Live queries and reads
 * use it directly; writes go through `writableDb()`.
 */
export function getDb(): FloeDatabase {
  return state().db;
}

function mapOpenError(err: unknown, db: FloeDatabase): FloeDbError {
  if (err instanceof FloeDbError) return err;
  const names = errorNames(err);
  if (names.includes('VersionError')) return new DatabaseTooNewError(NaN, db.codeVersion, err);
  if (names.includes('MissingAPIError')) return new StorageUnavailableError('IndexedDB is not available', err);
  if (names.includes('DatabaseClosedError')) return new ConnectionClosedError('it was closed', err);
  if (names.some((n) => n === 'InvalidStateError' || n === 'SecurityError' || n === 'UnknownError'))
    return new StorageUnavailableError('IndexedDB refused to open', err);
  if (names.includes('QuotaExceededError')) return new StorageUnavailableError('there is no room to create the database', err);
  return new StorageUnavailableError(err instanceof Error ? err.message : String(err), err);
}

/**
 * Opens the database and reports why it cannot be used: StorageUnavailableError when there is
 * no IndexedDB, DatabaseTooNewError (in `writeBlock`, reads still work) for newer data.
 * Call at start so the app can show the message before the observer types anything.
 */
export async function openFloeDb(): Promise<FloeDatabase> {
  const s = state();
  if (s.db.isOpen()) return s.db;
  s.opening ??= s.db.open().then(
    (db) => {
      s.opening = null;
      return db as FloeDatabase;
    },
    (err: unknown) => {
      s.opening = null;
      throw mapOpenError(err, s.db);
    },
  );
  return s.opening;
}

/** Why this tab may not write (database too new, closed for an upgrade), or null. */
export function writeBlockReason(): FloeDbError | null {
  return current?.writeBlock ?? null;
}

/** The open database, for a write; throws the typed reason when writing is refused. */
export async function writableDb(): Promise<FloeDatabase> {
  const s = state();
  if (s.writeBlock) throw s.writeBlock;
  const db = await openFloeDb();
  if (s.writeBlock) throw s.writeBlock;
  return db;
}

/**
 * Points the module at another database (tests, benchmarks, a second profile). Closes the
 * current connection. Options are those of FloeDatabase.
 */
export function selectDatabase(name: string, opts: FloeDatabaseOptions = {}): FloeDatabase {
  current?.db.close();
  current = createState(name, opts);
  return current.db;
}

/** Closes this tab's connection (the next call opens a fresh one with the defaults). */
export function closeFloeDb(): void {
  current?.db.close();
  current = null;
}
