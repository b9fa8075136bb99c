// Typed errors of the local store. Every failure a screen must explain to the observer has its
// own class, so the UI can say what happened and what to do, and never has to parse messages.
import type { Observation } from '../domain/model';
import type { ObservationInput } from './rows';

export type DbErrorKind =
  | 'unavailable'
  | 'too-new'
  | 'closed'
  | 'storage-full'
  | 'conflict'
  | 'invalid-record'
  | 'not-found'
  | 'write-interrupted'
  | 'write-failed';

export abstract class FloeDbError extends Error {
  abstract readonly kind: DbErrorKind;
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = new.target.name;
  }
}

/** IndexedDB is missing or refuses to open (some private windows, storage disabled by policy). */
export class StorageUnavailableError extends FloeDbError {
  readonly kind = 'unavailable';
  constructor(detail: string, cause?: unknown) {
    super(
      `This browser does not let Floe Ledger store data (${detail}). Observations cannot be kept here: ` +
        'leave private browsing mode or allow site data for this page, then reload.',
      { cause },
    );
  }
}

/** The database on disk was written by a newer version of the app than the code running now. */
export class DatabaseTooNewError extends FloeDbError {
  readonly kind = 'too-new';
  constructor(
    readonly installedVersion: number,
    readonly codeVersion: number,
    cause?: unknown,
  ) {
    super(
      `The data in this browser was saved by a newer version of Floe Ledger (database version ${installedVersion}; ` +
        `this page knows up to version ${codeVersion}). Nothing is written until you reload this page to get the newer version.`,
      { cause },
    );
  }
}

/** The connection was closed, usually because another tab is upgrading the database. */
export class ConnectionClosedError extends FloeDbError {
  readonly kind = 'closed';
  constructor(reason: string, cause?: unknown) {
    super(`The local database is closed: ${reason}. Reload this page; your draft is kept.`, { cause });
  }
}

/** The disk or the browser's storage quota is full (QuotaExceededError). Nothing was written. */
export class StorageFullError extends FloeDbError {
  readonly kind = 'storage-full';
  constructor(what: string, cause?: unknown) {
    super(
      `Storage is full: ${what} was not saved, and nothing of it was written; what was saved before, drafts included, is kept. ` +
        'Free disk space (or export and remove old photos), then save again.',
      { cause },
    );
  }
}

/**
 * An edit was made over a revision that has changed since (in another tab or window). The save
 * was refused; both versions are carried so the screen can show them side by side.
 */
export class ObservationConflictError extends FloeDbError {
  readonly kind = 'conflict';
  constructor(
    /** What this tab tried to save. */
    readonly mine: ObservationInput,
    /** What is stored now. */
    readonly theirs: Observation,
    /** The revision this tab started its edit from (0 for a new observation). */
    readonly expectedRevision: number,
  ) {
    super(
      expectedRevision === 0
        ? `An observation with id ${theirs.id} already exists (revision ${theirs.revision}, saved ${theirs.savedAt} by ${theirs.savedBy}); it was not overwritten.`
        : `Observation ${theirs.id} was changed elsewhere while you edited it: you started from revision ${expectedRevision}, ` +
            `the stored one is revision ${theirs.revision} (saved ${theirs.savedAt} by ${theirs.savedBy}). Your version was not saved; compare both and save again.`,
    );
  }
}

/** A record failed the store's structural checks; `path` names the field, as findings do. */
export class InvalidRecordError extends FloeDbError {
  readonly kind = 'invalid-record';
  constructor(
    readonly table: string,
    readonly path: string,
    detail: string,
  ) {
    super(`Not saved: ${table} field "${path}" ${detail}.`);
  }
}

export class RecordNotFoundError extends FloeDbError {
  readonly kind = 'not-found';
  constructor(
    readonly table: string,
    readonly id: string,
  ) {
    super(`No ${table} record with id ${id}.`);
  }
}

/**
 * A chunked bulk write stopped part way. Every batch before `committedRows` is stored in full;
 * the failing batch and all after it were not written at all.
 */
export class BulkWriteInterruptedError extends FloeDbError {
  readonly kind = 'write-interrupted';
  constructor(
    readonly committedRows: number,
    readonly totalRows: number,
    readonly reason: FloeDbError,
  ) {
    super(`${reason.message} (${committedRows} of ${totalRows} rows were stored in complete batches before this.)`, { cause: reason });
  }
}

/** Any other failure of a write; the transaction was rolled back. */
export class WriteFailedError extends FloeDbError {
  readonly kind = 'write-failed';
  constructor(what: string, cause?: unknown) {
    super(`${what} was not saved: ${describe(cause)}. Nothing of it was written.`, { cause });
  }
}

function describe(err: unknown): string {
  if (err instanceof Error) return `${err.name}: ${err.message}`;
  return String(err);
}

interface NamedError {
  name?: unknown;
  inner?: unknown;
  failures?: unknown;
  cause?: unknown;
}

/** Every error name found in a Dexie error and the errors it wraps. */
export function errorNames(err: unknown, depth = 0): string[] {
  if (err === null || typeof err !== 'object' || depth > 5) return [];
  const e = err as NamedError;
  const names = typeof e.name === 'string' ? [e.name] : [];
  names.push(...errorNames(e.inner, depth + 1), ...errorNames(e.cause, depth + 1));
  if (Array.isArray(e.failures)) for (const f of e.failures) names.push(...errorNames(f, depth + 1));
  else if (e.failures && typeof e.failures === 'object') for (const f of Object.values(e.failures)) names.push(...errorNames(f, depth + 1));
  return names;
}

/** Turns whatever a write threw into one of the typed errors above. */
export function mapWriteError(err: unknown, what: string): FloeDbError {
  if (err instanceof FloeDbError) return err;
  const names = errorNames(err);
  if (names.some((n) => n === 'QuotaExceededError' || n === 'QuotaExceeded')) return new StorageFullError(what, err);
  if (names.includes('DatabaseClosedError')) return new ConnectionClosedError('it was closed before the write', err);
  if (names.includes('MissingAPIError')) return new StorageUnavailableError('IndexedDB is missing', err);
  return new WriteFailedError(what, err);
}
