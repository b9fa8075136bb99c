import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { LEGACY_SNOW_KINDS } from '../../src/domain/legacyIceTypes';
import type { Observation } from '../../src/domain/model';
import { exportLogJson } from '../../src/format/encode';
import { bundleTarget, planMerge } from '../../src/format/merge';
import { CURRENT_VERSION, type LogFileV1 } from '../../src/format/types';
import { expectLiftedWithoutLoss } from './liftCheck';
import { MIGRATIONS, OLDEST_VERSION, VALIDATORS, V0_DEFAULT_MAX_SPEED_KN } from '../../src/format/migrate';
import { readLogText } from '../../src/format/read';

const V0_FIXTURE = resolve(import.meta.dirname, 'fixtures/log-v0.json');

describe('migration of earlier format versions', () => {
  it('has a validator for every version and a migration for every version below the current one', () => {
    for (let v = OLDEST_VERSION; v <= CURRENT_VERSION; v++) {
      expect(typeof VALIDATORS[v]).toBe('function');
      if (v < CURRENT_VERSION) expect(typeof MIGRATIONS[v]).toBe('function');
    }
  });

  it('reads a version-0 file into the current model', () => {
    const r = readLogText(readFileSync(V0_FIXTURE, 'utf8'));
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    expect(r.fromVersion).toBe(0);
    const { cruise, observations, track } = r.bundle;
    expect(cruise).toMatchObject({ id: 'v0-cruise', vesselName: 'RV Draft', iceClass: 'IA', maxSpeedKn: V0_DEFAULT_MAX_SPEED_KN, displayTimeZone: 'UTC' });
    const [a, b] = observations;
    expect(a).toMatchObject({
      id: 'v0-obs-1',
      cruiseId: 'v0-cruise',
      position: { lat: 75.5, lon: 20.25, source: 'gps-serial' },
      totalConcentration: 8,
      categories: [{ partialConcentration: 5, stage: 'medium-first-year', thicknessCm: 90, floeSize: 'medium-floe' }, { partialConcentration: 3, stage: 'nilas' }],
      savedBy: 'v0-obs-a',
      deviceId: 'format-v0',
      photoIds: [],
    });
    // Half a position (latitude without longitude) becomes no position.
    expect(b?.position).toBeNull();
    expect(track).toEqual([{ cruiseId: 'v0-cruise', time: '2026-01-10T05:00:00Z', lat: 75.4, lon: 20.1, source: 'gps-serial' }]);
  });

  it('still checks a version-0 file against its own schema', () => {
    const text = readFileSync(V0_FIXTURE, 'utf8').replace('"total": 8', '"total": 80');
    const r = readLogText(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems.listed[0]?.path).toBe('$.observations[0].total');
  });
});

