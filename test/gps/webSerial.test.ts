import { describe, expect, it } from 'vitest';
import { withChecksum } from '../../src/gps/nmea';
import { sentencesForFix } from '../../src/gps/nmeaWrite';
import { connectSerialGps, DEFAULT_BAUD_RATE, isWebSerialAvailable, requestSerialPort, type SerialStatus } from '../../src/gps/webSerial';
import { FakeSerialPort } from './fakeSerial';

const t0 = Date.UTC(2026, 2, 9, 6, 0, 0);
const fixLines = (i: number): string =>
  sentencesForFix({ timeMs: t0 + i * 1000, lat: 81 + i / 1000, lon: 12, sogKn: 8, cogDeg: 30, headingDeg: 31 }).join('\r\n') + '\r\n';

describe('Web Serial GPS reader', () => {
  it('opens at 4800 baud by default (NMEA 0183) and reads fixes through the line reader', async () => {
    // Bytes split mid-sentence, as a serial port delivers them.
    const text = fixLines(0) + fixLines(1) + '$GPGGA,garbage*00\r\n' + fixLines(2);
    const chunks = text.match(/[\s\S]{1,17}/g) ?? [];
    const port = new FakeSerialPort({ chunks });
    const statuses: SerialStatus[] = [];
    const fixes: number[] = [];
    const conn = await connectSerialGps(port, { now: () => t0 + 5000, onStatus: (s) => statuses.push(s), onFix: (f) => fixes.push(f.lat) });
    await conn.done;
    expect(port.openedWith).toMatchObject({ baudRate: 4800, dataBits: 8, stopBits: 1, parity: 'none' });
    expect(DEFAULT_BAUD_RATE).toBe(4800);
    expect(conn.tracker.counts).toMatchObject({ good: 12, bad: 1, ignored: 0 });
    expect(conn.fix()).toMatchObject({ time: '2026-03-09T06:00:02Z', lat: 81.002, sogKn: 8, headingDeg: 31, ageMs: 0 });
    // Two position sentences (RMC, GGA) per fix.
    expect(fixes).toHaveLength(6);
    expect(statuses).toEqual(['opening', 'reading', 'disconnected']);
    await conn.close();
    expect(port.closed).toBe(true);
    expect(conn.status()).toBe('closed');
  });

  it('uses the chosen baud rate', async () => {
    const port = new FakeSerialPort({ chunks: [] });
    const conn = await connectSerialGps(port, { baudRate: 38400 });
    expect(port.openedWith?.baudRate).toBe(38400);
    await conn.close();
  });

  it('keeps reading after a recoverable error, on the replacement stream', async () => {
    const port = new FakeSerialPort({ chunks: [fixLines(0)], errorAfterChunks: true });
    const details: string[] = [];
    const conn = await connectSerialGps(port, { onStatus: (_s, d) => d && details.push(d) });
    await conn.done;
    expect(details.some((d) => d.startsWith('Read error, continuing'))).toBe(true);
    // The fake's replacement stream carries one HDT.
    expect(conn.tracker.counts.byType.HDT).toBe(2);
    expect(conn.fix()?.headingDeg).toBe(10);
  });

  it('reports an unplugged device and stops reading', async () => {
    const port = new FakeSerialPort({ chunks: [fixLines(0)], keepOpen: true });
    const statuses: [SerialStatus, string | undefined][] = [];
    const conn = await connectSerialGps(port, { onStatus: (s, d) => statuses.push([s, d]) });
    await new Promise((r) => setTimeout(r, 10));
    expect(conn.status()).toBe('reading');
    port.unplug();
    await conn.done;
    expect(conn.status()).toBe('disconnected');
    expect(statuses.at(-1)).toEqual(['disconnected', 'The GPS device was unplugged.']);
    expect(conn.tracker.counts.good).toBe(4);
  });

  it('closes a live port on request', async () => {
    const port = new FakeSerialPort({ chunks: [withChecksum('HEHDT,1.0,T') + '\r\n'], keepOpen: true });
    const conn = await connectSerialGps(port);
    await new Promise((r) => setTimeout(r, 10));
    await conn.close();
    await conn.close();
    expect(conn.status()).toBe('closed');
    expect(port.closed).toBe(true);
  });

  it('explains why a port would not open', async () => {
    await expect(connectSerialGps(new FakeSerialPort({ chunks: [], openFails: 'InvalidStateError' }))).rejects.toThrow(/already open/);
    await expect(connectSerialGps(new FakeSerialPort({ chunks: [], openFails: 'NetworkError' }))).rejects.toThrow(/still plugged in/);
  });

  it('treats a cancelled port chooser as no port, and detects a browser without Web Serial', async () => {
    const serial = { requestPort: () => Promise.reject(new DOMException('No port selected', 'NotFoundError')) } as unknown as Serial;
    await expect(requestSerialPort(serial)).resolves.toBeNull();
    const failing = { requestPort: () => Promise.reject(new DOMException('blocked', 'SecurityError')) } as unknown as Serial;
    await expect(requestSerialPort(failing)).rejects.toThrow('blocked');
    expect(isWebSerialAvailable({} as Navigator)).toBe(false);
    expect(isWebSerialAvailable({ serial: {} } as unknown as Navigator)).toBe(true);
  });
});
