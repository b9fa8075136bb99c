import { describe, expect, it } from 'vitest';
import geographiclib from 'geographiclib-geodesic';
import { DEMO_HOURS, demoIceDepthNm, makeDemoCruise, makePrng } from '../../src/domain/demo';
import { snowOf } from '../../src/domain/iceTypes';
import { STAGE_KEYS, type IceCategory, type StageKey } from '../../src/domain/model';
import { checkSequence, validateObservation } from '../../src/domain/rules';

const geod = geographiclib.Geodesic.WGS84;
const demo = makeDemoCruise();
const doubtfulIds = new Set(demo.doubtful.map((d) => d.observationId));
const clean = demo.observations.filter((o) => !doubtfulIds.has(o.id));

// Thickness ranges of the stages of development, WMO-No. 259 (WMO Sea-Ice Nomenclature).
// Old ice has no range there; "thicker than first-year" is what the definition implies.
const WMO_THICKNESS_CM: Partial<Record<StageKey, [number, number]>> = {
  grease: [0, 10], shuga: [0, 10], new: [0, 10], nilas: [0, 10],
  grey: [10, 15], 'grey-white': [15, 30],
  'thin-first-year': [30, 70], 'medium-first-year': [70, 120], 'thick-first-year': [120, 200],
  'second-year': [120, 400], 'multi-year': [120, 500],
};

// Stages ordered thin to thick by their WMO-No. 259 ranges (the order of STAGE_KEYS in model.ts
// follows the nomenclature, thin to thick).
const rank = (c: IceCategory): number => STAGE_KEYS.indexOf(c.stage);

/** Freezing point of sea water at the surface, UNESCO 1983 (Fofonoff and Millard), EOS-80. */
const freezingPointC = (s: number): number => -0.0575 * s + 1.710523e-3 * s ** 1.5 - 2.154996e-4 * s * s;

