import { describe, expect, it } from 'vitest';
import type { Deformation, Finding, IceCategory, Observation, SnowCover } from '../../src/domain/model.ts';
import { FINDING_CODES, blocksSaving, checkSequence, sortCategoriesThickestFirst, validateObservation } from '../../src/domain/rules.ts';
import { cruise, observation } from './fixtures.ts';

const cats = (obs: Observation) => obs.categories;
const withCat = (i: number, change: Partial<IceCategory>): Observation => {
  const o = observation();
  o.categories = cats(o).map((c, j) => (j === i ? { ...c, ...change } : c));
  return o;
};
const withDeformation = (change: Deformation, over: Partial<Observation> = {}): Observation => {
  const o = observation(over);
  o.deformation = { ...o.deformation, a: { ...o.deformation?.a, ...change } };
  return o;
};
const withSnow = (change: SnowCover): Observation => {
  const o = observation();
  o.snow = { ...o.snow, a: { ...o.snow?.a, ...change } };
  return o;
};
const find = (fs: Finding[], code: string): Finding | undefined => fs.find((f) => f.code === code);
function expectFinding(obs: Observation, code: string, path: string, inMessage: string[]): Finding {
  const fs = validateObservation(obs, cruise);
  const f = find(fs, code);
  expect(f, `${code} in ${JSON.stringify(fs.map((x) => x.code))}`).toBeDefined();
  if (!f) throw new Error('unreachable');
  expect(f.path).toBe(path);
  expect(f.severity).toBe(FINDING_CODES[code as keyof typeof FINDING_CODES].severity);
  for (const s of inMessage) expect(f.message).toContain(s);
  return f;
}

