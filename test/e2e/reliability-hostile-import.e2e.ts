// Reliability suite, item 5 (issue 8): hostile import files against the built app in Chromium.
// The whole generated set (test/format/hostile.ts, over 1,000 files) goes through the app's own
// import worker, the built asset the Exchange screen starts (no test handle in production code:
// the page starts the same file and sends it the same message); a spread sample of 20 goes through the
// Exchange screen's real file input. Every one must be rejected with a message, the database must
// hold the same rows afterwards, and Object.prototype must be untouched in the page.
import { mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DIST_DIR, openApp, type AppSession } from './harness/browser';
import { storeCounts, type StoreCounts } from './harness/idbCounts';
import { createCruise, logObservation } from './harness/logFlow';
import { showScreen } from './harness/screens';
import { hostileCases, type HostileCase } from '../format/hostile';

const cases: HostileCase[] = hostileCases();
let app: AppSession;
let dir: string;
let before: StoreCounts;

/** Properties on Object.prototype the page can see (none, in a clean page). */
const prototypeKeys = () => app.page.evaluate(() => Object.getOwnPropertyNames(Object.prototype).filter((k) => !['constructor', '__proto__', 'hasOwnProperty', 'isPrototypeOf', 'propertyIsEnumerable', 'toLocaleString', 'toString', 'valueOf', '__defineGetter__', '__defineSetter__', '__lookupGetter__', '__lookupSetter__'].includes(k)));

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'floe-rel-hostile-'));
  app = await openApp();
  await createCruise(app.page, { name: 'Hostile files trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] });
  await logObservation(app.page, { position: '78 30.0 N 015 00.0 E', total: '7', notes: 'kept through the hostile imports' });
  before = await storeCounts(app.page);
}, 60_000);
afterAll(async () => {
  await app?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('hostile import files in the built app', () => {
  it(`the app's import worker rejects all ${cases.length} generated files with a message`, async () => {
    expect(cases.length).toBeGreaterThanOrEqual(1000);
    const worker = (await readdir(join(DIST_DIR, 'assets'))).find((f) => /^importWorker-[\w-]+\.js$/.test(f));
    expect(worker, 'the built import worker asset').toBeDefined();
    const t0 = Date.now();
    const accepted: string[] = [];
    const silent: string[] = [];
    const BATCH = 100;
    for (let i = 0; i < cases.length; i += BATCH) {
      const batch = cases.slice(i, i + BATCH).map((c, k) => ({ name: `hostile-${i + k}.json`, text: c.text }));
      const results = await app.page.evaluate(
        async ({ url, batch }) => {
          const out: Array<{ name: string; ok: boolean; message: string }> = [];
          // One worker for the batch (it answers each request in turn); the screen starts one a file.
          const w = new Worker(url, { type: 'module', name: 'floe-import' });
          for (const c of batch) {
            const r = await new Promise<{ ok: boolean; message: string }>((ok) => {
              w.onmessage = (ev: MessageEvent<{ type: string; result?: { ok: boolean; problems?: { listed: Array<{ message?: string }> } }; message?: string }>) => {
                const m = ev.data;
                if (m.type === 'progress') return;
                if (m.type === 'error') ok({ ok: false, message: m.message ?? '' });
                else ok({ ok: m.result?.ok ?? false, message: m.result?.problems?.listed.map((p) => p.message ?? '').join('; ') ?? '' });
              };
              w.onerror = (ev) => ok({ ok: false, message: `worker failed: ${ev.message}` });
              w.postMessage({ file: new Blob([c.text], { type: 'application/json' }), fileName: c.name });
            });
            out.push({ name: c.name, ...r });
          }
          w.terminate();
          return out;
        },
        { url: `/assets/${worker ?? ''}`, batch },
      );
      results.forEach((r, k) => {
        const name = cases[i + k]?.name ?? r.name;
        if (r.ok) accepted.push(name);
        else if (r.message.trim() === '' || r.message.startsWith('worker failed')) silent.push(`${name}: ${r.message}`);
      });
    }
    const ms = Date.now() - t0;
    console.log(`hostile-import: ${cases.length} generated files through the built import worker in ${ms} ms: ${accepted.length} accepted, ${silent.length} rejected without a message`);
    expect(accepted).toEqual([]);
    expect(silent).toEqual([]);
    expect(await prototypeKeys()).toEqual([]);
    expect(await storeCounts(app.page)).toEqual(before);
  }, 300_000);

  it('a spread sample of 20 through the Exchange screen’s file input: each refused by name, nothing stored', async () => {
    await showScreen(app.page, 'Exchange');
    const step = Math.floor(cases.length / 20);
    const shown: string[] = [];
    for (let k = 0; k < 20; k++) {
      const c = cases[k * step] as HostileCase;
      const file = join(dir, `sample-${k}.json`);
      await writeFile(file, c.text);
      await app.page.getByTestId('import-input').setInputFiles(file);
      const rejected = app.page.getByTestId('import-rejected').filter({ hasText: `sample-${k}.json` });
      await rejected.waitFor({ timeout: 30_000 });
      const text = await rejected.innerText();
      expect(text, c.name).toContain('was not imported');
      shown.push(`${c.name} -> ${text.split('\n').slice(0, 2).join(' ').slice(0, 120)}`);
      expect(await app.page.getByRole('button', { name: 'Apply import' }).count(), c.name).toBe(0);
    }
    console.log(`hostile-import: 20 of them through the file input, all refused; first lines:\n  ${shown.join('\n  ')}`);
    expect(await prototypeKeys()).toEqual([]);
    expect(await storeCounts(app.page)).toEqual(before);
  }, 120_000);
});
