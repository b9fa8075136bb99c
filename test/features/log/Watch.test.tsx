import { renderHook, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { getSetting } from '../../../src/db';
import type { Cruise, Observation } from '../../../src/domain/model';
import { latestShipPosition, useAutoTheme } from '../../../src/features/log/useAutoTheme';
import { WatchPanel } from '../../../src/features/log/WatchPanel';
import { useGpsStore } from '../../../src/state/gps';
import { useThemeStore } from '../../../src/state/theme';
import { useWatchStore } from '../../../src/state/watch';
import { closeDb, freshCruise, TEST_OBSERVERS } from './helpers';

vi.setConfig({ testTimeout: 30_000 });
afterEach(() => {
  vi.useRealTimers();
  closeDb();
});

function obsAt(time: string, pos: { lat: number; lon: number } | null = null): Observation {
  return {
    id: time, cruiseId: 'c', time, position: pos ? { ...pos, source: 'manual' } : null, observerId: 'obs-ak', totalConcentration: 0,
    categories: [], notes: '', photoIds: [], revision: 1, savedAt: time, savedBy: 'obs-ak', deviceId: 'd', deleted: false,
  };
}

describe('the watch panel', () => {
  it('shows the overdue state, the missed hours, and hands the watch over in one step', async () => {
    const cruise = await freshCruise();
    // 12:25 UTC with only the 09:00 observation made: 10:00 and 11:00 are missed, and 12:00 is
    // overdue (more than 10 minutes past; hourly slots on the hour, common practice).
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-03-10T12:25:00Z') });
    const user = userEvent.setup();
    useWatchStore.getState().setObserverOnWatch(cruise.id, 'obs-ak');
    render(<WatchPanel cruise={cruise} observations={[obsAt('2026-03-10T09:00:00Z')]} />);
    const panel = screen.getByTestId('watch-panel');
    expect(panel).toHaveAttribute('data-state', 'overdue');
    expect(panel).toHaveTextContent('Observation overdue 12:00 UTC');
    expect(screen.getByTestId('missed-list')).toHaveTextContent('10:00–11:00 UTC on 2026-03-10 (2 observations)');
    await user.selectOptions(screen.getByLabelText('On watch'), 'obs-jb');
    expect(useWatchStore.getState().observerOnWatch[cruise.id]).toBe('obs-jb');
    expect(screen.getByLabelText('On watch')).toHaveValue('obs-jb');
    expect(panel).toHaveTextContent('since 12:25 UTC');
    await waitFor(async () => expect(await getSetting('currentObserverId')).toBe('obs-jb'));
    expect(TEST_OBSERVERS.map((o) => o.id)).toContain('obs-jb');
  });

  it('counts down to the next slot while waiting', async () => {
    const cruise = (await freshCruise()) as Cruise;
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-03-10T12:20:00Z') });
    render(<WatchPanel cruise={cruise} observations={[obsAt('2026-03-10T12:01:00Z')]} />);
    expect(screen.getByTestId('watch-panel')).toHaveAttribute('data-state', 'waiting');
    expect(screen.getByTestId('watch-remaining')).toHaveTextContent('in 40 min 00 s');
  });
});

describe('the automatic night display', () => {
  it('takes the GPS fix before the latest observation', () => {
    expect(latestShipPosition({ lat: 1, lon: 2 }, [obsAt('2026-03-10T12:00:00Z', { lat: 3, lon: 4 })])).toEqual({ lat: 1, lon: 2 });
    expect(latestShipPosition(null, [obsAt('2026-03-10T11:00:00Z', { lat: 3, lon: 4 }), obsAt('2026-03-10T12:00:00Z')])).toEqual({ lat: 3, lon: 4 });
    expect(latestShipPosition(null, [])).toBeNull();
  });

  it('goes to night in the polar night and to day under the midnight sun at 81 N', () => {
    useGpsStore.setState({ fix: null });
    const at81 = [obsAt('2026-01-01T00:00:00Z', { lat: 81, lon: 31 })];
    // 21 December near local noon (about 10:00 UTC at 31 E): the noon elevation at 81 N is
    // 90 - 81 - 23.44 = -14.4 deg (declination at the solstice; spherical astronomy, common
    // practice), well below the -6 deg civil-twilight line: night.
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-12-21T10:00:00Z') });
    useThemeStore.setState({ mode: 'auto', autoTheme: 'day' });
    const a = renderHook(() => useAutoTheme(at81));
    expect(useThemeStore.getState().autoTheme).toBe('night');
    a.unmount();
    // 21 June near local midnight: the lowest elevation is 81 + 23.44 - 90 = +14.4 deg: day.
    vi.setSystemTime(new Date('2026-06-21T22:00:00Z'));
    renderHook(() => useAutoTheme(at81));
    expect(useThemeStore.getState().autoTheme).toBe('day');
  });
});
