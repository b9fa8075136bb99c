// Starts the import worker for one file and relays its progress; the same session runs on the
// main thread where Worker is missing (tests under jsdom). The worker lives from the preview to
// the apply (it holds the file) and is ended by close().
import type { ApplyResult } from '../../db';
import { overallProgress, type PreviewOutcome, type WorkerMessage, type WorkerRequest } from './progress';

export interface ImportClient {
  preview: Promise<PreviewOutcome>;
  /** Writes the previewed import; rejects with the reason (nothing written) on failure. */
  apply: (onProgress: (overall: number, stage: string) => void) => Promise<ApplyResult>;
  close: () => void;
}

/** An error from the worker: `stale` when the store or the file changed since the preview. */
export class ImportFailed extends Error {
  constructor(
    message: string,
    readonly stale: boolean,
  ) {
    super(message);
    this.name = 'ImportFailed';
  }
}

export function startImport(file: Blob, fileName: string, onProgress: (overall: number, stage: string) => void): ImportClient {
  if (typeof Worker === 'undefined') {
    // The readers and the session are loaded only here, so the app's main bundle does not carry them.
    const session = import('./importSession').then(({ ImportSession }) => new ImportSession(file, fileName));
    return {
      preview: session.then((s) => s.start((st, f) => onProgress(overallProgress(st, f), st))),
      apply: (p) => session.then((s) => s.apply((st, f) => p(overallProgress(st, f), st))),
      close: () => {},
    };
  }
  const worker = new Worker(new URL('./importWorker.ts', import.meta.url), { type: 'module', name: 'floe-import' });
  let relay = onProgress;
  let settle: { resolve: (m: WorkerMessage) => void; reject: (e: Error) => void } | null = null;
  const next = () => new Promise<WorkerMessage>((resolve, reject) => (settle = { resolve, reject }));
  worker.onmessage = (ev: MessageEvent<WorkerMessage>) => {
    const m = ev.data;
    if (m.type === 'progress') relay(overallProgress(m.stage, m.fraction), m.stage);
    else settle?.resolve(m);
  };
  worker.onerror = (ev) => settle?.reject(new Error(ev.message || 'the import worker failed'));
  const send = (req: WorkerRequest) => {
    const answer = next();
    worker.postMessage(req);
    return answer;
  };
  const preview = send({ type: 'preview', file, fileName }).then((m) => {
    if (m.type === 'done') return m.result;
    throw new ImportFailed(m.type === 'error' ? m.message : 'the import worker answered out of turn', false);
  });
  return {
    preview,
    apply: (p) => {
      relay = p;
      return send({ type: 'apply' }).then((m) => {
        if (m.type === 'applied') return m.result;
        throw new ImportFailed(m.type === 'error' ? m.message : 'the import worker answered out of turn', m.type === 'error' && m.stale === true);
      });
    },
    close: () => worker.terminate(),
  };
}
