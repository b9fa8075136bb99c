// Guards issue 16 "Merge": the command line's merge (src/format/mergeLogs.ts) must not depend on
// the order of its files, must report every disagreement, and must treat a deletion at revision 2
// against an edit at revision 3 made apart as a conflict. The fast-check properties build
// random pairs and triples of logs, each edited on its own "laptop" from one common log.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Observation } from '../../src/domain/model';
import { canonicalJson } from '../../src/format/merge';
import { mergeLogs, type MergeSource } from '../../src/format/mergeLogs';
import type { LogBundle } from '../../src/format/types';
import { sampleBundle } from './arbitraries';

const src = (name: string, bundle: LogBundle): MergeSource => ({ name, bundle });
const merged = (...bundles: LogBundle[]) => mergeLogs(bundles.map((b, i) => src(`f${i}`, b))).bundle;

/** Content with every list in a fixed order: equal content, equal text. */
function content(b: LogBundle): string {
  const sorted = (l: readonly unknown[]) => l.map(canonicalJson).sort();
  return canonicalJson({
    cruise: { ...b.cruise, observers: sorted(b.cruise.observers) },
    observations: sorted(b.observations),
    history: sorted(b.history),
    conflicts: sorted(b.conflicts),
    track: sorted(b.track),
    photos: sorted(b.photos),
  });
}

// Small value sets, so that laptops often make the same or clashing changes.
const stamp = fc.integer({ min: 0, max: 3 }).map((h) => `2026-03-0${3 + h}T00:00:00Z`);
type Op =
  | { op: 'edit'; obs: number; notes: string; deleted: boolean; at: string }
  | { op: 'forget-history'; obs: number }
  | { op: 'copy'; obs: number; notes: string }
  | { op: 'settings'; name: string; at: string }
  | { op: 'observer'; name: string; at: string }
  | { op: 'track'; i: number; lat: number }
  | { op: 'add-track'; minute: number; lat: number }
  | { op: 'add-obs'; id: string; notes: string };
const notes = fc.constantFrom('x', 'y', 'z');
const arbOp: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ op: fc.constant('edit' as const), obs: fc.nat(1), notes, deleted: fc.boolean(), at: stamp }),
  fc.record({ op: fc.constant('forget-history' as const), obs: fc.nat(1) }),
  fc.record({ op: fc.constant('copy' as const), obs: fc.nat(1), notes }),
  fc.record({ op: fc.constant('settings' as const), name: fc.constantFrom('North leg', 'South leg'), at: stamp }),
  fc.record({ op: fc.constant('observer' as const), name: fc.constantFrom('Ada E.', 'Ada Example-Frost'), at: stamp }),
  fc.record({ op: fc.constant('track' as const), i: fc.nat(2), lat: fc.constantFrom(70, 71) }),
  fc.record({ op: fc.constant('add-track' as const), minute: fc.nat(3), lat: fc.constantFrom(72, 73) }),
  fc.record({ op: fc.constant('add-obs' as const), id: fc.constantFrom('n-1', 'n-2'), notes }),
);

/** One laptop's log: the common log with its own edits, kept to the format's invariants. */
function edited(ops: Op[]): LogBundle {
  const b = sampleBundle();
  for (const o of ops) {
    const ids = ['o-1', 'o-2'];
    if (o.op === 'edit' || o.op === 'forget-history' || o.op === 'copy') {
      const id = ids[o.obs] as string;
      const i = b.observations.findIndex((x) => x.id === id);
      const cur = b.observations[i] as Observation;
      if (o.op === 'edit') {
        b.history.push(cur);
        b.observations[i] = { ...cur, revision: cur.revision + 1, notes: o.notes, deleted: o.deleted, savedAt: o.at };
      } else if (o.op === 'forget-history') {
        b.history = b.history.filter((h) => h.id !== id);
      } else if (!b.conflicts.some((c) => c.id === id && c.revision === cur.revision) && cur.notes !== o.notes) {
        b.conflicts.push({ ...cur, notes: o.notes, deviceId: 'dev-copy' });
      }
    } else if (o.op === 'settings') b.cruise = { ...b.cruise, name: o.name, updatedAt: o.at };
    else if (o.op === 'observer') b.cruise = { ...b.cruise, updatedAt: o.at, observers: b.cruise.observers.map((x) => (x.id === 'obs-a' ? { ...x, name: o.name } : x)) };
    else if (o.op === 'track') b.track[o.i] = { ...(b.track[o.i] as (typeof b.track)[number]), lat: o.lat };
    else if (o.op === 'add-track') {
      const time = `2026-03-02T12:0${o.minute}:00Z`;
      if (!b.track.some((p) => p.time === time)) b.track.push({ cruiseId: b.cruise.id, time, lat: o.lat, lon: 10, source: 'gps-serial' });
    } else if (!b.observations.some((x) => x.id === o.id)) {
      b.observations.push({ ...(b.observations[1] as Observation), id: o.id, revision: 1, notes: o.notes, savedAt: '2026-03-03T00:00:00Z' });
    }
  }
  return b;
}
const arbLog = fc.array(arbOp, { maxLength: 6 }).map(edited);

