import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { LineSplitter, MAX_LINE_LENGTH, readLines } from '../../src/gps/lines';
import { withChecksum } from '../../src/gps/nmea';
import { sentencesForFix } from '../../src/gps/nmeaWrite';
import { GpsTracker, fixEpochMs } from '../../src/gps/tracker';

const enc = new TextEncoder();

function streamOf(chunks: (string | Uint8Array)[]): ReadableStream<Uint8Array> {
  return new ReadableStream({
    start(c) {
      for (const ch of chunks) c.enqueue(typeof ch === 'string' ? enc.encode(ch) : ch);
      c.close();
    },
  });
}

describe('line splitter', () => {
  it('splits on CR LF, LF and CR, across chunk boundaries, and flushes the tail', () => {
    const s = new LineSplitter();
    expect(s.push('$GPHDT,1')).toEqual([]);
    expect(s.push('0.0,T*00\r')).toEqual(['$GPHDT,10.0,T*00']);
    expect(s.push('\n$A\n\n$B\r$C')).toEqual(['$A', '$B']);
    expect(s.flush()).toEqual(['$C']);
    expect(s.flush()).toEqual([]);
  });

  it('starts a new line at a "$" when the terminator was lost', () => {
    const s = new LineSplitter();
    expect(s.push('$GPGGA,1234$GPHDT,10.0,T*00\r\n')).toEqual(['$GPGGA,1234', '$GPHDT,10.0,T*00']);
  });

  it('cuts endless noise into bounded pieces', () => {
    const s = new LineSplitter();
    const lines = s.push('x'.repeat(MAX_LINE_LENGTH * 3 + 5));
    expect(lines).toHaveLength(3);
    expect(lines.every((l) => l.length === MAX_LINE_LENGTH)).toBe(true);
  });

  it('gives the same lines however the bytes are chunked (property)', () => {
    const text = ['$GPHDT,1.0,T*00', '$GPHDT,2.0,T*00', 'junk', '$GPHDT,3.0,T*00'].join('\r\n') + '\r\n';
    const bytes = enc.encode(text);
    fc.assert(fc.property(fc.array(fc.integer({ min: 1, max: bytes.length }), { maxLength: 10 }), (cuts) => {
      const points = [...new Set(cuts)].sort((a, b) => a - b);
      const s = new LineSplitter();
      const out: string[] = [];
      let prev = 0;
      for (const p of [...points, bytes.length]) {
        out.push(...s.push(bytes.slice(prev, p)));
        prev = p;
      }
      out.push(...s.flush());
      expect(out).toEqual(['$GPHDT,1.0,T*00', '$GPHDT,2.0,T*00', 'junk', '$GPHDT,3.0,T*00']);
    }));
  });

  it('reads a byte stream to lines', async () => {
    const lines: string[] = [];
    for await (const l of readLines(streamOf(['$A\r\n$B', '\r\n$C']))) lines.push(l);
    expect(lines).toEqual(['$A', '$B', '$C']);
  });

  it('never throws on random bytes (property)', () => {
    fc.assert(fc.property(fc.array(fc.uint8Array({ maxLength: 200 }), { maxLength: 10 }), (chunks) => {
      const s = new LineSplitter();
      const t = new GpsTracker();
      let n = 0;
      for (const c of chunks) for (const l of s.push(c)) { t.acceptLine(l, 0); n++; }
      for (const l of s.flush()) { t.acceptLine(l, 0); n++; }
      expect(t.counts.good + t.counts.bad + t.counts.ignored).toBe(n);
    }), { numRuns: 300 });
  });
});

