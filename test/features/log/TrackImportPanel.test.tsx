// @vitest-environment jsdom
// The track import panel: an invented CSV and NMEA log (our own test positions north of
// Svalbard) go through the real parsers into the in-memory store; garbage stores nothing.
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { listTrackPoints } from '../../../src/db';
import { sentencesForFix } from '../../../src/gps/nmeaWrite';
import { TrackImportPanel } from '../../../src/features/log/TrackImportPanel';
import { closeDb, freshCruise } from './helpers';

afterEach(() => closeDb());

const T0 = Date.parse('2026-03-09T00:00:00Z');

function csvFile(): File {
  const rows = ['time,lat,lon,sog'];
  for (let i = 0; i < 5; i++) rows.push(`2026-03-09T00:0${i}:00Z,${(81 + i * 0.01).toFixed(2)},${(12 + i * 0.02).toFixed(2)},9.5`);
  // Line 7: latitude out of range; line 8: not a time.
  rows.push('2026-03-09T00:05:00Z,95.0,12.1,9.5');
  rows.push('yesterday,81.06,12.12,9.5');
  return new File([rows.join('\n') + '\n'], 'leg1.csv', { type: 'text/csv' });
}

async function pickAndImport(file: File) {
  const user = userEvent.setup();
  await user.upload(screen.getByLabelText('Track file'), file);
  await user.click(screen.getByRole('button', { name: 'Import the track' }));
}

describe('TrackImportPanel', () => {
  it('stores the good rows of a CSV and lists the bad lines by number, as text', { timeout: 30_000 }, async () => {
    const cruise = await freshCruise();
    render(<TrackImportPanel cruiseId={cruise.id} />);
    await pickAndImport(csvFile());
    const result = await screen.findByTestId('track-import-result', {}, { timeout: 10_000 });
    expect(screen.getByTestId('track-imported').textContent).toBe('5');
    expect(result.textContent).toContain('2 bad lines');
    const items = screen.getAllByRole('listitem').map((li) => li.textContent ?? '');
    expect(items).toHaveLength(2);
    expect(items[0]).toMatch(/^line 7: /);
    expect(items[1]).toMatch(/^line 8: /);
    const stored = await listTrackPoints(cruise.id);
    expect(stored).toHaveLength(5);
    expect(stored[0]).toMatchObject({ time: '2026-03-09T00:00:00Z', lat: 81, lon: 12, source: 'track-file' });

    // The same file again: nothing doubles, and the panel says the points were there.
    await pickAndImport(csvFile());
    await waitFor(() => expect(screen.getByTestId('track-import-result').textContent).toContain('5 of them were already stored'), { timeout: 10_000 });
    expect(await listTrackPoints(cruise.id)).toHaveLength(5);
  });

  it('imports an NMEA log written by the sentence writer, skipping a bad checksum', { timeout: 30_000 }, async () => {
    const cruise = await freshCruise();
    render(<TrackImportPanel cruiseId={cruise.id} />);
    const lines: string[] = [];
    for (let i = 0; i < 10; i++) lines.push(...sentencesForFix({ timeMs: T0 + i * 60_000, lat: 81.5 + i * 0.002, lon: 15 - i * 0.003, fixQuality: 1, satellites: 9, hdop: 0.9, sogKn: 6, cogDeg: 300 }));
    const good = lines.length;
    lines.push('$GPRMC,000500.00,A,8130.000,N,01500.000,E,6.0,300.0,090326,,,A*00');
    const file = new File([lines.join('\r\n') + '\r\n'], 'bridge.nmea');
    await pickAndImport(file);
    await screen.findByTestId('track-import-result', {}, { timeout: 10_000 });
    expect(screen.getByTestId('track-imported').textContent).toBe('10');
    const items = screen.getAllByRole('listitem');
    expect(items).toHaveLength(1);
    expect(items[0]?.textContent).toMatch(new RegExp(`^line ${good + 1}: .*checksum`, 'i'));
    const stored = await listTrackPoints(cruise.id);
    expect(stored).toHaveLength(10);
    expect(stored[9]?.time).toBe('2026-03-09T00:09:00Z');
    expect(stored[9]?.lat).toBeCloseTo(81.518, 5);
  });

  it('names a file of garbage and stores nothing', { timeout: 30_000 }, async () => {
    const cruise = await freshCruise();
    render(<TrackImportPanel cruiseId={cruise.id} />);
    await pickAndImport(new File(['<b>not</b> a track\n\u0000\u0001 garbage\n'], 'notes.txt'));
    const alert = await screen.findByTestId('track-import-error', {}, { timeout: 10_000 });
    expect(alert.textContent).toContain('notes.txt');
    expect(alert.textContent).toContain('Nothing was stored');
    expect(alert.querySelector('b')).toBeNull();
    expect(await listTrackPoints(cruise.id)).toHaveLength(0);

    // Forced to CSV, the same garbage yields no point: still nothing stored.
    await userEvent.setup().selectOptions(screen.getByLabelText('Format'), 'csv');
    await pickAndImport(new File(['a,b\n1,2\n'], 'notes.txt'));
    await waitFor(() => expect(screen.getByTestId('track-import-error').textContent).toContain('notes.txt'), { timeout: 10_000 });
    expect(await listTrackPoints(cruise.id)).toHaveLength(0);
  });
});
