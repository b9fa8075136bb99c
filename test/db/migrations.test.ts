// Every shipped schema version has a fixture of its contents in test/db/fixtures/vN.json; the
// current code must open each one and keep every record.
import { describe, expect, it } from 'vitest';
import { Dexie } from 'dexie';
import type { Observation } from '../../src/domain/model';
import {
  getDb,
  getObservation,
  LATEST_SCHEMA_VERSION,
  listObservations,
  observationHistory,
  openFloeDb,
  saveObservation,
  SCHEMA_VERSIONS,
  selectDatabase,
  writeBlockReason,
  type SchemaVersion,
} from '../../src/db';
import { comparable, fixtureFiles, loadFixture, readFixture } from './fixtures/load';
import { freshDatabasePerTest } from './helpers';

const db = freshDatabasePerTest();

async function dumpComparable(): Promise<Record<string, unknown>> {
  const out: Record<string, unknown> = {};
  for (const t of getDb().tables) out[t.name] = await comparable(await t.toArray());
  return out;
}

function primaryKeyOf(table: string, row: unknown): unknown {
  const pk = getDb().table(table).schema.primKey;
  const r = row as Record<string, unknown>;
  return Array.isArray(pk.keyPath) ? pk.keyPath.map((k) => r[k]) : r[pk.keyPath as string];
}

describe('schema versions', () => {
  it('are numbered in increasing order with a note each, and every shipped version has a fixture', () => {
    // Parallel branches hold numbers of their own (docs/dev/db.md), so a branch may show a gap.
    const numbers = SCHEMA_VERSIONS.map((v) => v.version);
    expect(numbers[0]).toBe(1);
    for (let i = 1; i < numbers.length; i++) expect(numbers[i]).toBeGreaterThan(numbers[i - 1] as number);
    for (const v of SCHEMA_VERSIONS) expect(v.note.length, `version ${v.version} note`).toBeGreaterThan(0);
    expect(fixtureFiles().map((f) => f.version)).toEqual(SCHEMA_VERSIONS.map((v) => v.version));
  });

  for (const { version, file } of fixtureFiles()) {
    describe(`fixture of version ${version}`, () => {
      const fx = readFixture(file);

      it('matches the shipped store specs (a shipped version is never edited)', () => {
        expect(SCHEMA_VERSIONS.find((v) => v.version === version)?.stores).toEqual(fx.stores);
      });

      it(`upgrades to version ${LATEST_SCHEMA_VERSION} keeping every record`, async () => {
        await loadFixture(db.name(), fx);
        selectDatabase(db.name());
        await openFloeDb();
        expect(writeBlockReason()).toBeNull();
        expect(getDb().verno).toBe(LATEST_SCHEMA_VERSION);
        const rewritten = new Set(SCHEMA_VERSIONS.filter((v) => v.version > version).flatMap((v) => v.rewrites ?? []));
        const now = await dumpComparable();
        for (const [table, rows] of Object.entries(fx.tables)) {
          const stored = now[table] as unknown[];
          expect(stored, table).toHaveLength(rows.length);
          const keys = new Set(stored.map((r) => JSON.stringify(primaryKeyOf(table, r))));
          for (const r of rows) expect(keys.has(JSON.stringify(primaryKeyOf(table, r))), `${table} row ${JSON.stringify(primaryKeyOf(table, r))}`).toBe(true);
          if (!rewritten.has(table)) expect(stored, table).toEqual(expect.arrayContaining((await comparable(rows)) as unknown[]));
        }
      });

      it('is usable after the upgrade: lists, history, and an edit continue the revisions', async () => {
        await loadFixture(db.name(), fx);
        selectDatabase(db.name());
        const cruiseId = (fx.tables.cruises?.[0] as { id: string }).id;
        const visible = (fx.tables.observations as Observation[]).filter((o) => !o.deleted);
        expect((await listObservations(cruiseId)).map((o) => o.id).sort()).toEqual(visible.map((o) => o.id).sort());
        const edited = (fx.tables.observations as Observation[]).find((o) => o.revision > 1) as Observation;
        expect((await observationHistory(edited.id)).map((o) => o.revision)).toEqual(Array.from({ length: edited.revision }, (_, i) => i + 1));
        const next = await saveObservation({ ...edited, notes: 'edited after the upgrade' }, { expectedRevision: edited.revision, savedBy: 'obs-ak' });
        expect(next.observation.revision).toBe(edited.revision + 1);
        expect((await getObservation(edited.id))?.notes).toBe('edited after the upgrade');
      });
    });
  }
});

describe('the upgrade mechanism', () => {
  // A version as a future release would write it: a new index and rows rewritten by the
  // upgrade function. Test-only; shipped versions live in src/db/schema.ts.
  const latest = SCHEMA_VERSIONS[SCHEMA_VERSIONS.length - 1] as SchemaVersion;
  const next: SchemaVersion = {
    version: latest.version + 1,
    note: 'test: index photos by time, and give every observation a reviews list',
    stores: { ...latest.stores, photos: 'id, observationId, cruiseId, addedAt' },
    rewrites: ['observations'],
    upgrade: async (tx) => {
      await tx
        .table('observations')
        .toCollection()
        .modify((o: Observation) => {
          o.reviews ??= [];
        });
    },
  };

  it('runs a later version upgrade over the fixture of version 1, once, keeping every row', async () => {
    const first = fixtureFiles()[0];
    if (!first) throw new Error('no fixture');
    const fx = readFixture(first.file);
    await loadFixture(db.name(), fx);
    selectDatabase(db.name(), { versions: [...SCHEMA_VERSIONS, next] });
    await openFloeDb();
    expect(getDb().verno).toBe(next.version);
    const obs = await getDb().observations.toArray();
    expect(obs).toHaveLength(fx.tables.observations?.length ?? -1);
    for (const o of obs) {
      const before = (fx.tables.observations as Observation[]).find((x) => x.id === o.id) as Observation;
      expect(o).toEqual({ ...before, reviews: before.reviews ?? [] });
    }
    // The new index answers queries.
    expect(await getDb().photos.where('addedAt').above('2026-01-01').count()).toBe(fx.tables.photos?.length);
    // Opening again does not run the upgrade again (native version unchanged).
    const native = getDb().backendDB().version;
    selectDatabase(db.name(), { versions: [...SCHEMA_VERSIONS, next] });
    await openFloeDb();
    expect(getDb().backendDB().version).toBe(native);
    expect(Dexie.semVer.startsWith('4.')).toBe(true);
  });
});