describe('version 1 to version 2: the ice-type layout of our own', () => {
  const V1_FIXTURE = resolve(import.meta.dirname, 'fixtures/log-v1.json');
  const V1_EXAMPLE = resolve(import.meta.dirname, '../../docs/examples/demo-cruise-v1.floe-log.json');

  /** Every version of the old file lifted and found in the bundle, compared field by field. */
  function expectWholeFileLifted(path: string) {
    const text = readFileSync(path, 'utf8');
    const old = JSON.parse(text) as LogFileV1;
    const r = readLogText(text);
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    expect(r.fromVersion).toBe(1);
    const { bundle } = r;
    let versions = 0;
    const byKey = (list: Observation[]) => new Map(list.map((o) => [`${o.id}:${o.revision}:${o.savedAt}`, o]));
    const current = byKey(bundle.observations);
    const history = byKey(bundle.history);
    const conflicts = byKey(bundle.conflicts);
    const key = (o: { id: string; revision: number; savedAt: string }) => `${o.id}:${o.revision}:${o.savedAt}`;
    for (const fo of old.observations) {
      const lifted = current.get(key(fo));
      expect(lifted, fo.id).toBeDefined();
      expectLiftedWithoutLoss(fo as unknown as Record<string, unknown>, lifted as Observation, fo.id);
      versions++;
      for (const h of fo.history ?? []) {
        expectLiftedWithoutLoss(h as unknown as Record<string, unknown>, history.get(key(h)) as Observation, `${fo.id} history ${h.revision}`);
        versions++;
      }
      for (const c of fo.conflicts ?? []) {
        expectLiftedWithoutLoss(c as unknown as Record<string, unknown>, conflicts.get(key(c)) as Observation, `${fo.id} conflict`);
        versions++;
      }
    }
    expect(bundle.observations.length + bundle.history.length + bundle.conflicts.length).toBe(versions);
    expect(bundle.track).toHaveLength(old.track.points.length);
    expect(bundle.photos).toHaveLength(old.photos.length);
    expect(bundle.cruise).toMatchObject({ id: old.cruise.id, name: old.cruise.name, vesselName: old.vessel.name, iceClass: old.vessel.iceClass });
    return { old, bundle };
  }

  it('the fixture holds every snow kind of format 1, and a history and a conflict copy', () => {
    const old = JSON.parse(readFileSync(V1_FIXTURE, 'utf8')) as LogFileV1;
    const all = old.observations.flatMap((o) => [o, ...(o.history ?? []), ...(o.conflicts ?? [])]);
    const kinds = new Set(all.flatMap((o) => o.categories.map((c) => c.snowKind)).filter((k) => k !== undefined));
    expect([...kinds].sort()).toEqual([...LEGACY_SNOW_KINDS].sort());
    expect(all.length).toBeGreaterThan(old.observations.length + 1);
  });

  it('lifts the version-1 fixture with no value lost, field by field', () => {
    const { bundle } = expectWholeFileLifted(V1_FIXTURE);
    // Spot values, by hand: icy crust became a crust flag, wind-packed snow is kept in the notes.
    const first = bundle.observations.find((o) => o.id === 'v1-obs-1') as Observation;
    expect(first.snow).toEqual({ a: { crust: true, depthCm: 15 }, b: { depthCm: 8 }, c: { cover: 'none' } });
    expect(first.deformation).toEqual({ a: { ridgedTenths: 2, raftedTenths: 1, sailHeightM: 1.2 } });
    expect(first.notes).toBe('Ridges in lines to the north.\n[kept from format 1] ice type b snow: wind-packed');
  });

  it('lifts the committed version-1 example of the demo cruise with no value lost, field by field', () => {
    const { bundle } = expectWholeFileLifted(V1_EXAMPLE);
    expect(bundle.observations.length).toBeGreaterThan(100);
  });

  it('writes the lifted log as version 2, and reading it back and merging it adds nothing', () => {
    const r = readLogText(readFileSync(V1_FIXTURE, 'utf8'));
    if (!r.ok) throw new Error('fixture unreadable');
    const text = exportLogJson(r.bundle, { exportedAt: '2026-03-11T00:00:00Z' }).join('');
    expect(JSON.parse(text)).toMatchObject({ formatVersion: 2, $schema: 'format/floe-ledger-log-2.schema.json' });
    const again = readLogText(text);
    if (!again.ok) throw new Error(JSON.stringify(again.problems));
    expect(again.fromVersion).toBe(2);
    const plan = planMerge(bundleTarget(r.bundle), again.bundle);
    expect(plan.counts).toMatchObject({ new: 0, newer: 0, older: 0, conflict: 0, versionsWritten: 0 });
    // The same old file imported on a laptop that already lifted it merges as identical too.
    const twice = readLogText(readFileSync(V1_FIXTURE, 'utf8'));
    if (!twice.ok) throw new Error('fixture unreadable');
    expect(planMerge(bundleTarget(again.bundle), twice.bundle).counts.versionsWritten).toBe(0);
  });

  it('still checks a version-1 file against its own schema', () => {
    const text = readFileSync(V1_FIXTURE, 'utf8').replace('"snowKind": "icy-crust"', '"snowKind": "crusty"');
    const r = readLogText(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems.listed[0]?.path).toBe('$.observations[0].categories[0].snowKind');
  });
});
