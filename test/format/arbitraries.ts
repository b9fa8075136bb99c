// fast-check generators of valid logs (within the format's ranges) and a small hand-made log.
// Values are invented; they only need to be valid, not plausible.
import fc from 'fast-check';
import {
  FLOE_SIZE_KEYS,
  OPEN_WATER_KINDS,
  POSITION_SOURCES,
  SNOW_COVERS,
  SNOW_WETNESS_CLASSES,
  STAGE_KEYS,
  VESSEL_ICE_CLASSES,
  type Cruise,
  type Deformation,
  type IceCategory,
  type PerIceType,
  type SnowCover,
  type Observation,
  type TrackPoint,
} from '../../src/domain/model';
import type { LogBundle, PhotoMeta } from '../../src/format/types';

const T0 = Date.UTC(2026, 1, 1);
const T1 = Date.UTC(2026, 11, 31);
export const arbTime = fc.integer({ min: T0 / 1000, max: T1 / 1000 }).map((s) => new Date(s * 1000).toISOString().replace('.000Z', 'Z'));
export const arbId = fc.stringMatching(/^[a-z0-9][a-z0-9-]{3,20}$/);
const opt = <T>(a: fc.Arbitrary<T>) => fc.option(a, { nil: undefined });
const dbl = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true }).map((x) => (Object.is(x, -0) ? 0 : x));
/** Drops keys whose value is undefined, as a saved record has no such keys. */
function clean<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
}

export const arbCategory: fc.Arbitrary<IceCategory> = fc
  .record({
    partialConcentration: fc.integer({ min: 0, max: 10 }),
    stage: fc.constantFrom(...STAGE_KEYS),
    floeSize: opt(fc.constantFrom(...FLOE_SIZE_KEYS)),
    thicknessCm: opt(dbl(0, 3000)),
  })
  .map(clean);

const arbDeformation: fc.Arbitrary<Deformation> = fc
  .record({ ridgedTenths: opt(fc.integer({ min: 0, max: 10 })), raftedTenths: opt(fc.integer({ min: 0, max: 10 })), sailHeightM: opt(dbl(0, 30)) })
  .map(clean);

const arbSnow: fc.Arbitrary<SnowCover> = fc
  .record({
    cover: opt(fc.constantFrom(...SNOW_COVERS)),
    wetness: opt(fc.constantFrom(...SNOW_WETNESS_CLASSES)),
    crust: opt(fc.boolean()),
    drifts: opt(fc.boolean()),
    depthCm: opt(dbl(0, 500)),
  })
  .map(clean);

const arbGroup = <T extends object>(entry: fc.Arbitrary<T>) => opt(fc.record({ a: opt(entry), b: opt(entry), c: opt(entry) }));

/** A group as an observation holds it: only letters of its ice types, no empty entries, no empty group. */
function trimGroup<T extends object>(g: PerIceType<T> | undefined, count: number): PerIceType<T> | undefined {
  if (!g) return undefined;
  const out: PerIceType<T> = {};
  (['a', 'b', 'c'] as const).forEach((l, i) => {
    const e = g[l];
    if (i < count && e && Object.keys(e).length > 0) out[l] = e;
  });
  return Object.keys(out).length > 0 ? out : undefined;
}

