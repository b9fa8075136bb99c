import { act, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { listObservations, saveObservation } from '../../../src/db';
import type { Cruise, Observation } from '../../../src/domain/model';
import { useObservationForm } from '../../../src/state/observationForm';
import { closeDb, field, freshCruise, renderLog } from './helpers';

// A whole form typed key by key in jsdom, each key re-checked and autosaved, takes a few seconds.
vi.setConfig({ testTimeout: 30_000 });
afterEach(() => closeDb());

/** Waits for the save to be confirmed on screen (the store commits before it says so). */
async function saved(text: RegExp = /Saved: /) {
  return screen.findByText(text, {}, { timeout: 8000 });
}

async function stored(cruise: Cruise): Promise<Observation[]> {
  return listObservations(cruise.id);
}

/** A saved observation to start from (invented values). */
async function seedPrevious(cruise: Cruise, time = '2026-03-10T06:00:00Z'): Promise<Observation> {
  const r = await saveObservation({
    id: 'prev-1', cruiseId: cruise.id, time,
    position: { lat: 81.2, lon: 31.1, source: 'manual' }, observerId: 'obs-ak', totalConcentration: 9,
    categories: [
      { partialConcentration: 5, stage: 'thick-first-year', floeSize: 'big-floe', thicknessCm: 140 },
      { partialConcentration: 3, stage: 'medium-first-year', floeSize: 'medium-floe', thicknessCm: 90 },
      { partialConcentration: 1, stage: 'grey-white', floeSize: 'small-floe', thicknessCm: 20 },
    ],
    deformation: { a: { ridgedTenths: 3 } },
    snow: { a: { cover: 'complete', wetness: 'dry', drifts: true, depthCm: 20 } },
    weather: { airTempC: -18, windSpeedKn: 12 },
    notes: 'seed', photoIds: [],
  });
  return r.observation;
}

describe('the observation form by keyboard', () => {
  it('fills tenths with single digits, picks lists by typing and saves with Enter', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste("81 12.5 N 031 05.0 E");
    await user.click(field('Total concentration Ct, tenths'));
    // "8" sets Ct and moves on to Ca; "5" sets Ca and moves on to the stage.
    await user.keyboard('8');
    expect(field('Concentration Ca, tenths')).toHaveFocus();
    await user.keyboard('5');
    expect(field('Stage Sa')).toHaveFocus();
    await user.keyboard('thick{Tab}');
    expect(field('Stage Sa')).toHaveValue('Thick first-year ice');
    // The egg code's order (WMO-No. 259): concentration, stage, form, then thickness.
    expect(field('Floe size Fa')).toHaveFocus();
    await user.keyboard('big{Tab}');
    expect(field('Floe size Fa')).toHaveValue('Big floe');
    expect(field('Thickness (a), cm')).toHaveFocus();
    await user.keyboard('150');
    // Enter with the list closed saves.
    await user.keyboard('{Enter}');
    await saved(/Saved: the .* UTC observation, revision 1\./);
    const [o] = await stored(cruise);
    expect(o?.totalConcentration).toBe(8);
    expect(o?.categories).toEqual([{ partialConcentration: 5, stage: 'thick-first-year', thicknessCm: 150, floeSize: 'big-floe' }]);
    expect(o?.position?.source).toBe('manual');
    expect(o?.position?.lat).toBeCloseTo(81 + 12.5 / 60, 9);
    expect(o?.position?.lon).toBeCloseTo(31 + 5 / 60, 9);
    expect(o?.observerId).toBe('obs-ak');
  });

  it('types 10 tenths as "1" then "0", and keeps 1/10 with Tab', async () => {
    await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('1');
    expect(field('Total concentration Ct, tenths')).toHaveFocus();
    await user.keyboard('0');
    expect(field('Total concentration Ct, tenths')).toHaveValue('10');
    expect(field('Concentration Ca, tenths')).toHaveFocus();
    await user.keyboard('1{Tab}');
    expect(field('Concentration Ca, tenths')).toHaveValue('1');
    expect(field('Stage Sa')).toHaveFocus();
  });

  it('narrows a list by the egg-code symbol as well as by words', async () => {
    await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Stage Sa'));
    // "7." is the egg code of old ice (WMO-No. 259 stage symbols).
    await user.keyboard('7.{Enter}');
    expect(field('Stage Sa')).toHaveValue('Old ice');
    await user.click(field('Stage Sa'));
    await user.keyboard('grey w{Enter}');
    expect(field('Stage Sa')).toHaveValue('Grey-white ice');
  });

  it('moves between sections with Page Down and Page Up', async () => {
    await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('{PageDown}');
    expect(field('Concentration Ca, tenths')).toHaveFocus();
    // Deformation and snow are sections of their own after the ice types.
    await user.keyboard('{PageDown}');
    expect(field('Ridged (a), tenths')).toHaveFocus();
    await user.keyboard('{PageDown}');
    expect(field('Snow cover (a)')).toHaveFocus();
    await user.keyboard('{PageDown}');
    expect(field('Trace of thicker ice So')).toHaveFocus();
    await user.keyboard('{PageUp}{PageUp}{PageUp}{PageUp}');
    expect(field('Total concentration Ct, tenths')).toHaveFocus();
  });

  it('adds an ice type with Alt+A and removes the one in focus with Alt+X', async () => {
    await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('{Alt>}a{/Alt}');
    expect(field('Concentration Cb, tenths')).toHaveFocus();
    await user.keyboard('{Alt>}x{/Alt}');
    expect(screen.queryByLabelText('Concentration Cb, tenths')).toBeNull();
  });

  it('lists the shortcuts on screen', async () => {
    await freshCruise();
    await renderLog();
    const legend = screen.getByLabelText('Keyboard shortcuts');
    for (const k of ['Alt+P', 'Page Down / Up', 'Enter', '0-9']) expect(within(legend).getByText(k)).toBeInTheDocument();
  });
});

