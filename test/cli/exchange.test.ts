// The exchange commands: demo, validate, summary, convert, merge. Most run in-process through
// runCli; the exit codes are also checked on a spawned process through the bin shim.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { run } from './runCollected.ts';
import { makeDemoCruise } from '../../src/domain/demo.ts';
import { alongTrackDistanceM } from '../../src/domain/geodesy.ts';
import { reviewCruise } from '../../src/domain/stats.ts';
import { readLogText } from '../../src/format/read.ts';

const ROOT = resolve(import.meta.dirname, '../..');
const dir = mkdtempSync(join(tmpdir(), 'floe-cli-'));
const demoFile = join(dir, 'demo.json');


beforeAll(async () => {
  expect((await run('demo', '-o', demoFile)).code).toBe(0);
}, 60_000);

describe('demo', { timeout: 60_000 }, () => {
  it('writes the invented demo cruise as a valid log, reproducibly', async () => {
    const demo = makeDemoCruise(1);
    const r = readLogText(readFileSync(demoFile, 'utf8'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.bundle.cruise.vesselName).toBe(demo.cruise.vesselName);
    expect(r.bundle.observations).toHaveLength(demo.observations.length);
    expect(r.bundle.track).toHaveLength(demo.track.length);
    const again = join(dir, 'demo-again.json');
    await run('demo', '-o', again);
    expect(readFileSync(again, 'utf8')).toBe(readFileSync(demoFile, 'utf8'));
  });
  it('refuses a bad seed with exit 2', async () => {
    const r = await run('demo', '-o', join(dir, 'x.json'), '--seed', 'abc');
    expect(r.code).toBe(2);
    expect(r.err[0]).toContain('--seed "abc" is not a whole number');
  });
});

describe('validate', { timeout: 60_000 }, () => {
  it('exit 0 for valid files', async () => {
    const r = await run('validate', demoFile, resolve(ROOT, 'test/format/fixtures/log-v0.json'));
    expect(r.code).toBe(0);
    expect(r.out[0]).toMatch(/demo\.json: valid: \d+ observations/);
    expect(r.out.some((l) => l.includes('format version 0, read by migration'))).toBe(true);
  });
  it('exit 1 and one message per problem with its place', async () => {
    const bad = join(dir, 'bad.json');
    const text = readFileSync(demoFile, 'utf8').replace(/"totalConcentration":(\d+)/, '"totalConcentration":12').replace(/"lat":[\d.]+/, '"lat":"north"');
    writeFileSync(bad, text);
    const r = await run('validate', bad, demoFile, join(dir, 'missing.json'));
    expect(r.code).toBe(1);
    expect(r.err, r.err.join("\n")).toHaveLength(3);
    expect(r.err[0]).toMatch(/^.*bad\.json: line \d+, column \d+: \$\.observations\[0\]\.position\.lat: must be a number, not "north"$/);
    expect(r.err[1]).toMatch(/bad\.json: line \d+, column \d+: \$\.observations\[0\]\.totalConcentration: 12 is above the largest allowed value 10$/);
    expect(r.err[2]).toMatch(/missing\.json: \$: cannot be read/);
  });
});

describe('summary', { timeout: 60_000 }, () => {
  it('prints the cruise statistics, and --json an object computed by the domain', async () => {
    const text = await run('summary', demoFile);
    expect(text.code).toBe(0);
    expect(text.out.join('\n')).toContain('RV Frostwren');
    const r = await run('summary', demoFile, '--json');
    const s = JSON.parse(r.out.at(-1) as string) as { observations: { total: number }; track: { distanceNm: number }; meanTotalConcentration: number; observers: unknown[]; timeSpan: { first: string } };
    const demo = makeDemoCruise(1);
    expect(s.observations.total).toBe(demo.observations.length);
    expect(s.observers).toHaveLength(demo.cruise.observers.length);
    expect(s.timeSpan.first).toBe(demo.observations[0]?.time);
    expect(s.track.distanceNm).toBeCloseTo(alongTrackDistanceM(demo.track) / 1852, 1);
    const mean = demo.observations.reduce((a, o) => a + (o.totalConcentration ?? 0), 0) / demo.observations.length;
    expect(s.meanTotalConcentration).toBeCloseTo(mean, 2);
  });

  it('carries the review figures of the domain (ice hours, thickness, POLARIS) in text and --json', async () => {
    const demo = makeDemoCruise(1);
    const expected = reviewCruise({ cruise: demo.cruise, observations: demo.observations, track: demo.track }).summary;
    const r = await run('summary', demoFile, '--json');
    const s = JSON.parse(r.out.at(-1) as string) as { review: typeof expected };
    expect(s.review.inIce.hours).toBeCloseTo(expected.inIce.hours, 6);
    expect(s.review.marginal.distanceNm).toBeCloseTo(expected.marginal.distanceNm, 6);
    expect(s.review.polaris.iceClass).toBe('PC5');
    expect(s.review.polaris.minRio).toBe(expected.polaris.minRio);
    const text = (await run('summary', demoFile)).out.join('\n');
    expect(text).toContain(`In ice      ${expected.inIce.hours.toFixed(1)} h`);
    expect(text).toContain(`POLARIS     class PC5: RIO min ${expected.polaris.minRio}`);
    expect(text).toContain('decision support only');
  });
});

// IMO MSC.1/Circ.1519: POLARIS output is decision support, so every POLARIS figure travels with
// its cautions, in machine output too (as `polaris --json` does). The thickness with ridges is an
// estimate (Timco and Burden 1997 ratios from the sail height) and the ridged share a visual one:
// the JSON says so for every ridge-based figure, so a script cannot take them for measurements.
describe('summary --json: cautions and estimates', { timeout: 60_000 }, () => {
  type Flag = { path: string; estimate: boolean; basis: string };
  const summaryJson = async () => JSON.parse((await run('summary', demoFile, '--json')).out.at(-1) as string) as Record<string, unknown> & { cautions: string[]; estimates: Flag[] };

  it('carries a cautions array with the POLARIS cautions of `polaris --json` and the map caution', async () => {
    const s = await summaryJson();
    const p = JSON.parse((await run('polaris', '--class', 'PC5', '--ice', '5:thick-first-year', '--json')).out.at(-1) as string) as { cautions: string[] };
    expect(Array.isArray(s.cautions)).toBe(true);
    expect(p.cautions.length).toBeGreaterThan(0);
    for (const c of p.cautions) expect(s.cautions).toContain(c);
    expect(s.cautions.join(' ')).toContain('not a navigation chart');
    expect(s.cautions.join(' ')).toContain('Timco and Burden 1997');
  });

  it('flags every ridge-based figure as an estimate, by its path, with its basis', async () => {
    const s = await summaryJson();
    const ridgePaths: string[] = [];
    const walk = (v: unknown, path: string) => {
      if (v === null || typeof v !== 'object') return;
      for (const [k, x] of Object.entries(v)) {
        const p = path ? `${path}.${k}` : k;
        if (/ridge/i.test(k)) ridgePaths.push(p);
        if (!Array.isArray(x) && p !== 'estimates' && p !== 'cautions') walk(x, p);
      }
    };
    walk(s, '');
    expect(ridgePaths).toContain('review.ice.meanThicknessWithRidgesCm');
    const flagged = new Map(s.estimates.map((e) => [e.path, e]));
    for (const p of ridgePaths) {
      expect(flagged.get(p), p).toMatchObject({ estimate: true });
      expect(flagged.get(p)?.basis, p).toMatch(/^Estimate: /);
    }
    expect(flagged.get('review.ice.meanThicknessWithRidgesCm')?.basis).toContain('Timco and Burden (1997)');
    // Every flagged path names a figure that is really there.
    for (const e of s.estimates) {
      const value = e.path.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown> | undefined)?.[k], s);
      expect(value, e.path).not.toBeUndefined();
    }
  });

  it('the text form ends with the cautions too', async () => {
    const text = (await run('summary', demoFile)).out.join('\n');
    expect(text).toContain('Cautions:');
    expect(text).toContain('decision support only (IMO MSC.1/Circ.1519)');
    expect(text).toMatch(/Thickness .* with ridges \(estimate\)/);
  });
});

