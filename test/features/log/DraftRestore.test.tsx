import { screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { loadDraft, saveDraft } from '../../../src/db';
import type { StoredDraft } from '../../../src/features/log/useDraftAutosave';
import { emptyDraft, useObservationForm } from '../../../src/state/observationForm';
import { closeDb, field, freshCruise, renderLog } from './helpers';

vi.setConfig({ testTimeout: 30_000 });
afterEach(() => closeDb());

describe('the draft in progress', () => {
  it('is written to the store on every change and brought back after the screen is gone', async () => {
    const cruise = await freshCruise();
    const first = await renderLog();
    await first.user.click(field('Total concentration Ct, tenths'));
    await first.user.keyboard('7');
    await first.user.keyboard('3thick{Tab}');
    await first.user.click(field('Notes'));
    await first.user.keyboard('swell under the ice');
    // The last keystroke is in the drafts table, not only on screen.
    await waitFor(async () => {
      const row = await loadDraft<StoredDraft>(cruise.id, 'observation');
      expect(row?.data.draft.notes).toBe('swell under the ice');
    });
    first.unmount();
    // A reload starts with an empty store.
    useObservationForm.setState({ cruiseId: null, draft: emptyDraft(), editing: null, dirty: false });

    await renderLog();
    expect(await screen.findByTestId('draft-restored')).toHaveTextContent('Brought back the entry in progress');
    expect(field('Total concentration Ct, tenths')).toHaveValue('7');
    expect(field('Concentration Ca, tenths')).toHaveValue('3');
    expect(field('Stage Sa')).toHaveValue('Thick first-year ice');
    expect(field('Notes')).toHaveValue('swell under the ice');
    // Its time was fixed at the first change, not reset to the reload's clock.
    expect(field('Time, UTC')).toHaveValue(useObservationForm.getState().draft.time);
    expect(useObservationForm.getState().draft.time).toMatch(/^\d{4}-\d{2}-\d{2} \d{2}:\d{2}$/);
  });

  it('brings back a draft kept without the snow fields of today\'s ice-type rows, blank where missing', async () => {
    const cruise = await freshCruise();
    const draft = emptyDraft('obs-ak');
    const { snowCover: _c, snowWetness: _w, snowCrust: _k, snowDrifts: _d, ...older } = { ...(draft.categories[0] as (typeof draft.categories)[number]), partial: '4', stage: 'grey' as const };
    await saveDraft(cruise.id, 'observation', { draft: { ...draft, total: '4', categories: [older] }, editing: null });
    await renderLog();
    expect(await screen.findByTestId('draft-restored')).toBeInTheDocument();
    expect(field('Stage Sa')).toHaveValue('Grey ice');
    expect(field('Snow cover (a)')).toHaveValue('');
    expect(field('Crust (a)')).not.toBeChecked();
    expect(useObservationForm.getState().draft.categories[0]).toMatchObject({ snowCover: '', snowWetness: '', snowCrust: false, snowDrifts: false });
  });

  it('is cleared once the observation is saved', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste('80.1 15.2');
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('0');
    await waitFor(async () => expect(await loadDraft(cruise.id, 'observation')).toBeDefined());
    await user.keyboard('{Enter}');
    await screen.findByText(/Saved: /, {}, { timeout: 8000 });
    await waitFor(async () => expect(await loadDraft(cruise.id, 'observation')).toBeUndefined());
  });
});
