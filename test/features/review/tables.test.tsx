// The review's tables in jsdom: the figures shown are the domain's (src/domain/stats), formatted.
// Expected values for the small log are hand-computed (see test/domain/stats.test.ts for the same log).
import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import type { Cruise, IceCategory, Observation } from '../../../src/domain/model';
import { collectFindings, reviewCruise } from '../../../src/domain/stats';
import { makeDemoCruise } from '../../../src/domain/demo';
import { BandTable } from '../../../src/features/review/BandTable';
import { HandoverTable } from '../../../src/features/review/HandoverTable';
import { SummaryCards } from '../../../src/features/review/SummaryCards';
import { FindingsPanel, filterFindings } from '../../../src/features/review/FindingsPanel';
import { CruiseReview } from '../../../src/features/review/ReviewScreen';

const H = 3_600_000;
const T0 = Date.parse('2026-03-01T00:00:00Z');
const iso = (h: number): string => new Date(T0 + h * H).toISOString().replace('.000Z', 'Z');
const cruise: Cruise = {
  id: 'c', name: 'Test cruise', vesselName: 'RV Test', iceClass: 'PC7', intervalMinutes: 60,
  observers: [{ id: 'A', name: 'Observer A', initials: 'OA' }, { id: 'B', name: 'Observer B', initials: 'OB' }],
  displayTimeZone: 'UTC', maxSpeedKn: 16, createdAt: iso(0), updatedAt: iso(0),
};
const obs = (n: number, h: number, who: string, total: number, categories: IceCategory[], lat: number, extra: Partial<Observation> = {}): Observation => ({
  id: `o${n}`, cruiseId: 'c', time: iso(h), position: { lat, lon: 0, source: 'gps-serial' }, observerId: who,
  totalConcentration: total, categories, notes: '', photoIds: [], revision: 1, savedAt: iso(h), savedBy: who, deviceId: 'd', deleted: false, ...extra,
});
const log = [
  obs(1, 0, 'A', 0, [], 69.9),
  obs(2, 1, 'A', 3, [{ partialConcentration: 0, stage: 'grey', thicknessCm: 12 }], 70.0),
  obs(3, 2, 'B', 9, [
    { partialConcentration: 6, stage: 'thick-first-year', thicknessCm: 150 },
    { partialConcentration: 3, stage: 'grey-white', thicknessCm: 20 },
  ], 70.6, { deformation: { a: { ridgedTenths: 2 }, b: { ridgedTenths: 0 } } }),
  obs(4, 5, 'B', 10, [{ partialConcentration: 10, stage: 'medium-first-year', thicknessCm: 110 }], 71.2),
];
const review = reviewCruise({ cruise, observations: log });

describe('latitude band table', () => {
  it('shows each band north first with hand-computed figures', () => {
    render(<BandTable table={review.bands} />);
    const rows = within(screen.getByTestId('band-table')).getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getByRole('rowheader').textContent)).toEqual(['71°N to 72°N', '70°N to 71°N', '69°N to 70°N']);
    // Band 70: 2 observations, 1 + 1.5 h, (3 + 9) / 2 = 6.0/10, (36 + 960) / 12 = 83 cm,
    // stages thick FY 6/12, grey 3/12, grey-white 3/12.
    const cells = within(rows[1]!).getAllByRole('cell').map((c) => c.textContent);
    expect(cells).toEqual(['2', '2.5 h', '6.0/10', '83 cm', 'Thick FY 50 %, Grey 25 %, Grey-white 25 %']);
    expect(within(rows[2]!).getAllByRole('cell').map((c) => c.textContent)).toEqual(['1', '1.0 h', '0.0/10', '–', 'no ice']);
  });
});

describe('handover table', () => {
  it('shows the one handover A to B: +6 tenths, +94.7 cm (hand-computed)', () => {
    render(<HandoverTable table={review.handover} observers={cruise.observers} highlight={null} />);
    const rows = within(screen.getByTestId('handover-table')).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(1);
    expect(within(rows[0]!).getAllByRole('cell').map((c) => c.textContent)).toEqual([
      'Observer A (OA)', 'Observer B (OB)', '1', '+6.00 (mean |Δ| 6.00)', '+94.7 (mean |Δ| 94.7)',
    ]);
    const offsets = within(screen.getByTestId('observer-offset-table')).getAllByRole('row').slice(1);
    expect(offsets.map((r) => within(r).getAllByRole('cell')[1]!.textContent)).toEqual(['−6.00 (mean |Δ| 6.00)', '+6.00 (mean |Δ| 6.00)']);
  });
});

