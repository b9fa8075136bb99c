// The cruise review over 50,000 observations (issue 7: all of the summary in under 200 ms), against
// a single bare pass over the same array measured in the same run.
import { makeDemoCruise } from '../../../src/domain/demo.ts';
import type { Observation } from '../../../src/domain/model.ts';
import { ReviewLedger, reviewCruise } from '../../../src/domain/stats.ts';
import { absoluteRow, compare, median, ratioRow, type BenchSuite } from '../bench-kit';

const N = 50_000;
const HOUR_MS = 3_600_000;

/** The demo cruise repeated back to back (each copy shifted by its length) up to N observations. */
function bigLog(): { observations: Observation[]; cruise: ReturnType<typeof makeDemoCruise>['cruise'] } {
  const demo = makeDemoCruise();
  const first = Date.parse(demo.observations[0]!.time);
  const last = Date.parse(demo.observations.at(-1)!.time);
  const shift = last - first + HOUR_MS;
  const out: Observation[] = [];
  for (let copy = 0; out.length < N; copy++) {
    for (const o of demo.observations) {
      if (out.length >= N) break;
      const t = new Date(Date.parse(o.time) + copy * shift).toISOString().replace('.000Z', 'Z');
      out.push({ ...o, id: `${o.id}-${copy}`, time: t });
    }
  }
  return { observations: out, cruise: demo.cruise };
}

/** The least any summary must do: read every observation's time, concentration and categories. */
function singlePass(observations: readonly Observation[]): number {
  let acc = 0;
  for (const o of observations) {
    acc += Date.parse(o.time) % 7;
    acc += o.totalConcentration ?? 0;
    for (const c of o.categories) acc += c.partialConcentration * (c.thicknessCm ?? 0);
  }
  return acc;
}

export const suite: BenchSuite = {
  name: 'cruise review',
  async run() {
    const { observations, cruise } = bigLog();
    let sink = 0;
    const { subject, baseline } = await compare(
      () => {
        sink += reviewCruise({ cruise, observations }).summary.observedHours;
      },
      () => {
        sink += singlePass(observations);
      },
      9,
    );
    if (!Number.isFinite(sink)) throw new Error('no result');
    console.log(`review: ${N} observations: summary ${subject.toFixed(1)} ms (target 200 ms), single pass ${baseline.toFixed(1)} ms, ratio ${(subject / baseline).toFixed(1)}x`);
    // The review worker's work (src/features/review/reviewWorker.ts): the full summary once, then
    // each save taken in (the ledger's update) and the figures read out again for the screen.
    const ledger = new ReviewLedger({ cruise });
    const full = await compare(() => ledger.reset(observations), () => { sink += singlePass(observations); }, 5);
    ledger.reset(observations);
    const takeIn: number[] = [];
    const readOut: number[] = [];
    for (let k = 0; k < 41; k++) {
      // An edit in the middle of the log (a reviewed finding, a corrected concentration) and a new
      // observation at the end, in turn.
      const base = observations[k % 2 === 0 ? (k * 997) % N : N - 1] as Observation;
      const saved: Observation = k % 2 === 0
        ? { ...base, totalConcentration: ((base.totalConcentration ?? 0) + 1) % 11, revision: base.revision + 1 }
        : { ...base, id: `new-${k}`, time: new Date(Date.parse(base.time) + (k + 1) * HOUR_MS).toISOString() };
      const t0 = performance.now();
      ledger.upsert(saved);
      const t1 = performance.now();
      // What the worker sends back: the tables and the chart columns as typed arrays.
      sink += ledger.tables().summary.observedHours + ledger.packedSeries().time.length;
      const t2 = performance.now();
      takeIn.push(t1 - t0);
      readOut.push(t2 - t1);
    }
    const takeInMs = median(takeIn.slice(1));
    const readOutMs = median(readOut.slice(1));
    console.log(`review ledger: full ${full.subject.toFixed(1)} ms, take in one save ${takeInMs.toFixed(2)} ms, figures read out ${readOutMs.toFixed(1)} ms`);
    return [
      absoluteRow(`review summary of ${N} observations (median)`, subject, 'ms', 200),
      ratioRow(`review summary vs a single pass over the ${N}`, subject, baseline, 'ms', 30),
      absoluteRow(`review worker: full summary of ${N} (ledger reset, median)`, full.subject, 'ms', 200),
      ratioRow(`review worker: full summary vs a single pass over the ${N}`, full.subject, full.baseline, 'ms', 30),
      absoluteRow('review worker: take in one save (median of 40)', takeInMs, 'ms', 20),
      ratioRow('review worker: take in one save vs a single pass', takeInMs, full.baseline, 'ms', 0.5),
      absoluteRow('review worker: figures and chart columns read out after a save (median of 40)', readOutMs, 'ms', 200),
    ];
  },
};