describe('validateObservation', () => {
  it('finds nothing in a plausible observation', () => {
    expect(validateObservation(observation(), cruise)).toEqual([]);
  });

  it('every finding code has a severity and a summary', () => {
    for (const [code, info] of Object.entries(FINDING_CODES)) {
      expect(['error', 'warning', 'info']).toContain(info.severity);
      expect(info.summary.length, code).toBeGreaterThan(5);
    }
  });

  describe('time and cruise', () => {
    it.each(['2026-03-04 05:00', '2026-03-04T05:00:00+01:00', '2026-13-04T05:00:00Z', '2026-03-04T05:00Z', ''])('rejects time %j', (time) => {
      expectFinding(observation({ time }), 'time-invalid', 'time', [`"${time}"`]);
    });
    it('accepts fractional-second UTC times (seconds required, as the store requires them)', () => {
      expect(validateObservation(observation({ time: '2026-03-04T05:00:00.250Z' }))).toEqual([]);
    });
    it('flags another cruise and an unknown observer (only with a cruise)', () => {
      expectFinding(observation({ cruiseId: 'other' }), 'cruise-mismatch', 'cruiseId', ['"other"']);
      expectFinding(observation({ observerId: 'obs-zz' }), 'unknown-observer', 'observerId', ['"obs-zz"']);
      expect(validateObservation(observation({ observerId: 'obs-zz' }))).toEqual([]);
    });
  });

  describe('concentrations (WMO-No. 259: tenths 0-10; egg code partials add up to Ct)', () => {
    it.each([11, -1, 4.5])('total %d is an error', (t) => {
      const f = expectFinding(observation({ totalConcentration: t }), 'total-out-of-range', 'totalConcentration', [String(t)]);
      expect(blocksSaving([f])).toBe(true);
    });
    it('total not judged is a warning, not an error', () => {
      const fs = validateObservation(observation({ totalConcentration: null }));
      expect(fs.map((f) => f.code)).toEqual(['total-not-judged']);
      expect(blocksSaving(fs)).toBe(false);
    });
    it('partials over the total block saving, naming both', () => {
      expectFinding(observation({ totalConcentration: 8 }), 'partials-exceed-total', 'categories', ['9/10', '8/10']);
    });
    it('partials under the total are doubtful unless a remaining stage takes the rest', () => {
      expectFinding(observation({ totalConcentration: 10 }), 'partials-below-total', 'categories', ['9/10', '10/10']);
      expect(find(validateObservation(observation({ totalConcentration: 10, remainingStage: 'new' })), 'partials-below-total')).toBeUndefined();
    });
    it('partial out of range and partial zero', () => {
      expectFinding(withCat(1, { partialConcentration: 2.5 }), 'partial-out-of-range', 'categories.1.partialConcentration', ['2.5']);
      expectFinding(withCat(2, { partialConcentration: 0 }), 'partial-zero', 'categories.2.partialConcentration', ['Ice type c']);
    });
    it('more than three categories is an error', () => {
      const o = observation({ totalConcentration: 10 });
      o.categories = [...cats(o), { partialConcentration: 1, stage: 'new' }];
      expectFinding(o, 'too-many-categories', 'categories', ['4 ice types']);
    });
    it('ice without categories is doubtful', () => {
      expectFinding(observation({ categories: [] }), 'categories-missing', 'categories', ['9/10']);
      expect(validateObservation(observation({ totalConcentration: 0, categories: [] }))).toEqual([]);
    });
  });

  describe('thickest first (egg code order, WMO-No. 259)', () => {
    it('flags a thicker stage after a thinner one and sorting fixes it', () => {
      const o = observation();
      o.categories = [cats(o)[1] as IceCategory, cats(o)[0] as IceCategory, cats(o)[2] as IceCategory];
      expectFinding(o, 'categories-not-thickest-first', 'categories.1', ['medium first-year ice 90 cm', 'thin first-year ice 45 cm']);
      const sorted = sortCategoriesThickestFirst(o.categories);
      expect(sorted.reordered).toBe(true);
      expect(validateObservation({ ...o, categories: sorted.categories })).toEqual([]);
    });
    it('flags a trace stage that is not thicker and a remaining stage that is not thinner', () => {
      expectFinding(observation({ traceStage: 'grey' }), 'trace-not-thicker', 'traceStage', ['grey ice']);
      expect(find(validateObservation(observation({ traceStage: 'multi-year' })), 'trace-not-thicker')).toBeUndefined();
      expectFinding(observation({ remainingStage: 'medium-first-year' }), 'remaining-not-thinner', 'remainingStage', ['medium first-year']);
      expect(find(validateObservation(observation({ remainingStage: 'nilas' })), 'remaining-not-thinner')).toBeUndefined();
    });
  });

  describe('stage against thickness (WMO-No. 259 ranges)', () => {
    it.each([
      [0, 'medium-first-year', 60, '70-120 cm'],
      [1, 'thin-first-year', 75, '30-70 cm'],
      [2, 'grey', 16, '10-15 cm'],
      [2, 'new', 12, '0-10 cm'],
    ] as const)('category %d %s at %d cm is outside %s', (i, stage, t, range) => {
      expectFinding(withCat(i, { stage, thicknessCm: t }), 'stage-thickness-mismatch', `categories.${i}.thicknessCm`, [`${t} cm`, range]);
    });
    it('a value on a boundary fits (15 cm grey, 120 cm medium first-year)', () => {
      expect(find(validateObservation(withCat(2, { thicknessCm: 15 })), 'stage-thickness-mismatch')).toBeUndefined();
      expect(find(validateObservation(withCat(0, { thicknessCm: 120 })), 'stage-thickness-mismatch')).toBeUndefined();
    });
    it('negative thickness is an error; over 5 m of level ice is doubtful (common practice)', () => {
      expectFinding(withCat(0, { thicknessCm: -5 }), 'thickness-out-of-range', 'categories.0.thicknessCm', ['-5 cm']);
      expectFinding(withCat(0, { stage: 'glacier', thicknessCm: 20_000 }), 'thickness-out-of-range', 'categories.0.thicknessCm', ['20000 cm']);
      expect(find(validateObservation(withCat(0, { stage: 'glacier', thicknessCm: 3000 })), 'thickness-implausible')).toBeUndefined();
      expectFinding(withCat(0, { stage: 'multi-year', thicknessCm: 650 }), 'thickness-implausible', 'categories.0.thicknessCm', ['650 cm']);
    });
  });

  describe('data from files', () => {
    it('an unknown stage or floe size is an error and does not break the other rules', () => {
      const o = withCat(1, { stage: 'brash-ish' as IceCategory['stage'] });
      const fs = validateObservation(o, cruise);
      expect(fs.map((f) => [f.code, f.path])).toEqual([['stage-unknown', 'categories.1.stage']]);
      expectFinding(withCat(0, { floeSize: 'huge' as IceCategory['floeSize'] }), 'floe-size-unknown', 'categories.0.floeSize', ['"huge"']);
    });
  });

  describe('pancake ice (WMO-No. 259: pancakes are new or young ice)', () => {
    it('flags pancakes of first-year ice, not of grey ice or nilas', () => {
      expectFinding(withCat(1, { floeSize: 'pancake' }), 'pancake-stage-mismatch', 'categories.1.floeSize', ['thin first-year']);
      expect(find(validateObservation(withCat(2, { stage: 'nilas', thicknessCm: 6 })), 'pancake-stage-mismatch')).toBeUndefined();
    });
  });

  describe('deformation and snow', () => {
    it('ridged and rafted shares', () => {
      expectFinding(withDeformation({ ridgedTenths: 11 }), 'deformation-share-out-of-range', 'deformation.a.ridgedTenths', ['Ice type a', '11']);
      expectFinding(withDeformation({ ridgedTenths: 7, raftedTenths: 4 }), 'deformed-share-exceeds-category', 'deformation.a.ridgedTenths', ['7/10', '4/10']);
    });
    it('sail height: negative, deeper than keels reach (Timco and Burden 1997 ratio 4.4), without ridges', () => {
      expectFinding(withDeformation({ sailHeightM: -1 }), 'sail-height-out-of-range', 'deformation.a.sailHeightM', ['-1 m']);
      // 12 m x 4.4 = 52.8 m keel, beyond about 50 m (common practice).
      expectFinding(withDeformation({ sailHeightM: 12 }), 'sail-height-implausible', 'deformation.a.sailHeightM', ['12 m', '52.8 m']);
      // Multi-year ratio 3.3: 12 m x 3.3 = 39.6 m, plausible. The ratio follows ice type a's stage.
      const multiYear = withDeformation({ sailHeightM: 12 });
      multiYear.categories[0] = { ...(multiYear.categories[0] as IceCategory), stage: 'multi-year', thicknessCm: 300 };
      expect(find(validateObservation(multiYear), 'sail-height-implausible')).toBeUndefined();
      expectFinding(withDeformation({ ridgedTenths: 0 }), 'sail-height-without-ridges', 'deformation.a.sailHeightM', ['1.2 m']);
    });
    it('snow depth: negative, implausible, with "no snow"', () => {
      expectFinding(withSnow({ depthCm: -2 }), 'snow-depth-out-of-range', 'snow.a.depthCm', ['-2 cm']);
      expectFinding(withSnow({ depthCm: 200 }), 'snow-depth-implausible', 'snow.a.depthCm', ['200 cm']);
      expectFinding(withSnow({ cover: 'none', wetness: undefined, crust: undefined }), 'snow-depth-without-snow', 'snow.a.depthCm', ['15 cm']);
    });
    it('snow said to be absent but described (common practice: no wetness, crust or drifts without snow)', () => {
      expectFinding(withSnow({ cover: 'none', depthCm: 0 }), 'snow-described-without-snow', 'snow.a.cover', ['wetness', 'a crust']);
      const none = validateObservation(withSnow({ cover: 'none', wetness: undefined, crust: undefined, depthCm: 0 }), cruise);
      expect(find(none, 'snow-described-without-snow')).toBeUndefined();
    });
    it('unknown snow terms from a file are errors naming the value', () => {
      expectFinding(withSnow({ wetness: 'slushy' as SnowCover['wetness'] }), 'snow-term-unknown', 'snow.a.wetness', ['"slushy"']);
      expectFinding(withSnow({ cover: 'most' as SnowCover['cover'] }), 'snow-term-unknown', 'snow.a.cover', ['"most"']);
    });
    it('a group entry for an ice type the observation does not have is an error', () => {
      const o = observation();
      o.categories = o.categories.slice(0, 1);
      expectFinding(o, 'group-without-ice-type', 'snow.b', ['ice type b']);
      const d = observation({ deformation: { c: { ridgedTenths: 1 } } });
      d.categories = d.categories.slice(0, 2);
      expectFinding(d, 'group-without-ice-type', 'deformation.c', ['ice type c']);
    });
  });

  describe('position', () => {
    it('missing is a warning, out of range an error naming the coordinate', () => {
      expectFinding(observation({ position: null }), 'position-missing', 'position', ['No position']);
      expectFinding(observation({ position: { lat: 91, lon: 0, source: 'manual' } }), 'position-invalid', 'position.lat', ['91']);
      expectFinding(observation({ position: { lat: 70, lon: -181, source: 'manual' } }), 'position-invalid', 'position.lon', ['-181']);
      expectFinding(observation({ position: { lat: Number.NaN, lon: 0, source: 'manual' } }), 'position-invalid', 'position.lat', ['NaN']);
    });
    it('0°, 0°, negative accuracy and a stale fix', () => {
      expectFinding(observation({ position: { lat: 0, lon: 0, source: 'gps-serial' } }), 'position-null-island', 'position', ['0°, 0°']);
      expectFinding(observation({ position: { lat: 79, lon: 3, source: 'gps-serial', accuracyM: -3 } }), 'position-accuracy-invalid', 'position.accuracyM', ['-3 m']);
      expectFinding(observation({ position: { lat: 79, lon: 3, source: 'gps-serial', fixTime: '2026-03-04T04:30:00Z' } }), 'position-fix-stale', 'position.fixTime', ['30 min']);
      expect(validateObservation(observation({ position: { lat: 79, lon: 3, source: 'gps-serial', fixTime: '2026-03-04T04:50:00Z' } }))).toEqual([]);
      expectFinding(observation({ position: { lat: 79, lon: 3, source: 'gps-serial', fixTime: 'yesterday' } }), 'position-fix-time-invalid', 'position.fixTime', ['"yesterday"']);
    });
  });

  describe('remaining stage (Sd) with no share', () => {
    // WMO-No. 259 (egg code): Sd is the stage of the ice the partial concentrations leave of Ct.
    it('fires when the partials already make up Ct', () => {
      const o = observation({ totalConcentration: 8, remainingStage: 'new', categories: [{ partialConcentration: 8, stage: 'thick-first-year' }] });
      expectFinding(o, 'remaining-without-share', 'remainingStage', ['new ice', 'total 8/10']);
    });
    it('does not fire when Sd has the rest (Ct 9, Ca 5)', () => {
      const o = observation({ totalConcentration: 9, remainingStage: 'grey', categories: [{ partialConcentration: 5, stage: 'thick-first-year' }] });
      expect(find(validateObservation(o, cruise), 'remaining-without-share')).toBeUndefined();
    });
  });

  describe('weather', () => {
    const weather = (w: Partial<NonNullable<Observation['weather']>>) => observation({ weather: { ...observation().weather, ...w } });
    it('water below the UNESCO 1983 freezing point: -1.87 °C at S = 34.2 (UNESCO 1983 formula)', () => {
      // Tf(34.2, 0) = -0.0575*34.2 + 1.710523e-3*34.2^1.5 - 2.154996e-4*34.2^2 = -1.8765 °C.
      expectFinding(weather({ waterTempC: -2.0 }), 'water-below-freezing', 'weather.waterTempC', ['-2 °C', '-1.88 °C', 'salinity 34.2']);
      expect(find(validateObservation(weather({ waterTempC: -1.85 })), 'water-below-freezing')).toBeUndefined();
    });
    it('without salinity assumes 35 (Tf = -1.92 °C, UNESCO 1983)', () => {
      expectFinding(weather({ salinityPsu: undefined, waterTempC: -2.0 }), 'water-below-freezing', 'weather.waterTempC', ['-1.92 °C', 'salinity 35 assumed']);
      expect(find(validateObservation(weather({ salinityPsu: undefined, waterTempC: -1.9 })), 'water-below-freezing')).toBeUndefined();
    });
    const codesOf = (w: Partial<NonNullable<Observation['weather']>>) => validateObservation(weather(w), cruise).map((f) => f.code);

    it('air temperature beyond the world records is impossible (WMO Archive of Weather and Climate Extremes)', () => {
      // WMO archive: lowest -89.2 °C (Vostok, 21 July 1983), highest 56.7 °C (Furnace Creek,
      // 10 July 1913); the rule's bounds -90 and 57 sit just outside them.
      expectFinding(weather({ airTempC: -95 }), 'air-temp-out-of-range', 'weather.airTempC', ['-95 °C']);
      expectFinding(weather({ airTempC: -90.1 }), 'air-temp-out-of-range', 'weather.airTempC', ['-90.1 °C', 'recorded on Earth']);
      expectFinding(weather({ airTempC: 57.1 }), 'air-temp-out-of-range', 'weather.airTempC', ['57.1 °C']);
      expect(codesOf({ airTempC: -89.2 })).not.toContain('air-temp-out-of-range');
      expect(codesOf({ airTempC: 56.7 })).not.toContain('air-temp-out-of-range');
    });
    it('air temperature below -60 °C or above 25 °C at sea in polar waters is doubtful (common practice, our own bounds)', () => {
      expectFinding(weather({ airTempC: 30 }), 'air-temp-doubtful', 'weather.airTempC', ['30 °C', 'check the sign and unit']);
      expectFinding(weather({ airTempC: -60.5 }), 'air-temp-doubtful', 'weather.airTempC', ['-60.5 °C']);
      expect(codesOf({ airTempC: -60 })).not.toContain('air-temp-doubtful');
      expect(codesOf({ airTempC: 25 })).not.toContain('air-temp-doubtful');
    });
    it('water temperature outside -3..40 °C is impossible at the sea surface', () => {
      // Lower bound: below the freezing point of any sea water the UNESCO 1983 formula covers,
      // Tf(S = 40, p = 0) = -0.0575x40 + 1.710523e-3x40^1.5 - 2.154996e-4x40^2 = -2.21 °C.
      // Upper bound: above the warmest sea surfaces, about 35-36 °C in summer in the Persian Gulf
      // (from memory).
      expectFinding(weather({ waterTempC: -5 }), 'water-temp-out-of-range', 'weather.waterTempC', ['-5 °C', '-3 to 40 °C']);
      expectFinding(weather({ waterTempC: -3.1 }), 'water-temp-out-of-range', 'weather.waterTempC', ['-3.1 °C']);
      expectFinding(weather({ waterTempC: 40.5 }), 'water-temp-out-of-range', 'weather.waterTempC', ['40.5 °C']);
      expect(codesOf({ waterTempC: -2.9 })).not.toContain('water-temp-out-of-range');
      expect(codesOf({ waterTempC: 36 })).not.toContain('water-temp-out-of-range');
    });
    it('salinity outside 0-50 is refused (common practice: open-ocean surface water is about 32-37)', () => {
      expectFinding(weather({ salinityPsu: 60 }), 'salinity-out-of-range', 'weather.salinityPsu', ['60', '0 to 50']);
      expectFinding(weather({ salinityPsu: -0.5 }), 'salinity-out-of-range', 'weather.salinityPsu', ['-0.5']);
      expect(codesOf({ salinityPsu: 50 })).not.toContain('salinity-out-of-range');
    });
    it('salinity outside 4-40, the range of the UNESCO 1983 freezing-point formula (Fofonoff and Millard 1983), is flagged', () => {
      expectFinding(weather({ salinityPsu: 2 }), 'salinity-outside-formula-range', 'weather.salinityPsu', ['2', '4-40', 'UNESCO 1983']);
      expectFinding(weather({ salinityPsu: 40.5 }), 'salinity-outside-formula-range', 'weather.salinityPsu', ['40.5']);
      expect(codesOf({ salinityPsu: 4 })).not.toContain('salinity-outside-formula-range');
      expect(codesOf({ salinityPsu: 40 })).not.toContain('salinity-outside-formula-range');
    });
    it('wind: negative speed is impossible; above 120 kn, far beyond force 12 (64 kn and more, Beaufort scale), doubtful', () => {
      // The 120 kn bound is our own (common practice): a mean wind that far above hurricane force
      // is more likely km/h or m/s typed as knots.
      expectFinding(weather({ windSpeedKn: -1 }), 'wind-out-of-range', 'weather.windSpeedKn', ['-1 kn']);
      expectFinding(weather({ windSpeedKn: 150 }), 'wind-doubtful', 'weather.windSpeedKn', ['150 kn', '64 kn']);
      expectFinding(weather({ windSpeedKn: 120.5 }), 'wind-doubtful', 'weather.windSpeedKn', ['120.5 kn']);
      expect(codesOf({ windSpeedKn: 120 })).not.toContain('wind-doubtful');
      expect(codesOf({ windSpeedKn: 0 })).toEqual([]);
    });
    it('wind direction outside 0-360° true, negative visibility, cloud over 8 oktas (WMO-No. 306 code table 2700: 0-8 oktas)', () => {
      expectFinding(weather({ windFromDeg: 400 }), 'wind-out-of-range', 'weather.windFromDeg', ['400°']);
      expect(codesOf({ windFromDeg: 360 })).toEqual([]);
      expectFinding(weather({ visibilityKm: -1 }), 'visibility-out-of-range', 'weather.visibilityKm', ['-1 km']);
      expectFinding(weather({ cloudOktas: 9 }), 'cloud-out-of-range', 'weather.cloudOktas', ['9']);
      expect(codesOf({ cloudOktas: 8 })).toEqual([]);
    });
  });

  describe('melt ponds, icebergs, open water', () => {
    it('flags out-of-range values', () => {
      expectFinding(observation({ meltPonds: { coverTenths: 12 } }), 'melt-ponds-out-of-range', 'meltPonds.coverTenths', ['12']);
      expectFinding(observation({ icebergs: { icebergs: 1, bergyBits: -2, growlers: 0 } }), 'iceberg-count-invalid', 'icebergs.bergyBits', ['bergy bits -2']);
      expectFinding(observation({ openWater: { kind: 'lead', widthM: -10 } }), 'open-water-out-of-range', 'openWater.widthM', ['-10 m']);
      expectFinding(observation({ openWater: { kind: 'lead', orientationDeg: 200 } }), 'open-water-out-of-range', 'openWater.orientationDeg', ['200°']);
      expect(validateObservation(observation({ meltPonds: { coverTenths: 3, state: 'open' }, icebergs: { icebergs: 2, bergyBits: 1, growlers: 5 }, openWater: { kind: 'lead', widthM: 40, orientationDeg: 120 } }))).toEqual([]);
    });
  });
});

