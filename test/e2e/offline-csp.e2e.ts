// The Content-Security-Policy: strict (no unsafe-inline, no unsafe-eval) and the app runs under it
// on every screen and display without a single reported violation.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DIST_DIR, collectConsoleErrors, launchChromium, type Browser } from './harness/browser';
import { serveDirectory, type StaticServer } from './harness/server';
import { collectCspViolations, cspConsoleLines, waitForServiceWorkerControl, type CspViolation } from './harness/pwa';
import { SCREEN_BUTTONS, THEMES, setTheme, showScreen } from './harness/screens';

function shippedPolicy(): Map<string, string[]> {
  const html = readFileSync(join(DIST_DIR, 'index.html'), 'utf8');
  const m = /<meta http-equiv="Content-Security-Policy" content="([^"]+)"/.exec(html);
  if (!m?.[1]) throw new Error('dist/index.html has no Content-Security-Policy meta element');
  return new Map(
    m[1].split(';').map((d) => d.trim()).filter(Boolean).map((d) => {
      const [name, ...values] = d.split(/\s+/);
      return [name as string, values];
    }),
  );
}

describe('Content-Security-Policy', () => {
  let server: StaticServer;
  let browser: Browser;
  let violations: CspViolation[];

  beforeAll(async () => {
    server = await serveDirectory(DIST_DIR);
    browser = await launchChromium();
    violations = await collectCspViolations(browser.context);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('is strict: no unsafe-inline, no unsafe-eval, nothing from other origins', () => {
    const policy = shippedPolicy();
    const all = [...policy.values()].flat();
    // 'wasm-unsafe-eval' (CSP Level 3) allows compiling WebAssembly and nothing else: no eval,
    // no Function(); the NetCDF-4 reader (h5wasm) needs it.
    expect(all.filter((v) => /unsafe/i.test(v) && v !== "'wasm-unsafe-eval'")).toEqual([]);
    expect(all.filter((v) => /^(https?:|\*|data:)/.test(v) && v !== 'data:')).toEqual([]);
    expect(policy.get('default-src')).toEqual(["'self'"]);
    expect(policy.get('script-src')).toEqual(["'self'", "'wasm-unsafe-eval'"]);
    expect(policy.get('style-src')).toEqual(["'self'"]);
    expect(policy.get('object-src')).toEqual(["'none'"]);
    // MapLibre 5 starts its worker from a blob: URL.
    expect(policy.get('worker-src')).toEqual(["'self'", 'blob:']);
    // data: is allowed for images only (MapLibre's control icons are data: SVGs in its CSS).
    expect(policy.get('img-src')).toEqual(["'self'", 'blob:', 'data:']);
  });

  it('every screen in every display runs without a violation, online and from the service worker', async () => {
    const page = browser.context.pages()[0] ?? (await browser.context.newPage());
    const consoleErrors = collectConsoleErrors(page);
    const failed: string[] = [];
    page.on('requestfailed', (r) => failed.push(`${r.url().slice(0, 120)}: ${r.failure()?.errorText ?? '?'}`));
    page.on('console', (m) => {
      if (m.type() === 'error') failed.push(`console at ${JSON.stringify(m.location())}: ${m.text()}`);
    });
    await page.goto(server.url);
    await waitForServiceWorkerControl(page);
    let visits = 0;
    for (const offline of [false, true]) {
      await browser.context.setOffline(offline);
      await page.reload();
      for (const theme of THEMES) {
        await setTheme(page, theme);
        for (const screen of SCREEN_BUTTONS) {
          await showScreen(page, screen);
          visits++;
        }
      }
    }
    await browser.context.setOffline(false);
    // Let late work (map tiles, workers) report too.
    await page.waitForTimeout(1000);
    console.log(`csp: ${visits} screen visits, ${violations.length} violations, ${cspConsoleLines(consoleErrors).length} CSP console lines`);
    if (failed.length) console.log('csp: failed loads', failed);
    expect(violations).toEqual([]);
    expect(cspConsoleLines(consoleErrors)).toEqual([]);
    // Other console errors are not this test's subject; they are printed for whoever owns them.
    if (consoleErrors.length) console.log('csp: other console errors', consoleErrors);
  });

  it('the violation check itself works: an injected inline script is blocked and reported', async () => {
    const page = browser.context.pages()[0];
    if (!page) throw new Error('no page');
    const before = violations.length;
    const ran = await page.evaluate(async () => {
      const w = window as unknown as { __floeInlineRan?: boolean };
      const s = document.createElement('script');
      s.textContent = 'window.__floeInlineRan = true';
      document.body.append(s);
      await new Promise((r) => setTimeout(r, 200));
      s.remove();
      return w.__floeInlineRan === true;
    });
    await page.waitForTimeout(200);
    expect(ran).toBe(false);
    expect(violations.slice(before).map((v) => v.directive)).toContain('script-src-elem');
    violations.splice(before);
  });
});
