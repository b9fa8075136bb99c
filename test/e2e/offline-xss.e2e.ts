// Reliability 6, XSS: script payloads typed into every free-text field of the real screens, and
// carried in an imported log file, are shown as text on every screen and display; no payload
// runs, no markup appears, and the CSP reports nothing (so nothing even tried to run).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { demoBundle } from '../../src/cli/commands/demo';
import { encodeLog, writeLogJson } from '../../src/format/encode';
import { DIST_DIR, collectConsoleErrors, launchChromium, type Browser } from './harness/browser';
import { serveDirectory, type StaticServer } from './harness/server';
import { collectCspViolations, cspConsoleLines, type CspViolation } from './harness/pwa';
import { SCREEN_BUTTONS, THEMES, setTheme, showScreen } from './harness/screens';
import { XSS_PAYLOADS, injectedMarkup, installXssTrap, payloadsShownAsText, type XssTrap } from './harness/xss';
import { createCruise, detailsOnMap, logObservation } from './harness/logFlow';

interface Session {
  server: StaticServer;
  browser: Browser;
  page: Page;
  trap: XssTrap;
  violations: CspViolation[];
  consoleErrors: string[];
}

async function start(): Promise<Session> {
  const server = await serveDirectory(DIST_DIR);
  const browser = await launchChromium();
  const trap = await installXssTrap(browser.context);
  const violations = await collectCspViolations(browser.context);
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  const consoleErrors = collectConsoleErrors(page);
  // map-debug lets the test find where an observation is drawn, to click it.
  await page.goto(`${server.url}?map-debug`);
  await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
  return { server, browser, page, trap, violations, consoleErrors };
}

async function stop(s: Session | undefined): Promise<void> {
  await s?.browser.close();
  await s?.server.close();
}

/** Visits every screen in every display; returns how many payloads each screen shows as text. */
async function sweep(s: Session, label: string): Promise<Record<string, number>> {
  const shown: Record<string, number> = {};
  const markup: string[] = [];
  for (const theme of THEMES) {
    await setTheme(s.page, theme);
    for (const screen of SCREEN_BUTTONS) {
      await showScreen(s.page, screen);
      await s.page.waitForTimeout(150);
      shown[screen] = Math.max(shown[screen] ?? 0, await payloadsShownAsText(s.page, XSS_PAYLOADS));
      markup.push(...(await injectedMarkup(s.page)).map((m) => `${theme}/${screen}: ${m}`));
    }
  }
  await setTheme(s.page, 'day');
  await s.page.waitForTimeout(500);
  console.log(`xss ${label}: ${XSS_PAYLOADS.length} payloads; shown as text per screen ${JSON.stringify(shown)}; ran ${s.trap.fired.length}; injected markup ${markup.length}; CSP violations ${s.violations.length}`);
  expect(s.trap.fired).toEqual([]);
  expect(markup).toEqual([]);
  expect(s.violations).toEqual([]);
  return shown;
}

/** No payload ran, none became markup, the CSP reported nothing; other console errors are printed. */
async function expectNothingRan(s: Session, label: string): Promise<void> {
  expect(await injectedMarkup(s.page)).toEqual([]);
  expect(s.trap.fired).toEqual([]);
  expect(s.violations).toEqual([]);
  expect(cspConsoleLines(s.consoleErrors)).toEqual([]);
  if (s.consoleErrors.length) console.log(`xss ${label}: other console errors`, s.consoleErrors);
}

