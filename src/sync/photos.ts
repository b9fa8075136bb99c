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
  for (const { doc, meta } of pending) {
    const refuse = (reason: string) => out.refused.push({ docId: doc._id, reason });
    if (have(meta.id)) {
      out.accepted.push(doc._id);
      continue;
    }
    const stub: unknown = isObject(doc._attachments) ? doc._attachments[PHOTO_ATTACHMENT] : undefined;
    if (!isObject(stub)) {
      refuse(`has no image attached (an attachment named "${PHOTO_ATTACHMENT}")`);
      continue;
    }
    if (stub.content_type !== meta.mediaType) {
      refuse(`the attached image is of type ${JSON.stringify(String(stub.content_type)).slice(0, 60)}, the description says ${JSON.stringify(meta.mediaType)}`);
      continue;
    }
    if (typeof stub.length === 'number' && stub.length !== meta.byteLength) {
      refuse(`the attached image has ${stub.length} bytes, the description says ${meta.byteLength}`);
      continue;
    }
    let bytes: Uint8Array;
    try {
      ({ bytes } = await client.attachment(db, doc._id, PHOTO_ATTACHMENT, meta.byteLength));
    } catch (e) {
      if (e instanceof CouchError && e.kind === 'too-large') {
        refuse(`the attached image is larger than the ${meta.byteLength} bytes the description gives`);
        continue;
      }
      if (e instanceof CouchError && e.kind === 'not-found') {
        refuse('the server has no image for it');
        continue;
      }
      throw e;
    }
    if (bytes.length !== meta.byteLength) {
      refuse(`the attached image has ${bytes.length} bytes, the description says ${meta.byteLength}`);
      continue;
    }
    const named = /-([0-9a-f]{16})$/.exec(doc._id)?.[1];
    if (digestBytes(bytes) !== named) {
      refuse('the image does not match the digest its id names: altered on the server');
      continue;
    }
    out.metas.push(meta);
    out.bytes.set(meta.id, bytes);
    out.accepted.push(doc._id);
  }
  return out;
}

/** A checked batch with its fetched photos, ready for the merge plan (null: nothing to merge). */
export function bundleWithPhotos(checked: CheckResult, fetched: FetchedPhotos): LogBundle | null {
  if (fetched.metas.length === 0 || !checked.cruise) return checked.bundle;
  const base: LogBundle = checked.bundle ?? { cruise: checked.cruise, observations: [], history: [], conflicts: [], track: [], photos: [] };
  return { ...base, photos: fetched.metas };
}
