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
  }, 90_000);
});
