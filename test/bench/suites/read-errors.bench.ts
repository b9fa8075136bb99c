// Reading error-dense files (issue 16): a log whose track rows are all invalid must cost about
// what a valid log of the same size costs, and grow linearly with the number of bad rows (the
// validators used to copy their error list per row: 11 s at 10,000 bad rows, 834 s at 80,000).
//   80,000 bad rows vs the same log with 80,000 valid rows            target <= 2x
//   80,000 bad rows vs 8 x the time of 10,000 bad rows                target <= 1.5x
// test/format/schema-errors.test.ts proves the linear work by counting; this gives the times.
import { readLogText } from '../../../src/format/read';
import { errorDenseLog } from '../../format/hostile';
import { compare, ratioRow, type BenchRow, type BenchSuite } from '../bench-kit';

const SCALE = Number(process.env.FLOE_BENCH_SCALE ?? '1');
const BIG = Math.round(80_000 * SCALE);
const SMALL = Math.round(BIG / 8);

export const suite: BenchSuite = {
  name: `read error-dense logs (${BIG} bad track rows)`,
  async run(): Promise<BenchRow[]> {
    const bad = JSON.stringify(errorDenseLog(BIG));
    const good = JSON.stringify(errorDenseLog(BIG, true));
    const small = JSON.stringify(errorDenseLog(SMALL));
    const format = { rules: null };
    const vsValid = await compare(() => readLogText(bad, format), () => readLogText(good, format), 5);
    const vsSmall = await compare(() => readLogText(bad, format), () => readLogText(small, format), 5);
    return [
      ratioRow(`read ${BIG} bad track rows vs ${BIG} valid rows (median)`, vsValid.subject, vsValid.baseline, 'ms', 2),
      ratioRow(`read ${BIG} bad track rows vs 8 x ${SMALL} bad rows (median)`, vsSmall.subject, 8 * vsSmall.baseline, 'ms', 1.5),
    ];
  },
};
