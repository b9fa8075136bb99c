// Photos through the embedded ship server (PouchDB Server on a free loopback port, started and
// stopped here): each photo is one document with the image attached; a photo saved on laptop A
// arrives on laptop B byte for byte; an image altered on the server, one larger than its
// description or the format's limit, one of another type, or one whose observation is unknown is
// refused with its reason and never reaches B's store.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyMergePlan, attachPhoto, getPhoto, getSyncState, listPhotos, loadMergeTarget, readCruiseExport, saveObservation, selectDatabase } from '../../src/db';
import { LIMITS } from '../../src/format/limits';
import { CouchClient } from '../../src/sync/couch';
import type { PhotoDoc } from '../../src/sync/documents';
import { pullBundle, pushBundle } from '../../src/sync/fileSync';
import { cruiseDatabaseName, digest, digestBytes, PHOTO_ATTACHMENT, photoDocId } from '../../src/sync/ids';
import { photoDoc, toBase64 } from '../../src/sync/photos';
import { outbox, pullStore, pushStore, type SyncTarget } from '../../src/sync/storeSync';
import { canonicalJson, planMerge } from '../../src/format/merge';
import { startShipServer, type ShipServer } from '../../server/shipServer';
import { freshDatabasePerTest, makeCruise, makeObservation } from '../db/helpers';

const dbs = freshDatabasePerTest();

let server: ShipServer;
let dir: string;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'floe-ship-photos-'));
  server = await startShipServer({ dir });
});
afterAll(async () => {
  await server?.stop();
  rmSync(dir, { recursive: true, force: true });
});

/** A small image of our own: the JPEG start-of-image marker, then varied bytes. */
function image(n: number, seed = 1): Uint8Array {
  const b = new Uint8Array(n);
  b.set([0xff, 0xd8, 0xff, 0xe0]);
  for (let i = 4; i < n; i++) b[i] = (i * 31 + seed * 7) & 0xff;
  return b;
}

const target = (cruiseId: string, deviceId: string): SyncTarget => ({ client: new CouchClient({ url: server.url }), cruiseId, deviceId });
const LATER = Date.parse('2027-01-01T00:00:00Z');

/** Laptop A (the test's own database): a cruise, an observation with a photo, sent to the server. */
async function laptopA(bytes: Uint8Array) {
  const cruise = await makeCruise({ id: `cr-${crypto.randomUUID().slice(0, 8)}` });
  const obs = (await saveObservation(makeObservation(cruise.id), { savedBy: 'obs-ak' })).observation;
  const meta = await attachPhoto({ observationId: obs.id, cruiseId: cruise.id, blob: new Blob([bytes as Uint8Array<ArrayBuffer>], { type: 'image/jpeg' }), fileName: 'ridge-field.jpg', takenAt: '2026-02-10T06:02:00Z' }, { expectedRevision: 1, savedBy: 'obs-ak' });
  const t = target(cruise.id, 'laptop-a');
  return { cruise, obs, meta, t };
}

/** Switches to laptop B's own empty database (the test's database stays A's). */
function laptopB(): () => void {
  const a = dbs.name();
  selectDatabase(`${a}-b`);
  return () => selectDatabase(a);
}