describe('convert', { timeout: 60_000 }, () => {
  it('to csv, geojson and ndjson', async () => {
    for (const to of ['csv', 'geojson', 'ndjson']) expect((await run('convert', demoFile, '--to', to, '-o', join(dir, `demo.${to}`))).code).toBe(0);
    const n = makeDemoCruise(1).observations.length;
    const csv = Papa.parse<Record<string, string>>(readFileSync(join(dir, 'demo.csv'), 'utf8'), { header: true, skipEmptyLines: true });
    expect(csv.data).toHaveLength(n);
    const gj = JSON.parse(readFileSync(join(dir, 'demo.geojson'), 'utf8')) as { features: { geometry: { type: string } | null }[] };
    expect(gj.features.filter((f) => f.geometry?.type === 'Point')).toHaveLength(n);
    expect(gj.features.at(-1)?.geometry?.type).toMatch(/LineString$/);
    expect(readFileSync(join(dir, 'demo.ndjson'), 'utf8').trim().split('\n')).toHaveLength(n);
  });
  it('refuses an unknown target with exit 2', async () => {
    const r = await run('convert', demoFile, '--to', 'kml', '-o', join(dir, 'x'));
    expect(r.code).toBe(2);
    expect(r.err[0]).toContain('--to "kml" is not one of');
  });
});

