import { describe, expect, it } from 'vitest';
import geographiclib from 'geographiclib-geodesic';
import { makeDemoCruise } from '../../src/domain/demo';
import { positionFromTrack, TrackRecorder } from '../../src/gps/trackPosition';
import type { TrackPoint } from '../../src/domain/model';

const geod = geographiclib.Geodesic.WGS84;
const pt = (time: string, lat: number, lon: number): TrackPoint => ({ cruiseId: 'c', time, lat, lon, source: 'track-file' });

describe('position from an imported track', () => {
  const track = [pt('2026-03-09T12:00:00Z', 82, 10), pt('2026-03-09T12:10:00Z', 82.1, 12), pt('2026-03-09T13:00:00Z', 82.2, 12)];

  it('interpolates along the WGS 84 geodesic at the observation time', () => {
    const r = positionFromTrack(track, '2026-03-09T12:05:00Z');
    if (!r.ok) throw new Error(r.reason);
    // Reference: GeographicLib (Karney 2013) midpoint of the same geodesic.
    const line = geod.InverseLine(82, 10, 82.1, 12);
    const mid = line.Position(line.s13 / 2);
    expect(r.position.lat).toBeCloseTo(mid.lat2!, 9);
    expect(r.position.lon).toBeCloseTo(mid.lon2!, 9);
    expect(r.position.source).toBe('track-interpolated');
    expect(r.bracketMinutes).toBe(10);
    // A geodesic at 82 N bulges poleward of the straight latitude average.
    expect(r.position.lat).toBeGreaterThan(82.05);
  });

  it('returns an exact fix as it is', () => {
    expect(positionFromTrack(track, '2026-03-09T12:10:00Z')).toEqual({ ok: true, position: { lat: 82.1, lon: 12, source: 'track-interpolated' }, bracketMinutes: 0 });
  });

  it('refuses outside the track and across long gaps, saying why', () => {
    expect(positionFromTrack(track, '2026-03-09T11:59:00Z')).toEqual({ ok: false, reason: '2026-03-09T11:59:00Z is before the track starts (2026-03-09T12:00:00Z)' });
    expect(positionFromTrack(track, '2026-03-09T13:00:01Z')).toMatchObject({ ok: false, reason: expect.stringMatching(/after the track ends/) });
    expect(positionFromTrack(track, '2026-03-09T12:30:00Z')).toMatchObject({ ok: false, reason: expect.stringMatching(/gap of 50 min/) });
    expect(positionFromTrack(track, '2026-03-09T12:30:00Z', { maxBracketMinutes: 60 }).ok).toBe(true);
    expect(positionFromTrack([], '2026-03-09T12:30:00Z')).toEqual({ ok: false, reason: 'no track imported for this cruise' });
    expect(positionFromTrack(track, 'noon')).toMatchObject({ ok: false });
  });

  it('puts each demo observation within metres of the demo track', () => {
    const demo = makeDemoCruise();
    const typo = new Set(demo.doubtful.filter((d) => d.kind === 'position-typo').map((d) => d.observationId));
    let worst = 0;
    for (const o of demo.observations) {
      if (typo.has(o.id)) continue;
      const r = positionFromTrack(demo.track, o.time);
      if (!r.ok) throw new Error(r.reason);
      worst = Math.max(worst, geod.Inverse(r.position.lat, r.position.lon, o.position!.lat, o.position!.lon).s12!);
    }
    // Observation positions are rounded to 1e-5 deg (about a metre).
    expect(worst).toBeLessThan(2);
  });
});

describe('track recorder', () => {
  it('writes one point per minute from a 1 Hz source, skipping stale fixes', () => {
    const rec = new TrackRecorder({ cruiseId: 'c', source: 'gps-serial' });
    const t0 = Date.UTC(2026, 2, 9, 12, 0, 30);
    const written: TrackPoint[] = [];
    for (let s = 0; s < 180; s++) {
      const time = new Date(t0 + s * 1000).toISOString();
      const p = rec.offer({ time, lat: 82, lon: 10 + s * 1e-4, sogKn: 4, cogDeg: 90, headingDeg: null, ageMs: 200 }, t0 + s * 1000 + 200);
      if (p) written.push(p);
    }
    expect(written.map((p) => p.time)).toEqual(['2026-03-09T12:00:30Z', '2026-03-09T12:01:00Z', '2026-03-09T12:02:00Z', '2026-03-09T12:03:00Z']);
    expect(written[1]).toEqual({ cruiseId: 'c', time: '2026-03-09T12:01:00Z', lat: 82, lon: 10 + 30 * 1e-4, source: 'gps-serial', sogKn: 4, cogDeg: 90 });
    expect(rec.offer({ time: '2026-03-09T12:10:00Z', lat: 82, lon: 10, ageMs: 60_000 }, 0)).toBeNull();
  });

  it('uses a configurable interval and the receive time when a source gives none', () => {
    const rec = new TrackRecorder({ cruiseId: 'c', source: 'geolocation', intervalMs: 5 * 60_000 });
    const now = Date.UTC(2026, 2, 9, 12, 4, 0);
    expect(rec.offer({ time: null, lat: 1, lon: 2, ageMs: 1000 }, now)?.time).toBe('2026-03-09T12:03:59Z');
    expect(rec.offer({ time: null, lat: 1, lon: 2, ageMs: 0 }, now + 30_000)).toBeNull();
    expect(rec.offer({ time: null, lat: 1, lon: 2, ageMs: 0 }, now + 60_000 + 1)?.time).toBe('2026-03-09T12:05:00.001Z');
  });
});
