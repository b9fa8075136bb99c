// One push and one pull between this laptop's store and a cruise database on the ship server.
// The store is written only through the import path: the pulled documents are checked by the
// log reader (documents.ts), planned by the same merge rules (src/format/merge.ts) and applied
// in one transaction (applyMergePlan). Marks say which documents the server holds; the pull
// checkpoint is kept here and, as CouchDB's replicator does, in a `_local` document on the server.
import {
  applyMergePlan,
  forgetServer,
  getPhoto,
  getSyncState,
  heldOnServer,
  trackPointsOfHour,
  loadMergeTarget,
  markOnServer,
  putSyncState,
  readSyncSource,
  serverMarks,
  StaleImportError,
  type SyncMark,
  type SyncRefusal,
  type SyncStateRow,
} from '../db';
import type { Observation } from '../domain/model';
import { planMerge, planIsEmpty, type MergePlan, type MergeTarget, type StoredVersions } from '../format/merge';
import type { PhotoMeta } from '../format/types';
import { CouchClient } from './couch';
import { checkPulled, cruiseDoc, observationDoc, observationIdsOf, trackDoc, withHeldVersions, type Refusal, type SyncDoc } from './documents';
import { checkpointDocId, cruiseDatabaseName } from './ids';
import { bundleWithPhotos, fetchPhotos, photoDoc } from './photos';
import { PUSH_BATCH_BYTES, readPage, sendDocs, type SendResult } from './transfer';

export interface SyncTarget {
  client: CouchClient;
  cruiseId: string;
  /** This laptop's device id (names its checkpoint on the server). */
  deviceId: string;
}

export const targetDb = (t: SyncTarget) => cruiseDatabaseName(t.cruiseId);
/** The key of marks and state: the server database's address. */
export const targetKey = (t: SyncTarget) => t.client.dbUrl(targetDb(t));

const nowIso = () => new Date().toISOString().replace(/\.\d{3}Z$/, 'Z');
const MAX_REFUSALS_KEPT = 200;

function markOf(server: string, cruiseId: string, d: SyncDoc, at: string): SyncMark {
  if (d.type === 'floe-ledger/observation') return { server, docId: d._id, cruiseId, observationId: d.body.id, revision: d.body.revision, at };
  if (d.type === 'floe-ledger/track') return { server, docId: d._id, cruiseId, observationId: '', revision: d.body.points.length, at };
  // A photo names no observation here: the list's marks read observation documents only.
  return { server, docId: d._id, cruiseId, observationId: '', revision: 0, at };
}

// Document ids of saved versions, by what makes a version unique in the store; the digest of a
// version is computed once per session, not at every push.
const versionIdCache = new Map<string, string>();
const versionKey = (o: Observation) => `${o.cruiseId}\u0000${o.id}\u0000${o.revision}\u0000${o.savedAt}\u0000${o.deviceId}\u0000${o.deleted}`;

export interface Outbox {
  docs: SyncDoc[];
  /**
   * Photos the server does not hold yet, saved with an observation (a photo of an entry still
   * being typed waits for its save). Their documents are made at sending time, a few
   * megabytes at a time, not all in memory at once.
   */
  photos: PhotoMeta[];
  /** Hours whose points are waiting but held back until the hour ends (see TRACK_HOLD_MS). */
  heldHours: number;
}

/** Track of the running hour is sent at most this often; a finished hour at once. */
export const TRACK_HOLD_MS = 10 * 60 * 1000;

/** The stored versions of the batch's observations that the server holds (see withHeldVersions). */
async function storedOnServer(t: SyncTarget, target: MergeTarget, ids: Set<string>): Promise<Observation[]> {
  const stored = [...ids].flatMap((id) => {
    const v = target.versions(id);
    return v ? [v.current, ...v.others] : [];
  });
  if (stored.length === 0) return [];
  // Conflict copies may share a version key with other content: their ids are computed afresh.
  const docIds = stored.map((v) => observationDoc(v)._id);
  const held = await heldOnServer(targetKey(t), docIds);
  return stored.filter((_, i) => held.has(docIds[i] as string));
}

