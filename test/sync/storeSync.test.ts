// The store's sync against a real embedded ship server (PouchDB Server on a free loopback port,
// started and stopped here): push, pull, conflicts, refusals, and the checkpoint across a SIGKILL.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addTrackPoints, getSyncState, listConflicts, readCruiseExport, revisionsOnServer, saveObservation } from '../../src/db';
import type { Observation, TrackPoint } from '../../src/domain/model';
import { canonicalJson } from '../../src/format/merge';
import type { LogBundle } from '../../src/format/types';
import { CouchClient } from '../../src/sync/couch';
import { observationDoc } from '../../src/sync/documents';
import { pullBundle, pushBundle } from '../../src/sync/fileSync';
import { checkpointDocId, cruiseDatabaseName } from '../../src/sync/ids';
import { outbox, pullStore, pushStore, targetKey, type SyncTarget } from '../../src/sync/storeSync';
import { startShipServer, type ShipServer } from '../../server/shipServer';
import { freshDatabasePerTest, makeCruise, makeObservation } from '../db/helpers';

freshDatabasePerTest();

let server: ShipServer;
let dir: string;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'floe-ship-'));
  server = await startShipServer({ dir });
});
afterAll(async () => {
  await server?.stop();
  rmSync(dir, { recursive: true, force: true });
});

const sorted = (xs: readonly object[]) => xs.map(canonicalJson).sort();
function same(a: LogBundle, b: LogBundle) {
  expect(canonicalJson(a.cruise)).toBe(canonicalJson(b.cruise));
  expect(sorted(a.observations)).toEqual(sorted(b.observations));
  expect(sorted(a.history)).toEqual(sorted(b.history));
  expect(sorted(a.conflicts)).toEqual(sorted(b.conflicts));
  expect(sorted(a.track)).toEqual(sorted(b.track));
}

function track(cruiseId: string, hours: number): TrackPoint[] {
  const out: TrackPoint[] = [];
  const t0 = Date.parse('2026-02-10T00:00:00Z');
  for (let i = 0; i < hours * 60; i++) out.push({ cruiseId, time: new Date(t0 + i * 60_000).toISOString().replace('.000Z', 'Z'), lat: -70 - i * 1e-4, lon: -12 + i * 1e-4, source: 'gps-serial' });
  return out;
}

async function laptopWithLog(n = 5): Promise<{ cruiseId: string; obs: Observation[] }> {
  const cruise = await makeCruise({ id: `cr-${crypto.randomUUID().slice(0, 8)}` });
  const obs: Observation[] = [];
  for (let i = 0; i < n; i++) obs.push((await saveObservation(makeObservation(cruise.id, { time: `2026-02-10T0${i}:00:00Z` }), { savedBy: 'obs-ak' })).observation);
  obs[0] = (await saveObservation({ ...obs[0]!, notes: 'edited' }, { expectedRevision: 1, savedBy: 'obs-ak' })).observation;
  await addTrackPoints(track(cruise.id, 3));
  return { cruiseId: cruise.id, obs };
}

const target = (cruiseId: string, deviceId = 'laptop-a'): SyncTarget => ({ client: new CouchClient({ url: server.url }), cruiseId, deviceId });

