// Names on the server. One CouchDB database per cruise; one immutable document per saved
// observation revision, cruise record, track hour and photo, whose id says what it is and which
// content it holds (a digest), so two laptops never write the same document id with different
// content and CouchDB never holds a document conflict. docs/dev/sync.md explains the scheme.

/**
 * The database of a cruise: `floe-ledger-` and the cruise id, lower case letters, digits and
 * `-` kept, every other character written as `_` and its UTF-16 code in hex (4 digits), so the
 * mapping is one to one and the name obeys CouchDB's rule (lower case letter first, then
 * `a-z 0-9 _ $ ( ) + - /`).
 */
export function cruiseDatabaseName(cruiseId: string): string {
  let out = 'floe-ledger-';
  for (const ch of cruiseId) {
    if (/^[a-z0-9-]$/.test(ch)) out += ch;
    else {
      for (let i = 0; i < ch.length; i++) out += `_${ch.charCodeAt(i).toString(16).padStart(4, '0')}`;
    }
  }
  return out;
}

/**
 * A 64-bit digest of text as 16 hex digits: two 32-bit multiply-rotate lanes over the UTF-16
 * code units with a final avalanche. Not cryptographic: it names content, it does not guard it
 * (the server is trusted to store, never to be right: every pulled document is checked again).
 */
export function digest(text: string): string {
  return digestUnits(text.length, (i) => text.charCodeAt(i));
}

/** The same digest over bytes (a photo's image), one byte per unit. */
export function digestBytes(bytes: Uint8Array): string {
  return digestUnits(bytes.length, (i) => bytes[i] as number);
}

function digestUnits(length: number, unit: (i: number) => number): string {
  let h1 = 0x9e3779b1 ^ length;
  let h2 = 0x85ebca77;
  for (let i = 0; i < length; i++) {
    const c = unit(i);
    h1 = Math.imul(h1 ^ c, 0xcc9e2d51);
    h1 = (h1 << 15) | (h1 >>> 17);
    h2 = Math.imul(h2 + c, 0x1b873593);
    h2 = (h2 << 13) | (h2 >>> 19);
    h2 = (h2 + h1) | 0;
  }
  const fin = (h: number, k: number) => {
    h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
    h = Math.imul(h ^ (h >>> 13), k);
    return (h ^ (h >>> 16)) >>> 0;
  };
  const a = fin(h1 ^ h2, 0xc2b2ae35);
  const b = fin(h2 + Math.imul(h1, 5), 0x27d4eb2f);
  return a.toString(16).padStart(8, '0') + b.toString(16).padStart(8, '0');
}

/** The UTC hour of an ISO 8601 UTC time, `2026-03-04T05`: the unit of a track document. */
export function utcHour(time: string): string {
  return time.slice(0, 13);
}

const pad = (n: number) => String(n).padStart(6, '0');

export const observationDocId = (observationId: string, revision: number, hash: string) => `obs:${observationId}:r${pad(revision)}:${hash}`;
export const cruiseDocId = (updatedAt: string, hash: string) => `cruise:${updatedAt}:${hash}`;
export const trackDocId = (hour: string, hash: string) => `track:${hour}:${hash}`;
/** A photo: the digest of its description, then of its image bytes (the attachment). */
export const photoDocId = (photoId: string, metaHash: string, bytesHash: string) => `photo:${photoId}:${metaHash}-${bytesHash}`;
/** The name of a photo document's one attachment: the image. */
export const PHOTO_ATTACHMENT = 'image';

/** The server-side checkpoint of one laptop's pull (a `_local` document: never replicated). */
export const checkpointDocId = (deviceId: string) => `_local/floe-ledger-pull-${deviceId}`;
