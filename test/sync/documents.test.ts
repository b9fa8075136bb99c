// The server documents of a cruise and the check of pulled ones: a log split into documents and
// read back is the same log; altered, foreign or hostile documents are refused one by one with a
// reason, and never stop the good ones.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { makeDemoCruise } from '../../src/domain/demo';
import type { LogBundle } from '../../src/format/types';
import { canonicalJson } from '../../src/format/merge';
import { bundleDocs, checkPulled, cruiseDoc, observationDoc, trackDoc, type SyncDoc } from '../../src/sync/documents';
import { cruiseDatabaseName, digest } from '../../src/sync/ids';
import { arbBundle, sampleBundle } from '../format/arbitraries';

const sortKey = (xs: readonly object[]) => xs.map(canonicalJson).sort();

function demoBundle(): LogBundle {
  const d = makeDemoCruise(3);
  return { cruise: d.cruise, observations: d.observations.slice(0, 60), history: [], conflicts: [], track: d.track.slice(0, 2000), photos: [] };
}

const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T;

describe('document ids', () => {
  it('database names are one to one and obey CouchDB name rules (CouchDB 3 docs: "Database names")', () => {
    fc.assert(
      fc.property(fc.string({ minLength: 1, maxLength: 30 }), fc.string({ minLength: 1, maxLength: 30 }), (a, b) => {
        const na = cruiseDatabaseName(a);
        expect(na).toMatch(/^[a-z][a-z0-9_$()+/-]*$/);
        if (a !== b) expect(na).not.toBe(cruiseDatabaseName(b));
      }),
    );
  });

  it('the digest separates near texts and is stable', () => {
    expect(digest('abc')).toBe(digest('abc'));
    expect(digest('abc')).toMatch(/^[0-9a-f]{16}$/);
    const seen = new Set<string>();
    for (let i = 0; i < 20000; i++) seen.add(digest(`{"revision":${i}}`));
    expect(seen.size).toBe(20000);
  });

  it('one revision, one id; other content, other id', () => {
    const b = sampleBundle();
    const o = b.observations[0]!;
    expect(observationDoc(o)._id).toBe(observationDoc(clone(o))._id);
    expect(observationDoc({ ...o, notes: 'other' })._id).not.toBe(observationDoc(o)._id);
    expect(observationDoc(o)._id.startsWith(`obs:${o.id}:r${String(o.revision).padStart(6, '0')}:`)).toBe(true);
  });
});

describe('a log split into documents and checked back', () => {
  it('is the same log (demo cruise: 60 observations, 2000 track points)', () => {
    const b = demoBundle();
    const r = checkPulled(bundleDocs(b).map(clone), { cruiseId: b.cruise.id, storedCruise: null });
    expect(r.refused).toEqual([]);
    expect(r.bundle!.cruise).toEqual(b.cruise);
    expect(sortKey(r.bundle!.observations)).toEqual(sortKey(b.observations));
    expect(sortKey(r.bundle!.track)).toEqual(sortKey(b.track));
  });

  it('is the same log for random logs with history and conflicts (fast-check)', () => {
    fc.assert(
      fc.property(arbBundle, (b0) => {
        const b = { ...b0, photos: [], observations: b0.observations.map((o) => ({ ...o, photoIds: [] })), history: b0.history.map((o) => ({ ...o, photoIds: [] })) };
        const r = checkPulled(bundleDocs(b).map(clone), { cruiseId: b.cruise.id, storedCruise: null, rules: null });
        expect(r.refused).toEqual([]);
        const all = (x: LogBundle) => sortKey([...x.observations, ...x.history, ...x.conflicts]);
        expect(all(r.bundle!)).toEqual(all(b));
        expect(sortKey(r.bundle!.track)).toEqual(sortKey(b.track));
      }),
      { numRuns: 25 },
    );
  });

  it('observations without a cruise record wait for one', () => {
    const b = demoBundle();
    const docs = bundleDocs(b).filter((d) => d.type !== 'floe-ledger/cruise');
    const r = checkPulled(docs, { cruiseId: b.cruise.id, storedCruise: null });
    expect(r.bundle).toBeNull();
    expect(r.refused[0]!.reason).toMatch(/no valid cruise record/);
    const r2 = checkPulled(docs, { cruiseId: b.cruise.id, storedCruise: b.cruise });
    expect(r2.refused).toEqual([]);
  });
});

