// The import Web Worker: reads, checks and plans a dropped or picked file off the main thread,
// piece by piece, and writes it when the observer applies the preview, so the screen stays
// responsive and shows progress on a season's log. It keeps the file between the two.
import { ImportFileChangedError, StaleImportError } from '../../db';
import { ImportSession } from './importSession';
import type { ParseStage, WorkerMessage, WorkerRequest } from './progress';

const post = (m: WorkerMessage) => (self as unknown as { postMessage: (m: WorkerMessage) => void }).postMessage(m);

let session: ImportSession | null = null;

function progress(): (stage: ParseStage, fraction: number) => void {
  let last = 0;
  return (stage, fraction) => {
    // Progress messages at most every 50 ms: the bar needs no more and cloning costs.
    const now = Date.now();
    if (now - last > 50 || fraction >= 1) {
      last = now;
      post({ type: 'progress', stage, fraction });
    }
  };
}

const failed = (err: unknown): WorkerMessage => ({
  type: 'error',
  message: err instanceof Error ? err.message : String(err),
  stale: err instanceof StaleImportError || err instanceof ImportFileChangedError,
});

self.onmessage = (ev: MessageEvent<WorkerRequest>) => {
  const req = ev.data;
  if (req.type === 'apply') {
    const s = session;
    if (!s) return post({ type: 'error', message: 'there is no preview to apply' });
    s.apply(progress())
      .then((result) => post({ type: 'applied', result }))
      .catch((err: unknown) => post(failed(err)));
    return;
  }
  const s = (session = new ImportSession(req.file, req.fileName));
  s.start(progress())
    .then((result) => post({ type: 'done', result }))
    .catch((err: unknown) => post(failed(err)));
};
