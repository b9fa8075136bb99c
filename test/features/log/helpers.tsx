// Shared set-up for the log screen's component tests: a fresh in-memory database per test with
// an invented cruise (our own test vessel and observers), made active.
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { closeFloeDb, createCruise, selectDatabase, setActiveCruise } from '../../../src/db';
import type { Cruise } from '../../../src/domain/model';
import { LogScreen } from '../../../src/features/log/LogScreen';
import { emptyDraft, useObservationForm } from '../../../src/state/observationForm';
import { useGpsStore } from '../../../src/state/gps';
import { useSelection } from '../../../src/state/selection';
import { useWatchStore } from '../../../src/state/watch';

let n = 0;

export const TEST_OBSERVERS = [
  { id: 'obs-ak', name: 'Aino Korpela', initials: 'AK' },
  { id: 'obs-jb', name: 'Jonas Brekke', initials: 'JB' },
];

export async function freshCruise(patch: Partial<Cruise> = {}): Promise<Cruise> {
  n += 1;
  selectDatabase(`floe-log-test-${n}-${Math.random().toString(36).slice(2)}`);
  useObservationForm.setState({ cruiseId: null, draft: emptyDraft(), editing: null, dirty: false, notice: null });
  useWatchStore.setState({ observerOnWatch: {}, handoverAt: {}, soundOn: false, silencedSlot: null });
  useSelection.setState({ selectedId: null, source: null });
  useGpsStore.setState({ status: 'disconnected', fix: null, fixAtMs: 0, goodSentences: 0, badSentences: 0, lastBad: null });
  const cruise = await createCruise({
    name: 'TEST-01 component test cruise',
    vesselName: 'MV Testbed',
    iceClass: 'PC5',
    intervalMinutes: 60,
    observers: TEST_OBSERVERS,
    displayTimeZone: 'UTC',
    maxSpeedKn: 20,
    ...patch,
  });
  await setActiveCruise(cruise.id);
  return cruise;
}

export function closeDb(): void {
  closeFloeDb();
}

/** Renders the log screen and waits until the form is there. */
export async function renderLog() {
  const user = userEvent.setup();
  const view = render(<LogScreen />);
  await screen.findByRole('form', { name: /observation/i }, { timeout: 5000 });
  return { user, ...view };
}

/** The control of a labelled field (labels are unique on the form). */
export const field = (label: string | RegExp) => screen.getByLabelText(label);