function minutesAgo(m: number): string {
  const d = new Date(Date.now() - m * 60_000);
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)}`;
}

describe('XSS: payloads typed into the forms', () => {
  let s: Session;
  beforeAll(async () => {
    s = await start();
  });
  afterAll(() => stop(s));

  it('cruise, vessel and observer names, and notes, are stored and shown as text', async () => {
    const P = XSS_PAYLOADS;
    await createCruise(s.page, {
      name: P[0] as string,
      vessel: P[1] as string,
      observers: [
        { name: P[2] as string, initials: 'AB' },
        { name: P[3] as string, initials: 'CD' },
      ],
    });
    // A payload typed where a position is expected: refused with a message, shown as text.
    const form = s.page.locator('form.observation-form');
    await form.locator('#f-position-source').selectOption('manual');
    await form.locator('#f-position').fill(P[1] as string);
    await s.page.waitForTimeout(300);
    expect(await injectedMarkup(s.page)).toEqual([]);
    // Every payload goes into the notes of its own observation, an hour apart.
    for (let i = 0; i < P.length; i++) {
      const status = await logObservation(s.page, { time: minutesAgo(60 * (P.length - i)), position: `75 ${10 + i}.0 N 010 00.0 E`, total: '8', notes: P[i] as string });
      expect(status, `observation ${i}`).toMatch(/^Saved/);
    }
    const shown = await sweep(s, 'typed');
    // The names are on the screens themselves.
    expect(Math.max(...Object.values(shown))).toBeGreaterThanOrEqual(4);
    // The notes are shown in the map's details of each observation: literally what was typed.
    let literal = 0;
    for (let i = 0; i < P.length; i++) {
      const d = await detailsOnMap(s.page, 10, 75 + (10 + i) / 60);
      if (d?.notes === P[i]) literal++;
      else console.log(`xss: observation ${i} details`, d);
    }
    console.log(`xss typed: ${literal} of ${P.length} notes shown literally in the map details`);
    expect(literal).toBe(P.length);
    await expectNothingRan(s, 'typed');
  });

  it('the trap itself works: a payload turned into markup would be caught', async () => {
    const caught = await s.page.evaluate(async () => {
      const div = document.createElement('div');
      // innerHTML on purpose, to prove the detectors see what an unsafe render would produce.
      div.innerHTML = `<img src="data:," onerror="__floeXss('probe')">`;
      document.body.append(div);
      await new Promise((r) => setTimeout(r, 300));
      const found = document.querySelectorAll('[onerror]').length;
      div.remove();
      return found;
    });
    await s.page.waitForTimeout(200);
    expect(caught).toBe(1);
    // CSP blocks the inline handler (so it never ran) and reports it.
    expect(s.trap.fired).toEqual([]);
    expect(s.violations.map((v) => v.directive)).toContain('script-src-attr');
  });
});

describe('XSS: payloads in an imported log file', () => {
  let s: Session;
  beforeAll(async () => {
    s = await start();
  });
  afterAll(() => stop(s));

  it('every text of the file is shown as text after import', async () => {
    const bundle = demoBundle(3);
    const P = XSS_PAYLOADS;
    const pick = (i: number) => P[i % P.length] as string;
    bundle.cruise.name = pick(0);
    bundle.cruise.vesselName = pick(1);
    bundle.cruise.observers = bundle.cruise.observers.map((o, i) => ({ ...o, name: pick(2 + i) }));
    bundle.observations = bundle.observations.map((o, i) => ({ ...o, notes: pick(i), reviews: o.reviews?.map((r, j) => ({ ...r, comment: pick(i + j + 5) })) }));
    const text = writeLogJson(encodeLog(bundle, { exportedAt: bundle.cruise.updatedAt })).join('');

    await showScreen(s.page, 'Exchange');
    await s.page.getByTestId('import-input').setInputFiles({ name: `${P[0]}.floe-log.json`, mimeType: 'application/json', buffer: Buffer.from(text) });
    await s.page.getByTestId('import-preview').waitFor({ timeout: 60_000 });
    expect(await injectedMarkup(s.page)).toEqual([]);
    await s.page.getByRole('button', { name: 'Apply import' }).click();
    expect(await s.page.getByTestId('import-done').innerText({ timeout: 60_000 })).toContain(`${bundle.observations.length} observations written`);

    const shown = await sweep(s, `imported (${bundle.observations.length} observations)`);
    expect(Math.max(...Object.values(shown))).toBeGreaterThan(0);
    // Imported notes in the map details: one of the payloads, character for character.
    const withPosition = bundle.observations.filter((o) => o.position && !o.deleted).slice(0, 3);
    let literal = 0;
    for (const o of withPosition) {
      const d = await detailsOnMap(s.page, o.position?.lon ?? 0, o.position?.lat ?? 0);
      if (d?.notes && P.includes(d.notes)) literal++;
      else console.log('xss imported: details', d);
    }
    console.log(`xss imported: ${literal} of ${withPosition.length} clicked observations show their notes literally`);
    expect(literal).toBe(withPosition.length);
    await expectNothingRan(s, 'imported');
  });
});
