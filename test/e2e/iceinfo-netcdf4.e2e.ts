// NetCDF-4 / HDF5 grids in Chromium: a file written with h5wasm (gridFiles.ts) imported through the
// Exchange screen, read in the import worker by h5wasm's browser build. Its chunk (WebAssembly
// inside the JavaScript) is fetched only when such a file comes, and the shipped security policy
// lets the page compile WebAssembly ('wasm-unsafe-eval') without a violation.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { cspConsoleLines } from './harness/pwa';
import { showScreen } from './harness/screens';
import { gridNc4, H, W } from '../iceinfo/gridFiles';

describe('NetCDF-4 grid import in Chromium', () => {
  let app: AppSession;
  const requested: string[] = [];
  beforeAll(async () => {
    app = await openApp();
    app.page.on('request', (r) => requested.push(r.url()));
  });
  afterAll(async () => {
    await app?.close();
  });

  it('reads the grid in the worker, stores it, and loads the reader only then', async () => {
    const { page } = app;
    await showScreen(page, 'Exchange');
    await page.getByLabel('Source of the chart or grid').fill('Frostwren test grid');
    const hdf5Chunk = () => requested.filter((u) => /\/assets\/hdf5_hl-[^/]*\.js$/.test(u));
    expect(hdf5Chunk()).toEqual([]);

    await page.getByLabel('Chart or grid file').setInputFiles({ name: 'grid.nc', mimeType: 'application/x-netcdf', buffer: Buffer.from(await gridNc4()) });
    await expect.poll(() => page.getByRole('status').textContent(), { timeout: 60_000 }).toMatch(/Imported grid\.nc/);
    // The file's own time variable: 20516.5 days after 1970-01-01 (worked in grids.test.ts).
    expect(await page.getByRole('status').textContent()).toContain(`Imported grid.nc: grid of ${W} x ${H} cells (EPSG:3413), valid 2026-03-04T12:00:00Z.`);
    expect(hdf5Chunk()).toHaveLength(1);
    const stored = page.getByRole('list', { name: 'Stored charts and grids' }).getByRole('listitem');
    expect(await stored.count()).toBe(1);
    expect((await stored.first().textContent()) ?? '').toContain('Frostwren test grid');

    // The smallest valid module (magic "\0asm", version 1; WebAssembly Core Specification 5.5.16)
    // compiles on the page under the shipped policy.
    const compiled = await page.evaluate(async () => {
      try {
        await WebAssembly.compile(new Uint8Array([0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00]));
        return 'ok';
      } catch (e) {
        return String(e);
      }
    });
    expect(compiled).toBe('ok');
    expect(cspConsoleLines(app.consoleErrors)).toEqual([]);
  });

  it('refuses a NetCDF-4 file without coordinates, naming it, and stores nothing more', async () => {
    const { page } = app;
    await page.getByLabel('Chart or grid file').setInputFiles({ name: 'nocoord.nc', mimeType: 'application/x-netcdf', buffer: Buffer.from(await gridNc4({ noCoordinates: true })) });
    await expect.poll(() => page.getByRole('alert').textContent(), { timeout: 60_000 }).toMatch(/Nothing was stored: nocoord\.nc has no x coordinate variable/);
    expect(await page.getByRole('list', { name: 'Stored charts and grids' }).getByRole('listitem').count()).toBe(1);
  });
});
