// The watch log in Chromium: a full observation entered by keyboard alone, the next one started
// from it with the keystrokes counted, a reload in the middle of an entry, and the ship GPS fed
// through a fake Web Serial port with invented NMEA sentences.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sentencesForFix } from '../../src/gps/nmeaWrite';
import { openApp, type AppSession } from './harness/browser';
import { installFakeSerial } from './harness/fakeSerial';
import { runAxe } from './harness/pwa';
import { THEMES, setTheme } from './harness/screens';

/** Invented fixes drifting north-east near 81.2 N 31 E, one a second from now, as NMEA lines. */
function inventedNmea(count: number): string[] {
  const start = Date.now();
  return Array.from({ length: count }, (_, i) =>
    sentencesForFix({ timeMs: start + i * 1000, lat: 81.2 + i * 1e-5, lon: 31.05 + i * 2e-5, sogKn: 4.2, cogDeg: 38, headingDeg: 40, satellites: 10, hdop: 0.9 }),
  ).flat();
}

/** Presses keys one by one and counts them (a chord such as Alt+P counts as one keystroke). */
class Keys {
  count = 0;
  constructor(private readonly page: Page) {}
  async press(...keys: string[]) {
    for (const k of keys) {
      await this.page.keyboard.press(k);
      this.count += 1;
    }
  }
  /** Types text, one keystroke per character. */
  async type(text: string) {
    for (const ch of text) {
      await this.page.keyboard.press(ch === ' ' ? 'Space' : ch);
      this.count += 1;
    }
  }
}

async function focusedLabel(page: Page): Promise<string> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el?.id) return '';
    return document.querySelector(`label[for="${el.id}"]`)?.textContent ?? el.getAttribute('aria-label') ?? '';
  });
}

/** Set-up, not part of the observation: an invented test cruise from the start screen. */
async function createTestCruise(page: Page) {
  await page.getByRole('button', { name: 'New cruise' }).click();
  await page.getByLabel('Cruise name').fill('TEST-E2E keyboard cruise');
  await page.getByLabel('Vessel', { exact: true }).fill('MV Testbed');
  await page.getByLabel('Vessel ice class (POLARIS)').selectOption('PC5');
  await page.getByLabel('Time zone shown beside UTC').fill('UTC');
  await page.getByLabel('Observer 1 name').fill('Aino Korpela');
  await page.getByLabel('Initials').first().fill('AK');
  await page.getByRole('button', { name: 'Create the cruise' }).click();
  await page.getByTestId('watch-panel').waitFor({ timeout: 20_000 });
}

