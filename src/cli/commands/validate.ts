// `validate FILE...`: exit 0 when every file is a valid log; otherwise exit 1 with one line per
// problem, naming the file, the place (line, JSON path) and the reason.
import { parseOptions } from '../args.ts';
import { EXIT_FAILURE, EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { checkLog, printProblems } from '../logFiles.ts';
import { visible } from '../terminalText.ts';

const usage = `Usage: npm run cli -- validate FILE... [--quiet]

Checks each log file (JSON or zip archive, any supported format version) against the format's
schema, its consistency checks and the domain rules. Prints one line per problem:
  FILE: line L, column C: $.json.path: reason
The first 20 problems of a file are listed, the rest counted. Rule warnings are printed but do
not make a file invalid.

Exit status: 0 all valid, 1 a file has problems, 2 bad usage.

  --quiet   print problems only, not the "valid" lines and warnings`;

export const validateCommand: Command = {
  name: 'validate',
  summary: 'check log files; one message per problem with its place',
  usage,
  run(args: string[], io: CliIO): number {
    const { values, positionals } = parseOptions(args, { quiet: { type: 'boolean' } }, true);
    if (positionals.length === 0) throw new UsageError('give at least one FILE');
    let failed = 0;
    for (const file of positionals) {
      const log = checkLog(file);
      if (!log.ok) {
        printProblems(io, log);
        failed++;
        continue;
      }
      if (values.quiet) continue;
      const b = log.counts;
      const migrated = log.fromVersion < 1 ? ` (format version ${log.fromVersion}, read by migration)` : '';
      io.stdout(`${visible(file)}: valid${migrated}: ${b.observations} observations, ${b.history} earlier revisions, ${b.trackPoints} track points, ${b.photos} photos`);
      for (const w of log.warnings) io.stdout(visible(`${file}: warning: ${w.path}: ${w.message}`));
    }
    return failed > 0 ? EXIT_FAILURE : EXIT_OK;
  },
};
