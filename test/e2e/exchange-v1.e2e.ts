// A log of format version 1 (as another laptop with the older app wrote it) imported through the
// Exchange screen in Chromium: the worker validates it against schema 1, lifts it to format 2
// (deformation and snow in groups of their own, old snow kinds mapped or kept in the notes) and
// the full-log export then writes version 2 with every value kept.
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Observation } from '../../src/domain/model';
import { readLogText } from '../../src/format/read';
import type { LogFileV1 } from '../../src/format/types';
import { expectLiftedWithoutLoss } from '../format/liftCheck';
import { openApp, type AppSession } from './harness/browser';

const V1_FILE = resolve(import.meta.dirname, '../format/fixtures/log-v1.json');
const dir = mkdtempSync(join(tmpdir(), 'floe-e2e-exchange-v1-'));

describe('a version-1 log imported in Chromium', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
    await app.page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name: 'Exchange' }).click();
    await app.page.getByRole('heading', { name: 'Exchange', level: 2 }).waitFor();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('is lifted to format 2 on import and exported as version 2 with no value lost', async () => {
    const { page } = app;
    await page.getByTestId('import-input').setInputFiles(V1_FILE);
    await page.getByTestId('import-preview').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('count-new').locator('td.num').innerText()).toBe('4');
    await page.getByRole('button', { name: 'Apply import' }).click();
    expect(await page.getByTestId('import-done').innerText({ timeout: 30_000 })).toContain('4 observations written, 1 earlier revisions kept, 1 conflicting');

    const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Full log (JSON)' }).click()]);
    const path = join(dir, dl.suggestedFilename());
    await dl.saveAs(path);
    const text = readFileSync(path, 'utf8');
    expect(JSON.parse(text)).toMatchObject({ formatVersion: 2 });
    const r = readLogText(text);
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    const old = JSON.parse(readFileSync(V1_FILE, 'utf8')) as LogFileV1;
    for (const fo of old.observations) {
      const now = r.bundle.observations.find((o) => o.id === fo.id) as Observation;
      expectLiftedWithoutLoss(fo as unknown as Record<string, unknown>, now, fo.id);
    }
    expect(app.consoleErrors).toEqual([]);
  });
});
