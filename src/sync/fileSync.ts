// Push and pull between a log held in memory (a file) and a cruise database: the command line's
// `push` and `pull`. The same documents, checks and merge rules as the app's store sync.
import { applyPlanToBundle, bundleTarget, planMerge } from '../format/merge';
import type { LogBundle, PhotoBytes } from '../format/types';
import { CouchError, type CouchClient } from './couch';
import { bundleDocs, checkPulled, observationIdsOf, withHeldVersions, type Refusal } from './documents';
import { cruiseDatabaseName } from './ids';
import { bundleWithPhotos, fetchPhotos, photoDoc } from './photos';
import { readPage, sendDocs, type SendResult } from './transfer';

/**
 * Sends a log's documents; with `photos` (the bytes of an archive's photos) also a document per
 * photo whose bytes are there. A plain JSON log carries photo descriptions only: none is sent.
 */
export async function pushBundle(client: CouchClient, bundle: LogBundle, onProgress?: (done: number, total: number) => void, photos: PhotoBytes = new Map()): Promise<SendResult & { total: number }> {
  const db = cruiseDatabaseName(bundle.cruise.id);
  await client.ensureDatabase(db);
  const docs = bundleDocs(bundle);
  for (const p of bundle.photos) {
    const bytes = photos.get(p.id);
    if (bytes) docs.push(photoDoc(bundle.cruise.id, p, bytes));
  }
  let done = 0;
  const r = await sendDocs(client, db, docs, (b) => {
    done += b.onServer.length + b.rejected.length;
    onProgress?.(done, docs.length);
  });
  return { ...r, total: docs.length };
}

export interface PulledLog {
  bundle: LogBundle | null;
  /** The images of the bundle's photos, by photo id. */
  photos: PhotoBytes;
  refused: Refusal[];
  documents: number;
}

/** Reads a cruise's whole database into one log, page by page, checked and merged as an import. */
export async function pullBundle(client: CouchClient, cruiseId: string, onProgress?: (documents: number) => void): Promise<PulledLog> {
  const db = cruiseDatabaseName(cruiseId);
  let since = '0';
  let bundle: LogBundle | null = null;
  const refused: Refusal[] = [];
  const photos: PhotoBytes = new Map();
  let documents = 0;
  for (;;) {
    let page;
    try {
      page = await readPage(client, db, since);
    } catch (e) {
      if (e instanceof CouchError && e.kind === 'not-found' && documents === 0) break;
      throw e;
    }
    if (page.count === 0) break;
    refused.push(...page.oversized);
    const known = new Map((bundle?.observations ?? []).map((o) => [o.id, o]));
    const checked = checkPulled(page.docs, { cruiseId, storedCruise: bundle?.cruise ?? null, observation: (id) => known.get(id) });
    refused.push(...checked.refused);
    const fetched = await fetchPhotos(client, db, checked.photos, (id) => photos.has(id));
    refused.push(...fetched.refused);
    for (const [id, b] of fetched.bytes) photos.set(id, b);
    const pulled = bundleWithPhotos(checked, fetched);
    if (pulled) {
      // Everything read before came from this server: it all counts as held (withHeldVersions).
      const ids = observationIdsOf(pulled);
      const held = bundle ? [...bundle.observations, ...bundle.history, ...bundle.conflicts].filter((o) => ids.has(o.id)) : [];
      bundle = applyPlanToBundle(bundle, planMerge(bundleTarget(bundle), withHeldVersions(pulled, held)));
    }
    documents += page.count;
    onProgress?.(documents);
    since = page.lastSeq;
    if (page.pending === 0) break;
  }
  return { bundle, photos, refused, documents };
}
