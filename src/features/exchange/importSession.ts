// One import of one file: the preview (read and check in pieces, plan against the store) and,
// when the observer applies it, the apply (read again, plan and write in one transaction; see
// src/db/importStream.ts). The same code runs in the import worker, where the file is read
// with FileReaderSync a few megabytes at a time, and on the main thread where there is no
// worker (tests under jsdom), where the file's bytes are read once into memory.
import { applyImport, KEEP_PIECES_MAX_BYTES, previewImport, type ApplyResult, type ImportPreview, type ImportTiming, type OpenPieces } from '../../db';
import { looksLikeZip } from '../../format/archive';
import { readArchive } from '../../format/archiveRead';
import { LIMITS } from '../../format/limits';
import { bundlePieces, byteRangeSource, openLog } from '../../format/readStream';
import type { PhotoBytes } from '../../format/types';
import type { ParseStage, PreviewOutcome } from './progress';

type SyncReader = { readAsArrayBuffer: (b: Blob) => ArrayBuffer };

/** The file's bytes from `at`, `n` of them, without waiting (worker) or from memory (main thread). */
type ByteRange = (at: number, n: number) => Uint8Array;

async function byteRange(file: Blob): Promise<ByteRange> {
  const Sync = (globalThis as { FileReaderSync?: new () => SyncReader }).FileReaderSync;
  if (Sync) {
    const reader = new Sync();
    return (at, n) => new Uint8Array(reader.readAsArrayBuffer(file.slice(at, at + n)));
  }
  const all = new Uint8Array(await file.arrayBuffer());
  return (at, n) => all.subarray(at, at + n);
}

export class ImportSession {
  private preview: (ImportPreview & { ok: true }) | null = null;
  private open: OpenPieces | null = null;
  private photos: PhotoBytes = new Map();
  /** Where the reading's progress goes: the preview's bar; the apply shows its writes instead. */
  private readProgress: (fraction: number) => void = () => {};
  /** Largest file read once, its pieces kept for the apply (a benchmark lowers it to time the two readings). */
  keepPiecesUpTo = KEEP_PIECES_MAX_BYTES;
  /** Set by a benchmark to learn where each pass spends its time (src/db/importStream.ts). */
  timing: { preview: ImportTiming; apply: ImportTiming } | null = null;

  constructor(
    private readonly file: Blob,
    readonly fileName: string,
  ) {}

  async start(onProgress: (stage: ParseStage, fraction: number) => void): Promise<PreviewOutcome> {
    const { file, fileName } = this;
    const fail = (message: string): PreviewOutcome => ({ ok: false, fileName, problems: { listed: [{ path: '$', message }], more: 0 } });
    if (file.size > LIMITS.maxFileBytes) return fail(`the file has ${file.size} bytes, more than the limit of ${LIMITS.maxFileBytes}`);
    this.readProgress = (f) => onProgress('pieces', f);
    const range = await byteRange(file);
    if (looksLikeZip(range(0, 4))) {
      // An archive is unpacked whole (its photos are needed anyway); its log is then handed out in pieces.
      onProgress('read', 0);
      const r = readArchive(range(0, file.size), { onProgress });
      if (!r.ok) return { ok: false, fileName, problems: r.problems };
      this.photos = r.photos;
      this.open = () => bundlePieces(r);
    } else {
      const src = byteRangeSource(file.size, range, (f) => this.readProgress(f));
      this.open = (route, checkedHash) => openLog(src, checkedHash === undefined ? { route } : { route, checkedHash });
    }
    // A file up to the size whose pieces fit in memory is read once (src/db/importStream.ts).
    const popts = { photos: this.photos, keepPieces: file.size <= this.keepPiecesUpTo };
    const preview = await previewImport(this.open, this.timing ? { ...popts, timing: this.timing.preview } : popts);
    if (!preview.ok) return { ok: false, fileName, problems: preview.problems };
    this.preview = preview;
    return { ok: true, fileName, summary: preview.summary };
  }

  /** Writes the previewed import; throws StaleImportError or ImportFileChangedError and writes nothing. */
  async apply(onProgress: (stage: ParseStage, fraction: number) => void): Promise<ApplyResult> {
    const { preview, open } = this;
    if (!preview || !open) throw new Error('the import has no preview to apply');
    this.readProgress = () => {};
    const total = Math.max(1, preview.summary.totals.observations + preview.summary.totals.trackPoints);
    const opts = { source: this.fileName, photos: this.photos, onProgress: (done: number) => onProgress('apply', done / total) };
    return applyImport(open, preview, this.timing ? { ...opts, timing: this.timing.apply } : opts);
  }
}