describe('demo cruise generator', () => {
  it('is deterministic for a seed and differs between seeds', () => {
    expect(makeDemoCruise(1)).toEqual(demo);
    expect(JSON.stringify(makeDemoCruise(1))).toBe(JSON.stringify(demo));
    const other = makeDemoCruise(2);
    expect(other.cruise.id).not.toBe(demo.cruise.id);
    expect(other.observations.map((o) => o.weather?.airTempC)).not.toEqual(demo.observations.map((o) => o.weather?.airTempC));
  });

  it('builds a few days of hourly observations and a track point every minute', () => {
    expect(DEMO_HOURS).toBe(145);
    // 145 hours minus the 5 missed hours of the two documented gaps.
    expect(demo.observations).toHaveLength(140);
    expect(demo.gaps.map((g) => g.missedHours)).toEqual([3, 2]);
    // 145 h x 60 + 1 points, less the 15-minute GPS drop-out.
    expect(demo.track).toHaveLength(145 * 60 + 1 - 15);
    expect(demo.cruise.observers).toHaveLength(4);
    expect(new Set(demo.cruise.observers.map((o) => o.initials)).size).toBe(4);
    expect(demo.cruise.vesselName).toBe('RV Frostwren');
  });

  it('fills every required field with the cruise and its observers', () => {
    const observerIds = new Set(demo.cruise.observers.map((o) => o.id));
    const ids = new Set<string>();
    for (const o of demo.observations) {
      expect(o.cruiseId).toBe(demo.cruise.id);
      expect(observerIds.has(o.observerId)).toBe(true);
      expect(o.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
      ids.add(o.id);
      expect(o.time).toMatch(/^\d{4}-\d\d-\d\dT\d\d:00:00Z$/);
      expect(o.savedAt > o.time).toBe(true);
      expect(o.revision).toBe(1);
      expect(o.deleted).toBe(false);
      expect(o.categories.length).toBeLessThanOrEqual(3);
    }
    expect(ids.size).toBe(demo.observations.length);
    for (const p of demo.track) expect(p.cruiseId).toBe(demo.cruise.id);
  });

  it('keeps observation and track times strictly increasing', () => {
    for (let i = 1; i < demo.observations.length; i++) {
      expect(Date.parse(demo.observations[i]!.time)).toBeGreaterThan(Date.parse(demo.observations[i - 1]!.time));
    }
    let longest = 0;
    for (let i = 1; i < demo.track.length; i++) {
      const dt = Date.parse(demo.track[i]!.time) - Date.parse(demo.track[i - 1]!.time);
      expect(dt).toBeGreaterThan(0);
      longest = Math.max(longest, dt);
    }
    expect(longest).toBe(16 * 60_000);
  });

  it('has gaps only where documented', () => {
    const gaps: string[] = [];
    for (let i = 1; i < demo.observations.length; i++) {
      const dtH = (Date.parse(demo.observations[i]!.time) - Date.parse(demo.observations[i - 1]!.time)) / 3_600_000;
      if (dtH > 1) gaps.push(`${demo.observations[i - 1]!.time}/${demo.observations[i]!.time}`);
    }
    expect(gaps).toEqual(demo.gaps.map((g) => `${g.before}/${g.after}`));
  });

  it('crosses from open water through the marginal ice zone into the pack and back, in the high Arctic', () => {
    const lats = demo.track.map((p) => p.lat);
    expect(Math.min(...lats)).toBeGreaterThan(79);
    expect(Math.max(...lats)).toBeGreaterThan(83.5);
    const totals = demo.observations.map((o) => o.totalConcentration ?? -1);
    expect(totals[0]).toBe(0);
    expect(totals[totals.length - 1]).toBe(0);
    expect(Math.max(...totals)).toBe(10);
    // Every band of the scenario has observations.
    const depths = demo.observations.map((o) => demoIceDepthNm(o.position!.lat, o.position!.lon));
    expect(depths.filter((d) => d < 0).length).toBeGreaterThan(10);
    expect(depths.filter((d) => d >= 0 && d < 40).length).toBeGreaterThan(8);
    expect(depths.filter((d) => d >= 40).length).toBeGreaterThan(80);
    const stages = new Set(demo.observations.flatMap((o) => o.categories.map((c) => c.stage)));
    for (const s of ['grey', 'nilas', 'thin-first-year', 'thick-first-year', 'second-year', 'multi-year'] as const) {
      expect(stages.has(s)).toBe(true);
    }
  });

  it('keeps partial concentrations adding to the total, thickest first, thickness inside the WMO ranges', () => {
    for (const o of clean) {
      expect(o.categories.reduce((s, c) => s + c.partialConcentration, 0)).toBe(o.totalConcentration);
      for (let i = 1; i < o.categories.length; i++) expect(rank(o.categories[i]!)).toBeLessThan(rank(o.categories[i - 1]!));
      o.categories.forEach((c, i) => {
        const range = WMO_THICKNESS_CM[c.stage];
        expect(range, c.stage).toBeDefined();
        expect(c.thicknessCm).toBeGreaterThanOrEqual(range![0]);
        expect(c.thicknessCm).toBeLessThanOrEqual(range![1]);
        const depth = snowOf(o, i)?.depthCm;
        if (depth !== undefined) expect(depth).toBeLessThan(c.thicknessCm!);
      });
      // Groups name only ice types the observation has.
      for (const k of [...Object.keys(o.deformation ?? {}), ...Object.keys(o.snow ?? {})]) expect(['a', 'b', 'c'].indexOf(k)).toBeLessThan(o.categories.length);
    }
  });

  it('never has sea water below its freezing point, and the air is below freezing (March, high Arctic)', () => {
    for (const o of demo.observations) {
      const w = o.weather!;
      expect(w.waterTempC!).toBeGreaterThanOrEqual(freezingPointC(w.salinityPsu!));
      expect(w.airTempC!).toBeLessThan(0);
      // Common practice: the ice does not persist over water well above freezing.
      if ((o.totalConcentration ?? 0) >= 2) expect(w.waterTempC!).toBeLessThan(-1.5);
    }
  });

  it('moves at a plausible speed everywhere except the planted position typo', () => {
    const typo = demo.doubtful.find((d) => d.kind === 'position-typo')!;
    const speeds: { id: string; kn: number }[] = [];
    for (let i = 1; i < demo.observations.length; i++) {
      const a = demo.observations[i - 1]!;
      const b = demo.observations[i]!;
      const nm = geod.Inverse(a.position!.lat, a.position!.lon, b.position!.lat, b.position!.lon).s12! / 1852;
      speeds.push({ id: b.id, kn: nm / ((Date.parse(b.time) - Date.parse(a.time)) / 3_600_000) });
    }
    const fast = speeds.filter((s) => s.kn > demo.cruise.maxSpeedKn);
    // The typo makes both legs touching it impossible: into it and out of it.
    expect(fast).toHaveLength(2);
    expect(fast[0]!.id).toBe(typo.observationId);
    expect(fast[0]!.kn).toBeGreaterThan(50);
    for (let i = 1; i < demo.track.length; i++) expect(demo.track[i]!.sogKn!).toBeLessThan(demo.cruise.maxSpeedKn);
  });

  it('documents its deliberately doubtful entries', () => {
    expect(demo.doubtful.map((d) => d.kind)).toEqual(['position-typo', 'stage-thickness-mismatch']);
    const byId = new Map(demo.observations.map((o) => [o.id, o]));
    const typo = byId.get(demo.doubtful[0]!.observationId)!;
    expect(typo.position!.source).toBe('manual');
    const grey = byId.get(demo.doubtful[1]!.observationId)!;
    const idx = Number(demo.doubtful[1]!.path.split('.')[1]);
    expect(grey.categories[idx]!.stage).toBe('grey');
    expect(grey.categories[idx]!.thicknessCm).toBe(45);
  });

  it('has a seeded generator with a uniform spread', () => {
    const rng = makePrng(42);
    const xs = Array.from({ length: 10_000 }, () => rng.next());
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    expect(mean).toBeGreaterThan(0.48);
    expect(mean).toBeLessThan(0.52);
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...xs)).toBeLessThan(1);
  });

  describe.each([1, 2, 3, 7, 2026])('against the domain rules (seed %i)', (seed) => {
    const d = seed === 1 ? demo : makeDemoCruise(seed);
    const typo = d.doubtful.find((x) => x.kind === 'position-typo')!;
    const thick = d.doubtful.find((x) => x.kind === 'stage-thickness-mismatch')!;

    it('passes every observation rule except the planted thickness, and nothing blocks saving', () => {
      const findings = d.observations.flatMap((o) => validateObservation(o, d.cruise).map((f) => ({ id: o.id, code: f.code, path: f.path, severity: f.severity })));
      expect(findings).toEqual([{ id: thick.observationId, code: 'stage-thickness-mismatch', path: thick.path, severity: 'warning' }]);
    });

    it('has exactly the documented sequence findings: the two gaps and the position typo', () => {
      const idAt = new Map(d.observations.map((o) => [o.time, o.id]));
      const afterTypo = d.observations[d.observations.findIndex((o) => o.id === typo.observationId) + 1]!;
      const findings = checkSequence(d.observations, d.cruise).map((f) => ({ id: f.observationId, code: f.code }));
      expect(findings).toEqual([
        { id: idAt.get(d.gaps[0]!.after), code: 'observation-gap' },
        // The typo is reached at an impossible speed, and left at one.
        { id: typo.observationId, code: 'implied-speed' },
        { id: afterTypo.id, code: 'implied-speed' },
        { id: idAt.get(d.gaps[1]!.after), code: 'observation-gap' },
      ]);
    });
  });
});