function arbObservation(cruiseId: string, observerIds: string[]): fc.Arbitrary<Observation> {
  return fc
    .record({
      id: fc.uuid(),
      cruiseId: fc.constant(cruiseId),
      time: arbTime,
      position: fc.option(
        fc
          .record({
            lat: dbl(-90, 90),
            lon: dbl(-180, 180),
            source: fc.constantFrom(...POSITION_SOURCES),
            accuracyM: opt(dbl(0, 10_000)),
            fixTime: opt(arbTime),
          })
          .map(clean),
        { nil: null },
      ),
      observerId: fc.constantFrom(...observerIds),
      totalConcentration: fc.option(fc.integer({ min: 0, max: 10 }), { nil: null }),
      categories: fc.array(arbCategory, { maxLength: 3 }),
      traceStage: opt(fc.constantFrom(...STAGE_KEYS)),
      remainingStage: opt(fc.constantFrom(...STAGE_KEYS)),
      deformation: arbGroup(arbDeformation),
      snow: arbGroup(arbSnow),
      openWater: opt(fc.record({ kind: fc.constantFrom(...OPEN_WATER_KINDS), widthM: opt(dbl(0, 5000)), orientationDeg: opt(dbl(0, 180)) }).map(clean)),
      meltPonds: opt(fc.record({ coverTenths: fc.integer({ min: 0, max: 10 }), state: opt(fc.constantFrom('open' as const, 'frozen' as const, 'drained' as const)) }).map(clean)),
      icebergs: opt(fc.record({ icebergs: fc.nat(50), bergyBits: fc.nat(50), growlers: fc.nat(50) })),
      weather: opt(
        fc
          .record({
            airTempC: opt(dbl(-50, 20)),
            waterTempC: opt(dbl(-2, 10)),
            salinityPsu: opt(dbl(0, 40)),
            windSpeedKn: opt(dbl(0, 80)),
            windFromDeg: opt(dbl(0, 360)),
            visibilityKm: opt(dbl(0, 50)),
            cloudOktas: opt(fc.integer({ min: 0, max: 8 })),
          })
          .map(clean),
      ),
      notes: fc.string({ maxLength: 80, unit: 'grapheme' }),
      photoIds: fc.array(arbId, { maxLength: 2 }),
      revision: fc.integer({ min: 1, max: 6 }),
      savedAt: arbTime,
      savedBy: fc.constantFrom(...observerIds, 'import'),
      deviceId: arbId,
      deleted: fc.boolean(),
    })
    .map((o) => clean({ ...o, deformation: trimGroup(o.deformation, o.categories.length), snow: trimGroup(o.snow, o.categories.length) }));
}

/** A random valid bundle; history revisions lie below the current one, ids are unique. */
export const arbBundle: fc.Arbitrary<LogBundle> = fc
  .record({
    cruiseId: arbId,
    observers: fc.uniqueArray(fc.record({ id: arbId, name: fc.string({ minLength: 1, maxLength: 30 }), initials: fc.stringMatching(/^[A-Z]{2,3}$/) }), {
      minLength: 1,
      maxLength: 4,
      selector: (o) => o.id,
    }),
    name: fc.string({ minLength: 1, maxLength: 40 }),
    vesselName: fc.string({ minLength: 1, maxLength: 40 }),
    iceClass: fc.constantFrom(...VESSEL_ICE_CLASSES),
    intervalMinutes: fc.integer({ min: 10, max: 360 }),
    maxSpeedKn: fc.integer({ min: 5, max: 30 }),
    createdAt: arbTime,
  })
  .chain((c) => {
    const cruise: Cruise = {
      id: c.cruiseId,
      name: c.name,
      vesselName: c.vesselName,
      iceClass: c.iceClass,
      intervalMinutes: c.intervalMinutes,
      observers: c.observers,
      displayTimeZone: 'UTC',
      maxSpeedKn: c.maxSpeedKn,
      createdAt: c.createdAt,
      updatedAt: c.createdAt,
    };
    const ids = c.observers.map((o) => o.id);
    const obs = arbObservation(cruise.id, ids);
    return fc.record({
      cruise: fc.constant(cruise),
      observations: fc.uniqueArray(obs, { maxLength: 8, selector: (o) => o.id }),
      historyTemplate: fc.array(obs, { maxLength: 6 }),
      track: fc.uniqueArray(
        fc
          .record({
            cruiseId: fc.constant(cruise.id),
            time: arbTime,
            lat: dbl(-90, 90),
            lon: dbl(-180, 180),
            source: fc.constantFrom(...POSITION_SOURCES),
            sogKn: opt(dbl(0, 30)),
            cogDeg: opt(dbl(0, 360)),
            headingDeg: opt(dbl(0, 360)),
          })
          .map((p) => clean(p) as TrackPoint),
        { maxLength: 20, selector: (p) => p.time },
      ),
    });
  })
  .map(({ cruise, observations, historyTemplate, track }) => {
    // Earlier revisions: templates re-labelled as revision 1..current-1 of an observation.
    const history: Observation[] = [];
    const used = new Set<string>();
    historyTemplate.forEach((h, i) => {
      const target = observations[i % Math.max(1, observations.length)];
      if (!target || target.revision < 2) return;
      const revision = 1 + (i % (target.revision - 1));
      const key = `${target.id}#${revision}`;
      if (used.has(key)) return;
      used.add(key);
      history.push({ ...h, id: target.id, revision });
    });
    const photos: PhotoMeta[] = observations.flatMap((o) =>
      o.photoIds.map((pid, j) => ({ id: `${o.id}-p${j}`, observationId: o.id, fileName: `${pid}.jpg`, mediaType: 'image/jpeg', byteLength: 3 + j })),
    );
    const sortedTrack = [...track].sort((a, b) => (a.time < b.time ? -1 : 1));
    return { cruise, observations, history, conflicts: [], track: sortedTrack, photos };
  });

