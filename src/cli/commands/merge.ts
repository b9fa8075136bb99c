// `merge FILE FILE... -o OUT`: merges logs of one cruise into one. The result depends only on
// the files, not on their order (src/format/mergeLogs.ts has the rule), and every disagreement
// between them is printed.
import { MergeRefused } from '../../format/merge.ts';
import { mergeLogs } from '../../format/mergeLogs.ts';
import { parseOptions, stringOption } from '../args.ts';
import { EXIT_FAILURE, EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { loadAll, writeLog } from '../logFiles.ts';
import { visible } from '../terminalText.ts';

const usage = `Usage: npm run cli -- merge FILE FILE... -o OUT

Merges log files of the same cruise. The result is the same whatever the order of the FILEs:
  - every saved version of every observation is kept, once;
  - the current version is one of the highest revision; where files hold different versions of
    that revision, the one saved last is current (equal times: a fixed order of the content)
    and the others are kept as conflicting copies;
  - an earlier revision stays in the history only when a file shows it precedes the current
    version; otherwise (say a deletion at revision 2 against an edit at revision 3 made on
    another laptop) it is kept as a conflicting copy;
  - cruise settings and observer names: those saved last; track points by time, photos by id.
Every disagreement (conflicting copies, different track points at one time, renamed observers,
other cruise settings, other photo descriptions) is printed as a "disagreement:" line.
Every file is checked first; if any is rejected nothing is written. An OUT ending in .zip gets
the archive form, which needs the bytes of every photo (from zip inputs): otherwise it is
refused. OUT is replaced whole or not at all, and only after the result reads back as valid.`;

export const mergeCommand: Command = {
  name: 'merge',
  summary: 'merge log files of one cruise, independent of their order',
  usage,
  run(args: string[], io: CliIO): number {
    const { values, positionals } = parseOptions(args, { out: { type: 'string', short: 'o' } }, true);
    const out = stringOption(values, 'out', true);
    if (positionals.length < 2) throw new UsageError('give at least two FILEs to merge');
    const logs = loadAll(positionals, io);
    if (!logs) return EXIT_FAILURE;
    let merged;
    try {
      merged = mergeLogs(logs.map((l) => ({ name: l.file, bundle: l.bundle, photos: l.photos })));
    } catch (e) {
      if (e instanceof MergeRefused) {
        io.stderr(`${visible(e.message)}; nothing written`);
        return EXIT_FAILURE;
      }
      throw e;
    }
    for (const l of logs) {
      const b = l.bundle;
      io.stdout(`${visible(l.file)}: ${b.observations.length} observations, ${b.history.length} earlier revisions, ${b.conflicts.length} conflicting copies, ${b.track.length} track points, ${b.photos.length} photos`);
    }
    for (const d of merged.disagreements) io.stdout(`disagreement: ${d.subject} ${visible(d.key)}: ${visible(d.message)}`);
    writeLog(out, merged.bundle, merged.photos);
    const r = merged.bundle;
    io.stdout(
      `wrote ${visible(out)}: ${r.observations.length} observations, ${r.history.length} earlier revisions, ${r.conflicts.length} conflicting copies, ${r.track.length} track points, ${r.photos.length} photos; ${merged.disagreements.length} disagreement${merged.disagreements.length === 1 ? '' : 's'}`,
    );
    return EXIT_OK;
  },
};
