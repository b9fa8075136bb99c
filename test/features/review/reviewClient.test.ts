// The page's side of the review worker: the first request sends everything, a save afterwards
// sends only that observation, and the figures equal a full pass (reviewCruise) each time. jsdom
// has no Worker, so the channel runs the same engine in place.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { makeDemoCruise } from '../../../src/domain/demo';
import type { Observation } from '../../../src/domain/model';
import { collectFindings, reviewCruise } from '../../../src/domain/stats';
import { ReviewChannel, type ReviewFigures } from '../../../src/features/review/reviewClient';
import { ReviewEngine } from '../../../src/features/review/reviewEngine';
import type { ToReviewWorker } from '../../../src/features/review/reviewProtocol';

const demo = makeDemoCruise();

function channel(): { c: ReviewChannel; next: () => Promise<ReviewFigures>; sent: ToReviewWorker[] } {
  const sent: ToReviewWorker[] = [];
  const original = ReviewEngine.prototype.handle;
  vi.spyOn(ReviewEngine.prototype, 'handle').mockImplementation(function (this: ReviewEngine, m: ToReviewWorker) {
    sent.push(m);
    return original.call(this, m);
  });
  let resolve: ((f: ReviewFigures) => void) | null = null;
  const c = new ReviewChannel((f) => resolve?.(f), (message) => { throw new Error(message); });
  const next = () => new Promise<ReviewFigures>((r) => { resolve = r; });
  return { c, next, sent };
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe('review channel', () => {
  it('sends everything once, then only what a save changed; figures equal a full pass', async () => {
    const { c, next, sent } = channel();
    let got = next();
    c.request({ cruise: demo.cruise, observerId: '', observations: demo.observations, track: demo.track });
    let f = await got;
    expect(f.review.summary).toEqual(reviewCruise({ cruise: demo.cruise, observations: demo.observations, track: demo.track }).summary);
    expect(f.findings).toEqual(collectFindings(demo.observations, demo.cruise));
    const taken = sent.filter((m) => m.type === 'take').reduce((n, m) => n + (m.type === 'take' ? m.observations.length : 0), 0);
    expect(taken).toBe(demo.observations.length);

    // One observation edited (a new revision): only it goes to the worker.
    sent.length = 0;
    const edited = demo.observations.map((o, i): Observation => (i === 10 ? { ...o, totalConcentration: 2, revision: o.revision + 1 } : o));
    got = next();
    c.request({ cruise: demo.cruise, observerId: '', observations: edited, track: demo.track });
    f = await got;
    expect(sent.map((m) => m.type)).toEqual(['take', 'figures']);
    expect(sent[0]?.type === 'take' && sent[0].observations.map((o) => o.id)).toEqual([demo.observations[10]?.id]);
    const full = reviewCruise({ cruise: demo.cruise, observations: edited, track: demo.track });
    expect(f.review.summary.observations).toBe(full.summary.observations);
    expect(f.review.summary.ice.meanConcentration).toBeCloseTo(full.summary.ice.meanConcentration as number, 9);
    expect(f.review.series).toEqual(full.series);
    c.dispose();
  });
});
