// Benchmarks timed inside Chromium, against its real IndexedDB; the numbers go back to Node.
import type { Observation, TrackPoint } from '../../../src/domain/model';
import { CRUISE_INPUT } from '../../db/fixtures/demo-cruise';
import { addTrackPoints, createCruise, DEFAULT_TRACK_CHUNK, getDb, saveObservation, type ObservationInput } from '../../../src/db';

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

async function benchCruise(): Promise<string> {
  const c = await createCruise({ ...CRUISE_INPUT, name: 'Bench cruise' });
  return c.id;
}

function observation(cruiseId: string, i: number): ObservationInput {
  return {
    id: crypto.randomUUID(),
    cruiseId,
    time: new Date(Date.UTC(2026, 1, 1) + i * 3_600_000).toISOString().replace('.000Z', 'Z'),
    position: { lat: -70.5, lon: -12.3, source: 'gps-serial' },
    observerId: 'obs-ak',
    totalConcentration: 8,
    categories: [
      { partialConcentration: 5, stage: 'thin-first-year', thicknessCm: 45, floeSize: 'medium-floe' },
      { partialConcentration: 3, stage: 'grey-white', thicknessCm: 20, floeSize: 'small-floe' },
    ],
    notes: 'bench',
    photoIds: [],
  };
}

/**
 * Median ms of an edit through saveObservation (checks, conflict test, revision row, one
 * strict transaction) against a bare strict put of the same record, interleaved.
 */
export async function benchSaveVsPut(rounds: number): Promise<{ subject: number; baseline: number }> {
  const cruiseId = await benchCruise();
  const first = (await saveObservation(observation(cruiseId, 0))).observation;
  let current: Observation = first;
  const bare = { ...first, id: crypto.randomUUID() };
  const a: number[] = [];
  const b: number[] = [];
  for (let i = 0; i < rounds + 3; i++) {
    let t0 = performance.now();
    current = (await saveObservation({ ...current, notes: `edit ${i}` }, { expectedRevision: current.revision })).observation;
    const ta = performance.now() - t0;
    t0 = performance.now();
    await getDb().observations.put({ ...bare, notes: `edit ${i}`, revision: i + 2 });
    const tb = performance.now() - t0;
    if (i >= 3) {
      a.push(ta);
      b.push(tb);
    }
  }
  return { subject: median(a), baseline: median(b) };
}

function points(cruiseId: string, n: number): TrackPoint[] {
  const t0 = Date.UTC(2026, 1, 1);
  const out: TrackPoint[] = new Array<TrackPoint>(n);
  for (let i = 0; i < n; i++)
    out[i] = { cruiseId, time: new Date(t0 + i * 1000).toISOString().replace('.000Z', 'Z'), lat: -70 + i * 1e-6, lon: -12 + i * 1e-6, source: 'gps-serial', sogKn: 6 };
  return out;
}

/** Ms for `n` points through addTrackPoints (checks + batches) against one bare bulkPut. */
export async function benchTrackVsBulkPut(n: number, rounds: number, chunkSize = DEFAULT_TRACK_CHUNK): Promise<{ subject: number; baseline: number }> {
  const a: number[] = [];
  const b: number[] = [];
  for (let r = 0; r < rounds; r++) {
    // Alternate which goes first, so a warmer store does not favour one side.
    const order = r % 2 === 0 ? (['a', 'b'] as const) : (['b', 'a'] as const);
    for (const side of order) {
      const rows = points(`bench-${side}-${r}`, n);
      const t0 = performance.now();
      if (side === 'a') await addTrackPoints(rows, { chunkSize });
      else await getDb().trackPoints.bulkPut(rows);
      (side === 'a' ? a : b).push(performance.now() - t0);
      await getDb().trackPoints.clear();
    }
  }
  return { subject: median(a), baseline: median(b) };
}
