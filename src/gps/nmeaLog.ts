// NMEA log files as a track: one sentence a line, possibly behind a logger's own prefix (a
// timestamp, a counter). Positions come from RMC (which carries the date) and GGA (time of day
// only, dated from the nearest RMC or from `defaultDate`); VTG and HDT/HDG add speed, course
// and heading to the point of the same moment.
import type { TrackPoint } from '../domain/model';
import { describeNmeaError, parseNmea, type NmeaSentence } from './nmea';
import { fixEpochMs } from './tracker';
import {
  BadLineList, finishPoints, inChunks, isoUtc, splitLines, type TrackImportOptions, type TrackImportResult,
} from './trackImport';

export async function importNmeaLog(text: string, opts: TrackImportOptions): Promise<TrackImportResult> {
  const lines = splitLines(text);
  const bad = new BadLineList();
  // Sentences and their line numbers side by side: one object fewer per sentence for the collector.
  const parsed: NmeaSentence[] = [];
  const lineOf: number[] = [];
  let skipped = 0;
  let records = 0;
  await inChunks(lines.length, opts, 'reading sentences', 0, 0.7, (i) => {
    const raw = lines[i] ?? '';
    // The usual line starts with its sentence: no copies, no pattern search.
    const c0 = raw.charCodeAt(0);
    if (c0 !== 36 && c0 !== 33 && raw.trim() === '') return;
    records++;
    const dollar = c0 === 36 || c0 === 33 ? 0 : raw.indexOf('$');
    const bang = dollar === 0 ? -1 : raw.indexOf('!');
    const start = dollar < 0 ? bang : bang < 0 ? dollar : Math.min(dollar, bang);
    if (start < 0) {
      bad.add(i + 1, 'no NMEA sentence on this line');
      return;
    }
    const r = parseNmea(start === 0 ? raw : raw.slice(start));
    if (r.ok) {
      parsed.push(r.value);
      lineOf.push(i + 1);
    }
    else if (r.error.kind === 'unsupported') skipped++;
    else bad.add(i + 1, describeNmeaError(r.error));
  });

  // Dating GGA: the RMC date nearest in the file; before the first RMC, the first one.
  const fallbackMs = opts.defaultDate ? Date.parse(`${opts.defaultDate}T12:00:00Z`) : Number.NaN;
  const firstRmc = parsed.find((s) => s.type === 'RMC' && s.date && s.timeOfDay !== null);
  let referenceMs = firstRmc?.type === 'RMC' && firstRmc.date && firstRmc.timeOfDay !== null
    ? fixEpochMs(firstRmc.timeOfDay, firstRmc.date, 0)
    : fallbackMs;

  const points: TrackPoint[] = [];
  let current: TrackPoint | null = null;
  let currentMs = Number.NaN;
  const place = (ms: number, lat: number, lon: number): TrackPoint => {
    if (current && ms === currentMs) return current;
    current = { cruiseId: opts.cruiseId, time: isoUtc(ms), lat, lon, source: 'track-file' };
    currentMs = ms;
    points.push(current);
    return current;
  };
  await inChunks(parsed.length, opts, 'building the track', 0.7, 1, (i) => {
    const s = parsed[i] as NmeaSentence;
    const line = lineOf[i] as number;
    switch (s.type) {
      case 'RMC': {
        if (s.status !== 'A' || s.mode === 'N' || s.lat === null || s.lon === null) {
          skipped++;
          return;
        }
        if (s.timeOfDay === null || !s.date) {
          bad.add(line, `${s.talker}RMC: valid position without time or date`);
          return;
        }
        const ms = fixEpochMs(s.timeOfDay, s.date, 0);
        referenceMs = ms;
        const p = place(ms, s.lat, s.lon);
        if (s.sogKn !== null) p.sogKn = s.sogKn;
        if (s.cogDeg !== null) p.cogDeg = s.cogDeg;
        return;
      }
      case 'GGA': {
        if (s.fixQuality === 0 || s.lat === null || s.lon === null) {
          skipped++;
          return;
        }
        if (s.timeOfDay === null) {
          bad.add(line, `${s.talker}GGA: position without a time`);
          return;
        }
        if (Number.isNaN(referenceMs)) {
          bad.add(line, `${s.talker}GGA: only a time of day, and the log has no RMC to give the date (choose the date of the log)`);
          return;
        }
        // Each fix dates the next, so a GGA-only log rolls over midnight instead of jumping back.
        referenceMs = fixEpochMs(s.timeOfDay, null, referenceMs);
        place(referenceMs, s.lat, s.lon);
        return;
      }
      case 'VTG':
        if (current && s.mode !== 'N') {
          if (s.sogKn !== null) current.sogKn = s.sogKn;
          if (s.cogTrueDeg !== null) current.cogDeg = s.cogTrueDeg;
        } else skipped++;
        return;
      case 'HDT':
      case 'HDG':
        if (current && s.headingTrueDeg !== null) current.headingDeg = s.headingTrueDeg;
        else skipped++;
        return;
    }
  });
  const done = finishPoints(points);
  return {
    format: 'nmea', points: done.points, bad: bad.list,
    counts: { records, imported: done.points.length, bad: bad.count, skipped, duplicates: done.duplicates },
  };
}
