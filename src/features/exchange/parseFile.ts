// Reading an import file: the bytes (with progress), then the format's readers. The same code
// runs in the import Web Worker and, where no worker is available (tests under jsdom), on the
// main thread.
import { looksLikeZip } from '../../format/archive';
import { readArchive } from '../../format/archiveRead';
import { LIMITS } from '../../format/limits';
import { readLogText } from '../../format/read';
import { decodeLogText } from '../../format/text';
import type { ParsedFile, ParseStage } from './progress';

export type { ParsedFile, ParseStage, WorkerMessage, WorkerRequest } from './progress';

async function readBytes(file: Blob, onProgress: (f: number) => void): Promise<Uint8Array> {
  if (typeof file.stream !== 'function') return new Uint8Array(await file.arrayBuffer());
  const out = new Uint8Array(file.size);
  const reader = file.stream().getReader();
  let at = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    out.set(value.subarray(0, Math.max(0, Math.min(value.length, out.length - at))), at);
    at += value.length;
    onProgress(file.size === 0 ? 1 : at / file.size);
  }
  return at === out.length ? out : out.subarray(0, Math.min(at, out.length));
}

export async function parseFile(file: Blob, fileName: string, onProgress: (stage: ParseStage, fraction: number) => void = () => {}): Promise<ParsedFile> {
  const fail = (message: string): ParsedFile => ({ ok: false, fileName, problems: { listed: [{ path: '$', message }], more: 0 } });
  if (file.size > LIMITS.maxFileBytes) return fail(`the file has ${file.size} bytes, more than the limit of ${LIMITS.maxFileBytes}`);
  const bytes = await readBytes(file, (f) => onProgress('read', f));
  const progress = { onProgress };
  if (looksLikeZip(bytes)) {
    const r = readArchive(bytes, progress);
    return r.ok ? { ok: true, fileName, bundle: r.bundle, photos: r.photos, fromVersion: r.fromVersion, warnings: r.warnings } : { ok: false, fileName, problems: r.problems };
  }
  const decoded = decodeLogText(bytes);
  if (!decoded.ok) return { ok: false, fileName, problems: { listed: [decoded.problem], more: 0 } };
  const r = readLogText(decoded.text, progress, bytes.length);
  return r.ok ? { ok: true, fileName, bundle: r.bundle, photos: new Map(), fromVersion: r.fromVersion, warnings: r.warnings } : { ok: false, fileName, problems: r.problems };
}
