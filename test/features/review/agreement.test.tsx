// The Review with a stored ice chart, in jsdom: the agreement figures, the two plots' figures (no
// canvas in jsdom), and the largest disagreement in the findings list. Values by hand: the chart's
// triangle is CT 92, 10/10 (WMO/TD-No. 1214); observed 6/10 there is 4 tenths below it.
import { render, screen, waitFor } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { closeFloeDb, openFloeDb, saveIceChart, selectDatabase } from '../../../src/db';
import type { Cruise, Observation } from '../../../src/domain/model';
import { CruiseReview } from '../../../src/features/review/ReviewScreen';
import { storedChart } from '../../iceinfo/storedProducts';

const cruise: Cruise = {
  id: 'c', name: 'Test cruise', vesselName: 'RV Frostwren', iceClass: 'PC5', intervalMinutes: 60,
  observers: [{ id: 'A', name: 'Observer A', initials: 'OA' }],
  displayTimeZone: 'UTC', maxSpeedKn: 16, createdAt: '2026-03-05T00:00:00Z', updatedAt: '2026-03-05T00:00:00Z',
};
const obs = (id: string, time: string, total: number): Observation => ({
  id, cruiseId: 'c', time, position: { lat: 72, lon: 5, source: 'manual' }, observerId: 'A', totalConcentration: total,
  categories: [{ partialConcentration: total, stage: 'thick-first-year', thicknessCm: 140 }], notes: '', photoIds: [], revision: 1, savedAt: time, savedBy: 'A', deviceId: 'd', deleted: false,
});
const log = [obs('near', '2026-03-05T00:00:00Z', 9), obs('far', '2026-03-05T01:00:00Z', 6)];

let n = 0;
beforeEach(async () => {
  selectDatabase(`floe-review-agreement-${process.pid}-${++n}`);
  await openFloeDb();
});
afterEach(() => closeFloeDb());

describe('the Review with an ice chart stored', () => {
  it('shows the agreement, its two plots and the largest disagreement as a finding', async () => {
    await saveIceChart(storedChart());
    render(<CruiseReview cruise={cruise} observations={log} track={[]} />);
    const panel = await screen.findByTestId('agreement-chart', {}, { timeout: 10_000 });
    // Differences -1 and -4: mean -2.50, RMS sqrt((1 + 16) / 2) = 2.92, within 1/10 one of two.
    expect(panel.textContent).toContain('All observations2-2.502.9250 %50 %');
    expect(screen.getByTestId('chart-agreement-scatter').textContent).toContain('Ice chart: 2 pairs; satellite grid: 0 pairs.');
    expect(screen.getByTestId('chart-agreement-series')).toBeInTheDocument();
    await waitFor(() => expect(document.querySelectorAll('li[data-code="chart-disagreement"]')).toHaveLength(1));
    const item = document.querySelector('li[data-code="chart-disagreement"]');
    expect(item?.textContent).toContain('Observed total concentration more than 2/10 from the ice chart');
    expect(item?.textContent).toContain('Observed 6/10, chart "Frostwren test chart" (valid 2026-03-04T18:00:00Z) CT 92, read as 10/10: difference -4.0 tenths.');
    expect(item?.querySelector('button')?.textContent).toBe('Show on the map');
  });
});
