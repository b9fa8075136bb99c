// A long cruise for the benchmarks: the invented demo cruise repeated with new ids and later
// times, 50,000 observations and 1,000,000 track points at full size. Browser-safe (the
// Chromium benchmarks build it inside the page).
import { makeDemoCruise } from '../../src/domain/demo';
import type { Observation, TrackPoint } from '../../src/domain/model';
import type { LogBundle } from '../../src/format/types';

export function bigCruise(observationCount: number, trackPointCount: number): LogBundle {
  const demo = makeDemoCruise(1);
  const hour = 3_600_000;
  const t0 = Date.parse(demo.observations[0]?.time ?? '2026-03-09T00:00:00Z');
  const observations: Observation[] = [];
  for (let i = 0; i < observationCount; i++) {
    const o = demo.observations[i % demo.observations.length] as Observation;
    const time = new Date(t0 + i * hour).toISOString().replace('.000Z', 'Z');
    observations.push({ ...o, id: `bench-${i.toString(36).padStart(6, '0')}`, time, savedAt: time });
  }
  const track: TrackPoint[] = [];
  const p0 = Date.parse(demo.track[0]?.time ?? '2026-03-09T00:00:00Z');
  for (let i = 0; i < trackPointCount; i++) {
    const p = demo.track[i % demo.track.length] as TrackPoint;
    track.push({ ...p, time: new Date(p0 + i * 20_000).toISOString().replace('.000Z', 'Z') });
  }
  return { cruise: demo.cruise, observations, history: [], conflicts: [], track, photos: [] };
}
