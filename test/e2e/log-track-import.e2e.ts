// Track file import in Chromium: an invented CSV track (our own positions north of Svalbard)
// picked through the real file input of the watch log, parsed and stored, the count shown.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { createCruise } from './harness/logFlow';

function inventedCsv(): string {
  const rows = ['Timestamp (UTC);Latitude;Longitude;SOG [kn]'];
  for (let i = 0; i < 120; i++) {
    const t = new Date(Date.parse('2026-03-09T00:00:00Z') + i * 60_000).toISOString().replace('.000Z', 'Z');
    rows.push(`${t};${(81.2 + i * 0.001).toFixed(4)};${(14.5 + i * 0.002).toFixed(4)};7.5`);
  }
  rows.push('2026-03-09T02:00:00Z;81,32;14,74;7,5');
  return rows.join('\n') + '\n';
}

describe('track file import in Chromium', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('imports a CSV track through the file input and shows the count and the bad line', async () => {
    const { page } = app;
    await createCruise(page, { name: 'TEST-E2E track import', vessel: 'MV Testbed', observers: [{ name: 'Aino Korpela', initials: 'AK' }] });
    await page.getByLabel('Track file', { exact: true }).setInputFiles({ name: 'leg2.csv', mimeType: 'text/csv', buffer: Buffer.from(inventedCsv()) });
    await expect.poll(() => page.getByLabel('Format', { exact: true }).locator('option').first().textContent()).toContain('CSV');
    await page.getByRole('button', { name: 'Import the track' }).click();
    const result = page.getByTestId('track-import-result');
    await result.waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('track-imported').textContent()).toBe('120');
    expect(await result.textContent()).toContain('1 bad line');
    // Line 122 writes decimal commas (81,32), which are not decimal degrees: listed, not imported.
    expect(await result.getByRole('listitem').first().textContent()).toMatch(/^line 122: /);

    // The imported track now gives the form its position at an observation time inside it.
    await page.getByLabel('Position from').selectOption('track-interpolated');
    await page.getByLabel('Time, UTC').fill('2026-03-09 01:00');
    await expect.poll(() => page.getByText('Along the track at the observation time.').count(), { timeout: 15_000 }).toBe(1);
    // At 01:00 the track has the fix of row 61: 81.26 N 14.62 E, that is 81 deg 15.6' N 014 deg 37.2' E.
    const shown = (await page.locator('output#f-position').textContent()) ?? '';
    expect(shown).toMatch(/81\D+15\.60*\D/);
    expect(shown).toMatch(/14\D+37\.20*\D/);
  }, 90_000);
});
