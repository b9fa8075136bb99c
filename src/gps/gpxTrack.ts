// GPX track files. Every <trkpt> is checked first (latitude, longitude, time), with its line
// number found in the text; the points that fail are listed and taken out of the document, and
// @tmcw/togeojson converts what is left, so its per-point times line up with the coordinates.
// Routes (<rte>) and waypoints (<wpt>) are plans and marks, not where the ship was: skipped.
import { gpx } from '@tmcw/togeojson';
import type { Position as GeoPosition } from 'geojson';
import type { TrackPoint } from '../domain/model';
import {
  BadLineList, checkLatLon, finishPoints, inChunks, isoUtc, type TrackImportOptions, type TrackImportResult,
} from './trackImport';

/** Line number (from 1) of every `<trkpt` start tag, in document order, comments ignored. */
function trkptLines(text: string): number[] {
  const lines: number[] = [];
  const re = /<!--[\s\S]*?-->|<!\[CDATA\[[\s\S]*?\]\]>|<(?:[A-Za-z_][\w.-]*:)?trkpt[\s/>]/g;
  let line = 1;
  let at = 0;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    for (let i = at; i < m.index; i++) if (text.charCodeAt(i) === 10) line++;
    at = m.index;
    if (!m[0].startsWith('<!')) lines.push(line);
  }
  return lines;
}

const ISO = /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d+)?(Z|[+-]\d\d:\d\d)$/;

export async function importGpxTrack(text: string, opts: TrackImportOptions): Promise<TrackImportResult> {
  const bad = new BadLineList();
  const parser = opts.domParser ?? (typeof DOMParser === 'undefined' ? null : new DOMParser());
  const result = (points: TrackPoint[], records: number, skipped: number, duplicates = 0): TrackImportResult => ({
    format: 'gpx', points, bad: bad.list, counts: { records, imported: points.length, bad: bad.count, skipped, duplicates },
  });
  if (!parser) {
    bad.add(1, 'no XML parser available to read GPX here');
    return result([], 0, 0);
  }
  const doc = parser.parseFromString(text, 'application/xml');
  const parseError = doc.getElementsByTagName('parsererror')[0];
  if (parseError) {
    const message = (parseError.textContent ?? '').trim().replace(/\s+/g, ' ');
    const line = Number(/line(?: number)?\s*:?\s*(\d+)/i.exec(message)?.[1] ?? 1);
    bad.add(line, `not well-formed XML: ${message.slice(0, 200)}`);
    return result([], 0, 0);
  }
  if (doc.documentElement.localName !== 'gpx') {
    bad.add(1, `the root element is <${doc.documentElement.localName}>, not <gpx>`);
    return result([], 0, 0);
  }
  opts.onProgress?.(0.3, 'reading the GPX');

  const pts = Array.from(doc.getElementsByTagNameNS('*', 'trkpt'));
  const lineOf = trkptLines(text);
  const skipped = doc.getElementsByTagNameNS('*', 'wpt').length + doc.getElementsByTagNameNS('*', 'rtept').length;
  const good = new Set<Element>();
  await inChunks(pts.length, opts, 'checking track points', 0.3, 0.7, (i) => {
    const el = pts[i] as Element;
    const line = lineOf[i] ?? 1;
    const latS = el.getAttribute('lat');
    const lonS = el.getAttribute('lon');
    const why = latS === null || lonS === null ? 'track point without lat or lon attribute' : checkLatLon(Number(latS), Number(lonS));
    if (why) {
      bad.add(line, why);
      return;
    }
    const timeEl = Array.from(el.children).find((c) => c.localName === 'time');
    const t = timeEl?.textContent?.trim() ?? '';
    if (t === '') {
      bad.add(line, 'track point without a <time>');
      return;
    }
    if (!ISO.test(t) || Number.isNaN(Date.parse(t))) {
      bad.add(line, `time "${t}" is not ISO 8601 with a zone (GPX 1.1 uses UTC, e.g. 2026-03-09T12:00:00Z)`);
      return;
    }
    good.add(el);
  });
  // togeojson needs two points in a segment to make a line; a lone good point would vanish.
  for (const seg of Array.from(doc.getElementsByTagNameNS('*', 'trkseg'))) {
    const inSeg = Array.from(seg.children).filter((c) => c.localName === 'trkpt' && good.has(c));
    if (inSeg.length === 1) {
      const only = inSeg[0] as Element;
      good.delete(only);
      bad.add(lineOf[pts.indexOf(only)] ?? 1, 'the only usable point of its track segment (a segment needs two)');
    }
  }
  for (const el of pts) if (!good.has(el)) el.remove();

  const points: TrackPoint[] = [];
  for (const f of gpx(doc).features) {
    if (f.properties?._gpxType !== 'trk' || !f.geometry) continue;
    const g = f.geometry;
    const lines: GeoPosition[][] = g.type === 'LineString' ? [g.coordinates] : g.type === 'MultiLineString' ? g.coordinates : [];
    const rawTimes: unknown = f.properties.coordinateProperties?.times;
    const times: string[][] = lines.length === 1 ? [rawTimes as string[]] : (rawTimes as string[][]);
    lines.forEach((coords, li) => {
      coords.forEach((c, ci) => {
        const time = times[li]?.[ci];
        if (time === undefined) return;
        points.push({ cruiseId: opts.cruiseId, time: isoUtc(Date.parse(time)), lat: c[1] as number, lon: c[0] as number, source: 'track-file' });
      });
    });
  }
  opts.onProgress?.(1, 'building the track');
  const done = finishPoints(points);
  return result(done.points, pts.length, skipped, done.duplicates);
}
