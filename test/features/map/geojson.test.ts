// GeoJSON built from domain data: colours per concentration band (WMO/TD-No. 1215, the ice
// chart colour standard for total concentration), the marginal ice zone stretches (15-80 %
// concentration, common practice), the antimeridian split and the ship's position.
import { describe, expect, it } from 'vitest';
import type { Observation, TrackPoint } from '../../../src/domain/model';
import { BANDS, band, bandOfObservation, bandOfTenths, hexColour, inMarginalIceZone, MIZ_LEGEND } from '../../../src/features/map/concentrationBands';
import {
  initialBearing,
  marginalIceZoneStretches,
  observationFeatures,
  shipFeature,
  splitAtAntimeridian,
  trackFeature,
} from '../../../src/features/map/geojson';

function obs(id: string, time: string, total: number | null, lat = 80, lon = 10, extra: Partial<Observation> = {}): Observation {
  return {
    id, cruiseId: 'c', time, position: { lat, lon, source: 'manual' }, observerId: 'o1', totalConcentration: total,
    categories: total ? [{ partialConcentration: total, stage: 'thick-first-year' }] : [],
    notes: '', photoIds: [], revision: 1, savedAt: time, savedBy: 'o1', deviceId: 'd', deleted: false, ...extra,
  };
}

function tp(time: string, lat: number, lon: number, extra: Partial<TrackPoint> = {}): TrackPoint {
  return { cruiseId: 'c', time, lat, lon, source: 'gps-serial', ...extra };
}

describe('concentration bands (WMO/TD-No. 1215 colours)', () => {
  it('gives each tenth its band', () => {
    const expected = ['ice-free', 'c1-3', 'c1-3', 'c1-3', 'c4-6', 'c4-6', 'c4-6', 'c7-8', 'c7-8', 'c9-10', 'c9-10'];
    expect([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10].map((t) => bandOfTenths(t))).toEqual(expected);
    expect(bandOfTenths(null)).toBe('not-judged');
    expect(bandOfTenths(0, true)).toBe('open-water');
  });

  it('uses the standard RGB values', () => {
    // WMO/TD-No. 1215 colour table.
    expect(band('ice-free').rgb).toEqual([0, 100, 255]);
    expect(band('open-water').rgb).toEqual([150, 200, 255]);
    expect(band('c1-3').rgb).toEqual([140, 255, 160]);
    expect(band('c4-6').rgb).toEqual([255, 255, 0]);
    expect(band('c7-8').rgb).toEqual([255, 125, 7]);
    expect(band('c9-10').rgb).toEqual([255, 0, 0]);
    expect(band('fast-ice').rgb).toEqual([150, 150, 150]); // 2001 draft, unconfirmed
    expect(hexColour([255, 125, 7])).toBe('#ff7d07');
    expect(new Set(BANDS.map((b) => hexColour(b.rgb))).size).toBe(BANDS.length);
  });

  it('reads zero tenths with ice noted as open water and fast ice as its own band', () => {
    expect(bandOfObservation(obs('a', '2026-03-09T00:00:00Z', 0))).toBe('ice-free');
    expect(bandOfObservation(obs('a', '2026-03-09T00:00:00Z', 0, 80, 10, { traceStage: 'grey' }))).toBe('open-water');
    expect(bandOfObservation(obs('a', '2026-03-09T00:00:00Z', 10, 80, 10, { categories: [{ partialConcentration: 10, stage: 'first-year', floeSize: 'fast-ice' }] }))).toBe('fast-ice');
  });

  it('takes the marginal ice zone as 2-8 tenths (15-80 %)', () => {
    // 15 % = 1.5 tenths, so the first whole tenth inside is 2; 80 % = 8 tenths (common practice).
    expect([0, 1, 2, 3, 8, 9, 10].map((t) => inMarginalIceZone(t))).toEqual([false, false, true, true, true, false, false]);
    expect(inMarginalIceZone(null)).toBe(false);
    expect(MIZ_LEGEND).toContain('15-80 %');
    expect(MIZ_LEGEND).toContain('2-8/10');
  });
});

describe('observation features', () => {
  it('carries id, band colour, time and observer; leaves out deleted and unpositioned ones', () => {
    const fc = observationFeatures(
      [
        obs('a', '2026-03-09T01:00:00Z', 5, 81.5, -3.25),
        obs('b', '2026-03-09T02:00:00Z', 9, 81, 0, { deleted: true }),
        obs('c', '2026-03-09T03:00:00Z', 9, 81, 0, { position: null }),
        obs('d', '2026-03-09T04:00:00Z', 8),
      ],
      { observers: [{ id: 'o1', name: 'A. Example', initials: 'AE' }] },
    );
    expect(fc.features.map((f) => f.properties.id)).toEqual(['a', 'd']);
    const a = fc.features[0];
    expect(a?.geometry.coordinates).toEqual([-3.25, 81.5]);
    expect(a?.properties).toMatchObject({ band: 'c4-6', colour: '#ffff00', t: Date.UTC(2026, 2, 9, 1), initials: 'AE', egg: 'egg:a' });
    expect(fc.features[1]?.properties.colour).toBe('#ff7d07');
  });
});

