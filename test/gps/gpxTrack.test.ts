// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { importGpxTrack } from '../../src/gps/gpxTrack';
import { importTrackFile } from '../../src/gps/trackFiles';

// An invented GPX 1.1 track (schema: topografix.com/GPX/1/1): two segments, a waypoint, a route,
// a comment that mentions <trkpt> and some bad points.
const GPX = `<?xml version="1.0" encoding="UTF-8"?>
<gpx version="1.1" creator="floe-ledger-test" xmlns="http://www.topografix.com/GPX/1/1">
  <wpt lat="81.0" lon="12.0"><name>ice edge</name></wpt>
  <!-- a <trkpt lat="0" lon="0"> in a comment is not a point -->
  <trk><name>FW26-03</name>
    <trkseg>
      <trkpt lat="81.000000" lon="12.000000"><ele>12</ele><time>2026-03-09T12:00:00Z</time></trkpt>
      <trkpt lat="81.001000" lon="12.002000"><time>2026-03-09T12:01:00Z</time></trkpt>
      <trkpt lat="91.5" lon="12.004"><time>2026-03-09T12:02:00Z</time></trkpt>
      <trkpt lat="81.003" lon="12.006"></trkpt>
      <trkpt lat="81.004" lon="12.008"><time>yesterday</time></trkpt>
      <trkpt lon="12.010"><time>2026-03-09T12:05:00Z</time></trkpt>
      <trkpt lat="81.006" lon="12.012"><time>2026-03-09T12:06:00Z</time></trkpt>
    </trkseg>
    <trkseg>
      <trkpt lat="81.010" lon="12.020"><time>2026-03-09T13:00:00Z</time></trkpt>
      <trkpt lat="81.011" lon="12.022"><time>2026-03-09T13:01:00.500Z</time></trkpt>
      <trkpt lat="81.011" lon="12.022"><time>2026-03-09T13:01:00.500Z</time></trkpt>
    </trkseg>
    <trkseg>
      <trkpt lat="81.02" lon="12.03"><time>2026-03-09T14:00:00Z</time></trkpt>
      <trkpt lat="81.02" lon="12.03"/>
    </trkseg>
  </trk>
  <rte><rtept lat="80" lon="10"/><rtept lat="80.5" lon="10.5"/></rte>
</gpx>`;

describe('GPX track import', () => {
  it('imports the good points, lists each bad one by line, and skips waypoints and routes', async () => {
    const progress: number[] = [];
    const r = await importGpxTrack(GPX, { cruiseId: 'c1', onProgress: (f) => progress.push(f), chunkSize: 3 });
    expect(r.points.map((p) => [p.time, p.lat, p.lon])).toEqual([
      ['2026-03-09T12:00:00Z', 81, 12],
      ['2026-03-09T12:01:00Z', 81.001, 12.002],
      ['2026-03-09T12:06:00Z', 81.006, 12.012],
      ['2026-03-09T13:00:00Z', 81.01, 12.02],
      ['2026-03-09T13:01:00.500Z', 81.011, 12.022],
    ]);
    expect(r.points.every((p) => p.cruiseId === 'c1' && p.source === 'track-file')).toBe(true);
    expect(r.bad).toEqual([
      { line: 9, reason: 'latitude 91.5 is outside -90..90' },
      { line: 10, reason: 'track point without a <time>' },
      { line: 11, reason: 'time "yesterday" is not ISO 8601 with a zone (GPX 1.1 uses UTC, e.g. 2026-03-09T12:00:00Z)' },
      { line: 12, reason: 'track point without lat or lon attribute' },
      { line: 22, reason: 'track point without a <time>' },
      { line: 21, reason: 'the only usable point of its track segment (a segment needs two)' },
    ]);
    expect(r.counts).toEqual({ records: 12, imported: 5, bad: 6, skipped: 3, duplicates: 1 });
    expect(progress.at(-1)).toBe(1);
    expect(progress.length).toBeGreaterThan(3);
    for (let i = 1; i < progress.length; i++) expect(progress[i]!).toBeGreaterThanOrEqual(progress[i - 1]!);
  });

  it('reports a file that is not well-formed XML, with no points', async () => {
    const r = await importGpxTrack('<gpx><trk><trkseg><trkpt lat="1" lon="2">\n</trk>', { cruiseId: 'c' });
    expect(r.points).toEqual([]);
    expect(r.bad).toHaveLength(1);
    expect(r.bad[0]!.reason).toMatch(/^not well-formed XML/);
  });

  it('refuses an XML file that is not GPX', async () => {
    const r = await importGpxTrack('<kml><Document/></kml>', { cruiseId: 'c' });
    expect(r.bad).toEqual([{ line: 1, reason: 'the root element is <kml>, not <gpx>' }]);
  });

  it('reads a picked file by its extension', async () => {
    const file = new File([GPX], 'cruise.gpx', { type: 'application/gpx+xml' });
    const r = await importTrackFile(file, { cruiseId: 'c' });
    expect(r.format).toBe('gpx');
    expect(r.counts.imported).toBe(5);
  });
});
