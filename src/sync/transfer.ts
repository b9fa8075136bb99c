// Moving documents, independent of where the log is kept (the app's store or a file): sending
// new documents in batches, and reading the changes feed page by page with a byte limit, falling
// back to `_bulk_get` in smaller groups when a page is too large, so one oversized document is
// refused on its own instead of stalling the laptop.
import { CouchClient, CouchError, seqText } from './couch';
import type { Refusal, SyncDoc } from './documents';

export const PUSH_BATCH_DOCS = 500;
export const PUSH_BATCH_BYTES = 8 * 1024 * 1024;
export const PULL_PAGE = 500;
/** The largest document a laptop accepts; a log entry is a few kilobytes, an hour of track at 1 Hz about 200 kB. */
export const MAX_DOC_BYTES = 16 * 1024 * 1024;

export interface SendResult {
  /** Ids now on the server: written, or found there already. */
  onServer: string[];
  /** Documents the server would not take (e.g. a validation function on a real CouchDB). */
  rejected: Refusal[];
}

function batches(docs: readonly SyncDoc[]): SyncDoc[][] {
  const out: SyncDoc[][] = [];
  let cur: SyncDoc[] = [];
  let bytes = 0;
  for (const d of docs) {
    const size = JSON.stringify(d.body).length + ('_attachments' in d && d._attachments ? Object.values(d._attachments).reduce((n, a) => n + (a.data?.length ?? 0), 0) : 0);
    if (cur.length > 0 && (cur.length >= PUSH_BATCH_DOCS || bytes + size > PUSH_BATCH_BYTES)) {
      out.push(cur);
      cur = [];
      bytes = 0;
    }
    cur.push(d);
    bytes += size;
  }
  if (cur.length) out.push(cur);
  return out;
}

/**
 * Sends documents the server may not have. Ids already there (`_all_docs`) are not sent again;
 * a `conflict` answer means another laptop wrote the same id, hence the same content.
 * `onBatch` runs after each batch, so marks are kept even if a later batch fails.
 */
export async function sendDocs(client: CouchClient, db: string, docs: readonly SyncDoc[], onBatch?: (r: SendResult) => Promise<void> | void): Promise<SendResult> {
  const total: SendResult = { onServer: [], rejected: [] };
  for (const batch of batches(docs)) {
    const r: SendResult = { onServer: [], rejected: [] };
    const there = await client.existing(db, batch.map((d) => d._id));
    r.onServer.push(...there);
    const todo = batch.filter((d) => !there.has(d._id));
    if (todo.length) {
      const results = await client.bulkDocs(db, todo);
      for (const res of results) {
        if (res.ok || res.error === 'conflict') r.onServer.push(res.id);
        else if (res.error === 'unauthorized') throw new CouchError('unauthorized', `the server refused to store ${res.id}: ${res.reason ?? 'not logged in'}`, 401);
        else r.rejected.push({ docId: res.id, reason: `the server refused it: ${res.error ?? 'no answer'}${res.reason ? ` (${res.reason})` : ''}` });
      }
    }
    await onBatch?.(r);
    total.onServer.push(...r.onServer);
    total.rejected.push(...r.rejected);
  }
  return total;
}

export interface Page {
  docs: unknown[];
  /** Documents too large to take, refused by id. */
  oversized: Refusal[];
  lastSeq: string;
  /** Changes in the page (documents or not). */
  count: number;
  pending: number | null;
}

async function fetchDocs(client: CouchClient, db: string, ids: string[], out: Page): Promise<void> {
  try {
    out.docs.push(...(await client.bulkGet(db, ids, Math.max(MAX_DOC_BYTES, ids.length * 64 * 1024))));
  } catch (e) {
    if (!(e instanceof CouchError && e.kind === 'too-large')) throw e;
    if (ids.length === 1) {
      out.oversized.push({ docId: ids[0] as string, reason: `the document is larger than ${MAX_DOC_BYTES} bytes; no log entry is that large` });
      return;
    }
    const half = Math.ceil(ids.length / 2);
    await fetchDocs(client, db, ids.slice(0, half), out);
    await fetchDocs(client, db, ids.slice(half), out);
  }
}

/** One page of changes after `since`, with the documents. */
export async function readPage(client: CouchClient, db: string, since: string, opts: { limit?: number; waitMs?: number } = {}): Promise<Page> {
  const limit = opts.limit ?? PULL_PAGE;
  try {
    const q = { since, limit, includeDocs: true, ...(opts.waitMs === undefined ? {} : { waitMs: opts.waitMs }) };
    const r = await client.changes(db, q);
    return { docs: r.results.filter((x) => !x.deleted && x.doc !== undefined).map((x) => x.doc), oversized: [], lastSeq: seqText(r.last_seq), count: r.results.length, pending: r.pending ?? null };
  } catch (e) {
    if (!(e instanceof CouchError && e.kind === 'too-large')) throw e;
  }
  // The page with its documents is over the limit: take the ids, then the documents in groups.
  const r = await client.changes(db, { since, limit, includeDocs: false });
  const page: Page = { docs: [], oversized: [], lastSeq: seqText(r.last_seq), count: r.results.length, pending: r.pending ?? null };
  const ids = r.results.filter((x) => !x.deleted).map((x) => x.id);
  for (let i = 0; i < ids.length; i += 50) await fetchDocs(client, db, ids.slice(i, i + 50), page);
  return page;
}

/** Delay before retry number `attempt` (0-based): doubling from `baseMs` up to `maxMs`, with jitter so laptops do not retry in step. */
export function backoffDelay(attempt: number, baseMs = 1000, maxMs = 60_000, random: () => number = Math.random): number {
  const d = Math.min(maxMs, baseMs * 2 ** Math.min(attempt, 20));
  return Math.round(d * (0.5 + random() / 2));
}
