import { afterEach, describe, expect, it, vi } from 'vitest';
import type { TrackPoint } from '../../src/domain/model';
import {
  addTrackPoints,
  attachPhoto,
  BulkWriteInterruptedError,
  countTrackPoints,
  getDb,
  getObservation,
  getPhoto,
  InvalidRecordError,
  listPhotos,
  listTrackPoints,
  observationHistory,
  ObservationConflictError,
  removePhoto,
  requestPersistence,
  saveObservation,
  selectDatabase,
  StorageFullError,
  storageStatus,
  trackPointAtOrBefore,
} from '../../src/db';
import { freshDatabasePerTest, makeCruise, makeObservation, quotaFailure } from './helpers';

const db = freshDatabasePerTest();

function track(cruiseId: string, n: number, startMs = Date.UTC(2026, 1, 10, 0, 0, 0)): TrackPoint[] {
  return Array.from({ length: n }, (_, i) => ({
    cruiseId,
    time: new Date(startMs + i * 1000).toISOString().replace('.000Z', 'Z'),
    lat: -70 + i * 1e-5,
    lon: -12 + i * 1e-5,
    source: 'gps-serial' as const,
    sogKn: 6.5,
  }));
}

describe('track points', () => {
  it('adds points in batches with progress, and lists them in time order per cruise', async () => {
    const pts = track('c1', 2_500);
    const progress: number[] = [];
    const res = await addTrackPoints([...pts].reverse(), { chunkSize: 1_000, onProgress: (n, total) => progress.push(n / total) });
    expect(res).toEqual({ written: 2_500, batches: 3 });
    expect(progress).toEqual([0.4, 0.8, 1]);
    await addTrackPoints(track('c2', 10));
    expect(await countTrackPoints('c1')).toBe(2_500);
    expect(await listTrackPoints('c1', { limit: 2 })).toEqual(pts.slice(0, 2));
    expect(await listTrackPoints('c1', { from: pts[10]?.time, to: pts[12]?.time })).toEqual(pts.slice(10, 13));
    expect(await trackPointAtOrBefore('c1', '2026-02-10T00:00:05Z')).toEqual(pts[5]);
    expect(await trackPointAtOrBefore('c1', '2026-02-09T23:59:59Z')).toBeUndefined();
  });

  it('re-adding the same fixes replaces them instead of duplicating', async () => {
    await addTrackPoints(track('c1', 100));
    await addTrackPoints(track('c1', 100).map((p) => ({ ...p, sogKn: 7 })));
    const all = await listTrackPoints('c1');
    expect(all).toHaveLength(100);
    expect(all.every((p) => p.sogKn === 7)).toBe(true);
  });

  it('a bad point anywhere writes nothing and names its index', async () => {
    const pts = track('c1', 5_000);
    pts[4_321] = { ...(pts[4_321] as TrackPoint), lat: 91 };
    const err = await addTrackPoints(pts, { chunkSize: 1_000 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InvalidRecordError);
    expect((err as InvalidRecordError).path).toBe('points.4321.lat');
    expect(await countTrackPoints('c1')).toBe(0);
  });

  it('a batch that fails is absent in full; the batches before it are present in full', async () => {
    let batch = 0;
    selectDatabase(db.name()).use(quotaFailure((table) => table === 'trackChunks' && ++batch === 3));
    const pts = track('c1', 4_500);
    const err = await addTrackPoints(pts, { chunkSize: 1_000 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(BulkWriteInterruptedError);
    const e = err as BulkWriteInterruptedError;
    expect(e.committedRows).toBe(2_000);
    expect(e.totalRows).toBe(4_500);
    expect(e.reason).toBeInstanceOf(StorageFullError);
    expect(e.message).toContain('2000 of 4500');
    expect(await listTrackPoints('c1')).toEqual(pts.slice(0, 2_000));
  });
});

describe('photos', () => {
  const jpeg = () => new Blob([new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3])], { type: 'image/jpeg' });

  it('stores a photo for an observation being typed, returns its metadata, and reads the bytes back', async () => {
    const meta = await attachPhoto({ observationId: 'o1', cruiseId: 'c1', blob: jpeg(), fileName: 'ridge.jpg', takenAt: '2026-02-10T06:01:00Z' });
    expect(meta).toMatchObject({ observationId: 'o1', fileName: 'ridge.jpg', mimeType: 'image/jpeg', sizeBytes: 7, takenAt: '2026-02-10T06:01:00Z' });
    expect('blob' in meta).toBe(false);
    const stored = await getPhoto(meta.id);
    expect(new Uint8Array(await (stored?.blob as Blob).arrayBuffer())).toEqual(new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3]));
    expect((await listPhotos('o1')).map((p) => p.id)).toEqual([meta.id]);
    // Not yet referenced by any saved version: removing deletes the bytes.
    expect(await removePhoto(meta.id)).toEqual({ deletedBytes: true });
    expect(await getPhoto(meta.id)).toBeUndefined();
  });

  it('attaching to a saved observation is one edit: photo stored and id added as a new revision', async () => {
    const cruise = await makeCruise();
    const obs = (await saveObservation(makeObservation(cruise.id))).observation;
    const meta = await attachPhoto({ observationId: obs.id, cruiseId: cruise.id, blob: jpeg(), fileName: 'a.jpg' }, { expectedRevision: 1, savedBy: 'obs-ak' });
    const now = await getObservation(obs.id);
    expect(now?.photoIds).toEqual([meta.id]);
    expect(now?.revision).toBe(2);
    // A stale edit is refused and stores no photo.
    const err = await attachPhoto({ observationId: obs.id, cruiseId: cruise.id, blob: jpeg(), fileName: 'b.jpg' }, { expectedRevision: 1, savedBy: 'obs-ak' }).catch(
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(ObservationConflictError);
    expect(await listPhotos(obs.id)).toHaveLength(1);
    // Removing it from the observation keeps the bytes: revision 2 still shows the photo.
    const res = await removePhoto(meta.id, { expectedRevision: 2, savedBy: 'obs-ak' });
    expect(res.deletedBytes).toBe(false);
    expect(res.observation?.photoIds).toEqual([]);
    expect(res.observation?.revision).toBe(3);
    expect((await observationHistory(obs.id)).map((o) => o.photoIds.length)).toEqual([0, 1, 0]);
    expect(await getPhoto(meta.id)).toBeDefined();
  });

  it('refuses an empty file or a non-file', async () => {
    await expect(attachPhoto({ observationId: 'o', cruiseId: 'c', blob: new Blob([]), fileName: 'x' })).rejects.toBeInstanceOf(InvalidRecordError);
    await expect(attachPhoto({ observationId: 'o', cruiseId: 'c', blob: 'abc' as unknown as Blob, fileName: 'x' })).rejects.toBeInstanceOf(InvalidRecordError);
    expect(await getDb().photos.count()).toBe(0);
  });
});

