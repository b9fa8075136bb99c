// Starts the chart/grid worker for one file. No main-thread fallback: the readers would be
// bundled twice, and every browser the app supports has module workers.
import type { IceInfoRead, IceInfoRequest, IceInfoStage } from './iceInfoRead';
import type { IceInfoWorkerMessage } from './iceInfoWorker';

export function readIceInfoInWorker(req: IceInfoRequest, onStage: (stage: IceInfoStage) => void): Promise<IceInfoRead> {
  if (typeof Worker === 'undefined') return Promise.resolve({ ok: false, message: 'this browser cannot run the chart and grid reader (no Web Worker)' });
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL('./iceInfoWorker.ts', import.meta.url), { type: 'module', name: 'floe-iceinfo' });
    worker.onmessage = (ev: MessageEvent<IceInfoWorkerMessage>) => {
      const m = ev.data;
      if (m.type === 'progress') onStage(m.stage);
      else {
        worker.terminate();
        resolve(m.result);
      }
    };
    worker.onerror = (ev) => {
      worker.terminate();
      reject(new Error(ev.message || 'the chart and grid worker failed'));
    };
    worker.postMessage(req);
  });
}
