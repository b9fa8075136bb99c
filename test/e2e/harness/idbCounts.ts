// Reads the app's own database from a page of its origin without changing it: the number of
// rows in each store, and the observations as stored. For the reliability tests, which check
// what survived a crash or a refused operation.
import type { Page } from 'playwright-core';
import { DEFAULT_DB_NAME } from '../../../src/db/database';

export type StoreCounts = Record<string, number>;

/** Row count of every store of the app's database (opened at its current version). */
export function storeCounts(page: Page): Promise<StoreCounts> {
  return page.evaluate(
    (name) =>
      new Promise<StoreCounts>((ok, fail) => {
        const req = indexedDB.open(name);
        req.onerror = () => fail(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const names = [...db.objectStoreNames];
          const tx = db.transaction(names, 'readonly');
          const out: StoreCounts = {};
          for (const n of names) {
            const c = tx.objectStore(n).count();
            c.onsuccess = () => (out[n] = c.result);
          }
          // The track is stored an hour a row (schema version 4): its points are the sum of the
          // count index, reported as `trackPoints` as when every point was a row.
          if (names.includes('trackChunks')) {
            let points = 0;
            const cur = tx.objectStore('trackChunks').index('[cruiseId+hour+count]').openKeyCursor();
            cur.onsuccess = () => {
              const c = cur.result;
              if (!c) {
                out.trackPoints = points;
                return;
              }
              points += (c.key as [string, string, number])[2];
              c.continue();
            };
          }
          tx.oncomplete = () => {
            db.close();
            ok(out);
          };
          tx.onerror = () => fail(tx.error);
        };
      }),
    DEFAULT_DB_NAME,
  );
}

/** Id, UTC time, revision and notes of every stored observation. */
export interface StoredObservation {
  id: string;
  time: string;
  revision: number;
  notes: string;
}

export function storedObservations(page: Page): Promise<StoredObservation[]> {
  return page.evaluate(
    (name) =>
      new Promise<StoredObservation[]>((ok, fail) => {
        const req = indexedDB.open(name);
        req.onerror = () => fail(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const all = db.transaction('observations', 'readonly').objectStore('observations').getAll();
          all.onsuccess = () => {
            db.close();
            ok((all.result as Array<Omit<StoredObservation, 'notes'> & { notes?: string }>).map((o) => ({ id: o.id, time: o.time, revision: o.revision, notes: o.notes ?? '' })));
          };
          all.onerror = () => fail(all.error);
        };
      }),
    DEFAULT_DB_NAME,
  );
}

/** Notes of every stored observation (to find what a test saved). */
export async function storedNotes(page: Page): Promise<string[]> {
  return (await storedObservations(page)).map((o) => o.notes);
}

/**
 * Opens the app's database at a higher version from this page and closes it again, as a newer
 * release in another tab would; resolves with the version the database now has.
 */
export function openAtVersion(page: Page, version: number): Promise<number> {
  return page.evaluate(
    ([name, version]) =>
      new Promise<number>((ok, fail) => {
        const req = indexedDB.open(name, version);
        req.onerror = () => fail(req.error);
        req.onsuccess = () => {
          const v = req.result.version;
          req.result.close();
          ok(v);
        };
      }),
    [DEFAULT_DB_NAME, version] as const,
  );
}