describe('findings beside the fields', () => {
  it('shows an impossible value beside its field and blocks saving with the reason', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('4');
    await user.keyboard('{Alt>}a{/Alt}');
    // Two types of 3/10 and 2/10 under a total of 4/10: the partials exceed the total.
    await user.click(field('Concentration Ca, tenths'));
    await user.keyboard('3');
    await user.keyboard('grey{Enter}');
    await user.click(field('Concentration Cb, tenths'));
    await user.keyboard('2');
    await user.keyboard('nilas{Enter}');
    const summary = screen.getByRole('region', { name: 'Checks' });
    expect(within(summary).getByText(/1 error blocks saving/)).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: /Save the observation/ }));
    const alert = await screen.findByText(/Not saved: one value must be corrected/);
    expect(alert).toBeInTheDocument();
    expect(await stored(cruise)).toHaveLength(0);
  });

  it('marks an unreadable number beside the field, naming the field', async () => {
    await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Air, °C'));
    await user.keyboard('minus five');
    const input = field('Air, °C');
    expect(input).toHaveAttribute('aria-invalid', 'true');
    const id = input.getAttribute('aria-describedby');
    expect(id).toBeTruthy();
    expect(document.getElementById(id ?? '')).toHaveTextContent('Air temperature: "minus five" is not a number.');
  });

  it('lets a doubtful value be saved and keeps the note given on the warning', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste('80.5 20.25');
    await user.click(field('Total concentration Ct, tenths'));
    // Grey ice is 10-15 cm (WMO-No. 259); 40 cm is outside its range: a warning, not an error.
    await user.keyboard('66grey{Tab}{Tab}40');
    const summary = screen.getByRole('region', { name: 'Checks' });
    const note = await within(summary).findByRole('textbox', { name: /Note on the warning: .*/ });
    await user.click(note);
    await user.keyboard('rafted grey ice, checked against the hull');
    await user.click(screen.getByRole('button', { name: /Save the observation/ }));
    await saved();
    const [o] = await stored(cruise);
    expect(o?.categories[0]).toMatchObject({ stage: 'grey', thicknessCm: 40, partialConcentration: 6 });
    expect(o?.reviews).toEqual([
      expect.objectContaining({ code: 'stage-thickness-mismatch', path: 'categories.0.thicknessCm', comment: 'rafted grey ice, checked against the hull', by: 'obs-ak' }),
    ]);
  });
});

