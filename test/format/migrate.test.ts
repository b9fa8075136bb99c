import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { CURRENT_VERSION } from '../../src/format/types';
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
