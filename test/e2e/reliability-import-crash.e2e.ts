// Reliability suite, item 2 (issue 8): crash during a large import. The demo cruise, made about
// twenty times bigger, is imported through the Exchange screen's real file input; the browser is
// SIGKILLed at several moments of the apply and relaunched on the same profile. The apply is one
// IndexedDB transaction (docs/dev/exchange.md), so the relaunch must find all of the batch or
// none of it: never a part.
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoBundle } from '../../src/cli/commands/demo';
import type { LogBundle } from '../../src/format/types';
import { encodeLog, writeLogJson } from '../../src/format/encode';
import { DIST_DIR } from './harness/browser';
import { killBrowser, launchKillable } from './harness/crash';
import { storeCounts } from './harness/idbCounts';
import { showScreen } from './harness/screens';
import { serveDirectory, type StaticServer } from './harness/server';

const OBS_COPIES = 20; // the demo's observations, each again at 1..19 minutes later
const TRACK_COPIES = 4; // the demo's one-a-minute track, again at +15, +30 and +45 s

function shift(iso: string, ms: number): string {
  return new Date(Date.parse(iso) + ms).toISOString().replace('.000Z', 'Z');
}

/** The invented demo cruise with generated extra observations and track points. */
function bigBundle(): LogBundle {
  const demo = demoBundle(1);
  const observations = demo.observations.flatMap((o) =>
    Array.from({ length: OBS_COPIES }, (_, k) => (k === 0 ? o : { ...o, id: crypto.randomUUID(), time: shift(o.time, k * 60_000), notes: `${o.notes} (copy ${k})` })),
  );
  const track = demo.track.flatMap((p) => Array.from({ length: TRACK_COPIES }, (_, k) => ({ ...p, time: shift(p.time, k * 15_000) })));
  return { ...demo, observations, track };
}

let server: StaticServer;
let dir: string;
let file: string;
let bundle: LogBundle;

beforeAll(async () => {
  server = await serveDirectory(DIST_DIR);
  dir = await mkdtemp(join(tmpdir(), 'floe-rel-import-'));
  bundle = bigBundle();
  file = join(dir, 'big-demo.floe-log.json');
  await writeFile(file, writeLogJson(encodeLog(bundle, { exportedAt: bundle.cruise.updatedAt })).join(''));
});
afterAll(async () => {
  await server?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

const launch = (profile: string) => launchKillable(profile, server.url);

/** Picks the file and waits for the preview; returns the Apply button. */
async function preview(page: Page) {
  await showScreen(page, 'Exchange');
  await page.getByTestId('import-input').setInputFiles(file);
  await page.getByTestId('import-preview').waitFor({ timeout: 60_000 });
  return page.getByRole('button', { name: 'Apply import' });
}

describe('a crash during a large import leaves all of it or none of it', () => {
  let applyMs = 0;

  it('imports the big file whole when nothing goes wrong (the baseline)', async () => {
    const profile = join(dir, 'baseline');
    const s = await launch(profile);
    const apply = await preview(s.page);
    const t0 = Date.now();
    await apply.click();
    const done = await s.page.getByTestId('import-done').innerText({ timeout: 60_000 });
    applyMs = Date.now() - t0;
    expect(done).toContain(`${bundle.observations.length} observations written`);
    const counts = await storeCounts(s.page);
    expect(counts.observations).toBe(bundle.observations.length);
    expect(counts.trackPoints).toBe(bundle.track.length);
    await s.browser.close();
    console.log(`import-crash: ${bundle.observations.length} observations and ${bundle.track.length} track points; apply to "done" on screen ${applyMs} ms`);
  }, 120_000);

  // Kill at the click, and at a quarter, half and nine tenths of the measured apply time.
  for (const frac of [0, 0.25, 0.5, 0.9]) {
    it(`SIGKILL at ${Math.round(frac * 100)}% of the apply: all or none after relaunch`, async () => {
      const profile = join(dir, `kill-${frac}`);
      let s = await launch(profile);
      const before = await storeCounts(s.page);
      const apply = await preview(s.page);
      await apply.click();
      await new Promise((r) => setTimeout(r, Math.round(frac * applyMs)));
      await killBrowser(s);
      s = await launch(profile);
      await s.page.locator('main h2').first().waitFor();
      const after = await storeCounts(s.page);
      await s.browser.close();
      const obs = after.observations ?? 0;
      const track = after.trackPoints ?? 0;
      const outcome = obs === 0 && track === 0 ? 'none' : obs === bundle.observations.length && track === bundle.track.length ? 'all' : 'PART';
      console.log(`import-crash: killed ${Math.round(frac * applyMs)} ms after Apply: ${obs} observations, ${track} track points, ${after.cruises ?? 0} cruises after relaunch (${outcome})`);
      expect(outcome).not.toBe('PART');
      if (outcome === 'none') expect(after.observations).toBe(before.observations ?? 0);
      else expect(after.cruises).toBe(1);
    }, 120_000);
  }

  it('SIGKILL right after the screen says the import is done: all of it after relaunch', async () => {
    const profile = join(dir, 'kill-after-done');
    let s = await launch(profile);
    await (await preview(s.page)).click();
    await s.page.getByTestId('import-done').waitFor({ timeout: 60_000 });
    await killBrowser(s);
    s = await launch(profile);
    await s.page.locator('main h2').first().waitFor();
    const after = await storeCounts(s.page);
    await s.browser.close();
    console.log(`import-crash: killed right after "done": ${after.observations ?? 0} observations, ${after.trackPoints ?? 0} track points after relaunch`);
    expect(after.observations).toBe(bundle.observations.length);
    expect(after.trackPoints).toBe(bundle.track.length);
  }, 120_000);
});
