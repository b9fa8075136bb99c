// Sync with the embedded ship server (PouchDB Server on a free loopback port, started here):
//   a new laptop receiving a whole cruise (50,000 observations, 1,000,000 track points) from the
//   server into an empty store, vs importing the same cruise from its log file into an empty
//   store (read, schema, rules, merge, apply)                                     target <= 2x
//   one observation sent by another laptop until it is in this laptop's store (its pull loop's
//   long poll, the checks, the merge), median of 20                              target < 1000 ms
//   a new laptop receiving a cruise's photos (1,000 of 200 kB at full size: each description
//   read with its observation, each image fetched and checked against its id) vs importing the
//   zip archive that holds them                                                 target <= 2x
// Both stores are fake-indexeddb in Node, as in exchange.bench.ts. FLOE_BENCH_SCALE shrinks the cruise.
import 'fake-indexeddb/auto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { applyMergePlan, closeFloeDb, countTrackPoints, getDb, getObservation, loadMergeTarget, openFloeDb, selectDatabase } from '../../../src/db';
import type { Observation } from '../../../src/domain/model';
import { writeArchive } from '../../../src/format/archive';
import { readArchive } from '../../../src/format/archiveRead';
import { exportLogJson } from '../../../src/format/encode';
import type { LogBundle, PhotoBytes } from '../../../src/format/types';
import { planMerge } from '../../../src/format/merge';
import { readLogText } from '../../../src/format/read';
import { CouchClient } from '../../../src/sync/couch';
import { observationDoc } from '../../../src/sync/documents';
import { SyncEngine } from '../../../src/sync/engine';
import { pushBundle } from '../../../src/sync/fileSync';
import { cruiseDatabaseName } from '../../../src/sync/ids';
import { pullStore } from '../../../src/sync/storeSync';
import { startShipServer } from '../../../server/shipServer';
import { absoluteRow, median, ratioRow, type BenchRow, type BenchSuite } from '../bench-kit';
import { bigCruise } from '../bigCruise';

const SCALE = Number(process.env.FLOE_BENCH_SCALE ?? '1');
const OBSERVATIONS = Math.round(50_000 * SCALE);
const TRACK_POINTS = Math.round(1_000_000 * SCALE);
const PHOTOS = Math.max(10, Math.round(1_000 * SCALE));
const PHOTO_BYTES = 200 * 1024;

/** A cruise of its own with one photo per observation: invented bytes behind a JPEG marker. */
function photoCruise(): { bundle: LogBundle; bytes: PhotoBytes } {
  const base = bigCruise(PHOTOS, 0);
  const id = `${base.cruise.id}-photos`;
  const bytes: PhotoBytes = new Map();
  const observations = base.observations.map((o, i) => {
    const pid = `photo-${i}`;
    const b = new Uint8Array(PHOTO_BYTES);
    b.set([0xff, 0xd8, 0xff, 0xe0]);
    for (let k = 4; k < b.length; k++) b[k] = (k * 131 + i * 17) & 0xff;
    bytes.set(pid, b);
    return { ...o, cruiseId: id, photoIds: [pid] };
  });
  const photos = observations.map((o, i) => ({ id: `photo-${i}`, observationId: o.id, fileName: `floe-${i}.jpg`, mediaType: 'image/jpeg', byteLength: PHOTO_BYTES, addedAt: o.savedAt }));
  return { bundle: { ...base, cruise: { ...base.cruise, id }, observations, photos }, bytes };
}

let n = 0;
async function freshStore() {
  closeFloeDb();
  selectDatabase(`floe-sync-bench-${process.pid}-${++n}`);
  await openFloeDb();
}
async function dropStore() {
  const name = getDb().name;
  closeFloeDb();
  await new Promise<void>((ok) => {
    const req = indexedDB.deleteDatabase(name);
    req.onsuccess = req.onerror = req.onblocked = () => ok();
  });
}

