// The Exchange screen under jsdom (no Worker: the main-thread parse path): pick a file, see the
// preview, apply, see the result; a rejected file lists its problems and writes nothing.
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { closeFloeDb, getDb, openFloeDb, selectDatabase } from '../../../src/db';
import { ExchangeScreen } from '../../../src/features/exchange/ExchangeScreen';
import { exportLogJson } from '../../../src/format/encode';
import { sampleBundle } from '../../format/arbitraries';

let n = 0;
beforeEach(async () => {
  selectDatabase(`floe-exchange-ui-${process.pid}-${++n}`);
  await openFloeDb();
});
afterEach(() => closeFloeDb());

const logFile = (text: string, name = 'sample.floe-log.json') => new File([text], name, { type: 'application/json' });

describe('Exchange screen', { timeout: 30_000 }, () => {
  it('previews an import, writes nothing until applied, then imports it', async () => {
    const user = userEvent.setup();
    render(<ExchangeScreen />);
    await user.upload(screen.getByTestId('import-input'), logFile(exportLogJson(sampleBundle()).join('')));
    const preview = await screen.findByTestId('import-preview', {}, { timeout: 10_000 });
    expect(within(screen.getByTestId('count-new')).getByText('2')).toBeInTheDocument();
    expect(within(screen.getByTestId('count-trackNew')).getByText('3')).toBeInTheDocument();
    expect(preview).toHaveTextContent('Test cruise');
    expect(await getDb().observations.count()).toBe(0);
    await user.click(screen.getByRole('button', { name: 'Apply import' }));
    expect(await screen.findByTestId('import-done')).toHaveTextContent('2 observations written');
    expect(await getDb().observations.count()).toBe(2);
    expect((await getDb().trackChunks.toArray()).reduce((n, c) => n + c.count, 0)).toBe(3);
    // Export buttons are there for the imported cruise.
    expect(await screen.findByRole('button', { name: 'CSV' })).toBeEnabled();
  });

  it('lists the problems of a rejected file and changes nothing', async () => {
    const user = userEvent.setup();
    render(<ExchangeScreen />);
    const text = exportLogJson(sampleBundle()).join('').replace('"totalConcentration":9', '"totalConcentration":"nine"');
    await user.upload(screen.getByTestId('import-input'), logFile(text, 'broken.json'));
    const alert = await screen.findByTestId('import-rejected', {}, { timeout: 10_000 });
    expect(alert).toHaveTextContent('broken.json was not imported');
    expect(alert).toHaveTextContent(/line \d+, column \d+: \$\.observations\[0\]\.totalConcentration: must be a whole number or null, not "nine"/);
    expect(await getDb().observations.count()).toBe(0);
  });

  it('reminds to export where the browser cannot write to a folder', async () => {
    render(<ExchangeScreen />);
    expect(await screen.findByTestId('backup-reminder')).toHaveTextContent('Export the full log regularly');
  });
});
