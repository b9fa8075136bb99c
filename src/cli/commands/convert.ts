// `convert FILE --to geojson|csv|ndjson|log -o OUT`: the same writers as the app's export.
import { writeCsv } from '../../format/csv.ts';
import { writeGeoJson } from '../../format/geojson.ts';
import { writeNdjson } from '../../format/ndjson.ts';
import { parseOptions, stringOption } from '../args.ts';
import { EXIT_FAILURE, EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { collocateLoaded, ICEINFO_OPTIONS, ICEINFO_USAGE, loadIceInfo } from '../iceInfoFiles.ts';
import { loadLog, printProblems, writeLog, writeOut } from '../logFiles.ts';
import { visible } from '../terminalText.ts';

const TARGETS = ['geojson', 'csv', 'ndjson', 'log', 'zip'] as const;

const usage = `Usage: npm run cli -- convert FILE --to ${TARGETS.join('|')} -o OUT [--include-deleted]

  geojson   observations as points with flat properties, the track as a line (RFC 7946)
  csv       one row per observation, a column group per ice type, then deformation and snow blocks (RFC 4180)
  ndjson    one flat observation record per line
  log       the log in the current format version (reads older versions by migration)
  zip       the log and its photos as an archive (OUT must end in .zip; refused when FILE is a
            JSON log naming photos, whose bytes only an archive carries)

  --include-deleted   keep deleted observations in geojson, csv and ndjson (column "deleted")

OUT is replaced whole or not at all (written beside it, flushed, renamed). A log or zip is read
back before it is written: the command never writes a file that validate would reject.

With --chart or --grid, geojson, csv and ndjson get the chart and grid values at each
observation as a block of columns at the end (derived values; docs/format.md):
${ICEINFO_USAGE}`;

export const convertCommand: Command = {
  name: 'convert',
  summary: 'convert a log file to GeoJSON, CSV, NDJSON, the current log version or a zip',
  usage,
  async run(args: string[], io: CliIO): Promise<number> {
    const { values, positionals } = parseOptions(args, { to: { type: 'string' }, out: { type: 'string', short: 'o' }, 'include-deleted': { type: 'boolean' }, ...ICEINFO_OPTIONS }, true);
    if (positionals.length !== 1) throw new UsageError('give exactly one FILE');
    const to = stringOption(values, 'to', true);
    const out = stringOption(values, 'out', true);
    if (!(TARGETS as readonly string[]).includes(to)) throw new UsageError(`--to "${to}" is not one of ${TARGETS.join(', ')}`);
    const log = loadLog(positionals[0] as string);
    if (!log.ok) {
      printProblems(io, log);
      return EXIT_FAILURE;
    }
    const b = log.bundle;
    let collocation;
    if (values.chart !== undefined || values.grid !== undefined) {
      const info = await loadIceInfo(values, io);
      if (!info) return EXIT_FAILURE;
      collocation = collocateLoaded(b.observations, info);
    }
    const opts = { includeDeleted: values['include-deleted'] === true, ...(collocation ? { collocation } : {}) };
    if (to === 'geojson') writeOut(out, writeGeoJson(b, opts));
    else if (to === 'csv') writeOut(out, writeCsv(b, opts));
    else if (to === 'ndjson') writeOut(out, writeNdjson(b, opts));
    else if (to === 'zip') {
      if (!out.toLowerCase().endsWith('.zip')) throw new UsageError(`--to zip writes an archive: give an OUT ending in .zip, not "${out}"`);
      writeLog(out, b, log.photos);
    } else {
      if (out.toLowerCase().endsWith('.zip')) throw new UsageError(`--to log writes JSON: give an OUT not ending in .zip, or use --to zip`);
      writeLog(out, b, log.photos);
    }
    io.stdout(`wrote ${visible(out)} (${to})`);
    return EXIT_OK;
  },
};
