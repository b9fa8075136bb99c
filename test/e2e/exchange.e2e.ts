// The Exchange screen in Chromium: import the demo log by the file picker (worker, preview,
// apply), export every format capturing the download, re-import (nothing new), a hostile file
// (rejected, nothing changed), drag and drop, and the automatic backup into a folder.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoBundle } from '../../src/cli/commands/demo';
import { readArchive } from '../../src/format/archiveRead';
import { encodeLog, writeLogJson } from '../../src/format/encode';
import { readLogText } from '../../src/format/read';
import { openApp, type AppSession } from './harness/browser';

const dir = mkdtempSync(join(tmpdir(), 'floe-e2e-exchange-'));
const demo = demoBundle(1);
const demoText = writeLogJson(encodeLog(demo, { exportedAt: demo.cruise.updatedAt })).join('');
const demoFile = join(dir, 'demo.floe-log.json');
writeFileSync(demoFile, demoText);
const n = demo.observations.length;

async function openExchange(page: Page) {
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name: 'Exchange' }).click();
  await page.getByRole('heading', { name: 'Exchange', level: 2 }).waitFor();
}

async function download(page: Page, label: string): Promise<{ name: string; path: string }> {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: label }).click()]);
  const path = join(dir, dl.suggestedFilename());
  await dl.saveAs(path);
  return { name: dl.suggestedFilename(), path };
}

