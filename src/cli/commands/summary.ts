// `summary FILE [--json]`: the cruise statistics of a log file.
import { summarise, summaryLines } from '../../format/summary.ts';
import { parseOptions } from '../args.ts';
import { EXIT_FAILURE, EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { loadLog, printProblems } from '../logFiles.ts';
import { visible } from '../terminalText.ts';

const usage = `Usage: npm run cli -- summary FILE [--json]

Prints the cruise statistics of a log file: observations, time span, observers, distance along
the track (WGS 84 geodesic), mean total concentration, stages seen, quality-control findings.
Control characters in names (escape sequences, NUL, right-to-left overrides) are shown as \\u
escapes; --json gives the exact text.

  --json   print one JSON object instead`;

export const summaryCommand: Command = {
  name: 'summary',
  summary: 'cruise statistics of a log file',
  usage,
  run(args: string[], io: CliIO): number {
    const { values, positionals } = parseOptions(args, { json: { type: 'boolean' } }, true);
    if (positionals.length !== 1) throw new UsageError('give exactly one FILE');
    const log = loadLog(positionals[0] as string);
    if (!log.ok) {
      printProblems(io, log);
      return EXIT_FAILURE;
    }
    const s = summarise(log.bundle);
    if (values.json) io.stdout(JSON.stringify(s));
    else for (const line of summaryLines(s)) io.stdout(visible(line));
    return EXIT_OK;
  },
};
