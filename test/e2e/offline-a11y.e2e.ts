// Accessibility: axe-core (WCAG 2 A/AA rules as axe-core ships them) on every screen in the day,
// night and red display. No serious or critical violation is allowed; the rest is printed.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { runAxe, type AxeFinding } from './harness/pwa';
import { SCREEN_BUTTONS, THEMES, setTheme, showScreen } from './harness/screens';

const BLOCKING = new Set(['serious', 'critical']);

/**
 * Serious findings in screens this suite does not own, reported to their owners and printed on
 * every run as KNOWN until fixed. A finding is excused only if every node it names matches.
 * Remove an entry as soon as its fix lands (the run prints "no longer seen" then).
 */
const KNOWN_ELSEWHERE: Array<{ rule: string; nodes: RegExp; owner: string; why: string }> = [];

describe('accessibility (axe-core) on every screen and display', () => {
  let app: AppSession;
  const everSeen = new Set<string>();
  beforeAll(async () => {
    app = await openApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  async function sweep(label: string): Promise<void> {
    const { page } = app;
    const blocking: string[] = [];
    const seenKnown = new Set<string>();
    let checks = 0;
    let minor = 0;
    for (const theme of THEMES) {
      await setTheme(page, theme);
      for (const screen of SCREEN_BUTTONS) {
        await showScreen(page, screen);
        const findings: AxeFinding[] = await runAxe(page);
        checks++;
        for (const f of findings) {
          const line = `${theme} / ${screen}: ${f.impact ?? 'unknown'} ${f.id} (${f.help}) at ${f.nodes.slice(0, 3).join(', ')}${f.nodes.length > 3 ? ` and ${f.nodes.length - 3} more` : ''}`;
          const known = KNOWN_ELSEWHERE.find((k) => k.rule === f.id && f.nodes.every((n) => k.nodes.test(n)));
          if (known) {
            seenKnown.add(known.rule);
            everSeen.add(known.rule);
            console.log(`axe ${label}: KNOWN, owned by ${known.owner} (${known.why}): ${line}`);
            continue;
          }
          if (BLOCKING.has(f.impact ?? '')) blocking.push(line);
          else minor++;
          console.log(`axe ${label}: ${line}`);
        }
      }
    }
    console.log(`axe ${label}: ${checks} screen/display checks, ${blocking.length} serious or critical, ${minor} minor or moderate, known elsewhere: ${[...seenKnown].join(', ') || 'none'}`);
    expect(checks).toBe(SCREEN_BUTTONS.length * THEMES.length);
    expect(blocking).toEqual([]);
  }

  it('has no serious or critical violation before any cruise exists', async () => {
    await app.page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    await sweep('empty');
  });

  it('has no serious or critical violation with the demo cruise loaded (form, list, map, review)', async () => {
    const { page } = app;
    await setTheme(page, 'day');
    await showScreen(page, 'Watch log');
    await page.getByRole('button', { name: 'Load the demo cruise' }).click();
    await page.locator('form.observation-form').waitFor({ timeout: 120_000 });
    await sweep('demo cruise');
  });

  it('lists no excused finding that no longer occurs', () => {
    // Printed, not failed: the owner's fix must not break this suite; the entry should go.
    for (const k of KNOWN_ELSEWHERE) if (!everSeen.has(k.rule)) console.log(`axe: KNOWN_ELSEWHERE entry ${k.rule} (${k.owner}) no longer seen: remove it`);
  });

  it('the check itself works: a low-contrast, unlabelled control is reported', async () => {
    const { page } = app;
    await page.evaluate(() => {
      const probe = document.createElement('div');
      probe.id = 'axe-probe';
      const input = document.createElement('input');
      const text = document.createElement('p');
      text.textContent = 'faint text';
      text.style.color = '#777';
      text.style.background = '#7a7a7a';
      probe.append(input, text);
      document.querySelector('main')?.append(probe);
    });
    const ids = (await runAxe(page)).map((f) => f.id);
    await page.evaluate(() => document.getElementById('axe-probe')?.remove());
    expect(ids).toEqual(expect.arrayContaining(['label', 'color-contrast']));
  });
});