describe('track', () => {
  it('splits at the antimeridian with the crossing interpolated on both sides', () => {
    const pieces = splitAtAntimeridian([[178, 70], [-178, 72], [-176, 72]]);
    expect(pieces).toHaveLength(2);
    expect(pieces[0]).toEqual([[178, 70], [180, 71]]);
    expect(pieces[1]).toEqual([[-180, 71], [-178, 72], [-176, 72]]);
    const west = splitAtAntimeridian([[-179, 0], [179, 2]]);
    expect(west).toEqual([[[-179, 0], [-180, 1]], [[180, 1], [179, 2]]]);
  });

  it('sorts points by time before drawing', () => {
    const f = trackFeature([tp('2026-03-09T02:00:00Z', 81, 2), tp('2026-03-09T01:00:00Z', 80, 1)]);
    expect(f.geometry.coordinates).toEqual([[[1, 80], [2, 81]]]);
  });
});

describe('marginal ice zone stretches', () => {
  const track = [0, 1, 2, 3, 4, 5, 6, 7, 8].map((h) => tp(`2026-03-09T0${h}:00:00Z`, 80 + h * 0.1, 10));
  it('follows the observation nearest in time and stops where no observation is near', () => {
    const observations = [
      obs('a', '2026-03-09T00:00:00Z', 1),
      obs('b', '2026-03-09T02:00:00Z', 3), // in the zone
      obs('c', '2026-03-09T03:00:00Z', 8), // in the zone
      obs('d', '2026-03-09T04:00:00Z', 10),
      obs('e', '2026-03-09T08:00:00Z', 5), // in the zone, but 06:00 is 2 h from any observation
    ];
    const fc = marginalIceZoneStretches(track, observations, 90 * 60_000);
    const stretches = fc.features.map((f) => f.geometry.coordinates.flat().map((p) => p[1]));
    // 01:00 is equidistant from a (1/10) and b (3/10): the later observation wins.
    expect(stretches.length).toBe(2);
    expect(stretches[0]?.map((y) => Number((y as number).toFixed(1)))).toEqual([80.1, 80.2, 80.3]);
    expect(stretches[1]?.map((y) => Number((y as number).toFixed(1)))).toEqual([80.7, 80.8]);
  });

  it('draws nothing with no observations', () => {
    expect(marginalIceZoneStretches(track, [], 3_600_000).features).toEqual([]);
  });
});

describe('ship position', () => {
  it('uses the latest fix and its heading, else the course, else the bearing from the fix before', () => {
    const s = shipFeature([tp('2026-03-09T00:00:00Z', 80, 10), tp('2026-03-09T01:00:00Z', 80.1, 10, { headingDeg: 12 })], []);
    expect(s?.geometry.coordinates).toEqual([10, 80.1]);
    expect(s?.properties.heading).toBe(12);
    const c = shipFeature([tp('2026-03-09T00:00:00Z', 80, 10), tp('2026-03-09T01:00:00Z', 80.1, 10, { cogDeg: 200 })], []);
    expect(c?.properties.heading).toBe(200);
    const b = shipFeature([tp('2026-03-09T00:00:00Z', 80, 10), tp('2026-03-09T01:00:00Z', 80.1, 10)], []);
    expect(b?.properties.heading).toBeCloseTo(0, 6);
  });

  it('falls back to the latest observation when it is newer than the track', () => {
    const s = shipFeature([tp('2026-03-09T00:00:00Z', 80, 10)], [obs('a', '2026-03-09T05:00:00Z', 5, 82, 20)]);
    expect(s?.geometry.coordinates).toEqual([20, 82]);
    expect(s?.properties.heading).toBe(-1);
    expect(shipFeature([], [])).toBeNull();
  });

  it('computes bearings as a great circle does', () => {
    // Due east along the equator is 90; from 0,0 to the North Pole is 0 (spherical geometry).
    expect(initialBearing([0, 0], [1, 0])).toBeCloseTo(90, 9);
    expect(initialBearing([0, 0], [0, 90])).toBeCloseTo(0, 9);
    expect(initialBearing([0, 0], [-1, 0])).toBeCloseTo(270, 9);
  });
});