describe('the watch log in Chromium', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
    await installFakeSerial(app.page, { lines: inventedNmea(600), intervalMs: 25, loop: true });
    // The fake port is injected before the app's scripts: reload so it is there.
    await app.page.reload();
    await app.page.getByRole('button', { name: 'New cruise' }).waitFor();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('enters a full three-category observation by keyboard alone', async () => {
    const { page } = app;
    await createTestCruise(page);
    const k = new Keys(page);
    await k.press('Alt+n');
    expect(await focusedLabel(page)).toBe('Time, UTC');
    // Time stays "now"; position typed in degrees and decimal minutes.
    await k.press('Tab');
    await k.type('m');
    await k.press('Tab');
    await k.type("81 12.345 N 031 05.500 E");
    await k.press('Tab', 'Tab'); // observer (the one on watch) kept
    expect(await focusedLabel(page)).toBe('Total concentration Ct, tenths');
    await k.type('9'); // Ct, moves on
    await k.type('5'); // Ca, moves on to Sa
    // Each ice type in the egg code's order (WMO-No. 259): concentration, stage, form, thickness.
    await k.type('thick');
    await k.press('Tab');
    await k.type('big');
    await k.press('Tab');
    await k.type('150');
    await k.press('Tab'); // on to the deformation rows, a group of their own
    expect(await focusedLabel(page)).toBe('Ridged (a), tenths');
    await k.type('3'); // ridged share, moves on to rafted
    await k.press('Alt+a');
    expect(await focusedLabel(page)).toBe('Concentration Cb, tenths');
    await k.type('3medium');
    await k.press('Tab');
    await k.type('medium f');
    await k.press('Tab');
    await k.type('90');
    await k.press('Alt+a');
    await k.type('1');
    await k.press('Tab'); // "1" waits for a "0" (10/10); Tab keeps 1/10
    await k.type('grey w');
    await k.press('Tab', 'Tab'); // form Fc left blank
    await k.type('20');
    await k.press('Enter');
    await page.getByText(/Saved: the .* UTC observation, revision 1\./).waitFor({ timeout: 15_000 });
    console.log(`keystrokes for a full three-category observation typed from scratch: ${k.count}`);
    const row = page.getByTestId('observation-row').first();
    await row.waitFor();
    const text = await row.innerText();
    expect(text).toContain("81°12.345'N");
    expect(text).toContain("031°05.500'E");
    // Egg code of 9/10: 5 thick FY big floes, 3 medium FY medium floes, 1 grey-white (WMO egg code symbols 4., 1., 5).
    expect(text).toMatch(/9\s*5\s*3\s*1/);
    expect(text).toContain('4.');
    expect(app.consoleErrors).toEqual([]);
  });

  it('connects the ship GPS through Web Serial, shows fix and counts, and writes the track', async () => {
    const { page } = app;
    await page.getByLabel('Track point every').selectOption('10');
    await page.getByRole('button', { name: 'Connect the GPS' }).click();
    await page.waitForFunction(() => document.querySelector('[data-testid="gps-status"]')?.getAttribute('data-status') === 'connected');
    expect(await page.evaluate(() => window.__fakeSerial.openedWith()?.baudRate)).toBe(4800);
    await page.waitForFunction(() => document.querySelector('[data-testid="gps-fix"]')?.textContent?.includes("81°12"));
    // A corrupted sentence (wrong checksum) is counted and skipped.
    await page.evaluate(() => window.__fakeSerial.push('$GPGGA,000000.00,8112.0000,N,03103.0000,E,1,10,0.9,5.0,M,,M,,*00\r\n'));
    await page.waitForFunction(() => /[1-9]\d* bad/.test(document.querySelector('[data-testid="gps-counts"]')?.textContent ?? ''));
    expect(await page.getByTestId('gps-last-bad').innerText()).toMatch(/checksum/i);
    // Good sentences keep arriving (four per invented fix).
    await page.waitForFunction(() => Number(/(\d+) good/.exec(document.querySelector('[data-testid="gps-counts"]')?.textContent ?? '')?.[1]) > 20);
    // The first fix goes into the track at once.
    await page.waitForFunction(() => !document.querySelector('.gps-panel')?.textContent?.includes('Last track point—'), undefined, { timeout: 20_000 });
  });

  it('starts the next observation from the previous one in at most 30 keystrokes', async () => {
    const { page } = app;
    const k = new Keys(page);
    await k.press('Alt+p'); // carries all three types over; position from the connected GPS
    await page.waitForFunction(() => (document.getElementById('f-total') as HTMLInputElement | null)?.value === '9');
    expect(await focusedLabel(page)).toBe('Total concentration Ct, tenths');
    await k.type('8'); // Ct 9 -> 8
    expect(await page.getByLabel('Ridged (a), tenths').inputValue()).toBe('3'); // deformation carried over
    await k.type('4'); // Ca 5 -> 4, now on Sa (unchanged)
    await k.press('Tab', 'Tab'); // past Sa and Fa (unchanged)
    await k.type('160'); // thickness a
    await k.press('PageDown'); // to ice type b
    await k.type('3'); // Cb unchanged value retyped, on to Sb
    await k.press('Tab', 'Tab');
    await k.type('100'); // thickness b
    await k.press('PageDown'); // to ice type c
    await k.type('1');
    await k.press('Tab');
    await k.type('grey'); // Sc grey-white -> grey
    await k.press('Tab', 'Tab');
    await k.type('12'); // thickness c
    await k.press('Enter');
    await page.getByText(/Saved: the .* UTC observation, revision 1\./).waitFor({ timeout: 15_000 });
    console.log(`keystrokes for a full three-category observation started from the previous one: ${k.count}`);
    expect(k.count).toBeLessThanOrEqual(30);
    const row = await page.getByTestId('observation-row').first().innerText();
    expect(row).toMatch(/8\s*4\s*3\s*1/);
    // Position from the ship GPS (invented fixes near 81°12'N 031°03'E).
    expect(row).toContain("81°12.");
    expect(await page.getByTestId('observation-row').count()).toBe(2);
  });

  it('brings back an entry in progress after a reload', async () => {
    const { page } = app;
    await page.keyboard.press('Alt+n');
    await page.getByLabel('Total concentration Ct, tenths').focus();
    await page.keyboard.press('6');
    await page.keyboard.press('6');
    await page.keyboard.type('grey');
    await page.keyboard.press('Tab');
    await page.getByLabel('Notes').fill('fog bank to the north');
    await page.getByText(/Draft kept/).waitFor();
    await page.reload();
    await page.getByTestId('draft-restored').waitFor({ timeout: 20_000 });
    expect(await page.getByLabel('Total concentration Ct, tenths').inputValue()).toBe('6');
    expect(await page.getByLabel('Stage Sa').inputValue()).toBe('Grey ice');
    expect(await page.getByLabel('Notes').inputValue()).toBe('fog bank to the north');
    expect(app.consoleErrors).toEqual([]);
  });

  it('has no serious or critical accessibility violation with a cruise, findings and the list shown, in every display', async () => {
    const { page } = app;
    const blocking: string[] = [];
    for (const theme of THEMES) {
      await setTheme(page, theme);
      for (const f of await runAxe(page)) {
        if (f.impact === 'serious' || f.impact === 'critical') blocking.push(`${theme}: ${f.id} (${f.help}) at ${f.nodes.slice(0, 3).join(', ')}`);
      }
    }
    await setTheme(page, 'day');
    expect(blocking).toEqual([]);
  });
});