describe('photos as attachments', { timeout: 60_000 }, () => {
  it('a photo saved on A arrives on B byte-identical, as one document with the image attached; sending again sends nothing', async () => {
    const bytes = image(300_000);
    const { cruise, meta, t } = await laptopA(bytes);
    const box = await outbox(t, new Map(), LATER);
    expect(box.photos.map((p) => p.id)).toEqual([meta.id]);
    const pushed = await pushStore(t, box);
    expect(pushed.rejected).toEqual([]);
    expect((await outbox(t, new Map(), LATER)).photos).toEqual([]);

    // On the server: one photo document, its id naming the photo and the digests, the image attached.
    const client = new CouchClient({ url: server.url, cookies: 'manual' });
    const db = cruiseDatabaseName(cruise.id);
    const feed = await client.changes(db, { since: '0', limit: 100, includeDocs: true });
    const docs = feed.results.map((r) => r.doc as PhotoDoc).filter((d) => d.type === 'floe-ledger/photo');
    expect(docs).toHaveLength(1);
    const doc = docs[0]!;
    expect(doc._id).toBe(photoDocId(meta.id, digest(canonicalJson(doc.body)), digestBytes(bytes)));
    expect(doc._attachments?.[PHOTO_ATTACHMENT]).toMatchObject({ content_type: 'image/jpeg', stub: true });
    const served = await client.attachment(db, doc._id, PHOTO_ATTACHMENT, LIMITS.maxPhotoBytes);
    expect(served.bytes).toEqual(bytes);

    const back = laptopB();
    try {
      const r = await pullStore(target(cruise.id, 'laptop-b'));
      expect(r.refused).toEqual([]);
      const got = await getPhoto(meta.id);
      expect(got).toMatchObject({ observationId: meta.observationId, fileName: 'ridge-field.jpg', mimeType: 'image/jpeg', sizeBytes: bytes.length, takenAt: '2026-02-10T06:02:00Z' });
      expect(new Uint8Array(await got!.blob.arrayBuffer())).toEqual(bytes);
      const log = (await readCruiseExport(cruise.id)).bundle;
      expect(log.observations[0]!.photoIds).toEqual([meta.id]);
      // B holds it and its mark: B's outbox sends nothing back.
      expect((await outbox(target(cruise.id, 'laptop-b'), new Map(), LATER)).photos).toEqual([]);
    } finally {
      back();
    }
  });

  it('a photo whose id holds ":" (the format allows it) is sent once', async () => {
    const cruise = await makeCruise({ id: `cr-${crypto.randomUUID().slice(0, 8)}` });
    const obs = (await saveObservation(makeObservation(cruise.id), { savedBy: 'obs-ak' })).observation;
    const bytes = image(500, 6);
    const meta = { id: 'cam:2026:0001', observationId: obs.id, fileName: 'c.jpg', mediaType: 'image/jpeg', byteLength: bytes.length, addedAt: '2026-02-10T06:05:00Z' };
    // Stored as an import of an archive stores it, then named by a saved version.
    const b = (await readCruiseExport(cruise.id)).bundle;
    await applyMergePlan(planMerge(await loadMergeTarget(cruise.id), { ...b, photos: [meta] }), { source: 'x.zip', photos: new Map([[meta.id, bytes]]) });
    const t = target(cruise.id, 'laptop-a');
    await saveObservation({ ...obs, photoIds: [meta.id] }, { expectedRevision: 1, savedBy: 'obs-ak' });
    expect((await outbox(t, new Map(), LATER)).photos.map((p) => p.id)).toEqual([meta.id]);
    await pushStore(t, await outbox(t, new Map(), LATER));
    expect((await outbox(t, new Map(), LATER)).photos).toEqual([]);
  });

  it('a photo of an entry still being typed waits until the entry is saved with it', async () => {
    const cruise = await makeCruise({ id: `cr-${crypto.randomUUID().slice(0, 8)}` });
    const draft = makeObservation(cruise.id);
    const meta = await attachPhoto({ observationId: draft.id, cruiseId: cruise.id, blob: new Blob([image(100) as Uint8Array<ArrayBuffer>], { type: 'image/jpeg' }), fileName: 'x.jpg' });
    const t = target(cruise.id, 'laptop-a');
    expect((await outbox(t, new Map(), LATER)).photos).toEqual([]);
    await saveObservation({ ...draft, photoIds: [meta.id] }, { savedBy: 'obs-ak' });
    expect((await outbox(t, new Map(), LATER)).photos.map((p) => p.id)).toEqual([meta.id]);
  });

  it('altered, oversized, mistyped or orphaned photos on the server are refused with a reason; the rest arrive', async () => {
    const good = image(2000, 2);
    const { cruise, obs, meta, t } = await laptopA(good);
    await pushStore(t, await outbox(t, new Map(), LATER));
    const client = new CouchClient({ url: server.url, cookies: 'manual' });
    const db = cruiseDatabaseName(cruise.id);
    const fileMeta = (await readCruiseExport(cruise.id)).bundle.photos[0]!;
    const hostile = (id: string, over: Partial<typeof fileMeta>, bytes: Uint8Array, contentType = 'image/jpeg'): PhotoDoc => {
      const d = photoDoc(cruise.id, { ...fileMeta, id, ...over }, bytes);
      return { ...d, _attachments: { [PHOTO_ATTACHMENT]: { content_type: contentType, data: toBase64(bytes) } } };
    };
    const small = image(1000, 3);
    // Bytes changed after the id was made: the image no longer matches the digest in the id.
    const altered = photoDoc(cruise.id, { ...fileMeta, id: 'p-altered', byteLength: small.length }, small);
    const tampered = image(1000, 4);
    altered._attachments = { [PHOTO_ATTACHMENT]: { content_type: 'image/jpeg', data: toBase64(tampered) } };
    // The description says 1,000 bytes; 5,000 are attached (the id is made over the real bytes).
    const big = image(5000, 5);
    const larger = photoDoc(cruise.id, { ...fileMeta, id: 'p-larger', byteLength: 1000 }, big);
    // Over the format's limit for one photo (LIMITS.maxPhotoBytes, 50 MiB): refused by the description alone.
    const overLimit = photoDoc(cruise.id, { ...fileMeta, id: 'p-limit', byteLength: LIMITS.maxPhotoBytes + 1 }, small);
    // Not an image type the format allows.
    const script = hostile('p-type', { mediaType: 'text/html', byteLength: small.length }, small, 'text/html');
    // An attachment of another type than the description.
    const mismatch = hostile('p-mismatch', { byteLength: small.length }, small, 'image/png');
    // A photo of an observation nobody has.
    const orphan = hostile('p-orphan', { observationId: 'no-such-entry', byteLength: small.length }, small);
    // And one good second photo of the same observation.
    const second = photoDoc(cruise.id, { ...fileMeta, id: 'p-second', byteLength: small.length }, small);
    const res = await client.bulkDocs(db, [altered, larger, overLimit, script, mismatch, orphan, second]);
    expect(res.every((x) => x.ok)).toBe(true);

    const back = laptopB();
    try {
      const r = await pullStore(target(cruise.id, 'laptop-b'));
      const why = new Map(r.refused.map((x) => [x.docId.split(':')[1], x.reason]));
      expect(why.get('p-altered')).toMatch(/altered on the server/);
      expect(why.get('p-larger')).toMatch(/larger than the 1000 bytes|has 5000 bytes, the description says 1000/);
      expect(why.get('p-limit')).toMatch(new RegExp(`byteLength.*${LIMITS.maxPhotoBytes}`));
      expect(why.get('p-type')).toMatch(/mediaType/);
      expect(why.get('p-mismatch')).toMatch(/of type "image\/png", the description says "image\/jpeg"/);
      expect(why.get('p-orphan')).toMatch(/observation "no-such-entry", which is not in this laptop's log/);
      expect(why.size).toBe(6);
      // Only the good ones reached the store; the refusals are kept for Settings.
      expect((await listPhotos(obs.id)).map((p) => p.id).sort()).toEqual([meta.id, 'p-second'].sort());
      expect(new Uint8Array(await (await getPhoto('p-second'))!.blob.arrayBuffer())).toEqual(small);
      const state = await getSyncState(target(cruise.id, 'laptop-b').client.dbUrl(db));
      expect(state!.refused.map((x) => x.docId.split(':')[1]).sort()).toEqual(['p-altered', 'p-larger', 'p-limit', 'p-mismatch', 'p-orphan', 'p-type']);
    } finally {
      back();
    }
  });

  it('the command line carries photos between a zip archive and the server (pushBundle, pullBundle)', async () => {
    const bytes = image(4096, 9);
    const { cruise } = await laptopA(bytes);
    const exp = await readCruiseExport(cruise.id, { photoBytes: true });
    const client = new CouchClient({ url: server.url, cookies: 'manual' });
    const r = await pushBundle(client, exp.bundle, undefined, exp.photos);
    expect(r.rejected).toEqual([]);
    // Without the bytes (a JSON log), no photo document is made.
    expect(r.total).toBe((await pushBundle(client, exp.bundle)).total + 1);
    const pulled = await pullBundle(client, cruise.id);
    expect(pulled.refused).toEqual([]);
    expect(pulled.bundle!.photos).toEqual(exp.bundle.photos);
    expect(pulled.photos.get(exp.bundle.photos[0]!.id)).toEqual(bytes);
  });
});
