// Photos on the server: one immutable document per photo, its description as the body and the
// image as the document's one attachment. The id ends with the digest of the image, so bytes
// altered on the server are refused when fetched; the description was read by the log reader
// before (documents.ts), so the image is fetched no larger than the size it gives, which the
// format limits (LIMITS.maxPhotoBytes).
import { canonicalJson } from '../format/merge';
import { CURRENT_VERSION, type LogBundle, type PhotoBytes, type PhotoMeta } from '../format/types';
import { CouchError, type CouchClient } from './couch';
import type { CheckResult, PhotoDoc, Refusal } from './documents';
import { digest, digestBytes, PHOTO_ATTACHMENT, photoDocId } from './ids';
import { PUSH_BATCH_BYTES } from './transfer';

/** Base64 without a call per byte and without one huge argument list. */
export function toBase64(bytes: Uint8Array): string {
  let text = '';
  const STEP = 0x8000;
  for (let i = 0; i < bytes.length; i += STEP) text += String.fromCharCode(...bytes.subarray(i, i + STEP));
  return btoa(text);
}

/** The document of a photo, with the image as base64 for `_bulk_docs`. */
export function photoDoc(cruiseId: string, meta: PhotoMeta, bytes: Uint8Array): PhotoDoc {
  return {
    _id: photoDocId(meta.id, digest(canonicalJson(meta)), digestBytes(bytes)),
    type: 'floe-ledger/photo',
    cruiseId,
    formatVersion: CURRENT_VERSION,
    body: meta,
    _attachments: { [PHOTO_ATTACHMENT]: { content_type: meta.mediaType, data: toBase64(bytes) } },
  };
}

export interface FetchedPhotos {
  /** Descriptions of the photos whose image arrived and passed, with the bytes by photo id. */
  metas: PhotoMeta[];
  bytes: PhotoBytes;
  /** Documents taken: fetched and checked, or a photo this laptop holds already. */
  accepted: string[];
  refused: Refusal[];
}

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

/**
 * Fetches and checks the images of photo documents whose description passed. A photo this
 * laptop holds already is not fetched again. A network failure throws (the page is retried);
 * an image that is missing, of another type or size, or altered is refused with the reason.
 */
export async function fetchPhotos(client: CouchClient, db: string, pending: readonly { doc: PhotoDoc; meta: PhotoMeta }[], have: (photoId: string) => boolean): Promise<FetchedPhotos> {
  const out: FetchedPhotos = { metas: [], bytes: new Map(), accepted: [], refused: [] };
  // A few images at a time (the round trips overlap), and never more than a batch's worth of
  // bytes in flight; results are taken in the feed's order.
  let group: { doc: PhotoDoc; meta: PhotoMeta }[] = [];
  let bytes = 0;
  const flush = async () => {
    const results = await Promise.all(group.map((p) => fetchOne(client, db, p.doc, p.meta)));
    results.forEach((r, i) => {
      const { doc, meta } = group[i] as { doc: PhotoDoc; meta: PhotoMeta };
      if (typeof r === 'string') out.refused.push({ docId: doc._id, reason: r });
      else {
        out.metas.push(meta);
        out.bytes.set(meta.id, r);
        out.accepted.push(doc._id);
      }
    });
    group = [];
    bytes = 0;
  };
  for (const p of pending) {
    if (have(p.meta.id)) {
      out.accepted.push(p.doc._id);
      continue;
    }
    if (group.length > 0 && (group.length >= PARALLEL_FETCHES || bytes + p.meta.byteLength > PUSH_BATCH_BYTES * 4)) await flush();
    group.push(p);
    bytes += p.meta.byteLength;
  }
  if (group.length > 0) await flush();
  return out;
}

const PARALLEL_FETCHES = 4;

/** One photo's image, checked; a string is the reason it is refused. Network failures throw. */
async function fetchOne(client: CouchClient, db: string, doc: PhotoDoc, meta: PhotoMeta): Promise<Uint8Array | string> {
  const stub: unknown = isObject(doc._attachments) ? doc._attachments[PHOTO_ATTACHMENT] : undefined;
  if (!isObject(stub)) return `has no image attached (an attachment named "${PHOTO_ATTACHMENT}")`;
  if (stub.content_type !== meta.mediaType) return `the attached image is of type ${JSON.stringify(String(stub.content_type)).slice(0, 60)}, the description says ${JSON.stringify(meta.mediaType)}`;
  if (typeof stub.length === 'number' && stub.length !== meta.byteLength) return `the attached image has ${stub.length} bytes, the description says ${meta.byteLength}`;
  let bytes: Uint8Array;
  try {
    ({ bytes } = await client.attachment(db, doc._id, PHOTO_ATTACHMENT, meta.byteLength));
  } catch (e) {
    if (e instanceof CouchError && e.kind === 'too-large') return `the attached image is larger than the ${meta.byteLength} bytes the description gives`;
    if (e instanceof CouchError && e.kind === 'not-found') return 'the server has no image for it';
    throw e;
  }
  if (bytes.length !== meta.byteLength) return `the attached image has ${bytes.length} bytes, the description says ${meta.byteLength}`;
  if (digestBytes(bytes) !== /-([0-9a-f]{16})$/.exec(doc._id)?.[1]) return 'the image does not match the digest its id names: altered on the server';
  return bytes;
}

/** A checked batch with its fetched photos, ready for the merge plan (null: nothing to merge). */
export function bundleWithPhotos(checked: CheckResult, fetched: FetchedPhotos): LogBundle | null {
  if (fetched.metas.length === 0 || !checked.cruise) return checked.bundle;
  const base: LogBundle = checked.bundle ?? { cruise: checked.cruise, observations: [], history: [], conflicts: [], track: [], photos: [] };
  return { ...base, photos: fetched.metas };
}
