// The chart and grid import worker: decoding a large grid or chart off the main thread.
import { readIceInfoFile, type IceInfoRead, type IceInfoRequest, type IceInfoStage } from './iceInfoRead';

export type IceInfoWorkerMessage = { type: 'progress'; stage: IceInfoStage } | { type: 'done'; result: IceInfoRead };

const post = (m: IceInfoWorkerMessage, transfer: Transferable[] = []) => (self as unknown as { postMessage: (m: IceInfoWorkerMessage, t: Transferable[]) => void }).postMessage(m, transfer);

self.onmessage = (ev: MessageEvent<IceInfoRequest>) => {
  void readIceInfoFile(ev.data, (stage) => post({ type: 'progress', stage })).then((result) =>
    // A grid's cells move to the page without a copy.
    post({ type: 'done', result }, result.ok && result.kind === 'grid' ? [result.grid.cells.buffer as ArrayBuffer] : []),
  );
};
