import { describe, expect, it } from 'vitest';
import { detectCsvColumns, importCsvTrack, parseTrackTime } from '../../src/gps/csvTrack';
import { withChecksum } from '../../src/gps/nmea';
import { importNmeaLog } from '../../src/gps/nmeaLog';
import { sentencesForFix } from '../../src/gps/nmeaWrite';
import { importTrackText, TrackFormatError } from '../../src/gps/trackFiles';
import { detectTrackFormat, finishPoints, MAX_LISTED_BAD_LINES } from '../../src/gps/trackImport';

const t0 = Date.UTC(2026, 2, 9, 23, 59, 0);

describe('NMEA log import', () => {
  it('turns RMC+GGA+VTG+HDT groups into one point each, behind any logger prefix', () => {
    const lines: string[] = [];
    for (let i = 0; i < 3; i++) {
      const fix = { timeMs: t0 + i * 30_000, lat: 82 + i * 0.001, lon: 15, sogKn: 4 + i, cogDeg: 10, headingDeg: 12 };
      // A prefix the way shipboard loggers write one (counter, or ISO time).
      lines.push(...sentencesForFix(fix).map((s, k) => (k % 2 ? `2026-03-09T23:59:${String(i).padStart(2, '0')}Z ${s}` : `00000${i}${k} ${s}`)));
    }
    return importNmeaLog(lines.join('\r\n'), { cruiseId: 'c' }).then((r) => {
      expect(r.points).toEqual([
        { cruiseId: 'c', time: '2026-03-09T23:59:00Z', lat: 82, lon: 15, source: 'track-file', sogKn: 4, cogDeg: 10, headingDeg: 12 },
        { cruiseId: 'c', time: '2026-03-09T23:59:30Z', lat: 82.001, lon: 15, source: 'track-file', sogKn: 5, cogDeg: 10, headingDeg: 12 },
        // Crosses midnight: the RMC date moves on.
        { cruiseId: 'c', time: '2026-03-10T00:00:00Z', lat: 82.002, lon: 15, source: 'track-file', sogKn: 6, cogDeg: 10, headingDeg: 12 },
      ]);
      expect(r.counts).toEqual({ records: 12, imported: 3, bad: 0, skipped: 0, duplicates: 0 });
    });
  });

  it('counts and lists bad lines by number and imports the rest', async () => {
    const good1 = withChecksum('GPRMC,120000,A,8200.000,N,01500.000,E,5.0,10.0,090326,,,A');
    const good2 = withChecksum('GPRMC,120100,A,8200.100,N,01500.000,E,5.0,10.0,090326,,,A');
    const text = [
      good1,
      '$GPRMC,120030,A,8200.050,N,01500.000,E,5.0,10.0,090326,,,A*00',
      'logger restarted',
      withChecksum('GPGSV,3,1,12,01,43,189,44'),
      withChecksum('GPGGA,120045,8200.07,N,01500.000,E,1,08,0.9,1,M,,M,,'),
      withChecksum('GPRMC,120050,A,82OO.080,N,01500.000,E,5.0,10.0,090326,,,A'),
      '',
      good2,
    ].join('\n');
    const r = await importNmeaLog(text, { cruiseId: 'c' });
    expect(r.points.map((p) => p.time)).toEqual(['2026-03-09T12:00:00Z', '2026-03-09T12:00:45Z', '2026-03-09T12:01:00Z']);
    expect(r.bad).toEqual([
      { line: 2, reason: `GPRMC: checksum 00 does not match ${good1.slice(-2) === '00' ? '??' : withChecksum('GPRMC,120030,A,8200.050,N,01500.000,E,5.0,10.0,090326,,,A').slice(-2)}` },
      { line: 3, reason: 'no NMEA sentence on this line' },
      { line: 6, reason: 'GPRMC: latitude "82OO.080" is not ddmm.mmmm' },
    ]);
    expect(r.counts).toEqual({ records: 7, imported: 3, bad: 3, skipped: 1, duplicates: 0 });
  });

  it('needs a date for a GGA-only log, and uses the one given', async () => {
    const text = [withChecksum('GPGGA,235959,8200.000,N,01500.000,E,1,08,0.9,1,M,,M,,'), withChecksum('GPGGA,000001,8200.001,N,01500.000,E,1,08,0.9,1,M,,M,,')].join('\n');
    const without = await importNmeaLog(text, { cruiseId: 'c' });
    expect(without.points).toEqual([]);
    expect(without.bad[0]!.reason).toMatch(/no RMC to give the date/);
    const withDate = await importNmeaLog(text, { cruiseId: 'c', defaultDate: '2026-03-09' });
    // The second fix rolls over to the next day rather than jumping back 24 hours.
    expect(withDate.points.map((p) => p.time)).toEqual(['2026-03-09T23:59:59Z', '2026-03-10T00:00:01Z']);
  });

  it('keeps the page responsive on a large log: progress in chunks, and can be aborted', async () => {
    const lines: string[] = [];
    for (let i = 0; i < 3000; i++) lines.push(...sentencesForFix({ timeMs: t0 + i * 1000, lat: 80, lon: 10 + i * 1e-4 }));
    const progress: [number, string][] = [];
    const r = await importNmeaLog(lines.join('\n'), { cruiseId: 'c', chunkSize: 1000, onProgress: (f, p) => progress.push([f, p]) });
    expect(r.counts.imported).toBe(3000);
    expect(progress.length).toBeGreaterThanOrEqual(9 + 6);
    expect(progress.at(-1)).toEqual([1, 'building the track']);
    const ac = new AbortController();
    ac.abort();
    await expect(importNmeaLog(lines.join('\n'), { cruiseId: 'c', signal: ac.signal })).rejects.toThrow();
  });
});

