// Starts the import worker for one file and relays its progress; falls back to parsing on the
// main thread where Worker is missing.
import { overallProgress, type ParsedFile, type WorkerMessage } from './progress';

export function parseInWorker(file: Blob, fileName: string, onProgress: (overall: number, stage: string) => void): Promise<ParsedFile> {
  if (typeof Worker === 'undefined') {
    // The readers are loaded only here, so the app's main bundle does not carry them.
    return import('./parseFile').then(({ parseFile }) => parseFile(file, fileName, (s, f) => onProgress(overallProgress(s, f), s)));
  }
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL('./importWorker.ts', import.meta.url), { type: 'module', name: 'floe-import' });
    worker.onmessage = (ev: MessageEvent<WorkerMessage>) => {
      const m = ev.data;
      if (m.type === 'progress') onProgress(overallProgress(m.stage, m.fraction), m.stage);
      else {
        worker.terminate();
        if (m.type === 'done') resolve(m.result);
        else reject(new Error(m.message));
      }
    };
    worker.onerror = (ev) => {
      worker.terminate();
      reject(new Error(ev.message || 'the import worker failed'));
    };
    worker.postMessage({ file, fileName });
  });
}
