// The form's reading of a single ice type beside a remaining stage (Sd). WMO-No. 259 (the egg
// code): Ca is left blank only where a single ice type is present; with Sd there are two, so the
// form must not fill a blank Ca with Ct (that would leave Sd no share, and POLARIS would ignore it).
import { describe, expect, it } from 'vitest';
import { readDraft } from '../../../src/features/log/formModel';
import { emptyDraft } from '../../../src/state/observationForm';

const ctx = { id: 'o-sd', cruiseId: 'c-1', now: new Date('2026-03-04T05:00:00Z'), livePosition: null };

function draftWith(partial: string, remainingStage: '' | 'grey') {
  const d = emptyDraft('obs-1');
  d.total = '9';
  d.remainingStage = remainingStage;
  const first = d.categories[0];
  if (!first) throw new Error('the empty draft has its category rows');
  d.categories[0] = { ...first, partial, stage: 'thick-first-year' };
  return d;
}

describe('one ice type and a remaining stage in the form', () => {
  it('without Sd a blank Ca is Ct (single ice type)', () => {
    const r = readDraft(draftWith('', ''), ctx);
    expect(r.observation.categories).toEqual([{ partialConcentration: 9, stage: 'thick-first-year' }]);
  });

  it('with Sd a blank Ca is asked for, naming the ice type', () => {
    const r = readDraft(draftWith('', 'grey'), ctx);
    expect(r.observation.categories).toEqual([]);
    const f = r.findings.find((x) => x.path === 'categories.0.partialConcentration');
    expect(f?.message).toContain('Ice type a: give its concentration in tenths');
    expect(f?.message).toContain('remaining stage');
  });

  it('with Sd and Ca 5 the category keeps 5/10 and Sd the rest', () => {
    const r = readDraft(draftWith('5', 'grey'), ctx);
    expect(r.observation).toMatchObject({ totalConcentration: 9, remainingStage: 'grey', categories: [{ partialConcentration: 5, stage: 'thick-first-year' }] });
  });
});
