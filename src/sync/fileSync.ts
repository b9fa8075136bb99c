// Push and pull between a log held in memory (a file) and a cruise database: the command line's
// `push` and `pull`. The same documents, checks and merge rules as the app's store sync.
import { applyPlanToBundle, bundleTarget, planMerge } from '../format/merge';
import type { LogBundle } from '../format/types';
import { CouchError, type CouchClient } from './couch';
import { bundleDocs, checkPulled, type Refusal } from './documents';
import { cruiseDatabaseName } from './ids';
import { readPage, sendDocs, type SendResult } from './transfer';

export async function pushBundle(client: CouchClient, bundle: LogBundle, onProgress?: (done: number, total: number) => void): Promise<SendResult & { total: number }> {
  const db = cruiseDatabaseName(bundle.cruise.id);
  await client.ensureDatabase(db);
  const docs = bundleDocs(bundle);
  let done = 0;
  const r = await sendDocs(client, db, docs, (b) => {
    done += b.onServer.length + b.rejected.length;
    onProgress?.(done, docs.length);
  });
  return { ...r, total: docs.length };
}

export interface PulledLog {
  bundle: LogBundle | null;
  refused: Refusal[];
  documents: number;
}

/** Reads a cruise's whole database into one log, page by page, checked and merged as an import. */
export async function pullBundle(client: CouchClient, cruiseId: string, onProgress?: (documents: number) => void): Promise<PulledLog> {
  const db = cruiseDatabaseName(cruiseId);
  let since = '0';
  let bundle: LogBundle | null = null;
  const refused: Refusal[] = [];
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
    const checked = checkPulled(page.docs, { cruiseId, storedCruise: bundle?.cruise ?? null });
    refused.push(...checked.refused);
    if (checked.bundle) bundle = applyPlanToBundle(bundle, planMerge(bundleTarget(bundle), checked.bundle));
    documents += page.count;
    onProgress?.(documents);
    since = page.lastSeq;
    if (page.pending === 0) break;
  }
  return { bundle, refused, documents };
}
