// Position sources: how much the NMEA parser and the track importers cost over the bare minimum
// of the same work (split the text and turn fields into numbers), measured in the same run.
import Papa from 'papaparse';
import { makeDemoCruise } from '../../../src/domain/demo';
import { importCsvTrack } from '../../../src/gps/csvTrack';
import { importNmeaLog } from '../../../src/gps/nmeaLog';
import { sentencesForFix } from '../../../src/gps/nmeaWrite';
import { GpsTracker } from '../../../src/gps/tracker';
import { compare, ratioRow, type BenchSuite } from '../bench-kit';

export const suite: BenchSuite = {
  name: 'gps',
  async run() {
    const { track } = makeDemoCruise();
    // The demo cruise's track as a log: 8686 fixes x 4 sentences (RMC, GGA, VTG, HDT).
    const lines = track.flatMap((p) => sentencesForFix({ timeMs: Date.parse(p.time), lat: p.lat, lon: p.lon, sogKn: p.sogKn, cogDeg: p.cogDeg, headingDeg: p.headingDeg }));
    const log = lines.join('\r\n');
    const csv = ['time,lat,lon,sog,cog', ...track.map((p) => `${p.time},${p.lat},${p.lon},${p.sogKn},${p.cogDeg}`)].join('\n');
    const bareFields = (text: string): number => {
      let n = 0;
      for (const l of text.split(/\r?\n/)) for (const f of l.split(',')) if (Number.isFinite(Number(f))) n++;
      return n;
    };

    const live = await compare(() => {
      const t = new GpsTracker();
      for (const l of lines) t.acceptLine(l, 0);
    }, () => bareFields(log), 7);
    // The NMEA import's ratio moved between 2.8x and 4.0x from run to run with 5 rounds on the
    // shared machine: 25 interleaved rounds after a warm-up of both sides, median of each.
    await compare(() => importNmeaLog(log, { cruiseId: 'c', chunkSize: 1e9 }), () => bareFields(log), 3);
    const nmea = await compare(() => importNmeaLog(log, { cruiseId: 'c', chunkSize: 1e9 }), () => bareFields(log), 25);
    const csvRun = await compare(() => importCsvTrack(csv, { cruiseId: 'c', chunkSize: 1e9 }), () => Papa.parse(csv, { header: true }), 5);
    return [
      ratioRow(`parse ${lines.length} NMEA sentences into a live fix`, live.subject, live.baseline, 'ms', 4),
      ratioRow(`import an NMEA log of ${track.length} fixes (median of 25 interleaved)`, nmea.subject, nmea.baseline, 'ms', 3),
      ratioRow(`import a CSV track of ${track.length} rows (baseline: bare papaparse)`, csvRun.subject, csvRun.baseline, 'ms', 6),
    ];
  },
};