describe('CSV track import', () => {
  it('finds columns by their usual spellings', () => {
    expect(detectCsvColumns(['Timestamp (UTC)', 'Latitude', 'Longitude', 'SOG [kn]', 'Heading'])).toEqual({ columns: { time: 0, lat: 1, lon: 2, sog: 3, heading: 4 } });
    expect(detectCsvColumns(['date', 'time', 'lat', 'lng'])).toEqual({ columns: { time: 1, date: 0, lat: 2, lon: 3 } });
    expect(detectCsvColumns(['datetime', 'y', 'x'])).toEqual({ error: 'no lat, lon column found in the header (datetime, y, x); expected e.g. time, lat, lon' });
  });

  it('reads ISO 8601 with or without zone (UTC assumed) and epoch seconds or milliseconds', () => {
    expect(parseTrackTime('2026-03-09T12:00:00Z')).toBe(Date.UTC(2026, 2, 9, 12));
    expect(parseTrackTime('2026-03-09 12:00:00')).toBe(Date.UTC(2026, 2, 9, 12));
    expect(parseTrackTime('2026-03-09T13:00:00+01:00')).toBe(Date.UTC(2026, 2, 9, 12));
    expect(parseTrackTime('1773057600')).toBe(Date.UTC(2026, 2, 9, 12));
    expect(parseTrackTime('1773057600000')).toBe(Date.UTC(2026, 2, 9, 12));
    expect(parseTrackTime('12:00:00', '2026-03-09')).toBe(Date.UTC(2026, 2, 9, 12));
    expect(parseTrackTime('09/03/2026 12:00')).toBeNaN();
  });

  it('imports good rows, lists bad rows by line (CR LF, semicolons, quoted fields, blank lines)', async () => {
    const text = [
      'time;lat;lon;sog;cog',
      '2026-03-09T12:00:00Z;82.0;15.0;4.5;10',
      '',
      '"2026-03-09T12:01:00Z";82.001;15.0;4.4;11',
      '2026-03-09T12:02:00Z;82,002;15.0;;',
      'noon;82.003;15.0;;',
      '2026-03-09T12:04:00Z;82.004;;;',
      '2026-03-09T12:05:00Z;-95;15.0;;',
      '1773057900;82.006;15.0;4.0;12',
    ].join('\r\n') + '\r\n';
    const r = await importCsvTrack(text, { cruiseId: 'c' });
    expect(r.points.map((p) => [p.time, p.lat, p.sogKn ?? null])).toEqual([
      ['2026-03-09T12:00:00Z', 82, 4.5], ['2026-03-09T12:01:00Z', 82.001, 4.4], ['2026-03-09T12:05:00Z', 82.006, 4],
    ]);
    expect(r.bad.map((b) => b.line)).toEqual([5, 6, 7, 8]);
    expect(r.bad[1]!.reason).toBe('time "noon" is neither ISO 8601 nor epoch seconds or milliseconds');
    // Common practice: a decimal comma is the usual slip from a spreadsheet set to a European locale.
    expect(r.bad[0]!.reason).toBe('latitude "82,002": use a point, not a comma, for decimals');
    expect(r.bad[2]!.reason).toBe('longitude is empty');
    expect(r.counts).toEqual({ records: 7, imported: 3, bad: 4, skipped: 1, duplicates: 0 });
  });

  it('reads positions in the notations the domain parser knows, and catches a decimal comma in a comma-separated file', async () => {
    const text = `time,lat,lon\n2026-03-09T12:00:00Z,82°30.5'N,015 15.0 E\n2026-03-09T12:01:00Z,82,002,15\n2026-03-09T12:02:00Z,N 82 31.0,E 15 16.0\n`;
    const r = await importCsvTrack(text, { cruiseId: 'c' });
    expect(r.points.map((p) => [p.lat, p.lon])).toEqual([[82 + 30.5 / 60, 15.25], [82 + 31 / 60, 15 + 16 / 60]]);
    expect(r.bad).toEqual([{ line: 3, reason: 'row has 4 fields, the header has 3 (a decimal comma, or a missing separator?)' }]);
  });

  it('reports a header without the needed columns as the one bad line', async () => {
    const r = await importCsvTrack('when,where\n1,2\n', { cruiseId: 'c' });
    expect(r.points).toEqual([]);
    expect(r.bad).toEqual([{ line: 1, reason: 'no time, lat, lon column found in the header (when, where); expected e.g. time, lat, lon' }]);
  });

  it('lists at most a thousand bad lines but counts them all', async () => {
    const rows = ['time,lat,lon', ...Array.from({ length: 1500 }, () => 'x,1,2'), '2026-03-09T00:00:00Z,1,2'];
    const r = await importCsvTrack(rows.join('\n'), { cruiseId: 'c' });
    expect(r.bad).toHaveLength(MAX_LISTED_BAD_LINES);
    expect(r.counts.bad).toBe(1500);
    expect(r.counts.imported).toBe(1);
    expect(r.bad[999]!.line).toBe(1001);
  });
});

