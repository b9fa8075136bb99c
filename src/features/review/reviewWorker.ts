// The review's worker: keeps the figures of the open cruise up to date as observations are saved
// (see reviewEngine.ts), so the page never runs a pass over the whole log.
import { ReviewEngine } from './reviewEngine';
import type { FromReviewWorker, ToReviewWorker } from './reviewProtocol';

const engine = new ReviewEngine();

self.onmessage = (e: MessageEvent<ToReviewWorker>) => {
  try {
    const out = engine.handle(e.data);
    if (out) (self as unknown as Worker).postMessage(out.reply, out.transfer);
  } catch (err) {
    const seq = e.data.type === 'figures' ? e.data.seq : -1;
    const reply: FromReviewWorker = { type: 'error', seq, message: err instanceof Error ? err.message : String(err) };
    (self as unknown as Worker).postMessage(reply);
  }
};
