// The incremental review (ReviewLedger) must give the same figures as a full pass (reviewCruise)
// after any sequence of saves, edits and deletes: random sequences with fast-check over the demo
// cruise's observations, with and without the track, with and without an observer filter. The
// full pass itself is checked against hand-computed values in stats.test.ts.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { makeDemoCruise } from '../../src/domain/demo.ts';
import type { Observation } from '../../src/domain/model.ts';
import { ReviewLedger, changedStretch, reviewCruise, trackToColumns, type CruiseReview } from '../../src/domain/stats.ts';
import { buildDistanceTimeline } from '../../src/domain/stats/distanceTimeline.ts';

const demo = makeDemoCruise();
const H = 3_600_000;
const shifted = (o: Observation, halfHours: number): string => new Date(Date.parse(o.time) + halfHours * H / 2).toISOString().replace('.000Z', 'Z');

/** Deep equality with a relative tolerance on numbers: the ledger's sums are added and taken back. */
function expectClose(actual: unknown, expected: unknown, path = 'review'): void {
  if (typeof expected === 'number' && typeof actual === 'number') {
    const tol = 1e-7 * Math.max(1, Math.abs(expected));
    if (!(Math.abs(actual - expected) <= tol)) throw new Error(`${path}: ${actual} != ${expected}`);
    return;
  }
  if (Array.isArray(expected)) {
    if (!Array.isArray(actual) || actual.length !== expected.length) throw new Error(`${path}: length ${Array.isArray(actual) ? actual.length : typeof actual} != ${expected.length}`);
    expected.forEach((e, i) => expectClose(actual[i], e, `${path}[${i}]`));
    return;
  }
  if (expected !== null && typeof expected === 'object') {
    if (actual === null || typeof actual !== 'object') throw new Error(`${path}: ${String(actual)} is not an object`);
    const keys = new Set([...Object.keys(expected), ...Object.keys(actual)]);
    for (const k of keys) expectClose((actual as Record<string, unknown>)[k], (expected as Record<string, unknown>)[k], `${path}.${k}`);
    return;
  }
  if (actual !== expected) throw new Error(`${path}: ${String(actual)} !== ${String(expected)}`);
}

type Op =
  | { kind: 'add'; pool: number; halfHours: number }
  | { kind: 'edit'; pick: number; halfHours: number; total: number | null; dropPosition: boolean; observer: number }
  | { kind: 'delete'; pick: number };

const op: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ kind: fc.constant('add' as const), pool: fc.nat(demo.observations.length - 1), halfHours: fc.integer({ min: -8, max: 8 }) }),
  fc.record({
    kind: fc.constant('edit' as const), pick: fc.nat(), halfHours: fc.integer({ min: -8, max: 8 }),
    total: fc.option(fc.integer({ min: 0, max: 10 }), { nil: null }), dropPosition: fc.boolean(), observer: fc.nat(3),
  }),
  fc.record({ kind: fc.constant('delete' as const), pick: fc.nat() }),
);

function runSequence(start: number, ops: Op[], withTrack: boolean, observerFilter: number | null): void {
  const cruise = demo.cruise;
  const include = observerFilter === null ? undefined : (o: Observation) => o.observerId === cruise.observers[observerFilter]?.id;
  const track = withTrack ? demo.track : undefined;
  const current = new Map<string, Observation>();
  for (const o of demo.observations.slice(0, start)) current.set(o.id, o);
  const ledger = new ReviewLedger({ cruise, include });
  ledger.reset([...current.values()], track ? trackToColumns(track) : null);
  let added = 0;
  for (const step of ops) {
    const ids = [...current.keys()];
    let saved: Observation | null = null;
    if (step.kind === 'add') {
      const base = demo.observations[step.pool] as Observation;
      saved = { ...base, id: `copy-${added++}`, time: shifted(base, step.halfHours) };
    } else if (ids.length > 0) {
      const o = current.get(ids[step.pick % ids.length] as string) as Observation;
      if (step.kind === 'edit') {
        saved = {
          ...o, time: shifted(o, step.halfHours), totalConcentration: step.total, revision: o.revision + 1,
          position: step.dropPosition ? null : o.position, observerId: cruise.observers[step.observer]?.id ?? o.observerId,
        };
      } else {
        saved = { ...o, deleted: true, revision: o.revision + 1 };
      }
    }
    if (!saved) continue;
    if (saved.deleted) current.delete(saved.id);
    else current.set(saved.id, saved);
    ledger.upsert(saved);
  }
  const full: CruiseReview = reviewCruise({ cruise, observations: [...current.values()], track, include });
  expectClose(ledger.result(), full);
}

describe('incremental review (ReviewLedger)', () => {
  it('equals the full pass right after a reset (demo cruise, with the track)', () => {
    const ledger = new ReviewLedger({ cruise: demo.cruise });
    ledger.reset(demo.observations, trackToColumns(demo.track));
    expectClose(ledger.result(), reviewCruise({ cruise: demo.cruise, observations: demo.observations, track: demo.track }));
  });

  it('equals a full pass after random saves, edits and deletes, distances from the observations (fast-check)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 40 }), fc.array(op, { maxLength: 25 }), fc.option(fc.nat(3), { nil: null }), (start, ops, filter) => {
        runSequence(start, ops, false, filter);
      }),
      { numRuns: 150, seed: 15 },
    );
  });

  it('equals a full pass after random saves, edits and deletes, distances from the track (fast-check)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 40 }), fc.array(op, { maxLength: 25 }), fc.option(fc.nat(3), { nil: null }), (start, ops, filter) => {
        runSequence(start, ops, true, filter);
      }),
      { numRuns: 60, seed: 16 },
    );
  });

  it('redoes only what a longer track changes, and equals the full pass', () => {
    const cruise = demo.cruise;
    const half = Math.floor(demo.track.length / 2);
    const ledger = new ReviewLedger({ cruise });
    ledger.reset(demo.observations, trackToColumns(demo.track.slice(0, half)));
    ledger.setTrack(trackToColumns(demo.track));
    expectClose(ledger.result(), reviewCruise({ cruise, observations: demo.observations, track: demo.track }));
    // And back to no track: distances between the observation positions again.
    ledger.setTrack(null);
    expectClose(ledger.result(), reviewCruise({ cruise, observations: demo.observations }));
  });

  it('finds where two distance timelines differ', () => {
    const fixes = [0, 1, 2, 3, 4].map((h) => ({ timeMs: h * H, lat: 70 + h * 0.1, lon: 0 }));
    const a = buildDistanceTimeline(fixes, 'observations');
    expect(changedStretch(a, a)).toBeNull();
    const moved = fixes.map((f, i) => (i === 2 ? { ...f, lon: 1 } : f));
    // Fix 2 moved: the legs 1-2 and 2-3 change, so [fix 1, fix 3].
    expect(changedStretch(a, buildDistanceTimeline(moved, 'observations'))).toEqual([1 * H, 3 * H]);
    expect(changedStretch(a, buildDistanceTimeline(fixes, 'track'))).toEqual([Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY]);
  });
});
