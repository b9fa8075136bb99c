// Accessibility: axe-core (WCAG 2 A/AA rules as axe-core ships them) on every screen in the day,
// night and red display. No serious or critical violation is allowed; the rest is printed.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApp, type AppSession } from './harness/browser';
import { runAxe, type AxeFinding } from './harness/pwa';
import { SCREEN_BUTTONS, THEMES, setTheme, showScreen } from './harness/screens';

const BLOCKING = new Set(['serious', 'critical']);

describe('accessibility (axe-core) on every screen and display', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('has no serious or critical violation', async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'Floe Ledger' }).waitFor();
    const blocking: string[] = [];
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
          if (BLOCKING.has(f.impact ?? '')) blocking.push(line);
          else minor++;
          console.log(`axe: ${line}`);
        }
      }
    }
    console.log(`axe: ${checks} screen/display checks, ${blocking.length} serious or critical, ${minor} minor or moderate`);
    expect(checks).toBe(SCREEN_BUTTONS.length * THEMES.length);
    expect(blocking).toEqual([]);
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
