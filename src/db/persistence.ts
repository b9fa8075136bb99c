// Persistent storage: without it the browser may evict the whole log when the disk runs low.
import { getMeta, setMeta } from './settings';
import { nowIso } from './validate';

export interface StorageStatus {
  /** Whether this browser offers the Storage API at all. */
  supported: boolean;
  /** The browser promised not to evict this site's data without asking the user. */
  persisted: boolean;
  /** When the app asked, and the answer then; undefined if never asked. */
  request?: { askedAt: string; granted: boolean };
  usageBytes?: number;
  quotaBytes?: number;
}

function storageManager(): StorageManager | undefined {
  return typeof navigator !== 'undefined' && navigator.storage && typeof navigator.storage.persisted === 'function' ? navigator.storage : undefined;
}

let asking: Promise<boolean> | null = null;

/**
 * Asks the browser for persistent storage, once per profile (asking again only repeats the
 * prompt some browsers show); the answer is kept in the database. `askAgain` is for the user's
 * own "ask again" button. Returns whether storage is persistent now.
 */
export function requestPersistence({ askAgain = false } = {}): Promise<boolean> {
  // Screens mounting at once (and React's double effects in development) share one request.
  asking ??= ask(askAgain).finally(() => {
    asking = null;
  });
  return asking;
}

async function ask(askAgain: boolean): Promise<boolean> {
  const sm = storageManager();
  if (!sm) return false;
  if (await sm.persisted()) return true;
  if (!askAgain && (await getMeta('persistenceRequest'))) return false;
  const granted = await sm.persist();
  try {
    await setMeta('persistenceRequest', { askedAt: nowIso(), granted });
  } catch {
    // Not being able to note that we asked (database read-only or full) must not hide the answer.
  }
  return granted;
}

export async function storageStatus(): Promise<StorageStatus> {
  const sm = storageManager();
  const request = await getMeta('persistenceRequest');
  if (!sm) return { supported: false, persisted: false, ...(request ? { request } : {}) };
  const [persisted, estimate] = await Promise.all([sm.persisted(), typeof sm.estimate === 'function' ? sm.estimate() : Promise.resolve({} as StorageEstimate)]);
  return {
    supported: true,
    persisted,
    ...(request ? { request } : {}),
    ...(estimate.usage === undefined ? {} : { usageBytes: estimate.usage }),
    ...(estimate.quota === undefined ? {} : { quotaBytes: estimate.quota }),
  };
}