describe('persistent storage', () => {
  afterEach(() => vi.unstubAllGlobals());

  function stubStorage(answer: boolean) {
    const state = { persisted: false, asked: 0 };
    vi.stubGlobal('navigator', {
      storage: {
        persisted: async () => state.persisted,
        persist: async () => {
          state.asked++;
          state.persisted = answer;
          return answer;
        },
        estimate: async () => ({ usage: 12_345, quota: 1_000_000 }),
      },
    });
    return state;
  }

  it('asks once per profile, keeps the answer, and reports usage and quota', async () => {
    const s = stubStorage(false);
    expect(await requestPersistence()).toBe(false);
    expect(await requestPersistence()).toBe(false);
    expect(s.asked).toBe(1);
    const st = await storageStatus();
    expect(st).toMatchObject({ supported: true, persisted: false, usageBytes: 12_345, quotaBytes: 1_000_000 });
    expect(st.request?.granted).toBe(false);
    expect(st.request?.askedAt).toMatch(/Z$/);
  });

  it('reports granted persistence', async () => {
    stubStorage(true);
    expect(await requestPersistence()).toBe(true);
    expect((await storageStatus()).persisted).toBe(true);
  });

  it('without the Storage API: unsupported, not persisted', async () => {
    vi.stubGlobal('navigator', {});
    expect(await requestPersistence()).toBe(false);
    expect(await storageStatus()).toEqual({ supported: false, persisted: false });
  });
});
