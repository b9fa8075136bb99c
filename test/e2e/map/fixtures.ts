// Invented test cruises for the map's browser tests (our own vessel and observers, for tests
// only): a loop near 85 N across the antimeridian, and one along 75 S.
import type { Cruise, Observation, TrackPoint } from '../../../src/domain/model';

export function testCruise(name: string): Cruise {
  return {
    id: `test-${name}`,
    name: `Test ${name}`,
    vesselName: 'RV Testing Floe',
    iceClass: 'PC5',
    intervalMinutes: 60,
    observers: [
      { id: 'obs-a', name: 'Ada Tester', initials: 'AT' },
      { id: 'obs-b', name: 'Bo Checker', initials: 'BC' },
    ],
    displayTimeZone: 'UTC',
    maxSpeedKn: 20,
    createdAt: '2026-03-01T00:00:00Z',
    updatedAt: '2026-03-01T00:00:00Z',
  };
}

const HOUR = 3_600_000;
const START = Date.UTC(2026, 2, 10);

function iso(ms: number): string {
  return new Date(ms).toISOString().replace('.000Z', 'Z');
}

/** Observations at the given positions, an hour apart, with the given totals (tenths). */
export function observationsAt(cruiseId: string, positions: readonly (readonly [number, number])[], totals: readonly number[]): Observation[] {
  return positions.map(([lon, lat], i) => {
    const t = totals[i % totals.length] as number;
    const time = iso(START + i * HOUR);
    return {
      id: `${cruiseId}-o${i}`,
      cruiseId,
      time,
      position: { lat, lon, source: 'manual' },
      observerId: i % 2 ? 'obs-b' : 'obs-a',
      totalConcentration: t,
      categories: t > 0 ? [{ partialConcentration: t, stage: 'thick-first-year', thicknessCm: 140, floeSize: 'big-floe' }] : [],
      notes: '',
      photoIds: [],
      revision: 1,
      savedAt: time,
      savedBy: 'obs-a',
      deviceId: 'test',
      deleted: false,
    };
  });
}

/** A track through the positions, `perLeg` points between each pair (longitudes interpolated the short way). */
export function trackThrough(cruiseId: string, positions: readonly (readonly [number, number])[], perLeg = 20): TrackPoint[] {
  const out: TrackPoint[] = [];
  for (let i = 0; i + 1 < positions.length; i++) {
    const [lon0, lat0] = positions[i] as [number, number];
    const [lon1, lat1] = positions[i + 1] as [number, number];
    let d = lon1 - lon0;
    if (d > 180) d -= 360;
    if (d < -180) d += 360;
    for (let k = 0; k < perLeg; k++) {
      const f = k / perLeg;
      let lon = lon0 + f * d;
      if (lon > 180) lon -= 360;
      if (lon < -180) lon += 360;
      out.push({ cruiseId, time: iso(START + (i + f) * HOUR), lat: lat0 + f * (lat1 - lat0), lon, source: 'gps-serial', headingDeg: 90 });
    }
  }
  const [lon, lat] = positions[positions.length - 1] as [number, number];
  out.push({ cruiseId, time: iso(START + (positions.length - 1) * HOUR), lat, lon, source: 'gps-serial', headingDeg: 90 });
  return out;
}

/**
 * A ring round the North Pole near 85 N, crossing the antimeridian; four observations lie
 * poleward of Web Mercator's limit (85.05 N).
 */
export const RING_85N: (readonly [number, number])[] = [
  [150, 84.6], [165, 85.4], [178, 85.0], [-170, 84.4], [-150, 85.3], [-120, 85.6], [-90, 84.8], [-40, 84.3], [10, 84.9], [60, 85.5], [110, 84.5],
];

/** A stretch along 75 S in the Weddell and Bellingshausen seas. */
export const LINE_75S: (readonly [number, number])[] = [
  [-60, -74.8], [-52, -75.2], [-44, -75.5], [-36, -75.1], [-30, -74.7], [-24, -75.3],
];

/** Totals cycling through the colour bands (tenths). */
export const BAND_TOTALS = [0, 2, 5, 8, 10, 6, 3, 9, 7, 4, 1] as const;
