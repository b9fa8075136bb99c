// A fake Web Serial port for unit tests: its readable stream plays back the given chunks.
import type { SerialPortLike } from '../../src/gps/webSerial';
import { withChecksum } from '../../src/gps/nmea';

export interface FakePortOptions {
  /** Byte or text chunks, played back in order. */
  chunks: (string | Uint8Array)[];
  /** Keep the stream open after the last chunk (like a live device) instead of ending it. */
  keepOpen?: boolean;
  /** Make open() reject with this DOMException name. */
  openFails?: string;
  /** Make the stream error after the chunks, once, to test recovery. */
  errorAfterChunks?: boolean;
}

export class FakeSerialPort extends EventTarget implements SerialPortLike {
  openedWith: SerialOptions | null = null;
  closed = false;
  readable: ReadableStream<Uint8Array> | null = null;
  private controller: ReadableStreamDefaultController<Uint8Array> | null = null;
  private readonly opts: FakePortOptions;
  onconnect = null;
  ondisconnect = null;

  constructor(opts: FakePortOptions) {
    super();
    this.opts = opts;
  }

  async open(options: SerialOptions): Promise<void> {
    if (this.opts.openFails) throw new DOMException('fake failure', this.opts.openFails);
    if (this.openedWith) throw new DOMException('already open', 'InvalidStateError');
    this.openedWith = options;
    const enc = new TextEncoder();
    const chunks = this.opts.chunks.map((c) => (typeof c === 'string' ? enc.encode(c) : c));
    let i = 0;
    this.readable = new ReadableStream<Uint8Array>({
      start: (c) => {
        this.controller = c;
      },
      pull: (c) => {
        const next = chunks[i++];
        if (next) c.enqueue(next);
        else if (this.opts.errorAfterChunks) {
          this.opts.errorAfterChunks = false;
          c.error(new DOMException('framing error', 'FramingError'));
          // The spec replaces the stream after a non-fatal error.
          this.readable = new ReadableStream<Uint8Array>({ start: (c2) => { c2.enqueue(enc.encode(withChecksum('GPHDT,10.0,T') + '\r\n')); c2.close(); } });
        } else if (!this.opts.keepOpen) c.close();
      },
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    this.readable = null;
  }

  /** Simulate the cable being pulled. */
  unplug(): void {
    try {
      this.controller?.error(new DOMException('device lost', 'NetworkError'));
    } catch {
      // already closed
    }
    this.readable = null;
    this.dispatchEvent(new Event('disconnect'));
  }

  getInfo(): SerialPortInfo {
    return { usbVendorId: 0x1234, usbProductId: 0x5678 };
  }
}