describe('checkSequence', () => {
  const at = (id: string, time: string, lat: number, lon: number, extra: Partial<Observation> = {}): Observation =>
    observation({ id, time, position: { lat, lon, source: 'gps-serial' }, ...extra });

  it('finds nothing in an hourly series at a plausible speed', () => {
    // 0.1° of latitude is about 6 NM (WGS 84): 6 kn, below the 16 kn limit.
    const series = [0, 1, 2, 3].map((h) => at(`o${h}`, `2026-03-04T0${h}:00:00Z`, 79 + h * 0.1, -3));
    expect(checkSequence(series, cruise)).toEqual([]);
  });

  it('flags a gap longer than the interval (with 25 % grace), on the later observation', () => {
    const series = [at('a', '2026-03-04T00:00:00Z', 79, -3), at('b', '2026-03-04T01:15:00Z', 79.1, -3), at('c', '2026-03-04T03:25:00Z', 79.2, -3)];
    const fs = checkSequence(series, cruise);
    expect(fs).toHaveLength(1);
    expect(fs[0]).toMatchObject({ code: 'observation-gap', severity: 'warning', path: 'time', observationId: 'c' });
    expect(fs[0]?.message).toContain('2 h 10 min');
    expect(checkSequence(series, cruise, { gapGraceFraction: 0 }).filter((f) => f.code === 'observation-gap').map((f) => f.observationId)).toEqual(['b', 'c']);
  });

  it('flags duplicate times whatever the input order, and ignores deleted observations', () => {
    const series = [at('b', '2026-03-04T01:00:00Z', 79.1, -3), at('a', '2026-03-04T01:00:00Z', 79.1, -3), at('x', '2026-03-04T01:00:00Z', 79.1, -3, { deleted: true })];
    const fs = checkSequence(series, cruise);
    expect(fs).toEqual([expect.objectContaining({ code: 'duplicate-time', observationId: 'b' })]);
    expect(fs[0]?.message).toContain('(a)');
  });

  it('flags an implied speed above the cruise limit using the geodesic distance', () => {
    // 79°N 3°W to 79.5°N 3°W: about 30 NM (WGS 84 meridian arc, geographiclib) in 1 h, ~30 kn > 16 kn.
    const series = [at('a', '2026-03-04T00:00:00Z', 79, -3), at('b', '2026-03-04T01:00:00Z', 79.5, -3)];
    const fs = checkSequence(series, cruise);
    expect(fs).toEqual([expect.objectContaining({ code: 'implied-speed', path: 'position', observationId: 'b' })]);
    expect(fs[0]?.message).toMatch(/implies 30\.\d kn, above the cruise limit of 16 kn/);
    expect(checkSequence(series, { ...cruise, maxSpeedKn: 35 })).toEqual([]);
  });

  it('measures speed from the last fix across observations without a position, and across the antimeridian', () => {
    const series = [
      at('a', '2026-03-04T00:00:00Z', 75, 179.9),
      observation({ id: 'b', time: '2026-03-04T01:00:00Z', position: null }),
      at('c', '2026-03-04T02:00:00Z', 75, -179.9),
    ];
    // 0.2° of longitude at 75°N is about 3.1 NM in 2 h: slow, no finding (a lon/lat difference would be 359.8°).
    expect(checkSequence(series, cruise)).toEqual([]);
  });
});
