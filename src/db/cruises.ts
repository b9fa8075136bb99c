// Cruises: create, edit, list, and the one this laptop is logging (the active cruise).
import type { Cruise } from '../domain/model';
import { getDb, writableDb } from './connection';
import { mapWriteError, RecordNotFoundError } from './errors';
import type { CruiseInput } from './rows';
import { getSetting } from './settings';
import { checkCruise, nowIso } from './validate';

export async function createCruise(input: CruiseInput): Promise<Cruise> {
  const db = await writableDb();
  const at = nowIso();
  const cruise: Cruise = { ...input, id: input.id ?? crypto.randomUUID(), createdAt: at, updatedAt: at };
  checkCruise(cruise);
  try {
    // add, not put: an id that exists already is an error, not an overwrite.
    await db.cruises.add(cruise);
  } catch (err) {
    throw mapWriteError(err, `the cruise "${cruise.name}"`);
  }
  return cruise;
}

export type CruisePatch = Partial<Omit<Cruise, 'id' | 'createdAt' | 'updatedAt'>>;

export async function updateCruise(id: string, patch: CruisePatch): Promise<Cruise> {
  const db = await writableDb();
  try {
    return await db.transaction('rw', db.cruises, async () => {
      const old = await db.cruises.get(id);
      if (!old) throw new RecordNotFoundError('cruise', id);
      const next: Cruise = { ...old, ...patch, id, createdAt: old.createdAt, updatedAt: nowIso() };
      // `endTime: undefined` in a patch reopens the cruise: no key is stored for it.
      if (next.endTime === undefined) delete next.endTime;
      checkCruise(next);
      await db.cruises.put(next);
      return next;
    });
  } catch (err) {
    throw mapWriteError(err, `the cruise ${id}`);
  }
}

export function getCruise(id: string): Promise<Cruise | undefined> {
  return getDb().cruises.get(id);
}

/** Every cruise, newest first. */
export async function listCruises(): Promise<Cruise[]> {
  const all = await getDb().cruises.toArray();
  return all.sort((a, b) => (a.createdAt < b.createdAt ? 1 : a.createdAt > b.createdAt ? -1 : a.name.localeCompare(b.name)));
}

/** Sets the cruise this laptop logs into (null for none); the cruise must exist. */
export async function setActiveCruise(id: string | null): Promise<void> {
  const db = await writableDb();
  try {
    await db.transaction('rw', db.cruises, db.settings, async () => {
      if (id !== null && !(await db.cruises.get(id))) throw new RecordNotFoundError('cruise', id);
      await db.settings.put({ key: 'activeCruiseId', value: id });
    });
  } catch (err) {
    throw mapWriteError(err, 'the active cruise');
  }
}

export async function getActiveCruise(): Promise<Cruise | undefined> {
  const id = await getSetting('activeCruiseId');
  return id ? getCruise(id) : undefined;
}