/** A small fixed log for content checks. */
export function sampleBundle(): LogBundle {
  const cruise: Cruise = {
    id: 'cruise-test-1',
    name: 'Test cruise',
    vesselName: 'RV Example',
    iceClass: 'PC5',
    intervalMinutes: 60,
    observers: [
      { id: 'obs-a', name: 'Ada Example', initials: 'AE' },
      { id: 'obs-b', name: 'Ben Example', initials: 'BE' },
    ],
    displayTimeZone: 'UTC',
    maxSpeedKn: 20,
    createdAt: '2026-03-01T00:00:00Z',
    updatedAt: '2026-03-01T00:00:00Z',
  };
  const base: Observation = {
    id: 'o-1',
    cruiseId: cruise.id,
    time: '2026-03-02T10:00:00Z',
    position: { lat: 78.25, lon: -15.5, source: 'gps-serial', accuracyM: 5 },
    observerId: 'obs-a',
    totalConcentration: 9,
    categories: [
      { partialConcentration: 6, stage: 'thick-first-year', floeSize: 'big-floe', thicknessCm: 140 },
      { partialConcentration: 3, stage: 'grey-white', floeSize: 'pancake', thicknessCm: 20 },
    ],
    traceStage: 'multi-year',
    deformation: { a: { ridgedTenths: 2, sailHeightM: 1.5 } },
    snow: { a: { cover: 'complete', wetness: 'dry', crust: true, depthCm: 20 }, b: { cover: 'none' } },
    weather: { airTempC: -12.5, waterTempC: -1.8, windSpeedKn: 14, windFromDeg: 270, visibilityKm: 10 },
    notes: 'Leads to the north, "refrozen"; =SUM(A1)',
    photoIds: ['ph-1'],
    revision: 2,
    savedAt: '2026-03-02T10:05:00Z',
    savedBy: 'obs-a',
    deviceId: 'dev-1',
    deleted: false,
  };
  const second: Observation = {
    ...base,
    id: 'o-2',
    time: '2026-03-02T11:00:00Z',
    position: null,
    observerId: 'obs-b',
    totalConcentration: null,
    categories: [],
    traceStage: undefined,
    weather: undefined,
    notes: '-dark, not judged',
    photoIds: [],
    revision: 1,
    savedAt: '2026-03-02T11:02:00Z',
    savedBy: 'obs-b',
  };
  delete second.traceStage;
  delete second.weather;
  delete second.deformation;
  delete second.snow;
  const history: Observation[] = [
    {
      ...base,
      revision: 1,
      totalConcentration: 8,
      categories: [{ ...(base.categories[0] as IceCategory), partialConcentration: 5 }, base.categories[1] as IceCategory],
      notes: 'first try',
      savedAt: '2026-03-02T10:01:00Z',
    },
  ];
  const track: TrackPoint[] = [
    { cruiseId: cruise.id, time: '2026-03-02T09:00:00Z', lat: 78.2, lon: 179.5, source: 'gps-serial', sogKn: 8, cogDeg: 90 },
    { cruiseId: cruise.id, time: '2026-03-02T09:30:00Z', lat: 78.3, lon: -179.5, source: 'gps-serial', sogKn: 8.5, cogDeg: 90 },
    { cruiseId: cruise.id, time: '2026-03-02T10:00:00Z', lat: 78.4, lon: -179.0, source: 'gps-serial' },
  ];
  const photos: PhotoMeta[] = [{ id: 'ph-1', observationId: 'o-1', fileName: 'floe.jpg', mediaType: 'image/jpeg', byteLength: 4, takenAt: '2026-03-02T10:00:30Z' }];
  return { cruise, observations: [base, second], history, conflicts: [], track, photos };
}
