import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Observation } from '../../src/domain/model';
import { applyPlanToBundle, bundleTarget, canonicalJson, MergeRefused, planIsEmpty, planMerge } from '../../src/format/merge';
import type { LogBundle } from '../../src/format/types';
import { arbBundle, sampleBundle } from './arbitraries';

const edit = (o: Observation, changes: Partial<Observation>): Observation => ({ ...o, ...changes });

function stored(): LogBundle {
  return sampleBundle();
}

describe('merge planning', { timeout: 120_000 }, () => {
  it('into nothing: everything is new', () => {
    const b = sampleBundle();
    const plan = planMerge(bundleTarget(null), b);
    expect(plan.cruise.action).toBe('create');
    expect(plan.counts).toMatchObject({ new: 2, identical: 0, newer: 0, older: 0, conflict: 0, trackNew: 3, photosNew: 1 });
    expect(plan.putCurrent.map((o) => o.id).sort()).toEqual(['o-1', 'o-2']);
    expect(plan.addHistory).toHaveLength(1);
  });

  it("keeps the stored cruise's end time, a local setting the file does not carry", () => {
    const local = stored();
    local.cruise = { ...local.cruise, endTime: '2026-03-05T12:00:00Z' };
    const incoming = sampleBundle();
    incoming.cruise = { ...incoming.cruise, name: 'Renamed later', updatedAt: '2099-01-01T00:00:00Z' };
    const plan = planMerge(bundleTarget(local), incoming);
    expect(plan.cruise.value).toMatchObject({ name: 'Renamed later', endTime: '2026-03-05T12:00:00Z' });
  });

  it('the same file again: everything identical, nothing to write', () => {
    const plan = planMerge(bundleTarget(stored()), sampleBundle());
    expect(plan.counts).toMatchObject({ new: 0, identical: 2, newer: 0, older: 0, conflict: 0, trackNew: 0, trackDuplicate: 3, photosNew: 0, photosDuplicate: 1 });
    expect(planIsEmpty(plan)).toBe(true);
  });

  it('a newer revision is applied and the stored one goes to the history', () => {
    const incoming = sampleBundle();
    const o2 = incoming.observations[1] as Observation;
    incoming.observations[1] = edit(o2, { revision: 2, totalConcentration: 3, savedAt: '2026-03-02T12:00:00Z' });
    incoming.history.push(o2);
    const plan = planMerge(bundleTarget(stored()), incoming);
    expect(plan.items.find((i) => i.id === 'o-2')).toMatchObject({ kind: 'newer', incomingRevision: 2, storedRevision: 1 });
    expect(plan.putCurrent).toEqual([incoming.observations[1]]);
    // The stored revision 1 is already in the incoming history identically: it is moved to the history once.
    expect(plan.addHistory).toEqual([o2]);
    const after = applyPlanToBundle(stored(), plan);
    expect(after.observations.find((o) => o.id === 'o-2')?.revision).toBe(2);
    expect(after.history.filter((h) => h.id === 'o-2')).toHaveLength(1);
  });

  it('an older revision that is not stored is kept as history when the file shows it precedes the stored one', () => {
    const s = stored();
    s.history = []; // this laptop never had revision 1 of o-1
    const incoming = sampleBundle(); // revision 2 (as stored) with revision 1 in its history
    const plan = planMerge(bundleTarget(s), incoming);
    expect(plan.items.find((i) => i.id === 'o-1')).toMatchObject({ kind: 'older', incomingRevision: 2, storedRevision: 2 });
    expect(plan.putCurrent).toEqual([]);
    expect(plan.addHistory).toEqual([incoming.history[0]]);
  });

  it('issue 16: an older revision alone, from a file holding none of the later stored versions, is a conflict', () => {
    const s = stored();
    s.history = [];
    const incoming = sampleBundle();
    incoming.observations = [incoming.history[0] as Observation];
    incoming.history = [];
    const plan = planMerge(bundleTarget(s), incoming);
    expect(plan.items).toMatchObject([{ id: 'o-1', kind: 'conflict', incomingRevision: 1, storedRevision: 2 }]);
    expect(plan.putCurrent).toEqual([]);
    expect(plan.addConflicts).toEqual([incoming.observations[0]]);
  });

  it('issue 16: a deletion at revision 2 against an edit at revision 3 made apart is a conflict in either direction', () => {
    const base = sampleBundle();
    const o2 = base.observations[1] as Observation; // revision 1
    const deleted: LogBundle = { ...sampleBundle(), observations: [base.observations[0] as Observation, edit(o2, { revision: 2, deleted: true, savedAt: '2026-03-02T10:00:00Z' })], history: [...base.history, o2] };
    // The other laptop's revision 3, whose file has no revision 2: nothing shows it follows the deletion.
    const edited: LogBundle = { ...sampleBundle(), observations: [base.observations[0] as Observation, edit(o2, { revision: 3, notes: 'edited apart', savedAt: '2026-03-02T11:00:00Z' })], history: [...base.history, o2] };
    const a = planMerge(bundleTarget(deleted), edited);
    expect(a.items.find((i) => i.id === o2.id)?.kind).toBe('conflict');
    expect(a.putCurrent).toEqual([]);
    expect(a.addConflicts.map((c) => c.revision)).toEqual([3]);
    const b = planMerge(bundleTarget(edited), deleted);
    expect(b.items.find((i) => i.id === o2.id)?.kind).toBe('conflict');
    expect(b.addConflicts.map((c) => c.revision)).toEqual([2]);
    // With the deletion in its history, revision 3 descends from it: newer.
    const descended: LogBundle = { ...edited, history: [...edited.history, deleted.observations[1] as Observation] };
    expect(planMerge(bundleTarget(deleted), descended).items.find((i) => i.id === o2.id)?.kind).toBe('newer');
  });

  it('the same revision with different content is a conflict: both kept, flagged', () => {
    const incoming = sampleBundle();
    incoming.observations[0] = edit(incoming.observations[0] as Observation, { notes: 'edited on the other laptop', deviceId: 'dev-2' });
    const plan = planMerge(bundleTarget(stored()), incoming);
    expect(plan.items.find((i) => i.id === 'o-1')?.kind).toBe('conflict');
    expect(plan.addConflicts.map((c) => c.notes)).toEqual(['edited on the other laptop']);
    expect(plan.putCurrent).toEqual([]);
    // Importing it again adds nothing: the conflict copy is now stored.
    const after = applyPlanToBundle(stored(), plan);
    const again = planMerge(bundleTarget(after), incoming);
    expect(planIsEmpty(again)).toBe(true);
    expect(again.counts.identical).toBe(2);
  });

  it('a conflict in the history flags the observation too', () => {
    const incoming = sampleBundle();
    incoming.history[0] = edit(incoming.history[0] as Observation, { notes: 'another first try' });
    const plan = planMerge(bundleTarget(stored()), incoming);
    expect(plan.items.find((i) => i.id === 'o-1')?.kind).toBe('conflict');
  });

  it('refuses to merge another cruise', () => {
    const incoming = sampleBundle();
    incoming.cruise = { ...incoming.cruise, id: 'other' };
    expect(() => planMerge(bundleTarget(stored()), incoming)).toThrow(MergeRefused);
  });

  it('keeps every observer and the later cruise settings', () => {
    const incoming = sampleBundle();
    incoming.cruise = { ...incoming.cruise, name: 'Renamed', updatedAt: '2026-03-05T00:00:00Z', observers: [{ id: 'obs-c', name: 'Cai Example', initials: 'CE' }] };
    const plan = planMerge(bundleTarget(stored()), incoming);
    expect(plan.cruise.action).toBe('update');
    expect(plan.cruise.value.name).toBe('Renamed');
    expect(plan.cruise.value.observers.map((o) => o.id)).toEqual(['obs-a', 'obs-b', 'obs-c']);
  });

  it('is idempotent and order-independent for random logs (fast-check)', () => {
    fc.assert(
      fc.property(arbBundle, (b) => {
        const once = applyPlanToBundle(null, planMerge(bundleTarget(null), b));
        const twice = planMerge(bundleTarget(once), b);
        expect(planIsEmpty(twice)).toBe(true);
        expect(twice.counts.identical).toBe(b.observations.length);
      }),
      { numRuns: 150 },
    );
  });

  it('merging A then B equals merging B then A in content', () => {
    const a = sampleBundle();
    const b = sampleBundle();
    b.observations[1] = edit(b.observations[1] as Observation, { revision: 2, notes: 'rev 2' });
    b.history = [...b.history, a.observations[1] as Observation];
    const ab = applyPlanToBundle(applyPlanToBundle(null, planMerge(bundleTarget(null), a)), planMerge(bundleTarget(applyPlanToBundle(null, planMerge(bundleTarget(null), a))), b));
    const bFirst = applyPlanToBundle(null, planMerge(bundleTarget(null), b));
    const ba = applyPlanToBundle(bFirst, planMerge(bundleTarget(bFirst), a));
    const key = (x: LogBundle) => [x.observations, x.history, x.conflicts].map((l) => l.map(canonicalJson).sort());
    expect(key(ab)).toEqual(key(ba));
  });
});
