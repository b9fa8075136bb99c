import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { closeFloeDb, getActiveCruise, listCruises, selectDatabase } from '../../../src/db';
import { checkCruiseForm, CruiseSetup } from '../../../src/features/settings/CruiseSetup';
import { LogScreen } from '../../../src/features/log/LogScreen';

vi.setConfig({ testTimeout: 60_000 });
let n = 0;
beforeEach(() => selectDatabase(`floe-cruise-setup-${++n}-${Math.random().toString(36).slice(2)}`));
afterEach(() => closeFloeDb());

const base = {
  name: 'X', vesselName: 'Y', iceClass: 'PC7' as const, intervalMinutes: '60', displayTimeZone: 'Europe/Oslo', maxSpeedKn: '15',
  observers: [{ id: 'a', name: 'Aino Korpela', initials: 'ak' }],
};

describe('checkCruiseForm', () => {
  it('accepts a complete setup and upper-cases initials', () => {
    const r = checkCruiseForm(base);
    expect(r.errors).toEqual({});
    expect(r.observers).toEqual([{ id: 'a', name: 'Aino Korpela', initials: 'AK' }]);
  });

  it('names every bad field', () => {
    const r = checkCruiseForm({
      ...base, name: ' ', intervalMinutes: '0', displayTimeZone: 'Mars/Olympus', maxSpeedKn: 'fast',
      observers: [{ id: 'a', name: 'A', initials: 'X' }, { id: 'b', name: 'B', initials: 'X' }],
    });
    expect(r.errors.name).toMatch(/^Cruise name/);
    expect(r.errors.intervalMinutes).toMatch(/^Interval: "0"/);
    expect(r.errors.displayTimeZone).toMatch(/"Mars\/Olympus" is not a time zone/);
    expect(r.errors.maxSpeedKn).toMatch(/"fast"/);
    expect(r.errors.observers).toMatch(/two or three letters/);
    expect(r.errors.observers).toMatch(/the initials X are used twice/);
  });
});

describe('CruiseSetup', () => {
  it('creates a cruise with its observers and makes the first cruise active', async () => {
    const user = userEvent.setup();
    render(<CruiseSetup />);
    await user.click(await screen.findByRole('button', { name: 'New cruise' }));
    await user.type(screen.getByLabelText('Cruise name'), 'TEST-03 setup');
    await user.type(screen.getByLabelText('Vessel'), 'MV Testbed');
    await user.selectOptions(screen.getByLabelText('Vessel ice class (POLARIS)'), 'IA-Super');
    await user.clear(screen.getByLabelText('Observation interval, minutes'));
    await user.type(screen.getByLabelText('Observation interval, minutes'), '30');
    await user.clear(screen.getByLabelText('Time zone shown beside UTC'));
    await user.type(screen.getByLabelText('Time zone shown beside UTC'), 'Arctic/Longyearbyen');
    await user.type(screen.getByLabelText('Observer 1 name'), 'Aino Korpela');
    await user.type(screen.getAllByLabelText('Initials')[0] as HTMLElement, 'ak');
    await user.click(screen.getByRole('button', { name: 'Add an observer' }));
    await user.type(screen.getByLabelText('Observer 2 name'), 'Jonas Brekke');
    await user.type(screen.getAllByLabelText('Initials')[1] as HTMLElement, 'jb');
    await user.click(screen.getByRole('button', { name: 'Create the cruise' }));
    await screen.findByText('Saved TEST-03 setup.', {}, { timeout: 5000 });
    const [c] = await listCruises();
    expect(c).toMatchObject({
      name: 'TEST-03 setup', vesselName: 'MV Testbed', iceClass: 'IA-Super', intervalMinutes: 30, displayTimeZone: 'Arctic/Longyearbyen',
      observers: [expect.objectContaining({ name: 'Aino Korpela', initials: 'AK' }), expect.objectContaining({ name: 'Jonas Brekke', initials: 'JB' })],
    });
    // The first cruise becomes the active one.
    expect((await getActiveCruise())?.id).toBe(c?.id);
  });

  it('refuses a setup with errors and writes nothing', async () => {
    const user = userEvent.setup();
    render(<CruiseSetup />);
    await user.click(await screen.findByRole('button', { name: 'New cruise' }));
    await user.click(screen.getByRole('button', { name: 'Create the cruise' }));
    expect(await screen.findByText(/Cruise name: give the cruise a name/)).toBeInTheDocument();
    expect(screen.getByText(/Observers: add at least one observer/)).toBeInTheDocument();
    expect(await listCruises()).toEqual([]);
  });
});

describe('the start screen', () => {
  it('offers a new cruise and loads the invented demo cruise into the store', async () => {
    const user = userEvent.setup();
    render(<LogScreen />);
    expect(await screen.findByRole('button', { name: 'New cruise' })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Load the demo cruise' }));
    await waitFor(async () => expect((await getActiveCruise())?.vesselName).toBe('RV Frostwren'), { timeout: 50_000 });
    expect(await screen.findByTestId('watch-panel', {}, { timeout: 20_000 })).toBeInTheDocument();
  });
});