describe('summary cards and regime tables', () => {
  it('show the hand-computed summary', () => {
    render(<SummaryCards summary={review.summary} cruise={cruise} />);
    expect(screen.getByTestId('value-observations').textContent).toBe('4');
    expect(screen.getByTestId('value-span').textContent).toBe('5.0 h');
    // 2096 / 22 = 95.3 cm; 5.5/10; RIO min -10, mean 11 (PC7, IMO MSC.1/Circ.1519 Table 1.3).
    expect(screen.getByTestId('value-thickness').textContent).toBe('95 cm');
    expect(screen.getByTestId('value-concentration').textContent).toBe('5.5/10');
    expect(screen.getByTestId('value-rio-min').textContent).toBe('-10');
    expect(screen.getByTestId('value-rio-mean').textContent).toBe('11.0');
    expect(screen.getByTestId('value-in-ice').textContent).toMatch(/^3\.5 h · /);
    const outcome = within(screen.getByTestId('outcome-table'));
    const elevated = outcome.getByRole('rowheader', { name: 'Elevated operational risk' }).closest('tr')!;
    expect(within(elevated).getAllByRole('cell').map((c) => c.textContent).slice(0, 2)).toEqual(['2', '2.5 h']);
  });
});

describe('findings list', () => {
  const demo = makeDemoCruise();
  const findings = collectFindings(demo.observations, demo.cruise);
  const byId = new Map(demo.observations.map((o) => [o.id, o]));

  it('lists every finding and filters by rule', async () => {
    const { default: userEvent } = await import('@testing-library/user-event');
    const user = userEvent.setup();
    render(<FindingsPanel findings={findings} cruise={demo.cruise} observations={byId} />);
    const list = screen.getByTestId('findings-list');
    expect(within(list).getAllByRole('listitem')).toHaveLength(Math.min(200, findings.length));
    await user.selectOptions(screen.getByLabelText('Rule'), 'observation-gap');
    expect(within(list).getAllByRole('listitem').map((li) => li.dataset.code)).toEqual(['observation-gap', 'observation-gap']);
    expect(screen.getByTestId('findings-count').textContent).toContain('2 shown');
  });

  it('filter function: severity, observer, review state', () => {
    const first = demo.cruise.observers[0]!.id;
    expect(filterFindings(findings, { severity: '', code: '', observerId: first, state: '' }).every((f) => f.observerId === first)).toBe(true);
    expect(filterFindings(findings, { severity: '', code: '', observerId: '', state: 'reviewed' })).toEqual([]);
    expect(filterFindings(findings, { severity: 'warning', code: '', observerId: '', state: 'open' }).length).toBe(findings.filter((f) => f.severity === 'warning').length);
  });
});

describe('the whole review of the demo cruise', () => {
  it('renders without canvas (jsdom) and the observer filter changes the figures', async () => {
    const { default: userEvent } = await import('@testing-library/user-event');
    const user = userEvent.setup();
    const demo = makeDemoCruise();
    const full = reviewCruise({ cruise: demo.cruise, observations: demo.observations, track: demo.track });
    render(<CruiseReview cruise={demo.cruise} observations={demo.observations} track={demo.track} />);
    // The figures come from the review engine (in place here: jsdom has no Worker), a moment later.
    expect((await screen.findByTestId('value-observations')).textContent).toBe(String(full.summary.observations));
    await waitFor(() => expect(screen.getByTestId('review-updating').textContent).toBe(''));
    expect(screen.getByTestId('value-sailed').textContent).toBe(`${full.summary.sailedNm.toFixed(1)} nm`);
    expect(screen.getAllByRole('figure')).toHaveLength(4);
    const observer = demo.cruise.observers[1]!;
    await user.selectOptions(screen.getByLabelText('Observer', { selector: 'select[id$="-observer"]' }), observer.id);
    const one = reviewCruise({ cruise: demo.cruise, observations: demo.observations, track: demo.track, include: (o) => o.observerId === observer.id });
    await waitFor(() => expect(screen.getByTestId('value-observations').textContent).toBe(String(one.summary.observations)));
    expect(screen.getByRole('status').textContent).toContain(observer.name);
  });
});