/** What the server does not hold yet: cruise record, saved versions (oldest first), track hours. */
export async function outbox(t: SyncTarget, lastTrackSend: Map<string, number> = new Map(), now = Date.now()): Promise<Outbox> {
  const key = targetKey(t);
  const [source, marks] = await Promise.all([readSyncSource(t.cruiseId), serverMarks(key, t.cruiseId)]);
  const held = new Set(marks.map((m) => m.docId));
  const docs: SyncDoc[] = [];
  if (source.cruise) {
    const c = cruiseDoc(source.cruise);
    if (!held.has(c._id)) docs.push(c);
  }
  const versions = [...source.versions].sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : a.revision - b.revision));
  for (const v of versions) {
    const k = versionKey(v);
    const known = versionIdCache.get(k);
    if (known !== undefined && held.has(known)) continue;
    const d = observationDoc(v);
    // Conflict copies may share the key with another content; cache only what the key names.
    if (known === undefined) versionIdCache.set(k, d._id);
    if (!held.has(d._id)) docs.push(d);
  }
  const sentCount = new Map<string, number>();
  for (const m of marks) {
    if (!m.docId.startsWith('track:')) continue;
    const h = m.docId.slice(6, 19);
    sentCount.set(h, Math.max(sentCount.get(h) ?? 0, m.revision));
  }
  let heldHours = 0;
  const runningHour = new Date(now).toISOString().slice(0, 13);
  for (const [hour, count] of [...source.trackHours].sort((a, b) => (a[0] < b[0] ? -1 : 1))) {
    if ((sentCount.get(hour) ?? 0) >= count) continue;
    if (hour >= runningHour && now - (lastTrackSend.get(hour) ?? 0) < TRACK_HOLD_MS) {
      heldHours++;
      continue;
    }
    // Every time of the hour starts with `HH:`, and ':' sorts right before ';'.
    const points = await trackPointsOfHour(t.cruiseId, hour);
    docs.push(trackDoc(t.cruiseId, hour, points));
    lastTrackSend.set(hour, now);
  }
  // `photo:<id>:<16 hex>-<16 hex>`; a photo id may itself hold ':'.
  const photosHeld = new Set(marks.filter((m) => m.docId.startsWith('photo:')).map((m) => m.docId.slice(6, -34)));
  const saved = new Set(source.versions.flatMap((v) => v.photoIds));
  const photos = source.photos.filter((p) => !photosHeld.has(p.id) && saved.has(p.id));
  return { docs, photos, heldHours };
}

/** Documents waiting in an outbox (photos included). */
export const outboxSize = (box: Outbox) => box.docs.length + box.photos.length;

export interface PushResult {
  sent: number;
  rejected: Refusal[];
}

/** Sends everything the server does not hold yet; marks are written batch by batch. */
export async function pushStore(t: SyncTarget, box?: Outbox, onProgress?: (done: number, total: number) => void): Promise<PushResult> {
  const db = targetDb(t);
  const key = targetKey(t);
  const { docs, photos } = box ?? (await outbox(t));
  const total = docs.length + photos.length;
  if (total === 0) return { sent: 0, rejected: [] };
  await t.client.ensureDatabase(db);
  let done = 0;
  const send = async (list: SyncDoc[]): Promise<SendResult> => {
    const byId = new Map(list.map((d) => [d._id, d]));
    return sendDocs(t.client, db, list, async (batch) => {
      const at = nowIso();
      await markOnServer(batch.onServer.flatMap((id) => {
        const d = byId.get(id);
        return d ? [markOf(key, t.cruiseId, d, at)] : [];
      }));
      done += batch.onServer.length + batch.rejected.length;
      onProgress?.(done, total);
    });
  };
  const r = await send(docs);
  const out = { sent: r.onServer.length, rejected: r.rejected };
  // Photos after the observations they belong to, a batch's worth of bytes in memory at a time.
  let group: SyncDoc[] = [];
  let bytes = 0;
  const flush = async () => {
    const g = await send(group);
    out.sent += g.onServer.length;
    out.rejected.push(...g.rejected);
    group = [];
    bytes = 0;
  };
  for (const p of photos) {
    const row = await getPhoto(p.id);
    // Removed since the outbox was made: nothing to send.
    if (!row) {
      done++;
      continue;
    }
    const data = new Uint8Array(await row.blob.arrayBuffer());
    if (group.length > 0 && bytes + data.length > PUSH_BATCH_BYTES) await flush();
    group.push(photoDoc(t.cruiseId, p, data));
    bytes += data.length;
  }
  if (group.length > 0) await flush();
  return out;
}

export interface PullResult {
  /** Documents taken into the log this call (new or identical to what was there). */
  accepted: number;
  refused: Refusal[];
  /** Observations that changed in the store (new, newer, older, conflicting). */
  changed: number;
  conflicts: number;
  /** True when the feed had nothing more. */
  caughtUp: boolean;
}

async function loadState(t: SyncTarget): Promise<SyncStateRow> {
  const key = targetKey(t);
  const stored = await getSyncState(key);
  const fresh: SyncStateRow = { key, cruiseId: t.cruiseId, since: '0', refused: [], lastPullAt: null, lastPushAt: null };
  if (!stored || stored.since === '0') return stored ?? fresh;
  // The server's copy of the checkpoint must agree (it may lag one step when the server stopped
  // right after the local write). Otherwise the database on the server is not the one pulled
  // from (replaced, restored): pull it all again; merging makes a repeated document harmless.
  const remote = await t.client.getLocal(targetDb(t), checkpointDocId(t.deviceId));
  const agreed = remote !== null && (remote.since === stored.since || remote.since === stored.previousSince);
  if (agreed) return stored;
  // What the marks say the server holds is not true of this database either: send it all again.
  await forgetServer(key);
  return { ...fresh, refused: stored.refused };
}

/**
 * Pulls pages of changes until the feed is empty (or `maxPages`), each page merged and its
 * checkpoint saved before the next; with `waitMs` the first empty page waits for a change.
 */
