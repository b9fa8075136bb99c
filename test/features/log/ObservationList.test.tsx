import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Cruise, Observation } from '../../../src/domain/model';
import { buildRows, ObservationList } from '../../../src/features/log/ObservationList';
import { useSelection } from '../../../src/state/selection';

// jsdom lays nothing out: give the scrolling list a height so the virtualiser renders rows.
const heightSpy = vi.spyOn(HTMLElement.prototype, 'clientHeight', 'get');
const widthSpy = vi.spyOn(HTMLElement.prototype, 'clientWidth', 'get');
beforeAll(() => {
  heightSpy.mockReturnValue(420);
  widthSpy.mockReturnValue(900);
});
afterAll(() => {
  heightSpy.mockRestore();
  widthSpy.mockRestore();
});

const cruise: Cruise = {
  id: 'c1', name: 'TEST-02', vesselName: 'MV Testbed', iceClass: 'PC5', intervalMinutes: 60,
  observers: [{ id: 'ak', name: 'Aino Korpela', initials: 'AK' }], displayTimeZone: 'UTC', maxSpeedKn: 20,
  createdAt: '2026-03-01T00:00:00Z', updatedAt: '2026-03-01T00:00:00Z',
};

function obs(i: number, hour: number, patch: Partial<Observation> = {}): Observation {
  const t = new Date(Date.UTC(2026, 2, 10, hour)).toISOString().replace('.000Z', 'Z');
  return {
    id: `o${i}`, cruiseId: 'c1', time: t, position: { lat: 80 + hour * 0.01, lon: 15.5, source: 'manual' }, observerId: 'ak',
    totalConcentration: 9, categories: [{ partialConcentration: 9, stage: 'thick-first-year', thicknessCm: 140, floeSize: 'big-floe' }],
    notes: '', photoIds: [], revision: 1, savedAt: t, savedBy: 'ak', deviceId: 'd', deleted: false, ...patch,
  };
}

describe('buildRows', () => {
  it('puts the newest first and flags the missed hours between observations', () => {
    // 00, 01, 04 UTC: 02 and 03 are missed.
    const rows = buildRows(cruise, [obs(1, 0), obs(2, 1), obs(3, 4)]);
    expect(rows.map((r) => (r.kind === 'observation' ? r.observation.id : `missed ${r.run.count}`))).toEqual(['o3', 'missed 2', 'o2', 'o1']);
  });

  it('computes RIO for the cruise class (PC5: 9/10 thick first-year, RIV 0; 1/10 ice free, RIV 3)', () => {
    // IMO MSC.1/Circ.1519 Table 1.3, PC5 row: thick first-year 0, ice free 3 -> RIO = 9x0 + 1x3 = 3.
    const [row] = buildRows(cruise, [obs(1, 0)]);
    expect(row?.kind === 'observation' && row.rio).toBe(3);
    expect(row?.kind === 'observation' && row.outcome).toBe('normal');
  });

  it('attaches the domain findings to their observation', () => {
    // Partials 9/10 over a total of 5/10: an error (partials exceed the total).
    const rows = buildRows(cruise, [obs(1, 0, { totalConcentration: 5 })]);
    const r = rows[0];
    expect(r?.kind === 'observation' && r.findings.map((f) => f.code)).toContain('partials-exceed-total');
  });
});

describe('ObservationList', () => {
  it('shows time, position in degrees and decimal minutes, Ct, egg code and RIO; arrows select, Enter edits', async () => {
    const onEdit = vi.fn();
    const user = userEvent.setup();
    useSelection.setState({ selectedId: null, source: null });
    render(<ObservationList cruise={cruise} observations={[obs(1, 0), obs(2, 1)]} onEdit={onEdit} onHistory={() => undefined} />);
    const rows = screen.getAllByTestId('observation-row');
    expect(rows).toHaveLength(2);
    const newest = rows[0] as HTMLElement;
    expect(newest).toHaveTextContent('2026-03-10 01:00');
    // 80.01 N = 80°00.600'N; 15.5 E = 015°30.000'E.
    expect(newest).toHaveTextContent("80°00.600'N 015°30.000'E");
    expect(within(newest).getByText('3')).toBeInTheDocument();
    screen.getByTestId('observation-list').focus();
    await user.keyboard('{ArrowDown}');
    expect(useSelection.getState().selectedId).toBe('o2');
    await user.keyboard('{ArrowDown}');
    expect(useSelection.getState().selectedId).toBe('o1');
    await user.keyboard('{Enter}');
    expect(onEdit).toHaveBeenCalledWith(expect.objectContaining({ id: 'o1' }));
  });

  it('nests no control inside an option; the toolbar buttons act on the selected row', async () => {
    // WAI-ARIA 1.2: option has presentational children, so a button inside a row is hidden from
    // assistive technology (axe-core rule nested-interactive). The actions live above the list.
    const onEdit = vi.fn();
    const onHistory = vi.fn();
    const user = userEvent.setup();
    useSelection.setState({ selectedId: null, source: null });
    render(<ObservationList cruise={cruise} observations={[obs(1, 0), obs(2, 1, { revision: 3 })]} onEdit={onEdit} onHistory={onHistory} />);
    for (const option of screen.getAllByRole('option')) {
      expect(option.querySelectorAll('button, a[href], input, select, textarea, [tabindex]')).toHaveLength(0);
    }
    const edit = screen.getByRole('button', { name: /Edit the selected observation/ });
    expect(edit).toBeDisabled();
    screen.getByTestId('observation-list').focus();
    await user.keyboard('{ArrowDown}');
    expect(screen.getByTestId('observation-list')).toHaveAttribute('aria-activedescendant', 'row-o2');
    await user.click(screen.getByRole('button', { name: /Its history \(3 revisions\)/ }));
    expect(onHistory).toHaveBeenCalledWith(expect.objectContaining({ id: 'o2' }));
    await user.click(edit);
    expect(onEdit).toHaveBeenCalledWith(expect.objectContaining({ id: 'o2' }));
    screen.getByTestId('observation-list').focus();
    await user.keyboard('{ArrowDown}h');
    expect(onHistory).toHaveBeenLastCalledWith(expect.objectContaining({ id: 'o1' }));
  });

  it('renders only a window of a long cruise', () => {
    const many = Array.from({ length: 20_000 }, (_, i) => obs(i, i));
    render(<ObservationList cruise={cruise} observations={many} onEdit={() => undefined} onHistory={() => undefined} />);
    const shown = screen.getAllByTestId('observation-row').length;
    expect(shown).toBeGreaterThan(0);
    expect(shown).toBeLessThan(60);
    expect(screen.getByRole('heading', { name: /Observations/ })).toHaveTextContent('20000');
  });
});
