// `merge FILE FILE... -o OUT`: merges logs of one cruise by the same rules as the app's import
// (src/format/merge.ts): new, identical, newer revision, older revision, conflict (both kept).
import { writeArchive } from '../../format/archive.ts';
import { exportLogJson } from '../../format/encode.ts';
import { applyPlanToBundle, bundleTarget, MergeRefused, planMerge } from '../../format/merge.ts';
import type { LogBundle, PhotoBytes } from '../../format/types.ts';
import { parseOptions, stringOption } from '../args.ts';
import { EXIT_FAILURE, EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { loadAll, writeOut } from '../logFiles.ts';

const usage = `Usage: npm run cli -- merge FILE FILE... -o OUT

Merges log files of the same cruise, in the order given, by the rules of the app's import:
  new        observations only in a later file are added
  identical  the same revision with the same content is kept once
  newer      a higher revision becomes current; the earlier one stays in the history
  older      a lower revision missing from the history is added to it
  conflict   the same revision with other content: both are kept, the copy flagged for review
Every file is checked first; if any is rejected nothing is written. An OUT ending in .zip gets
the archive form with the photos of zip inputs.`;

export const mergeCommand: Command = {
  name: 'merge',
  summary: 'merge log files of one cruise by the app\'s merge rules',
  usage,
  run(args: string[], io: CliIO): number {
    const { values, positionals } = parseOptions(args, { out: { type: 'string', short: 'o' } }, true);
    const out = stringOption(values, 'out', true);
    if (positionals.length < 2) throw new UsageError('give at least two FILEs to merge');
    const logs = loadAll(positionals, io);
    if (!logs) return EXIT_FAILURE;
    let merged: LogBundle | null = null;
    const photos: PhotoBytes = new Map();
    for (const log of logs) {
      let plan;
      try {
        plan = planMerge(bundleTarget(merged), log.bundle);
      } catch (e) {
        if (e instanceof MergeRefused) {
          io.stderr(`${log.file}: ${e.message}; nothing written`);
          return EXIT_FAILURE;
        }
        throw e;
      }
      const c = plan.counts;
      io.stdout(`${log.file}: ${c.new} new, ${c.identical} identical, ${c.newer} newer, ${c.older} older, ${c.conflict} conflicting; ${c.trackNew} new track points, ${c.photosNew} new photos`);
      merged = applyPlanToBundle(merged, plan);
      for (const [id, bytes] of log.photos) if (!photos.has(id)) photos.set(id, bytes);
    }
    const result = merged as LogBundle;
    writeOut(out, out.toLowerCase().endsWith('.zip') ? writeArchive(result, photos) : exportLogJson(result));
    io.stdout(`wrote ${out}: ${result.observations.length} observations, ${result.history.length} earlier revisions, ${result.conflicts.length} conflicting copies, ${result.track.length} track points`);
    return EXIT_OK;
  },
};
