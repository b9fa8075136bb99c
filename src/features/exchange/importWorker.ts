// The import Web Worker: parses and validates a dropped or picked file off the main thread, so
// the screen stays responsive and shows progress on a large log.
import { parseFile, type WorkerMessage, type WorkerRequest } from './parseFile';

const post = (m: WorkerMessage) => (self as unknown as { postMessage: (m: WorkerMessage) => void }).postMessage(m);

self.onmessage = (ev: MessageEvent<WorkerRequest>) => {
  const { file, fileName } = ev.data;
  let last = 0;
  parseFile(file, fileName, (stage, fraction) => {
    // Progress messages at most every 50 ms: the bar needs no more and cloning costs.
    const now = Date.now();
    if (now - last > 50 || fraction >= 1) {
      last = now;
      post({ type: 'progress', stage, fraction });
    }
  })
    .then((result) => post({ type: 'done', result }))
    .catch((err: unknown) => post({ type: 'error', message: err instanceof Error ? err.message : String(err) }));
};