describe('hostile or broken documents', () => {
  const b = demoBundle();
  const good = () => bundleDocs(b).map(clone);

  function refusedWith(mutate: (docs: SyncDoc[]) => unknown[]) {
    const docs = good();
    const r = checkPulled(mutate(docs), { cruiseId: b.cruise.id, storedCruise: null });
    return r;
  }

  it('content altered on the server: refused because the id no longer names it', () => {
    const r = refusedWith((docs) => {
      const d = docs.find((x) => x.type === 'floe-ledger/observation')! as SyncDoc & { body: { notes: string } };
      d.body.notes = 'changed on the server';
      return docs;
    });
    expect(r.refused).toHaveLength(1);
    expect(r.refused[0]!.reason).toMatch(/id does not match its content/);
    expect(r.bundle!.observations).toHaveLength(b.observations.length - 1);
  });

  it('a value outside the schema, with a matching id: refused with the reader\'s reason, the rest accepted', () => {
    const bad = clone(b.observations[5]!);
    (bad as { totalConcentration: number }).totalConcentration = 14;
    const doc = observationDoc(bad);
    const r = checkPulled([...good(), doc], { cruiseId: b.cruise.id, storedCruise: null });
    expect(r.refused.map((x) => x.docId)).toEqual([doc._id]);
    expect(r.refused[0]!.reason).toMatch(/totalConcentration/);
    expect(r.refused[0]!.reason).toMatch(/above the largest allowed value 10/);
    expect(r.accepted).toHaveLength(good().length);
  });

  it('a rule error (partials above the total, WMO-No. 259 egg code: partials are shares of the total): refused like an imported file would be', () => {
    const bad = { ...clone(b.observations[7]!), id: 'over-1', totalConcentration: 2, categories: [{ partialConcentration: 5, stage: 'thick-first-year' as const }] };
    const doc = observationDoc(bad);
    const r = checkPulled([...good(), doc], { cruiseId: b.cruise.id, storedCruise: null });
    expect(r.refused.map((x) => x.docId)).toEqual([doc._id]);
    expect(r.refused[0]!.reason).toMatch(/add up to 5\/10, more than the total 2/);
  });

  it('foreign, unknown, newer, prototype-key, deeply nested and non-object documents', () => {
    const other = observationDoc({ ...clone(b.observations[0]!), cruiseId: 'other-cruise' });
    let deep: unknown = 1;
    for (let i = 0; i < 200_000; i++) deep = [deep];
    const proto = JSON.parse(`{"_id":"x","type":"floe-ledger/observation","cruiseId":${JSON.stringify(b.cruise.id)},"formatVersion":1,"body":{"__proto__":{"polluted":true},"id":"a","revision":1}}`) as unknown;
    const protoDoc = clone(observationDoc(clone(b.observations[1]!)));
    (protoDoc.body as unknown as Record<string, unknown>)['constructor'] = { prototype: { polluted: true } };
    const fixedProto = { ...protoDoc, _id: observationDoc(protoDoc.body as never)._id };
    const newer = { ...observationDoc({ ...clone(b.observations[2]!), notes: 'from a newer laptop' }), formatVersion: 99 };
    const r = checkPulled(
      [...good(), other, { _id: 'weird', type: 'something-else', cruiseId: b.cruise.id }, newer, proto, { _id: 'deep', type: 'floe-ledger/observation', cruiseId: b.cruise.id, formatVersion: 1, body: { deep } }, 'text', null, { _id: '_design/x' }, { _id: 'gone', _deleted: true }, fixedProto],
      { cruiseId: b.cruise.id, storedCruise: null },
    );
    const reasons = Object.fromEntries(r.refused.map((x) => [x.docId, x.reason]));
    expect(reasons[other._id]).toMatch(/belongs to cruise "other-cruise"/);
    expect(reasons.weird).toMatch(/not one this program writes/);
    expect(reasons[newer._id]).toMatch(/newer Floe Ledger/);
    expect(reasons.x).toMatch(/the key "__proto__" is not allowed/);
    expect(reasons.deep).toMatch(/deep|no observation id/);
    expect(r.refused.filter((x) => x.docId === '?')).toHaveLength(2);
    expect(r.ignored).toEqual(['_design/x', 'gone']);
    expect(Object.keys(reasons)).toContain(fixedProto._id);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(r.bundle!.observations).toHaveLength(b.observations.length);
  });

  it('a track point outside its hour, and a broken cruise record', () => {
    const hourDoc = trackDoc(b.cruise.id, '2026-03-09T00', [{ ...b.track[0]!, time: '2026-03-09T01:30:00Z' }]);
    const badCruise = cruiseDoc({ ...b.cruise, intervalMinutes: -5, updatedAt: '2026-03-10T00:00:00Z' });
    const r = checkPulled([...good(), hourDoc, badCruise], { cruiseId: b.cruise.id, storedCruise: null });
    const reasons = Object.fromEntries(r.refused.map((x) => [x.docId, x.reason]));
    expect(reasons[hourDoc._id]).toMatch(/not in the hour/);
    expect(reasons[badCruise._id]).toMatch(/intervalMinutes/);
    expect(r.bundle!.cruise).toEqual(b.cruise);
  });
});
