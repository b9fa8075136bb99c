import { render, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { saveObservation } from '../../../src/db';
import { useWatchStore } from '../../../src/state/watch';
import { closeDb, freshCruise } from './helpers';

const calls = vi.hoisted(() => ({ beep: [] as string[], notify: [] as string[] }));
vi.mock('../../../src/features/log/alarm', async (orig) => ({
  ...(await orig<typeof import('../../../src/features/log/alarm')>()),
  beep: (kind: string) => {
    calls.beep.push(kind);
    return true;
  },
  notify: (title: string) => {
    calls.notify.push(title);
    return true;
  },
}));

const { LogBackground } = await import('../../../src/features/log/LogBackground');

vi.setConfig({ testTimeout: 30_000 });
afterEach(() => {
  vi.useRealTimers();
  closeDb();
});

describe('the watch alarm', () => {
  it('beeps and notifies once when the observation falls overdue, on whatever screen is open', async () => {
    const cruise = await freshCruise();
    await saveObservation({
      id: 'o1', cruiseId: cruise.id, time: '2026-03-10T11:00:00Z', position: null, observerId: 'obs-ak',
      totalConcentration: 0, categories: [], notes: '', photoIds: [],
    });
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-03-10T12:15:00Z') });
    useWatchStore.setState({ soundOn: true, silencedSlot: null });
    calls.beep.length = 0;
    calls.notify.length = 0;
    const view = render(<LogBackground />);
    await waitFor(() => expect(calls.beep).toEqual(['overdue']));
    expect(calls.notify).toEqual(['Ice observation overdue (12:00 UTC)']);
    view.rerender(<LogBackground />);
    expect(calls.beep).toHaveLength(1);
  });

  it('stays quiet for a silenced slot', async () => {
    const cruise = await freshCruise();
    await saveObservation({
      id: 'o1', cruiseId: cruise.id, time: '2026-03-10T11:00:00Z', position: null, observerId: 'obs-ak',
      totalConcentration: 0, categories: [], notes: '', photoIds: [],
    });
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-03-10T12:15:00Z') });
    useWatchStore.setState({ soundOn: true, silencedSlot: '2026-03-10T12:00:00Z' });
    calls.beep.length = 0;
    render(<LogBackground />);
    await new Promise((r) => setTimeout(r, 800));
    expect(calls.beep).toEqual([]);
  });
});