describe('thickest first', () => {
  it('reorders ice types entered thinnest first when leaving them, and says so', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste('80.5 20.25');
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('9');
    await user.keyboard('{Alt>}a{/Alt}');
    await user.click(field('Concentration Ca, tenths'));
    await user.keyboard('3grey{Enter}');
    await user.click(field('Concentration Cb, tenths'));
    await user.keyboard('6thick{Enter}');
    // Leaving the ice types puts them in order (WMO egg code: Sa is the thickest stage).
    await user.click(field('Air, °C'));
    expect(await screen.findByText(/Ice types put thickest first/)).toHaveTextContent('thick first-year ice is now a, grey ice is now b');
    expect(field('Stage Sa')).toHaveValue('Thick first-year ice');
    expect(field('Concentration Ca, tenths')).toHaveValue('6');
    expect(field('Stage Sb')).toHaveValue('Grey ice');
    await user.keyboard('{Enter}');
    await saved();
    const [o] = await stored(cruise);
    expect(o?.categories.map((c) => [c.stage, c.partialConcentration])).toEqual([
      ['thick-first-year', 6],
      ['grey', 3],
    ]);
  });

  it('reorders at save time too, when the observer saves from inside the ice types', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste('80.5 20.25');
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('7');
    await user.keyboard('{Alt>}a{/Alt}');
    await user.click(field('Concentration Ca, tenths'));
    await user.keyboard('2nilas{Enter}');
    await user.click(field('Concentration Cb, tenths'));
    await user.keyboard('5medium{Enter}{Enter}');
    await saved();
    const [o] = await stored(cruise);
    expect(o?.categories.map((c) => c.stage)).toEqual(['medium-first-year', 'nilas']);
  });
});

describe('deformation and snow, groups of their own', () => {
  it('saves a row per ice type into the deformation and snow groups, keyed by the ice type', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste('80.5 20.25');
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('9');
    await user.keyboard('{Alt>}a{/Alt}');
    await user.click(field('Concentration Ca, tenths'));
    await user.keyboard('6thick{Enter}');
    await user.click(field('Concentration Cb, tenths'));
    await user.keyboard('3grey w{Enter}');
    // Deformation row of ice type a: 2/10 ridged, "0" rafted, 1.5 m sails.
    await user.click(field('Ridged (a), tenths'));
    await user.keyboard('20');
    expect(field('Sail height (a), m')).toHaveFocus();
    await user.keyboard('1.5');
    // Snow of ice type a: complete, wetness by its code "V" (very wet, Fierz et al. 2009), a crust, 25 cm.
    await user.click(field('Snow cover (a)'));
    await user.keyboard('snow-c{Tab}V{Tab}');
    expect(field('Crust (a)')).toHaveFocus();
    await user.keyboard(' ');
    await user.click(field('Snow depth (a), cm'));
    await user.keyboard('25');
    // Snow of ice type b: partial, dry.
    await user.click(field('Snow cover (b)'));
    await user.keyboard('partly{Tab}dry{Tab}');
    await user.click(screen.getByRole('button', { name: /Save the observation/ }));
    await saved();
    const [o] = await stored(cruise);
    expect(o?.categories).toEqual([
      { partialConcentration: 6, stage: 'thick-first-year' },
      { partialConcentration: 3, stage: 'grey-white' },
    ]);
    expect(o?.deformation).toEqual({ a: { ridgedTenths: 2, raftedTenths: 0, sailHeightM: 1.5 } });
    expect(o?.snow).toEqual({ a: { cover: 'complete', wetness: 'very-wet', crust: true, depthCm: 25 }, b: { cover: 'partial', wetness: 'dry' } });
    // Two ice types and both groups typed key by key: longer than the file's 30 s on a loaded machine.
  }, 90_000);

  it('names a bad snow depth beside its field and puts the cursor there on save', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('5');
    await user.click(field('Stage Sa'));
    await user.keyboard('grey{Tab}');
    await user.click(field('Snow depth (a), cm'));
    await user.keyboard('-3');
    const input = field('Snow depth (a), cm');
    expect(input).toHaveAttribute('aria-invalid', 'true');
    expect(document.getElementById(input.getAttribute('aria-describedby') ?? '')).toHaveTextContent('Ice type a snow depth -3 cm is not a depth');
    await user.click(screen.getByRole('button', { name: /Save the observation/ }));
    await screen.findByText(/Not saved/);
    expect(field('Snow depth (a), cm')).toHaveFocus();
    expect(await stored(cruise)).toHaveLength(0);
  });

  it('moves the deformation and snow rows with their ice type when the types are put thickest first', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste('80.5 20.25');
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('9');
    await user.keyboard('{Alt>}a{/Alt}');
    await user.click(field('Concentration Ca, tenths'));
    await user.keyboard('3grey{Enter}');
    await user.click(field('Concentration Cb, tenths'));
    await user.keyboard('6thick{Enter}');
    // Ridges typed on the thick first-year ice while it is still row b.
    await user.click(field('Ridged (b), tenths'));
    await user.keyboard('4');
    expect(await screen.findByText(/Ice types put thickest first/)).toBeInTheDocument();
    expect(field('Ridged (a), tenths')).toHaveValue('4');
    expect(field('Ridged (b), tenths')).toHaveValue('');
    await user.click(screen.getByRole('button', { name: /Save the observation/ }));
    await saved();
    const [o] = await stored(cruise);
    expect(o?.categories.map((c) => c.stage)).toEqual(['thick-first-year', 'grey']);
    expect(o?.deformation).toEqual({ a: { ridgedTenths: 4 } });
  });
});

