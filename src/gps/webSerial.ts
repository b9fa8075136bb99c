// The ship's GPS over Web Serial (Chromium): choose a port, open it at the chosen baud rate, read
// NMEA 0183 lines into a GpsTracker, and notice when the cable is pulled.
import { LineSplitter } from './lines';
import type { ParseResult } from './nmea';
import { GpsTracker, type GpsFix } from './tracker';

/** NMEA 0183 is 4800 baud; "high speed" NMEA (IEC 61162-2) and AIS use 38400. */
export const BAUD_RATES = [4800, 9600, 19200, 38400, 57600, 115200] as const;
export const DEFAULT_BAUD_RATE = 4800;

export type SerialStatus = 'opening' | 'reading' | 'closed' | 'disconnected' | 'error';

/** The part of the Web Serial SerialPort this module uses, so tests can pass a fake. */
export type SerialPortLike = Pick<SerialPort, 'open' | 'close' | 'readable' | 'addEventListener' | 'removeEventListener'>;

export interface SerialGpsOptions {
  baudRate?: number;
  /** Accept sentences without a checksum (some old gyros send HDT without one). */
  allowMissingChecksum?: boolean;
  /** Clock for fix ages; injectable for tests. */
  now?: () => number;
  /** Called whenever a sentence moved the position. */
  onFix?: (fix: GpsFix) => void;
  /** Called for every line read, with what the parser made of it. */
  onLine?: (line: string, result: ParseResult) => void;
  onStatus?: (status: SerialStatus, detail?: string) => void;
}

export interface SerialGpsConnection {
  readonly tracker: GpsTracker;
  readonly baudRate: number;
  status: () => SerialStatus;
  /** The current fix with its age, or null before the first valid position. */
  fix: () => GpsFix | null;
  /** Stop reading and close the port. Safe to call more than once. */
  close: () => Promise<void>;
  /** Settles when reading has ended, for whatever reason. */
  done: Promise<void>;
}

export function isWebSerialAvailable(nav: Navigator | undefined = globalThis.navigator): boolean {
  return nav !== undefined && 'serial' in nav && nav.serial !== undefined;
}

/** Ask the user to pick a port. Returns null when they cancel the chooser. */
export async function requestSerialPort(serial: Serial = navigator.serial, options?: SerialPortRequestOptions): Promise<SerialPort | null> {
  try {
    return await serial.requestPort(options);
  } catch (e) {
    if (e instanceof DOMException && e.name === 'NotFoundError') return null;
    throw e;
  }
}

function describeOpenError(e: unknown, baudRate: number): string {
  if (e instanceof DOMException) {
    if (e.name === 'InvalidStateError') return 'The serial port is already open (in another tab or program).';
    if (e.name === 'NetworkError') return 'The serial port could not be opened: is the device still plugged in and not in use elsewhere?';
  }
  if (e instanceof TypeError) return `The serial port refused ${baudRate} baud: ${e.message}`;
  return `The serial port could not be opened: ${e instanceof Error ? e.message : String(e)}`;
}

/** Open a port and start reading NMEA from it. Rejects with a clear message if opening fails. */
export async function connectSerialGps(port: SerialPortLike, opts: SerialGpsOptions = {}): Promise<SerialGpsConnection> {
  const baudRate = opts.baudRate ?? DEFAULT_BAUD_RATE;
  const now = opts.now ?? (() => Date.now());
  const tracker = new GpsTracker({ allowMissingChecksum: opts.allowMissingChecksum ?? false });
  let status: SerialStatus = 'opening';
  const setStatus = (s: SerialStatus, detail?: string): void => {
    status = s;
    opts.onStatus?.(s, detail);
  };
  setStatus('opening');
  try {
    await port.open({ baudRate, dataBits: 8, stopBits: 1, parity: 'none', flowControl: 'none' });
  } catch (e) {
    const message = describeOpenError(e, baudRate);
    setStatus('error', message);
    throw new Error(message, { cause: e });
  }

  let closing = false;
  let reader: ReadableStreamDefaultReader<Uint8Array> | null = null;
  const onDisconnect = (): void => {
    if (!closing) setStatus('disconnected', 'The GPS device was unplugged.');
    void reader?.cancel().catch(() => undefined);
  };
  port.addEventListener('disconnect', onDisconnect);

  const handleLine = (line: string): void => {
    const result = tracker.acceptLine(line, now());
    opts.onLine?.(line, result);
    if (result.ok && opts.onFix) {
      const f = tracker.fix(now());
      if (f && (result.value.type === 'GGA' || result.value.type === 'RMC')) opts.onFix(f);
    }
  };

  const loop = async (): Promise<void> => {
    setStatus('reading');
    const splitter = new LineSplitter();
    // After a recoverable error (parity, framing, buffer overrun) the Web Serial spec gives a new
    // readable stream; it is null once the device is gone.
    let lastStream: ReadableStream<Uint8Array> | null = null;
    while (port.readable && !closing) {
      const stream = port.readable;
      if (stream === lastStream) break; // errored and not replaced: the device is gone
      lastStream = stream;
      reader = stream.getReader();
      let ended = false;
      try {
        for (;;) {
          const { value, done } = await reader.read();
          if (done) {
            ended = true;
            break;
          }
          for (const line of splitter.push(value)) handleLine(line);
        }
      } catch (e) {
        if (!closing && status !== 'disconnected') opts.onStatus?.('reading', `Read error, continuing: ${e instanceof Error ? e.message : String(e)}`);
      } finally {
        reader.releaseLock();
        reader = null;
      }
      if (ended || closing || status === 'disconnected') break;
    }
    for (const line of splitter.flush()) handleLine(line);
    port.removeEventListener('disconnect', onDisconnect);
    if (!closing && status !== 'disconnected') setStatus('disconnected', 'The GPS stopped sending.');
  };
  const done = loop();

  const close = async (): Promise<void> => {
    if (closing) return done;
    closing = true;
    await reader?.cancel().catch(() => undefined);
    await done;
    await port.close().catch(() => undefined);
    setStatus('closed');
  };

  return { tracker, baudRate, status: () => status, fix: () => tracker.fix(now()), close, done };
}
