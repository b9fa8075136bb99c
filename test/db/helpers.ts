// Shared set-up for the database tests: a fresh database per test and an invented cruise.
// The vessel, cruise and observers are our own demo scenario.
import { afterEach, beforeEach } from 'vitest';
import type { DBCore, DBCoreMutateRequest, Middleware } from 'dexie';
import type { Cruise, Observation } from '../../src/domain/model';
import { closeFloeDb, createCruise, selectDatabase, type CruiseInput, type FloeDatabaseOptions, type ObservationInput } from '../../src/db';
import { CRUISE_INPUT } from './fixtures/demo-cruise';

export { CRUISE_INPUT };

let counter = 0;

/** Gives each test its own empty database, deleted afterwards. */
export function freshDatabasePerTest(opts: FloeDatabaseOptions = {}): { name: () => string } {
  let name = '';
  beforeEach(() => {
    name = `floe-test-${process.pid}-${++counter}`;
    selectDatabase(name, opts);
  });
  afterEach(async () => {
    closeFloeDb();
    await new Promise<void>((ok) => {
      const req = indexedDB.deleteDatabase(name);
      req.onsuccess = req.onerror = req.onblocked = () => ok();
    });
  });
  return { name: () => name };
}

export function makeCruise(overrides: Partial<CruiseInput> = {}): Promise<Cruise> {
  return createCruise({ ...CRUISE_INPUT, ...overrides });
}

export function makeObservation(cruiseId: string, overrides: Partial<Observation> = {}): ObservationInput {
  return {
    id: crypto.randomUUID(),
    cruiseId,
    time: '2026-02-10T06:00:00Z',
    position: { lat: -70.512, lon: -12.345, source: 'gps-serial', accuracyM: 5 },
    observerId: 'obs-ak',
    totalConcentration: 8,
    categories: [
      { partialConcentration: 5, stage: 'thin-first-year', floeSize: 'medium-floe', thicknessCm: 45 },
      { partialConcentration: 3, stage: 'grey-white', floeSize: 'small-floe', thicknessCm: 20 },
    ],
    deformation: { a: { ridgedTenths: 2 } },
    notes: 'Snow cover patchy.',
    photoIds: [],
    ...overrides,
  };
}

/** Every row of every table, for "the database is unchanged" checks. */
export async function dumpAll(): Promise<Record<string, unknown[]>> {
  const { getDb } = await import('../../src/db');
  const db = getDb();
  const out: Record<string, unknown[]> = {};
  for (const t of db.tables) out[t.name] = await t.toArray();
  return out;
}

/**
 * A Dexie middleware that makes the chosen writes fail as a full disk does in a browser
 * (QuotaExceededError), for "a failed write changes nothing" tests. `fails` sees each write's
 * table and its 1-based number among all writes since the middleware was added.
 */
export function quotaFailure(fails: (table: string, n: number) => boolean): Middleware<DBCore> {
  let n = 0;
  return {
    stack: 'dbcore',
    name: 'test-quota-failure',
    create: (down) => ({
      ...down,
      table: (name) => {
        const t = down.table(name);
        return {
          ...t,
          mutate: (req: DBCoreMutateRequest) =>
            fails(name, ++n) ? Promise.reject(new DOMException('The quota has been exceeded.', 'QuotaExceededError')) : t.mutate(req),
        };
      },
    }),
  };
}
