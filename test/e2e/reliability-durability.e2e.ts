// Guards issue 16 "the crash tests must be able to fail": the kill tests (reliability-save-crash,
// db-durability, reliability-import-crash) SIGKILL the browser, which leaves the operating
// system's page cache intact, so they pass even with relaxed durability and say nothing about a
// power cut. This test checks the cause instead: every read-write transaction the built app
// opens, for a save through the watch log and for an import through the Exchange screen, asks
// IndexedDB for "strict" durability (IDBTransaction.durability, Indexed Database API 3.0), which
// in Chromium means the commit is flushed to the disk before it is reported. Setting
// chromeTransactionDurability to "relaxed" in src/db/database.ts makes it fail (docs/dev/offline.md).
// What it cannot show: that the disk honours the flush; no fault at the file-system layer can be
// made here.
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoBundle } from '../../src/cli/commands/demo';
import { encodeLog, writeLogJson } from '../../src/format/encode';
import { openApp, type AppSession } from './harness/browser';
import { createCruise, logObservation } from './harness/logFlow';
import { showScreen } from './harness/screens';
import { TX_PROBE, type TxRecord } from './harness/txProbe';

let app: AppSession;
let dir: string;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'floe-rel-durability-'));
  app = await openApp({ initScript: TX_PROBE });
}, 60_000);
afterAll(async () => {
  await app?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

const transactions = () => app.page.evaluate(() => (window as unknown as { __floeTx: TxRecord[] }).__floeTx.slice());

describe('the durability the app asks for (issue 16)', () => {
  it('every read-write transaction of a save and of an import asks for strict durability', async () => {
    await createCruise(app.page, { name: 'Durability trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] });
    await logObservation(app.page, { position: '78 30.0 N 015 00.0 E', total: '7', notes: 'saved through the form' });
    const demo = demoBundle(1);
    const file = join(dir, 'demo.floe-log.json');
    await writeFile(file, writeLogJson(encodeLog(demo, { exportedAt: demo.cruise.updatedAt })).join(''));
    await showScreen(app.page, 'Exchange');
    await app.page.getByTestId('import-input').setInputFiles(file);
    await app.page.getByTestId('import-preview').waitFor({ timeout: 60_000 });
    await app.page.getByRole('button', { name: 'Apply import' }).click();
    await app.page.getByTestId('import-done').waitFor({ timeout: 60_000 });

    const all = await transactions();
    const writes = all.filter((t) => t.mode === 'readwrite');
    const summary = [...new Set(writes.map((t) => `${t.durability}: ${t.stores.join('+')}`))];
    console.log(`durability: ${all.length} transactions, ${writes.length} read-write; kinds:\n  ${summary.join('\n  ')}`);
    // The probe saw the writes that matter: the observation with its revision, and the import.
    expect(writes.some((t) => t.stores.includes('observations') && t.stores.includes('revisions'))).toBe(true);
    expect(writes.some((t) => t.stores.includes('observations') && t.stores.includes('trackChunks'))).toBe(true);
    expect(writes.filter((t) => t.durability !== 'strict')).toEqual([]);
  }, 180_000);
});
