// The zip archive (fflate): the log as JSON plus the photos as files, for handing a whole cruise
// to someone else or to an archive. Images are stored, not deflated: JPEG and PNG are already
// compressed. Reading is in archiveRead.ts.
import { strToU8, zipSync, type Zippable } from 'fflate';
import { exportLogJson, photoArchivePath, type EncodeOptions } from './encode';
import { CURRENT_VERSION, SCHEMA_V2_PATH, type LogBundle, type PhotoBytes } from './types';

export const ARCHIVE_LOG_NAME = 'floe-ledger-log.json';

const README = `Floe Ledger log archive
${ARCHIVE_LOG_NAME}  the log (format "floe-ledger-log", version ${CURRENT_VERSION}; schema: ${SCHEMA_V2_PATH}
                      served with the app, documented in docs/format.md)
photos/               the images referenced by the log's "photos" list (archivePath)
`;

export function writeArchive(bundle: LogBundle, photos: PhotoBytes, opts: EncodeOptions = {}): Uint8Array {
  const files: Zippable = {
    [ARCHIVE_LOG_NAME]: strToU8(exportLogJson(bundle, opts).join('')),
    'README.txt': strToU8(README),
  };
  for (const p of bundle.photos) {
    const bytes = photos.get(p.id);
    if (bytes) files[photoArchivePath(p)] = [bytes, { level: 0 }];
  }
  return zipSync(files, { level: 6 });
}

/** True when the bytes start like a zip file ("PK\x03\x04"). */
export function looksLikeZip(bytes: Uint8Array): boolean {
  return bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04;
}

