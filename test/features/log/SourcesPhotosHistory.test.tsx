import { render, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { getPhoto, listObservations, saveObservation } from '../../../src/db';
import { HistoryPanel } from '../../../src/features/log/HistoryPanel';
import { closeDb, field, freshCruise, renderLog } from './helpers';

vi.setConfig({ testTimeout: 30_000 });
afterEach(() => {
  Reflect.deleteProperty(navigator, 'geolocation');
  closeDb();
});

describe('position sources', () => {
  it('takes a position from this device\'s geolocation and stores the source with it', async () => {
    const cruise = await freshCruise();
    Object.defineProperty(navigator, 'geolocation', {
      configurable: true,
      value: {
        getCurrentPosition: (ok: PositionCallback) =>
          ok({ coords: { latitude: 78.2232, longitude: 15.6267, accuracy: 12.4 }, timestamp: Date.parse('2026-03-10T06:00:00Z') } as unknown as GeolocationPosition),
      },
    });
    const { user } = await renderLog();
    await user.selectOptions(field('Position from'), 'geolocation');
    await user.click(screen.getByRole('button', { name: 'Locate' }));
    expect(await screen.findByText("78°13.392'N 015°37.602'E")).toBeInTheDocument();
    expect(screen.getByText('Accuracy about 12 m.')).toBeInTheDocument();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('0{Enter}');
    await screen.findByText(/Saved: /, {}, { timeout: 8000 });
    const [o] = await listObservations(cruise.id);
    expect(o?.position).toEqual({ lat: 78.2232, lon: 15.6267, source: 'geolocation', accuracyM: 12, fixTime: '2026-03-10T06:00:00Z' });
  });

  it('says why a typed position cannot be read', async () => {
    await freshCruise();
    const { user } = await renderLog();
    await user.click(field('Position'));
    await user.paste('95 N 10 E');
    const id = field('Position').getAttribute('aria-describedby') ?? '';
    expect(document.getElementById(id)?.textContent).toMatch(/Position: .*latitude/i);
  });
});

describe('photos', () => {
  it('stores a picked photo as a blob at once and saves its id with the observation', async () => {
    const cruise = await freshCruise();
    const { user } = await renderLog();
    const file = new File([new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3])], 'floe.jpg', { type: 'image/jpeg' });
    await user.upload(field('Photos'), file);
    expect(await screen.findByRole('button', { name: 'Remove photo floe.jpg' }, { timeout: 8000 })).toBeInTheDocument();
    await user.click(field('Total concentration Ct, tenths'));
    await user.keyboard('0{Enter}');
    await screen.findByText(/Saved: /, {}, { timeout: 8000 });
    const [o] = await listObservations(cruise.id);
    expect(o?.photoIds).toHaveLength(1);
    const photo = await getPhoto(o?.photoIds[0] ?? '');
    expect(photo).toMatchObject({ fileName: 'floe.jpg', mimeType: 'image/jpeg', sizeBytes: 7, observationId: o?.id });
  });
});

describe('history', () => {
  it('shows the revisions of an observation side by side with the changes marked', async () => {
    const cruise = await freshCruise();
    const base = {
      id: 'h1', cruiseId: cruise.id, time: '2026-03-10T06:00:00Z', position: null, observerId: 'obs-ak',
      totalConcentration: 6, categories: [{ partialConcentration: 6, stage: 'grey' as const }], notes: 'first', photoIds: [],
    };
    await saveObservation(base);
    await saveObservation({ ...base, totalConcentration: 7, categories: [{ partialConcentration: 7, stage: 'grey' as const }], notes: 'second' }, { expectedRevision: 1 });
    render(<HistoryPanel cruise={cruise} observationId="h1" onClose={() => undefined} />);
    const table = await screen.findByRole('table', { name: /Revisions of the 2026-03-10 06:00 UTC observation/ });
    expect(within(table).getByText('Revision 1')).toBeInTheDocument();
    expect(within(table).getByText('Revision 2')).toBeInTheDocument();
    const notes = within(table).getByRole('rowheader', { name: /Notes/ }).closest('tr');
    expect(notes).toHaveClass('differs');
    expect(notes).toHaveTextContent('firstsecond');
    const stage = within(table).getByRole('rowheader', { name: 'a: stage' }).closest('tr');
    expect(stage).not.toHaveClass('differs');
    await waitFor(() => expect(screen.getByText(/2 revisions, oldest on the left/)).toBeInTheDocument());
  });
});