export async function pullStore(t: SyncTarget, opts: { waitMs?: number; maxPages?: number; onProgress?: (received: number, pending: number | null) => void } = {}): Promise<PullResult> {
  const db = targetDb(t);
  const key = targetKey(t);
  await t.client.ensureDatabase(db);
  let state = await loadState(t);
  const out: PullResult = { accepted: 0, refused: [], changed: 0, conflicts: 0, caughtUp: false };
  let received = 0;
  let target: MergeTarget | null = null;
  for (let page = 0; page < (opts.maxPages ?? Infinity); page++) {
    const p = await readPage(t.client, db, state.since, page === 0 && opts.waitMs !== undefined ? { waitMs: opts.waitMs } : {});
    if (p.count === 0) {
      out.caughtUp = true;
      break;
    }
    const refused: Refusal[] = [...p.oversized];
    const accepted: SyncDoc[] = [];
    if (p.docs.length) {
      const r = await mergePulled(t, p.docs, target);
      target = r.target;
      refused.push(...r.refused);
      accepted.push(...r.accepted);
      out.changed += r.changed;
      out.conflicts += r.conflicts;
    }
    const at = nowIso();
    await markOnServer(accepted.map((d) => markOf(key, t.cruiseId, d, at)));
    const refusals: SyncRefusal[] = refused.map((x) => ({ ...x, at }));
    state = { ...state, previousSince: state.since, since: p.lastSeq, lastPullAt: at, refused: [...state.refused, ...refusals].slice(-MAX_REFUSALS_KEPT) };
    await putSyncState(state);
    // Best effort: a failure here only costs a longer pull after the next start.
    await t.client.putLocal(db, checkpointDocId(t.deviceId), { since: state.since, at }).catch(() => undefined);
    out.accepted += accepted.length;
    out.refused.push(...refused);
    received += p.count;
    opts.onProgress?.(received, p.pending);
    if (p.pending === 0) {
      out.caughtUp = true;
      break;
    }
  }
  return out;
}

/** The merge target after a plan was applied, without reading the store again. */
function afterPlan(base: MergeTarget, plan: MergePlan): MergeTarget {
  const current = new Map(plan.putCurrent.map((o) => [o.id, o]));
  const others = new Map<string, Observation[]>();
  for (const o of [...plan.addHistory, ...plan.addConflicts]) {
    const l = others.get(o.id);
    if (l) l.push(o);
    else others.set(o.id, [o]);
  }
  const times = new Set(plan.addTrack.map((p) => p.time));
  const photos = new Set(plan.addPhotos.map((p) => p.id));
  return {
    cruise: plan.cruise.value,
    versions: (id) => {
      const b = base.versions(id);
      const c = current.get(id);
      if (!b && !c) return undefined;
      const extra = others.get(id) ?? [];
      return { current: c ?? (b as StoredVersions).current, others: extra.length ? [...(b?.others ?? []), ...extra] : (b?.others ?? []) };
    },
    hasTrackTime: (t) => times.has(t) || base.hasTrackTime(t),
    hasPhoto: (id) => photos.has(id) || base.hasPhoto(id),
  };
}

interface Merged {
  accepted: SyncDoc[];
  refused: Refusal[];
  changed: number;
  conflicts: number;
  /** What is stored now, for the next page. */
  target: MergeTarget;
}

/**
 * Checks pulled documents and merges the good ones into the store, as an import does. The
 * target (what is stored) is carried from page to page; when an observer saved meanwhile the
 * apply refuses the stale plan and the target is read again.
 */
async function mergePulled(t: SyncTarget, raw: unknown[], known: MergeTarget | null): Promise<Merged> {
  let target = known ?? (await loadMergeTarget(t.cruiseId));
  for (let attempt = 0; ; attempt++) {
    const stored = target;
    const checked = checkPulled(raw, { cruiseId: t.cruiseId, storedCruise: target.cruise, observation: (id) => stored.versions(id)?.current });
    const photos = await fetchPhotos(t.client, targetDb(t), checked.photos, (id) => stored.hasPhoto(id));
    const acceptedIds = new Set([...checked.accepted, ...photos.accepted]);
    const accepted = (raw as SyncDoc[]).filter((d) => d && typeof d === 'object' && acceptedIds.has(d._id));
    const refused = [...checked.refused, ...photos.refused];
    const none = { accepted, refused, changed: 0, conflicts: 0, target };
    const pulled = bundleWithPhotos(checked, photos);
    if (!pulled) return none;
    const bundle = withHeldVersions(pulled, await storedOnServer(t, target, observationIdsOf(pulled)));
    const plan = planMerge(target, bundle);
    const c = plan.counts;
    if (planIsEmpty(plan)) return none;
    try {
      await applyMergePlan(plan, { source: `ship server ${targetKey(t)}`, photos: photos.bytes });
    } catch (e) {
      if (e instanceof StaleImportError && attempt < 5) {
        target = await loadMergeTarget(t.cruiseId);
        continue;
      }
      throw e;
    }
    return { accepted, refused, changed: c.new + c.newer + c.older + c.conflict, conflicts: c.conflict, target: afterPlan(target, plan) };
  }
}