describe('merge of several files, independent of their order (issue 16)', { timeout: 120_000 }, () => {
  it('is commutative on content (fast-check)', () => {
    fc.assert(
      fc.property(arbLog, arbLog, (a, b) => {
        expect(content(merged(a, b))).toBe(content(merged(b, a)));
      }),
      { numRuns: 300 },
    );
  });

  it('is associative on content (fast-check)', () => {
    fc.assert(
      fc.property(arbLog, arbLog, arbLog, (a, b, c) => {
        const left = content(merged(merged(a, b), c));
        expect(content(merged(a, merged(b, c)))).toBe(left);
        expect(content(merged(a, b, c))).toBe(left);
      }),
      { numRuns: 300 },
    );
  });

  it('is idempotent: a file with itself, and a result with itself or its inputs, changes nothing (fast-check)', () => {
    fc.assert(
      fc.property(arbLog, arbLog, (a, b) => {
        expect(content(merged(a, a))).toBe(content(merged(a)));
        const m = merged(a, b);
        expect(content(merged(m, m))).toBe(content(m));
        expect(content(merged(m, a))).toBe(content(m));
      }),
      { numRuns: 300 },
    );
  });

  it('keeps every version of every observation in one of the three places (fast-check)', () => {
    fc.assert(
      fc.property(arbLog, arbLog, (a, b) => {
        const m = merged(a, b);
        const kept = new Set([...m.observations, ...m.history, ...m.conflicts].map(canonicalJson));
        for (const v of [...a.observations, ...a.history, ...a.conflicts, ...b.observations, ...b.history, ...b.conflicts]) expect(kept.has(canonicalJson(v))).toBe(true);
        // History revisions are unique and below the current one, as the format requires.
        for (const o of m.observations) {
          const revs = m.history.filter((h) => h.id === o.id).map((h) => h.revision);
          expect(new Set(revs).size).toBe(revs.length);
          for (const r of revs) expect(r).toBeLessThan(o.revision);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('a same-revision conflict: the later save is current in both orders, the other kept and reported', () => {
    const a = edited([{ op: 'edit', obs: 1, notes: 'x', deleted: false, at: '2026-03-03T00:00:00Z' }]);
    const b = edited([{ op: 'edit', obs: 1, notes: 'y', deleted: true, at: '2026-03-04T00:00:00Z' }]);
    const files = [src('one.json', a), src('two.json', b)];
    for (const order of [files, [...files].reverse()]) {
      const r = mergeLogs(order);
      const o2 = r.bundle.observations.find((o) => o.id === 'o-2');
      expect(o2).toMatchObject({ revision: 2, deleted: true, notes: 'y' });
      expect(r.bundle.conflicts.map((c) => c.notes)).toEqual(['x']);
      expect(r.disagreements.filter((d) => d.subject === 'observation')).toHaveLength(1);
      expect(r.disagreements[0]?.message).toBe('revision 2 in one.json differs from revision 2 in two.json; kept as a conflicting copy for review');
    }
  });

  it('a deletion at revision 2 against an edit at revision 3 made apart: a conflict, reported, in both orders', () => {
    const del = edited([{ op: 'edit', obs: 1, notes: 'gone', deleted: true, at: '2026-03-03T00:00:00Z' }]);
    // The other laptop's file lost revision 2 from its history: nothing shows revision 3 follows the deletion.
    const ed = edited([
      { op: 'edit', obs: 1, notes: 'x', deleted: false, at: '2026-03-03T00:00:00Z' },
      { op: 'edit', obs: 1, notes: 'y', deleted: false, at: '2026-03-04T00:00:00Z' },
    ]);
    ed.history = ed.history.filter((h) => !(h.id === 'o-2' && h.revision === 2));
    const files = [src('del.json', del), src('edit.json', ed)];
    for (const order of [files, [...files].reverse()]) {
      const r = mergeLogs(order);
      expect(r.bundle.observations.find((o) => o.id === 'o-2')).toMatchObject({ revision: 3, notes: 'y' });
      expect(r.bundle.conflicts.filter((c) => c.id === 'o-2').map((c) => [c.revision, c.deleted])).toEqual([[2, true]]);
      const d = r.disagreements.find((x) => x.key === 'o-2');
      expect(d?.message).toBe('revision 2 (a deletion) in del.json is not shown to precede the current revision 3 of edit.json; kept as a conflicting copy for review');
    }
  });

  it('track points at one time with other positions, a renamed observer and other settings are each reported', () => {
    const a = edited([{ op: 'track', i: 1, lat: 70 }, { op: 'observer', name: 'Ada E.', at: '2026-03-05T00:00:00Z' }]);
    const b = edited([{ op: 'track', i: 1, lat: 71 }, { op: 'settings', name: 'South leg', at: '2026-03-04T00:00:00Z' }]);
    const files = [src('a.json', a), src('b.json', b)];
    for (const order of [files, [...files].reverse()]) {
      const r = mergeLogs(order);
      expect(r.bundle.track.filter((p) => p.time === '2026-03-02T09:30:00Z')).toHaveLength(1);
      expect(r.disagreements.map((d) => d.subject).sort()).toEqual(['cruise', 'observer', 'track']);
      // Settings and observer names saved last win: a's rename (03-05) over b's name change (03-04).
      expect(r.bundle.cruise.observers.find((o) => o.id === 'obs-a')?.name).toBe('Ada E.');
      expect(r.bundle.cruise.name).toBe('Test cruise');
    }
  });

  it('refuses files of different cruises, naming them', () => {
    const other = sampleBundle();
    other.cruise = { ...other.cruise, id: 'cruise-other' };
    expect(() => mergeLogs([src('a.json', sampleBundle()), src('b.json', other)])).toThrow('the files are of different cruises: b.json is of cruise "Test cruise" (cruise-other); a.json is of cruise "Test cruise" (cruise-test-1)');
  });
});
