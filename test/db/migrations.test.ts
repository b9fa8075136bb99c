// Every shipped schema version has a fixture of its contents in test/db/fixtures/vN.json; the
// current code must open each one and keep every record.
import { describe, expect, it } from 'vitest';
import { Dexie } from 'dexie';
import type { Observation } from '../../src/domain/model';
import {
  FloeDatabase,
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
import { liftDraftData, liftStoredObservation } from '../../src/db/upgradeIceTypes';
import { cruiseObservations } from '../../src/db/cruiseObservations';
import { compareObservations } from '../../src/domain/stats/review';
import { expectLiftedWithoutLoss, MARKER } from '../format/liftCheck';
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
    // Numbers may have gaps: versions are reserved per piece of work before they merge.
    const numbers = SCHEMA_VERSIONS.map((v) => v.version);
    expect(numbers[0]).toBe(1);
    for (let i = 1; i < numbers.length; i++) expect(numbers[i], `version after ${numbers[i - 1]}`).toBeGreaterThan(numbers[i - 1] as number);
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
          // A table a later version removed must be one its upgrade rewrote into another
          // (checked record by record in the tests of that upgrade below).
          if (!(table in now)) {
            expect(rewritten.has(table), `${table} removed without a rewrite`).toBe(true);
            continue;
          }
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
      // Version 3 (on the way) lifted the ice types; the test version then added the reviews list.
      const before = liftStoredObservation((fx.tables.observations as Observation[]).find((x) => x.id === o.id) as Observation);
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

describe('version 3: deformation and snow in groups of their own', () => {
  const v2File = fixtureFiles().find((f) => f.version === 2);
  type Row = Record<string, unknown> & { observation?: Record<string, unknown> };

  it('lifts every observation, earlier revision and conflict copy of the version-2 fixture with no value lost', async () => {
    if (!v2File) throw new Error('no version-2 fixture');
    const fx = readFixture(v2File.file);
    await loadFixture(db.name(), fx);
    selectDatabase(db.name());
    await openFloeDb();
    const d = getDb();
    const old = fx.tables as Record<string, Row[]>;
    for (const o of old.observations ?? []) {
      expectLiftedWithoutLoss(o, (await d.observations.get(o.id as string)) as Observation, `observations ${String(o.id)}`);
    }
    for (const r of old.revisions ?? []) {
      const row = (await d.revisions.get([r.observationId as string, r.revision as number])) as unknown as Row;
      const { observation: _o, ...rest } = row;
      const { observation: _b, ...restBefore } = r;
      expect(rest).toEqual(restBefore);
      expectLiftedWithoutLoss(r.observation as Record<string, unknown>, row.observation as unknown as Observation, `revisions ${String(r.observationId)}:${String(r.revision)}`);
    }
    for (const c of old.conflicts ?? []) {
      const row = (await d.table('conflicts').get(c.id as string)) as Row;
      expectLiftedWithoutLoss(c.observation as Record<string, unknown>, row.observation as unknown as Observation, `conflicts ${String(c.id)}`);
    }
    // The fixture's draft has no ice types typed yet: it is kept as it was.
    expect(await d.drafts.toArray()).toEqual(old.drafts);
  });

  it('maps every old snow kind, keeps the unmappable ones in the notes, and lifts a form draft', async () => {
    // Rows of schema 2 built here (invented): one observation per old snow kind.
    const kinds = ['none', 'fresh-loose', 'wind-packed', 'drifted', 'wet', 'icy-crust', 'patchy'];
    const v2 = SCHEMA_VERSIONS.filter((v) => v.version <= 2);
    const old = new FloeDatabase(db.name(), { versions: v2 });
    await old.open();
    const rows = kinds.map((kind, i) => ({
      id: `kind-${i}`, cruiseId: 'c-kinds', time: `2026-03-0${1 + (i % 7)}T0${i}:00:00Z`, position: null, observerId: 'obs-ak',
      totalConcentration: 9,
      categories: [
        { partialConcentration: 6, stage: 'thick-first-year', thicknessCm: 150, floeSize: 'big-floe', ridgedTenths: 3, sailHeightM: 1.4, snowKind: kind, snowDepthCm: 20 },
        { partialConcentration: 3, stage: 'grey', snowKind: kind },
      ],
      notes: i % 2 === 0 ? '' : 'observed at dawn', photoIds: [], revision: 1, savedAt: '2026-03-08T00:00:00Z', savedBy: 'obs-ak', deviceId: 'dev', deleted: false,
    }));
    const draftData = {
      draft: {
        notes: 'half typed',
        categories: [
          { key: 'k1', partial: '6', stage: 'thick-first-year', thicknessCm: '150', floeSize: '', ridged: '2', rafted: '', sailHeightM: '', snowKind: 'icy-crust', snowDepthCm: '20' },
          { key: 'k2', partial: '3', stage: 'grey', thicknessCm: '', floeSize: '', ridged: '', rafted: '', sailHeightM: '', snowKind: 'wind-packed', snowDepthCm: '' },
          { key: 'k3', partial: '', stage: '', thicknessCm: '', floeSize: '', ridged: '', rafted: '', sailHeightM: '', snowKind: '', snowDepthCm: '' },
        ],
      },
      editing: null,
    };
    await old.transaction('rw', old.tables, async () => {
      await old.table('observations').bulkAdd(rows);
      await old.table('drafts').add({ cruiseId: 'c-kinds', form: 'observation', data: draftData, savedAt: '2026-03-08T00:00:00Z' });
    });
    old.close();

    selectDatabase(db.name());
    await openFloeDb();
    for (const r of rows) {
      const now = (await getDb().observations.get(r.id)) as Observation;
      expectLiftedWithoutLoss(r, now, r.id);
    }
    // Spot values by hand (docs/format.md, "Versions and migration").
    const get = async (i: number) => (await getDb().observations.get(`kind-${i}`)) as Observation;
    expect((await get(3)).snow).toEqual({ a: { drifts: true, depthCm: 20 }, b: { drifts: true } });
    expect((await get(5)).snow?.a).toEqual({ crust: true, depthCm: 20 });
    expect((await get(1)).notes).toBe(`observed at dawn\n${MARKER} ice type a snow: fresh-loose; ice type b snow: fresh-loose`);
    expect((await get(2)).notes).toBe(`${MARKER} ice type a snow: wind-packed; ice type b snow: wind-packed`);
    expect((await get(0)).deformation).toEqual({ a: { ridgedTenths: 3, sailHeightM: 1.4 } });

    const draft = (await getDb().drafts.get(['c-kinds', 'observation'])) as { data: { draft: { notes: string; categories: Record<string, unknown>[] } } };
    expect(draft.data.draft.notes).toBe(`half typed\n${MARKER} ice type b snow: wind-packed`);
    expect(draft.data.draft.categories[0]).toEqual({
      key: 'k1', partial: '6', stage: 'thick-first-year', thicknessCm: '150', floeSize: '', ridged: '2', rafted: '', sailHeightM: '',
      snowCover: '', snowWetness: '', snowCrust: true, snowDrifts: false, snowDepthCm: '20',
    });
    expect(draft.data.draft.categories[2]).toMatchObject({ snowCover: '', snowWetness: '', snowCrust: false, snowDrifts: false });
    expect(draft.data.draft.categories.every((c) => !('snowKind' in c))).toBe(true);
  });

  it('leaves drafts it does not recognise as they are', () => {
    for (const d of [null, 'text', { totalConcentration: 6 }, { draft: { categories: 'x' } }]) expect(liftDraftData(d)).toEqual(d);
  });
});

/** Loads the fixture of schema `version`, opens it with the current code, and gives its observations. */
async function openedFromFixture(version: number) {
  const file = fixtureFiles().find((f) => f.version === version);
  if (!file) throw new Error(`no version-${version} fixture`);
  await loadFixture(db.name(), readFixture(file.file));
  selectDatabase(db.name());
  await openFloeDb();
  const d = getDb();
  return { d, all: await d.observations.toArray() };
}

describe('version 7: no index on cruiseId alone for observations', () => {
  it('drops the index over the version-6 fixture and still finds every observation of each cruise, in time order', async () => {
    const { d, all } = await openedFromFixture(6);
    const indexes = d.observations.schema.indexes.map((i) => i.name);
    expect(indexes).toContain('[cruiseId+time]');
    expect(indexes).not.toContain('cruiseId');
    const cruiseIds = [...new Set(all.map((o) => o.cruiseId))];
    expect(cruiseIds.length).toBeGreaterThan(0);
    for (const id of cruiseIds) {
      const byIndex = await cruiseObservations(d, id).toArray();
      const byScan = all.filter((o) => o.cruiseId === id).sort(compareObservations);
      expect(byIndex.map((o) => o.id)).toEqual(byScan.map((o) => o.id));
    }
  });
});

describe('version 8: no index on observerId for observations', () => {
  it('drops the index over the version-7 fixture and an observer is still found per cruise, in time order', async () => {
    const { d, all } = await openedFromFixture(7);
    expect(d.observations.schema.indexes.map((i) => i.name)).toEqual(['[cruiseId+time]']);
    const pairs = [...new Set(all.filter((o) => !o.deleted).map((o) => `${o.cruiseId} ${o.observerId}`))];
    expect(pairs.length).toBeGreaterThan(1);
    for (const pair of pairs) {
      const [cruiseId, observerId] = pair.split(' ') as [string, string];
      const listed = await listObservations(cruiseId, { observerId });
      const byScan = all.filter((o) => o.cruiseId === cruiseId && o.observerId === observerId && !o.deleted).sort(compareObservations);
      expect(listed.map((o) => o.id)).toEqual(byScan.map((o) => o.id));
    }
  });
});