describe('merge', { timeout: 60_000 }, () => {
  it('merges independent of the order of the files, printing each disagreement (issue 16)', async () => {
    const doc = JSON.parse(readFileSync(demoFile, 'utf8')) as { observations: Record<string, unknown>[] };
    const o0 = doc.observations[0] as Record<string, unknown>;
    const o1 = doc.observations[1] as Record<string, unknown>;
    doc.observations[0] = { ...o0, revision: 2, notes: 'edited on laptop B', history: [o0] };
    doc.observations[1] = { ...o1, notes: 'same revision, other text', savedAt: '2026-12-01T00:00:00Z' };
    const b = join(dir, 'laptop-b.json');
    writeFileSync(b, JSON.stringify(doc));
    const outs = [join(dir, 'merged-1.json'), join(dir, 'merged-2.json')];
    const r1 = await run('merge', demoFile, b, demoFile, '-o', outs[0] as string);
    const r2 = await run('merge', b, demoFile, '-o', outs[1] as string);
    for (const r of [r1, r2]) {
      expect(r.code).toBe(0);
      const lines = r.out.filter((l) => l.startsWith('disagreement:'));
      expect(lines).toEqual([`disagreement: observation ${String(o1.id)}: revision 1 in ${demoFile} differs from revision 1 in ${b}; kept as a conflicting copy for review`]);
      expect(r.out.at(-1)).toMatch(/; 1 disagreement$/);
    }
    const read = outs.map((f) => readLogText(readFileSync(f, 'utf8')));
    const bundles = read.map((m) => (m.ok ? m.bundle : null));
    expect(bundles[0]).not.toBeNull();
    expect(bundles[1]).toEqual(bundles[0]);
    const merged = bundles[0];
    if (!merged) return;
    expect(merged.observations.find((o) => o.id === o0.id)?.notes).toBe('edited on laptop B');
    // The copy saved last is current (the rule), the other one is kept for review.
    expect(merged.observations.find((o) => o.id === o1.id)?.notes).toBe('same revision, other text');
    expect(merged.history.map((h) => h.id)).toEqual([o0.id]);
    expect(merged.conflicts.map((c) => c.notes)).toEqual([o1.notes]);
  });
  it('writes nothing when a file is rejected or of another cruise', async () => {
    const other = join(dir, 'other.json');
    await run('demo', '-o', other, '--seed', '2');
    const out = join(dir, 'never.json');
    const r = await run('merge', demoFile, other, '-o', out);
    expect(r.code).toBe(1);
    expect(r.err[0]).toMatch(/^the files are of different cruises: .*(demo|other)\.json is of cruise "[^"]+" \([\w-]+\); .*(demo|other)\.json is of cruise "[^"]+" \([\w-]+\); nothing written$/);
    expect(() => readFileSync(out)).toThrow();
  });
});

describe('the bin shim, spawned', { timeout: 60_000 }, () => {
  const bin = resolve(ROOT, 'bin/floe-ledger.mjs');
  it('exit codes 0, 1 and 2', () => {
    const ok = spawnSync(process.execPath, [bin, 'validate', demoFile, '--quiet'], { encoding: 'utf8' });
    expect(ok.status).toBe(0);
    writeFileSync(join(dir, 'truncated.json'), readFileSync(demoFile, 'utf8').slice(0, 5000));
    const bad = spawnSync(process.execPath, [bin, 'validate', join(dir, 'truncated.json')], { encoding: 'utf8' });
    expect(bad.status).toBe(1);
    expect(bad.stderr).toMatch(/truncated\.json: line \d+, column \d+: \$: .*truncated/);
    const usage = spawnSync(process.execPath, [bin, 'validate'], { encoding: 'utf8' });
    expect(usage.status).toBe(2);
  }, 60_000);
});