describe('GPS tracker', () => {
  const t0 = Date.UTC(2026, 2, 9, 12, 0, 0);

  it('combines GGA, RMC, VTG and HDT into one fix with its age', () => {
    const t = new GpsTracker();
    for (const line of sentencesForFix({ timeMs: t0, lat: 82.5, lon: 15.25, sogKn: 3.2, cogDeg: 12.5, headingDeg: 20.1, satellites: 11, hdop: 0.8 })) {
      expect(t.acceptLine(line, t0 + 400).ok).toBe(true);
    }
    expect(t.fix(t0 + 2400)).toEqual({
      time: '2026-03-09T12:00:00Z', lat: 82.5, lon: 15.25, fixQuality: 1, satellites: 11, hdop: 0.8,
      sogKn: 3.2, cogDeg: 12.5, headingDeg: 20.1, ageMs: 2000,
    });
    expect(t.counts).toEqual({ good: 4, bad: 0, ignored: 0, byType: { GGA: 1, RMC: 1, VTG: 1, HDT: 1, HDG: 0 } });
  });

  it('counts and keeps bad sentences, skips them, and carries on', () => {
    const t = new GpsTracker();
    const good = withChecksum('GPGGA,120000,8230.000,N,01515.000,E,2,09,0.9,10.0,M,30.0,M,,');
    const results = [
      '$GPGGA,120000,8230.000,N,01515.000,E,2,09,0.9,10.0,M,30.0,M,,*00',
      withChecksum('GPGGA,120000,8230.000,N,01515.000,E,2,09,0.9,10.0,M,30.0,M'),
      withChecksum('GPGSV,3,1,12,01,43,189,44'),
      'noise',
      good,
    ].map((l) => t.acceptLine(l, t0));
    expect(results.map((r) => r.ok)).toEqual([false, false, false, false, true]);
    expect(t.counts).toMatchObject({ good: 1, bad: 3, ignored: 1 });
    expect(t.recentErrors.map((e) => e.kind)).toEqual(['checksum', 'field', 'framing']);
    expect(t.fix(t0)).toMatchObject({ lat: 82.5, fixQuality: 2 });
  });

  it('does not move the position on a no-fix GGA or a void RMC', () => {
    const t = new GpsTracker();
    t.acceptLine(withChecksum('GPGGA,120000,8230.000,N,01515.000,E,1,09,0.9,10.0,M,30.0,M,,'), t0);
    t.acceptLine(withChecksum('GPGGA,120001,8000.000,N,01000.000,E,0,00,,,,,,,'), t0 + 1000);
    t.acceptLine(withChecksum('GPRMC,120002,V,8000.000,N,01000.000,E,,,090326,,,N'), t0 + 2000);
    expect(t.fix(t0 + 3000)).toMatchObject({ lat: 82.5, fixQuality: 0, ageMs: 3000 });
  });

  it('prefers a gyro HDT to a compass HDG', () => {
    const t = new GpsTracker();
    t.acceptLine(withChecksum('GPGGA,120000,8230.000,N,01515.000,E,1,09,0.9,10.0,M,30.0,M,,'), t0);
    t.acceptLine(withChecksum('HCHDG,100.0,,,5.0,E'), t0);
    expect(t.fix(t0)?.headingDeg).toBe(105);
    t.acceptLine(withChecksum('HEHDT,98.0,T'), t0);
    t.acceptLine(withChecksum('HCHDG,100.0,,,5.0,E'), t0);
    expect(t.fix(t0)?.headingDeg).toBe(98);
  });

  it('says when the stream as a whole looks wrong', () => {
    const garbage = new GpsTracker();
    // What 4800-baud NMEA looks like read at 38400: framing noise.
    for (let i = 0; i < 12; i++) garbage.acceptLine('\u00f8\u00e0x\u00fe', t0);
    expect(garbage.diagnosis()).toMatch(/check the baud rate/);
    const gyroOnly = new GpsTracker();
    for (let i = 0; i < 50; i++) gyroOnly.acceptLine(withChecksum('HEHDT,98.0,T'), t0);
    expect(gyroOnly.diagnosis()).toMatch(/no position/);
    const noFix = new GpsTracker();
    for (let i = 0; i < 20; i++) noFix.acceptLine(withChecksum('GPGGA,120000,,,,,0,00,,,,,,,'), t0);
    expect(noFix.diagnosis()).toMatch(/no fix yet/);
    noFix.acceptLine(withChecksum('GPGGA,120000,8230.000,N,01515.000,E,1,09,0.9,10.0,M,30.0,M,,'), t0);
    expect(noFix.diagnosis()).toBeNull();
  });

  it('dates a GGA time of day from the last RMC, or from the clock nearest to it', () => {
    expect(fixEpochMs(3600, { year: 2026, month: 3, day: 9 }, 0)).toBe(Date.UTC(2026, 2, 9, 1));
    // Heard at 00:00:02 on 10 March, stamped 23:59:59: belongs to 9 March.
    expect(fixEpochMs(86399, null, Date.UTC(2026, 2, 10, 0, 0, 2))).toBe(Date.UTC(2026, 2, 9, 23, 59, 59));
    // Heard at 23:59:58, stamped 00:00:01: the next day.
    expect(fixEpochMs(1, null, Date.UTC(2026, 2, 9, 23, 59, 58))).toBe(Date.UTC(2026, 2, 10, 0, 0, 1));
  });
});
