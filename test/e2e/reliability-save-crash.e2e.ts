// Reliability suite, item 1 (issue 8): crash during saves through the real form. Each round types
// one observation into the built app's watch log, saves it with Enter, and SIGKILLs the browser
// the moment the form shows it as saved; the relaunch on the same profile must find every
// observation ever shown as saved, both in the list on screen and in the database.
// What it proves: a save shown as done was committed, and survives the browser process dying.
// What it does not: survival of a power cut. SIGKILL keeps the operating system's page cache, so
// this passes with relaxed durability too; reliability-durability.e2e.ts checks that the app asks
// for strict durability (docs/dev/offline.md, "What the crash tests prove").
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DIST_DIR } from './harness/browser';
import { killBrowser, launchKillable } from './harness/crash';
import { storedNotes } from './harness/idbCounts';
import { createCruise } from './harness/logFlow';
import { serveDirectory, type StaticServer } from './harness/server';

let server: StaticServer;
let profile: string;

beforeAll(async () => {
  server = await serveDirectory(DIST_DIR);
  profile = await mkdtemp(join(tmpdir(), 'floe-rel-save-'));
});
afterAll(async () => {
  await server?.close();
  if (profile) await rm(profile, { recursive: true, force: true });
});

const launch = () => launchKillable(profile, server.url);

/** Types one observation and saves it with Enter; resolves when the form says it is saved. */
async function saveWithEnter(page: Page, notes: string, total: string): Promise<string> {
  const form = page.locator('form.observation-form');
  await form.locator('#f-position-source').selectOption('manual');
  await form.locator('#f-position').fill('78 30.0 N 015 00.0 E');
  await form.locator('#f-notes').fill(notes);
  await form.locator('#f-total').fill(total);
  await form.locator('#f-total').press('Enter');
  const saved = page.getByText(/^Saved: the .* UTC observation, revision 1\./);
  await saved.waitFor({ timeout: 20_000 });
  return saved.innerText();
}

describe('saves shown as done survive a browser crash', () => {
  it('every observation shown as saved is there after each SIGKILL and relaunch', async () => {
    const ROUNDS = 4;
    const shown: string[] = [];
    const relaunchMs: number[] = [];
    let s = await launch();
    await createCruise(s.page, { name: 'Crash trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] });
    for (let i = 0; i < ROUNDS; i++) {
      const notes = `crash round ${i + 1}: pancake ice, light swell`;
      // Each save gets its own minute so it is a new observation, not an edit.
      await s.page.locator('form.observation-form #f-time').fill(`2026-02-10 0${i}:00`);
      await saveWithEnter(s.page, notes, String(5 + i));
      shown.push(notes);
      await killBrowser(s); // right after the screen said "Saved"
      const t0 = Date.now();
      s = await launch();
      await s.page.locator('form.observation-form').waitFor({ timeout: 30_000 });
      await s.page.getByTestId('observation-row').nth(shown.length - 1).waitFor({ timeout: 20_000 });
      relaunchMs.push(Date.now() - t0);
      const stored = await storedNotes(s.page);
      for (const n of shown) expect(stored, `after kill ${i + 1}`).toContain(n);
      expect(stored.length).toBe(shown.length);
      expect(await s.page.getByTestId('observation-row').count()).toBe(shown.length);
    }
    await s.browser.close({ keepProfile: true });
    console.log(`save-crash: ${ROUNDS} saves through the form, each followed by SIGKILL; ${shown.length}/${shown.length} found after relaunch; relaunch to list shown ${relaunchMs.map((m) => `${m} ms`).join(', ')}`);
  }, 120_000);
});
