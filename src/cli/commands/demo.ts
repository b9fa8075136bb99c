// `demo -o FILE`: writes the invented demo cruise (src/domain/demo.ts) as a log file.
import { makeDemoCruise } from '../../domain/demo.ts';
import { writeArchive } from '../../format/archive.ts';
import { exportLogJson } from '../../format/encode.ts';
import type { LogBundle } from '../../format/types.ts';
import { parseOptions, stringOption } from '../args.ts';
import { EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { writeOut } from '../logFiles.ts';

const usage = `Usage: npm run cli -- demo -o FILE [--seed N]

Writes the demo cruise, an invented scenario (vessel, cruise and observers are fictional), as a
Floe Ledger log file (format "floe-ledger-log", version 1). A FILE ending in .zip gets the
archive form.

  -o, --out   where to write
  --seed      another whole number gives another, equally plausible cruise (default 1)`;

export function demoBundle(seed = 1): LogBundle {
  const demo = makeDemoCruise(seed);
  return { cruise: demo.cruise, observations: demo.observations, history: [], conflicts: [], track: demo.track, photos: [] };
}

export const demoCommand: Command = {
  name: 'demo',
  summary: 'write the invented demo cruise as a log file',
  usage,
  run(args: string[], io: CliIO): number {
    const { values } = parseOptions(args, { out: { type: 'string', short: 'o' }, seed: { type: 'string' } });
    const out = stringOption(values, 'out', true);
    const seedText = stringOption(values, 'seed') ?? '1';
    if (!/^\d{1,9}$/.test(seedText)) throw new UsageError(`--seed "${seedText}" is not a whole number`);
    const bundle = demoBundle(Number(seedText));
    // A fixed export time keeps the demo file byte-for-byte reproducible.
    const opts = { exportedAt: bundle.cruise.updatedAt };
    writeOut(out, out.toLowerCase().endsWith('.zip') ? writeArchive(bundle, new Map(), opts) : exportLogJson(bundle, opts));
    io.stdout(`wrote ${out}: ${bundle.observations.length} observations, ${bundle.track.length} track points (invented demo data)`);
    return EXIT_OK;
  },
};