describe('format detection and the shared steps', () => {
  it('detects the format by extension, then content', () => {
    expect(detectTrackFormat('a.GPX', '')).toBe('gpx');
    expect(detectTrackFormat('a.txt', '<?xml version="1.0"?><gpx version="1.1">')).toBe('gpx');
    expect(detectTrackFormat('gps.log', '0001 $GPRMC,1')).toBe('nmea');
    expect(detectTrackFormat('a.txt', 'x\n$GNGGA,1')).toBe('nmea');
    expect(detectTrackFormat('a.txt', 'Time,Lat,Lon\n')).toBe('csv');
    expect(detectTrackFormat('a.txt', 'hello')).toBeNull();
  });

  it('refuses an unknown file with a clear message', async () => {
    await expect(importTrackText('notes.txt', 'hello', { cruiseId: 'c' })).rejects.toThrow(TrackFormatError);
    await expect(importTrackText('notes.txt', 'hello', { cruiseId: 'c' })).rejects.toThrow(/notes.txt: not a track file/);
  });

  it('sorts by time and keeps the first point of each time', () => {
    const p = (time: string, lat: number) => ({ cruiseId: 'c', time, lat, lon: 0, source: 'track-file' as const });
    expect(finishPoints([p('2026-01-01T00:02:00Z', 2), p('2026-01-01T00:01:00Z', 1), p('2026-01-01T00:01:00.000Z', 9)])).toEqual({
      points: [p('2026-01-01T00:01:00Z', 1), p('2026-01-01T00:02:00Z', 2)], duplicates: 1,
    });
  });
});
