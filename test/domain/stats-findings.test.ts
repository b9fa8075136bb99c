// The review's quality-control list over the demo cruise: the entries the demo plants as doubtful
// (src/domain/demo.ts) must be found, and a recorded review must be matched to its finding.
import { describe, expect, it } from 'vitest';
import { makeDemoCruise } from '../../src/domain/demo.ts';
import { collectFindings, reviewFor, withFindingReview, withoutFindingReview } from '../../src/domain/stats.ts';

describe('quality-control list', () => {
  const demo = makeDemoCruise();
  const findings = collectFindings(demo.observations, demo.cruise);

  it('lists the planted thickness mismatch and the position typo', () => {
    const thickness = demo.doubtful.find((d) => d.kind === 'stage-thickness-mismatch')!;
    expect(findings.some((f) => f.observationId === thickness.observationId && f.code === 'stage-thickness-mismatch' && f.path === thickness.path)).toBe(true);
    const typo = demo.doubtful.find((d) => d.kind === 'position-typo')!;
    const typoIndex = demo.observations.findIndex((o) => o.id === typo.observationId);
    // The implied-speed rule flags the later observation of each pair: the typo and the one after it.
    const speedIds = findings.filter((f) => f.code === 'implied-speed').map((f) => f.observationId);
    expect(speedIds).toEqual(expect.arrayContaining([typo.observationId, demo.observations[typoIndex + 1]!.id]));
    // The documented gaps are findings too.
    expect(findings.filter((f) => f.code === 'observation-gap')).toHaveLength(demo.gaps.length);
  });

  it('is in time order with observer and scope', () => {
    for (let i = 1; i < findings.length; i++) expect(findings[i]!.time >= findings[i - 1]!.time).toBe(true);
    expect(findings.find((f) => f.code === 'implied-speed')?.scope).toBe('sequence');
    expect(findings.find((f) => f.code === 'stage-thickness-mismatch')?.scope).toBe('observation');
  });

  it('a review is matched by code and path, replaced by a later one and can be taken back', () => {
    const f = findings.find((x) => x.code === 'stage-thickness-mismatch')!;
    const obs = demo.observations.find((o) => o.id === f.observationId)!;
    const once = withFindingReview(obs, f, ' Checked with the observer: 45 cm is right, rafted grey ice. ', 'Chief scientist', '2026-03-16T10:00:00Z');
    expect(reviewFor(once, f)?.comment).toBe('Checked with the observer: 45 cm is right, rafted grey ice.');
    const twice = withFindingReview(once, f, 'Second look.', 'Chief scientist', '2026-03-16T11:00:00Z');
    expect(twice.reviews).toHaveLength(1);
    expect(reviewFor(twice, f)?.comment).toBe('Second look.');
    expect(reviewFor(twice, { code: f.code, path: 'categories.0.thicknessCm' })).toBeNull();
    const listed = collectFindings(demo.observations.map((o) => (o.id === obs.id ? twice : o)), demo.cruise);
    expect(listed.find((x) => x.key === f.key)?.review?.comment).toBe('Second look.');
    expect(withoutFindingReview(twice, f).reviews).toEqual([]);
  });
});