describe('start from the previous observation', () => {
  it('carries the ice and weather over with Alt+P, with a fresh time, observer on watch and no notes', async () => {
    const cruise = await freshCruise();
    await seedPrevious(cruise);
    const { user } = await renderLog();
    await user.keyboard('{Alt>}p{/Alt}');
    await waitFor(() => expect(field('Total concentration Ct, tenths')).toHaveFocus());
    expect(field('Total concentration Ct, tenths')).toHaveValue('9');
    expect(field('Stage Sa')).toHaveValue('Thick first-year ice');
    expect(field('Stage Sc')).toHaveValue('Grey-white ice');
    expect(field('Snow depth (a), cm')).toHaveValue('20');
    expect(field('Snow cover (a)')).toHaveValue('Snow-covered throughout');
    expect(field('Wetness (a)')).toHaveValue('Dry');
    expect(field('Drifts (a)')).toBeChecked();
    expect(field('Crust (a)')).not.toBeChecked();
    expect(field('Ridged (a), tenths')).toHaveValue('3');
    expect(field('Air, °C')).toHaveValue('-18');
    expect(field('Notes')).toHaveValue('');
    expect(field('Time, UTC')).toHaveValue('');
    const draft = useObservationForm.getState().draft;
    expect(draft.id).not.toBe('prev-1');
  });

  it('asks before replacing an entry in progress', async () => {
    const cruise = await freshCruise();
    await seedPrevious(cruise);
    const { user } = await renderLog();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('3');
    await user.keyboard('{Alt>}p{/Alt}');
    expect(await screen.findByText(/The entry in progress would be replaced/)).toBeInTheDocument();
    expect(field('Total concentration Ct, tenths')).toHaveValue('3');
    await user.keyboard('{Alt>}p{/Alt}');
    await waitFor(() => expect(field('Total concentration Ct, tenths')).toHaveValue('9'));
  });
});

describe('editing and conflicts', () => {
  it('refuses to overwrite an edit made elsewhere and shows both versions', async () => {
    const cruise = await freshCruise();
    const prev = await seedPrevious(cruise);
    const { user } = await renderLog();
    // Open the stored observation for editing, as the list's Edit button does.
    const { observationToDraft } = await import('../../../src/features/log/formModel');
    act(() => {
      useObservationForm.getState().load(cruise.id, observationToDraft(prev, { asNext: false }), { id: prev.id, expectedRevision: prev.revision }, false);
    });
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('10');
    // Meanwhile another tab saves revision 2.
    await saveObservation({ ...prev, notes: 'edited in another tab' }, { expectedRevision: 1 });
    await user.click(screen.getByRole('button', { name: /Save the edit/ }));
    const panel = await screen.findByRole('alertdialog', { name: /changed elsewhere/ }, { timeout: 8000 });
    expect(within(panel).getByText('Stored now (revision 2)')).toBeInTheDocument();
    expect(within(panel).getByText('edited in another tab')).toBeInTheDocument();
    const [o] = await stored(cruise);
    expect(o?.revision).toBe(2);
    expect(o?.totalConcentration).toBe(9);
    // Only an explicit choice saves over it, as a new revision.
    await user.click(within(panel).getByRole('button', { name: 'Save my edit as revision 3' }));
    await saved(/revision 3/);
    const [after] = await stored(cruise);
    expect(after?.revision).toBe(3);
    expect(after?.totalConcentration).toBe(10);
  });
});