describe('Exchange screen in Chromium', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
    // A folder picker that hands out the origin-private file system, so the backup can be
    // checked without a native dialog.
    await app.page.addInitScript(() => {
      (window as unknown as { showDirectoryPicker: () => Promise<FileSystemDirectoryHandle> }).showDirectoryPicker = () => navigator.storage.getDirectory();
    });
    await app.page.reload();
    await openExchange(app.page);
  });
  afterAll(async () => {
    await app?.close();
  });

  it('imports the demo log through the picker: preview first, then apply', async () => {
    const { page } = app;
    await page.getByTestId('import-input').setInputFiles(demoFile);
    await page.getByTestId('import-preview').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('count-new').locator('td.num').innerText()).toBe(String(n));
    expect(await page.getByTestId('count-trackNew').locator('td.num').innerText()).toBe(String(demo.track.length));
    await page.getByRole('button', { name: 'Apply import' }).click();
    const done = await page.getByTestId('import-done').innerText({ timeout: 30_000 });
    expect(done).toContain(`${n} observations written`);
    expect(done).toContain(`${demo.track.length} track points`);
  });

  it('exports the full log, GeoJSON, CSV, NDJSON and the zip, captured as downloads', async () => {
    const { page } = app;
    const log = await download(page, 'Full log (JSON)');
    expect(log.name).toMatch(/^fw26-03-nansen-basin-ice-edge-transect-\d{8}T\d{4}Z\.floe-log\.json$/);
    const read = readLogText(readFileSync(log.path, 'utf8'));
    expect(read.ok).toBe(true);
    if (read.ok) {
      expect(read.bundle.observations).toHaveLength(n);
      expect(read.bundle.track).toHaveLength(demo.track.length);
      expect(read.bundle.cruise.vesselName).toBe('RV Frostwren');
    }
    const csv = Papa.parse<Record<string, string>>(readFileSync((await download(page, 'CSV')).path, 'utf8'), { header: true, skipEmptyLines: true });
    expect(csv.errors).toEqual([]);
    expect(csv.data).toHaveLength(n);
    expect(csv.data[0]?.time_utc).toBe(demo.observations[0]?.time);
    const gj = JSON.parse(readFileSync((await download(page, 'GeoJSON')).path, 'utf8')) as { features: { geometry: { type: string } | null }[] };
    expect(gj.features.filter((f) => f.geometry?.type === 'Point')).toHaveLength(n);
    expect(readFileSync((await download(page, 'NDJSON')).path, 'utf8').trim().split('\n')).toHaveLength(n);
    const zip = readArchive(new Uint8Array(readFileSync((await download(page, 'Archive with photos (zip)')).path)));
    expect(zip.ok && zip.bundle.observations.length).toBe(n);
    expect(await page.getByTestId('export-message').innerText()).toContain('Exported');
  });

  it('importing the same file again adds nothing', async () => {
    const { page } = app;
    await page.getByTestId('import-input').setInputFiles(demoFile);
    await page.getByTestId('import-nothing').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('count-identical').locator('td.num').innerText()).toBe(String(n));
    expect(await page.getByRole('button', { name: 'Apply import' }).isDisabled()).toBe(true);
    await page.getByRole('button', { name: 'Cancel' }).click();
  });

  it('rejects a hostile file, naming the place, and shows its text as text', async () => {
    const { page } = app;
    const bad = demoText.replace('"notes":"', '"__proto__":{"polluted":1},"notes":"<img src=x onerror=window.pwned=1>');
    const file = join(dir, 'hostile.json');
    writeFileSync(file, bad);
    await page.getByTestId('import-input').setInputFiles(file);
    const msg = await page.getByTestId('import-rejected').innerText({ timeout: 30_000 });
    expect(msg).toContain('was not imported');
    expect(msg).toMatch(/line \d+, column \d+: \$: the key "__proto__" is not allowed/);
    expect(await page.evaluate(() => ({ polluted: ({} as Record<string, unknown>).polluted, pwned: (window as unknown as { pwned?: number }).pwned }))).toEqual({ polluted: undefined, pwned: undefined });
    const truncated = join(dir, 'truncated.json');
    writeFileSync(truncated, demoText.slice(0, 20_000));
    await page.getByTestId('import-input').setInputFiles(truncated);
    await page.getByTestId('import-rejected').getByText(/truncated\.json: .*|it is truncated/).first().waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('import-rejected').innerText()).toMatch(/line \d+, column \d+: \$: .*truncated/);
  });

  it('takes a file by drag and drop, and shows a newer revision in the preview', async () => {
    const { page } = app;
    const edited = JSON.parse(demoText) as { observations: Record<string, unknown>[] };
    const first = edited.observations[0] as Record<string, unknown>;
    edited.observations[0] = { ...first, revision: 2, notes: 'edited on the other laptop', history: [first] };
    const text = JSON.stringify(edited);
    await page.evaluate(async (content) => {
      const dt = new DataTransfer();
      dt.items.add(new File([content], 'laptop-b.json', { type: 'application/json' }));
      const zone = document.querySelector('[data-testid="drop-zone"]') as HTMLElement;
      zone.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, bubbles: true, cancelable: true }));
      zone.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, text);
    await page.getByTestId('import-preview').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('count-newer').locator('td.num').innerText()).toBe('1');
    expect(await page.getByTestId('count-identical').locator('td.num').innerText()).toBe(String(n - 1));
    await page.getByRole('button', { name: 'Apply import' }).click();
    expect(await page.getByTestId('import-done').innerText({ timeout: 30_000 })).toContain('1 observations written, 1 earlier revisions kept');
  });

  it('writes an automatic backup into the chosen folder and shows the time', async () => {
    const { page } = app;
    expect(await page.getByTestId('last-backup').innerText()).toContain('never');
    await page.getByRole('button', { name: 'Choose backup folder' }).click();
    await page.getByTestId('last-backup').getByText(/UTC/).waitFor({ timeout: 30_000 });
    const backup = await page.evaluate(async () => {
      const root = await navigator.storage.getDirectory();
      const file = await (await root.getFileHandle('fw26-03-nansen-basin-ice-edge-transect.floe-backup.json')).getFile();
      return file.text();
    });
    const r = readLogText(backup);
    expect(r.ok && r.bundle.observations.length).toBe(n);
    expect(r.ok && r.bundle.history.length).toBe(1);
    expect(app.consoleErrors).toEqual([]);
  });
});
