// The log written piece by piece from the store (exportLogPieces) is the same text, byte for
// byte, as the whole-bundle writer gives for the same records, whatever the batch sizes.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addTrackPoints, exportLogPieces, getDb } from '../../src/db';
import { applyMergePlan, loadMergeTarget } from '../../src/db/importPlan';
import { readCruiseExport } from '../../src/db/exportBundle';
import { exportLogJson } from '../../src/format/encode';
import { planMerge } from '../../src/format/merge';
import { readLogText } from '../../src/format/read';
import type { TrackPoint } from '../../src/domain/model';
import { arbBundle, sampleBundle } from '../format/arbitraries';
import { freshDatabasePerTest } from './helpers';

freshDatabasePerTest();

const AT = { exportedAt: '2026-04-01T00:00:00Z' };

async function store(text: string): Promise<void> {
  const r = readLogText(text, { rules: null });
  if (!r.ok) throw new Error(r.problems.listed[0]?.message);
  await applyMergePlan(planMerge(await loadMergeTarget(r.bundle.cruise.id), r.bundle), { source: 'test.json' });
}

async function streamed(cruiseId: string, observationBatch: number, chunkBatch: number): Promise<string> {
  let out = '';
  for await (const piece of exportLogPieces(cruiseId, { ...AT, observationBatch, chunkBatch })) out += piece;
  return out;
}

async function wipe() {
  const db = getDb();
  await db.transaction('rw', db.tables, async () => {
    for (const t of db.tables) await t.clear();
  });
}

describe('streaming export', { timeout: 120_000 }, () => {
  it('equals the whole-bundle writer for random logs and batch sizes (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(arbBundle, fc.integer({ min: 1, max: 5 }), fc.integer({ min: 1, max: 3 }), async (b, obsBatch, chunkBatch) => {
        await wipe();
        await store(exportLogJson(b, AT).join(''));
        const whole = exportLogJson((await readCruiseExport(b.cruise.id)).bundle, AT).join('');
        expect(await streamed(b.cruise.id, obsBatch, chunkBatch)).toBe(whole);
      }),
      { numRuns: 25 },
    );
  });

  it('walks many observations of one time and a track over many hours in small pieces', async () => {
    const b = sampleBundle();
    const same = b.observations.map((o, i) => ({ ...o, id: `same-${String(i).padStart(3, '0')}`, time: '2026-03-10T12:00:00Z' }));
    await store(exportLogJson({ ...b, observations: [...b.observations, ...same] }, AT).join(''));
    const t0 = Date.UTC(2026, 2, 10, 0, 0, 0);
    const track: TrackPoint[] = Array.from({ length: 5_000 }, (_, i) => ({
      cruiseId: b.cruise.id, time: new Date(t0 + i * 37_000).toISOString().replace('.000Z', 'Z'), lat: -65 - i * 1e-4, lon: 30 + i * 1e-4, source: 'gps-serial', sogKn: 8.5,
    }));
    await addTrackPoints(track);
    const whole = exportLogJson((await readCruiseExport(b.cruise.id)).bundle, AT).join('');
    expect(await streamed(b.cruise.id, 2, 5)).toBe(whole);
    const parsed = JSON.parse(whole) as { observations: unknown[]; track: { points: unknown[] } };
    expect(parsed.observations.length).toBe(b.observations.length * 2);
    expect(parsed.track.points.length).toBe(b.track.length + 5_000);
  });

  it('names a cruise that is not stored', async () => {
    await expect(streamed('no-such-cruise', 10, 10)).rejects.toThrow(/no-such-cruise/);
  });
});