describe('store sync with the embedded ship server', () => {
  it('push sends everything once; the server copy read back is the laptop\'s log', async () => {
    const { cruiseId } = await laptopWithLog();
    const t = target(cruiseId);
    const box = await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z'));
    // 1 cruise record + 5 observations + 1 earlier revision + 3 track hours.
    expect(box.docs.map((d) => d.type.split('/')[1])).toEqual(['cruise', ...Array(6).fill('observation'), 'track', 'track', 'track']);
    const r = await pushStore(t, box);
    expect(r).toEqual({ sent: 10, rejected: [] });
    expect((await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z'))).docs).toEqual([]);
    const pulled = await pullBundle(new CouchClient({ url: server.url }), cruiseId);
    expect(pulled.refused).toEqual([]);
    same(pulled.bundle!, (await readCruiseExport(cruiseId)).bundle);
    expect([...(await revisionsOnServer(targetKey(t), cruiseId)).values()].sort()).toEqual([1, 1, 1, 1, 2]);
  });

  it('pull brings another laptop\'s saves and edits, and a same-revision edit made apart is a conflict kept on both', async () => {
    const { cruiseId, obs } = await laptopWithLog(3);
    const t = target(cruiseId);
    await pushStore(t, await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z')));
    const client = new CouchClient({ url: server.url });
    const other = (await pullBundle(client, cruiseId)).bundle!;
    // Laptop B, apart: a new observation, and its own edit of revision 1 of obs[1] as revision 2.
    const fresh: Observation = { ...obs[2]!, id: 'from-b-1', time: '2026-02-10T05:00:00Z', deviceId: 'laptop-b', notes: 'from B' };
    const theirs: Observation = { ...obs[1]!, revision: 2, notes: 'B says open water to the east', savedAt: '2026-02-10T06:30:00Z', deviceId: 'laptop-b' };
    await pushBundle(client, { ...other, observations: [...other.observations.filter((o) => o.id !== obs[1]!.id), fresh, theirs], history: [...other.history, obs[1]!] });
    // Laptop A edits the same revision its own way meanwhile.
    const mine = (await saveObservation({ ...obs[1]!, notes: 'A says ridges to the east' }, { expectedRevision: 1, savedBy: 'obs-ak' })).observation;
    const r = await pullStore(t);
    expect(r.refused).toEqual([]);
    expect(r.conflicts).toBe(1);
    const log = (await readCruiseExport(cruiseId)).bundle;
    expect(log.observations.find((o) => o.id === 'from-b-1')?.notes).toBe('from B');
    expect(log.observations.find((o) => o.id === mine.id)?.notes).toBe('A says ridges to the east');
    expect((await listConflicts(cruiseId)).map((c) => c.observation.notes)).toEqual(['B says open water to the east']);
    // A's edit goes up too; the server then holds both versions as separate documents.
    await pushStore(t, await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z')));
    const shore = (await pullBundle(client, cruiseId)).bundle!;
    const both = [...shore.observations, ...shore.conflicts].filter((o) => o.id === mine.id && o.revision === 2).map((o) => o.notes).sort();
    expect(both).toEqual(['A says ridges to the east', 'B says open water to the east']);
  });

  it('an edit made on another laptop arrives as the newer revision, not as a conflict with the one it replaced', async () => {
    const { cruiseId, obs } = await laptopWithLog(2);
    const t = target(cruiseId);
    await pushStore(t, await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z')));
    // Caught up: the next page holds only what comes after.
    await pullStore(t);
    // Laptop B edits obs[1] (revision 1, which the server holds) and sends only its revision 2.
    const theirs: Observation = { ...obs[1]!, revision: 2, notes: 'B: the lead closed', savedAt: '2026-02-10T07:30:00Z', deviceId: 'laptop-b' };
    const client = new CouchClient({ url: server.url });
    await client.bulkDocs(cruiseDatabaseName(cruiseId), [observationDoc(theirs)]);
    const r = await pullStore(t);
    expect(r.refused).toEqual([]);
    expect(r.conflicts).toBe(0);
    const log = (await readCruiseExport(cruiseId)).bundle;
    expect(log.observations.find((o) => o.id === obs[1]!.id)).toEqual(theirs);
    expect(log.history.filter((o) => o.id === obs[1]!.id).map((o) => o.revision)).toEqual([1]);
    expect(await listConflicts(cruiseId)).toEqual([]);
    // A shore copy read page by page (pullBundle) judges it the same way.
    const shore = (await pullBundle(client, cruiseId)).bundle!;
    expect(shore.observations.find((o) => o.id === obs[1]!.id)?.notes).toBe('B: the lead closed');
    expect(shore.conflicts).toEqual([]);
  });

  it('a hostile or altered document on the server is refused with its reason and never reaches the log', async () => {
    const { cruiseId, obs } = await laptopWithLog(2);
    const t = target(cruiseId);
    await pushStore(t, await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z')));
    const client = new CouchClient({ url: server.url });
    const db = cruiseDatabaseName(cruiseId);
    const altered = observationDoc({ ...obs[1]!, id: 'x-1', notes: 'fine' });
    (altered.body as { notes: string }).notes = 'changed after naming';
    const bad = observationDoc({ ...obs[1]!, id: 'x-2', totalConcentration: 12 as never });
    await client.bulkDocs(db, [altered, bad, { _id: 'junk', type: 'floe-ledger/observation', cruiseId, formatVersion: 1, body: { __proto__x: 1 } }]);
    const before = (await readCruiseExport(cruiseId)).bundle;
    const r = await pullStore(t);
    expect(r.refused.map((x) => x.docId).sort()).toEqual([altered._id, bad._id, 'junk'].sort());
    expect(r.refused.find((x) => x.docId === bad._id)?.reason).toMatch(/above the largest allowed value 10/);
    same((await readCruiseExport(cruiseId)).bundle, before);
    const state = await getSyncState(targetKey(t));
    expect(state?.refused.map((x) => x.docId).sort()).toEqual([altered._id, bad._id, 'junk'].sort());
  });

  it('the checkpoint: a second pull takes nothing; after a SIGKILL and restart it resumes where it stood', async () => {
    const { cruiseId } = await laptopWithLog(2);
    const t = target(cruiseId);
    await pushStore(t, await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z')));
    const first = await pullStore(t);
    expect(first.caughtUp).toBe(true);
    const state = await getSyncState(targetKey(t));
    const remote = await t.client.getLocal(cruiseDatabaseName(cruiseId), checkpointDocId('laptop-a'));
    expect(remote?.since).toBe(state?.since);
    expect((await pullStore(t)).accepted).toBe(0);
    await server.kill();
    await expect(pullStore(t)).rejects.toMatchObject({ kind: 'offline' });
    server = await startShipServer({ dir, port: server.port });
    const again = await pullStore(t);
    expect(again.accepted).toBe(0);
    expect((await getSyncState(targetKey(t)))?.since).toBe(state?.since);
  });

  it('a replaced server (same address, empty database): the laptop notices and sends everything again', async () => {
    const { cruiseId } = await laptopWithLog(2);
    const t = target(cruiseId);
    await pushStore(t, await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z')));
    await pullStore(t);
    await t.client.request('DELETE', cruiseDatabaseName(cruiseId));
    await pullStore(t);
    const r = await pushStore(t, await outbox(t, new Map(), Date.parse('2026-03-01T00:00:00Z')));
    expect(r.sent).toBe(7);
    same((await pullBundle(t.client, cruiseId)).bundle!, (await readCruiseExport(cruiseId)).bundle);
  });
});
