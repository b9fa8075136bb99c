// Invented test data (our own scenario): research vessel "Brinicle", cruise BR-26-1, two observers.
import type { Cruise, Observation } from '../../src/domain/model.ts';

export const cruise: Cruise = {
  id: 'br-26-1',
  name: 'BR-26-1 Fram Strait transect',
  vesselName: 'RV Brinicle',
  iceClass: 'PC5',
  intervalMinutes: 60,
  observers: [
    { id: 'obs-ak', name: 'Ana Kvist', initials: 'AK' },
    { id: 'obs-tm', name: 'Teo Moreau', initials: 'TM' },
  ],
  displayTimeZone: 'UTC',
  maxSpeedKn: 16,
  createdAt: '2026-03-01T00:00:00Z',
  updatedAt: '2026-03-01T00:00:00Z',
};

/** A plausible, fully valid observation; tests change one thing at a time. */
export function observation(over: Partial<Observation> = {}): Observation {
  const o: Observation = {
    id: 'o-1',
    cruiseId: 'br-26-1',
    time: '2026-03-04T05:00:00Z',
    position: { lat: 79.12, lon: -3.45, source: 'gps-serial', accuracyM: 5 },
    observerId: 'obs-ak',
    totalConcentration: 9,
    categories: [
      { partialConcentration: 5, stage: 'medium-first-year', floeSize: 'big-floe', thicknessCm: 90 },
      { partialConcentration: 3, stage: 'thin-first-year', floeSize: 'small-floe', thicknessCm: 45 },
      { partialConcentration: 1, stage: 'grey', floeSize: 'pancake', thicknessCm: 12 },
    ],
    deformation: { a: { ridgedTenths: 2, raftedTenths: 1, sailHeightM: 1.2 } },
    snow: { a: { cover: 'complete', wetness: 'dry', crust: true, depthCm: 15 }, b: { cover: 'partial', wetness: 'dry', depthCm: 4 } },
    weather: { airTempC: -18, waterTempC: -1.8, salinityPsu: 34.2, windSpeedKn: 14, windFromDeg: 20, visibilityKm: 10, cloudOktas: 6 },
    notes: '',
    photoIds: [],
    revision: 1,
    savedAt: '2026-03-04T05:02:00Z',
    savedBy: 'obs-ak',
    deviceId: 'dev-1',
    deleted: false,
    ...over,
  };
  // The groups describe the default ice types: a test that gives its own ice types gets no
  // groups unless it gives them too.
  if (over.categories && !('deformation' in over)) delete o.deformation;
  if (over.categories && !('snow' in over)) delete o.snow;
  return o;
}