export const suite: BenchSuite = {
  name: 'sync with the embedded ship server',
  async run() {
    const rows: BenchRow[] = [];
    const dir = mkdtempSync(join(tmpdir(), 'floe-sync-bench-'));
    const server = await startShipServer({ dir });
    try {
      const bundle = bigCruise(OBSERVATIONS, TRACK_POINTS);
      const client = new CouchClient({ url: server.url, cookies: 'manual', timeoutMs: 600_000 });
      let t = performance.now();
      const pushed = await pushBundle(client, bundle);
      console.log(`sync bench: ${pushed.total} documents put on the server in ${((performance.now() - t) / 1000).toFixed(1)} s`);
      const text = exportLogJson(bundle).join('');

      // Interleaved: import, then receive, each into an empty store.
      await freshStore();
      t = performance.now();
      const r = readLogText(text);
      if (!r.ok) throw new Error('the benchmark log was rejected');
      await applyMergePlan(planMerge(await loadMergeTarget(r.bundle.cruise.id), r.bundle), { source: 'bench.json' });
      const importMs = performance.now() - t;
      await dropStore();

      await freshStore();
      t = performance.now();
      const got = await pullStore({ client, cruiseId: bundle.cruise.id, deviceId: 'bench-new-laptop' });
      const receiveMs = performance.now() - t;
      if (got.refused.length || (await countTrackPoints(bundle.cruise.id)) !== bundle.track.length) throw new Error('the new laptop did not receive the whole cruise');
      rows.push(ratioRow(`new laptop receives ${bundle.observations.length} observations + ${bundle.track.length} track points vs import of the log file`, receiveMs, importMs, 'ms', 2));

      // One save made elsewhere, until it is in this store; the engine runs as in the app.
      const engine = new SyncEngine({ client: new CouchClient({ url: server.url, cookies: 'manual' }), cruiseId: bundle.cruise.id, deviceId: 'bench-laptop-b', longPollMs: 10_000, pollMs: 60_000 });
      engine.start();
      while (engine.status.phase !== 'synced') await new Promise((ok) => setTimeout(ok, 20));
      const base = bundle.observations[0] as Observation;
      const lat: number[] = [];
      for (let i = 0; i < 20; i++) {
        const o: Observation = { ...base, id: `elsewhere-${i}`, time: new Date(Date.parse('2030-01-01T00:00:00Z') + i * 3_600_000).toISOString().replace('.000Z', 'Z'), deviceId: 'laptop-a' };
        const t0 = performance.now();
        await client.bulkDocs(cruiseDatabaseName(bundle.cruise.id), [observationDoc(o)]);
        while (!(await getObservation(o.id))) await new Promise((ok) => setTimeout(ok, 5));
        lat.push(performance.now() - t0);
      }
      await engine.stop();
      await dropStore();
      rows.push(absoluteRow('one observation from another laptop visible here (median of 20)', median(lat), 'ms', 1000));

      // Photos: the zip archive imported, then the same cruise received, each into an empty store.
      const pc = photoCruise();
      await pushBundle(client, pc.bundle, undefined, pc.bytes);
      const zip = writeArchive(pc.bundle, pc.bytes);
      await freshStore();
      t = performance.now();
      const zr = readArchive(zip);
      if (!zr.ok) throw new Error('the benchmark archive was rejected');
      await applyMergePlan(planMerge(await loadMergeTarget(zr.bundle.cruise.id), zr.bundle), { source: 'bench.zip', photos: zr.photos });
      const zipMs = performance.now() - t;
      await dropStore();
      await freshStore();
      t = performance.now();
      const gotPhotos = await pullStore({ client, cruiseId: pc.bundle.cruise.id, deviceId: 'bench-photo-laptop' });
      const photoMs = performance.now() - t;
      if (gotPhotos.refused.length || (await getDb().photos.count()) !== PHOTOS) throw new Error('the new laptop did not receive every photo');
      await dropStore();
      rows.push(ratioRow(`new laptop receives ${PHOTOS} observations with a ${PHOTO_BYTES / 1024} kB photo each vs import of the zip archive`, photoMs, zipMs, 'ms', 2));
    } finally {
      await server.stop();
      rmSync(dir, { recursive: true, force: true });
    }
    return rows;
  },
};
