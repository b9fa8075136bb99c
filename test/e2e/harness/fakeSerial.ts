// A fake Web Serial device for browser tests: injects `navigator.serial` into every page of a
// Playwright page before the app's scripts run. The "device" sends the given NMEA lines at a
// steady pace once the app opens it, as a GPS on a USB-serial adapter would.
//
//   await installFakeSerial(page, { lines: demoNmeaLines(120) });
//   ... the app calls navigator.serial.requestPort() and port.open({ baudRate }) ...
//   await page.evaluate(() => window.__fakeSerial.unplug());
import type { Page } from 'playwright-core';
import { makeDemoCruise } from '../../../src/domain/demo';
import { sentencesForFix } from '../../../src/gps/nmeaWrite';

export interface FakeSerialScript {
  /** Lines to send, without line endings (CR LF is added). */
  lines: string[];
  /** Pause between lines, ms (default 20). */
  intervalMs?: number;
  /** Start again from the first line after the last (default false: go quiet). */
  loop?: boolean;
  /** Pretend the user already granted this port, so `getPorts()` returns it. */
  alreadyGranted?: boolean;
  /** Make `requestPort()` reject as if the user cancelled the chooser. */
  userCancels?: boolean;
}

/** What the page can see of the fake, as `window.__fakeSerial`. */
export interface FakeSerialControl {
  /** Options the app passed to `port.open()`, or null while closed. */
  openedWith: () => SerialOptions | null;
  linesSent: () => number;
  isOpen: () => boolean;
  /** Send extra text right away (e.g. a corrupted sentence). */
  push: (text: string) => void;
  /** Simulate the cable being pulled: the stream errors and `disconnect` fires. */
  unplug: () => void;
}

/** Install the fake before the page loads. Call before `page.goto` (or reload afterwards). */
export async function installFakeSerial(page: Page, script: FakeSerialScript): Promise<void> {
  await page.addInitScript(fakeSerialInit, script);
}

/** NMEA sentences of the demo cruise's track, one fix a minute of track, `count` fixes long. */
export function demoNmeaLines(count: number, seed = 1): string[] {
  const { track } = makeDemoCruise(seed);
  return track.slice(0, count).flatMap((p) => sentencesForFix({
    timeMs: Date.parse(p.time), lat: p.lat, lon: p.lon, sogKn: p.sogKn, cogDeg: p.cogDeg, headingDeg: p.headingDeg, satellites: 11, hdop: 0.8,
  }));
}

// Runs inside the browser: it must not use anything from this module's scope.
function fakeSerialInit(script: FakeSerialScript): void {
  const enc = new TextEncoder();
  const interval = script.intervalMs ?? 20;

  class FakePort extends EventTarget {
    readable: ReadableStream<Uint8Array> | null = null;
    writable: WritableStream<Uint8Array> | null = null;
    connected = true;
    onconnect = null;
    ondisconnect = null;
    options: SerialOptions | null = null;
    sent = 0;
    private timer: ReturnType<typeof setInterval> | null = null;
    private controller: ReadableStreamDefaultController<Uint8Array> | null = null;

    async open(options: SerialOptions): Promise<void> {
      if (this.options) throw new DOMException('The port is already open.', 'InvalidStateError');
      if (!this.connected) throw new DOMException('Failed to open serial port.', 'NetworkError');
      if (!Number.isInteger(options.baudRate) || options.baudRate <= 0) throw new TypeError('Requested baud rate is not valid.');
      this.options = options;
      let i = 0;
      this.readable = new ReadableStream<Uint8Array>({
        start: (c) => {
          this.controller = c;
          this.timer = setInterval(() => {
            if (i >= script.lines.length) {
              if (!script.loop) return;
              i = 0;
            }
            c.enqueue(enc.encode(`${script.lines[i++] ?? ''}\r\n`));
            this.sent++;
          }, interval);
        },
        cancel: () => this.stop(),
      });
      this.writable = new WritableStream<Uint8Array>();
    }

    private stop(): void {
      if (this.timer !== null) clearInterval(this.timer);
      this.timer = null;
    }

    async close(): Promise<void> {
      if (!this.options) throw new DOMException('The port is already closed.', 'InvalidStateError');
      this.stop();
      this.options = null;
      this.readable = null;
      this.writable = null;
    }

    push(text: string): void {
      this.controller?.enqueue(enc.encode(text));
    }

    unplug(): void {
      this.stop();
      this.connected = false;
      try {
        this.controller?.error(new DOMException('The device has been lost.', 'NetworkError'));
      } catch {
        // stream already finished
      }
      this.readable = null;
      this.dispatchEvent(new Event('disconnect'));
      serial.dispatchEvent(new Event('disconnect'));
    }

    getInfo(): SerialPortInfo {
      return { usbVendorId: 0x067b, usbProductId: 0x2303 };
    }

    async forget(): Promise<void> {
      granted = false;
    }

    async setSignals(): Promise<void> {}

    async getSignals(): Promise<SerialInputSignals> {
      return { dataCarrierDetect: true, clearToSend: true, ringIndicator: false, dataSetReady: true };
    }
  }

  const port = new FakePort();
  let granted = script.alreadyGranted ?? false;
  const serial = Object.assign(new EventTarget(), {
    onconnect: null,
    ondisconnect: null,
    requestPort: async (): Promise<FakePort> => {
      if (script.userCancels) throw new DOMException('No port selected by the user.', 'NotFoundError');
      granted = true;
      return port;
    },
    getPorts: async (): Promise<FakePort[]> => (granted ? [port] : []),
  });
  Object.defineProperty(Navigator.prototype, 'serial', { configurable: true, get: () => serial });
  const control: FakeSerialControl = {
    openedWith: () => port.options,
    linesSent: () => port.sent,
    isOpen: () => port.options !== null,
    push: (text) => port.push(text),
    unplug: () => port.unplug(),
  };
  (window as unknown as { __fakeSerial: FakeSerialControl }).__fakeSerial = control;
}

declare global {
  interface Window {
    __fakeSerial: FakeSerialControl;
  }
}
