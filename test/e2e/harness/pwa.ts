// Helpers for the offline, update, CSP and accessibility browser tests.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, relative } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';

/** Resolves once a service worker controls the page (waits for install and clientsClaim). */
export async function waitForServiceWorkerControl(page: Page, timeoutMs = 60_000): Promise<void> {
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: timeoutMs, polling: 100 });
}

/** The state of the page's service worker registration, for assertions and printed figures. */
export async function serviceWorkerState(page: Page): Promise<{ controlled: boolean; active: string | null; waiting: string | null; installing: string | null }> {
  return page.evaluate(async () => {
    const reg = await navigator.serviceWorker.getRegistration();
    return {
      controlled: navigator.serviceWorker.controller !== null,
      active: reg?.active?.state ?? null,
      waiting: reg?.waiting?.state ?? null,
      installing: reg?.installing?.state ?? null,
    };
  });
}

/** URLs (relative to the app root) held in the service worker's precache, revision marks removed. */
export async function precachedPaths(page: Page): Promise<string[]> {
  return page.evaluate(async () => {
    const out: string[] = [];
    for (const name of await caches.keys()) {
      if (!name.includes('precache')) continue;
      const cache = await caches.open(name);
      for (const req of await cache.keys()) {
        const url = new URL(req.url);
        url.searchParams.delete('__WB_REVISION__');
        out.push(url.pathname.replace(/^\//, '') + url.search);
      }
    }
    return out.sort();
  });
}

/** Every file of a build that the app may load (what the precache must hold). */
export function builtAppFiles(distDir: string): string[] {
  const walk = (dir: string): string[] =>
    readdirSync(dir).flatMap((name) => {
      const p = join(dir, name);
      return statSync(p).isDirectory() ? walk(p) : [relative(distDir, p).split('\\').join('/')];
    });
  return walk(distDir)
    .filter((f) => !f.endsWith('.map'))
    // The worker script and its runtime are kept by the browser's service worker machinery.
    .filter((f) => f !== 'sw.js' && !/^workbox-[\w-]+\.js$/.test(f))
    .sort();
}

export interface CspViolation {
  directive: string;
  blockedURI: string;
  sourceFile: string;
  line: number;
  sample: string;
}

/**
 * Collects every `securitypolicyviolation` event of every page and frame of the context, across
 * reloads. Install before the first navigation.
 */
export async function collectCspViolations(context: BrowserContext): Promise<CspViolation[]> {
  const violations: CspViolation[] = [];
  await context.exposeBinding('__floeReportCspViolation', (_source, v: CspViolation) => {
    violations.push(v);
  });
  await context.addInitScript(() => {
    const report = (window as unknown as { __floeReportCspViolation: (v: unknown) => void }).__floeReportCspViolation;
    document.addEventListener('securitypolicyviolation', (e) => {
      report({ directive: e.violatedDirective, blockedURI: e.blockedURI, sourceFile: e.sourceFile, line: e.lineNumber, sample: e.sample });
    });
  });
  return violations;
}

/** Console lines in which Chromium reports a blocked resource or script (also from workers). */
export function cspConsoleLines(consoleErrors: string[]): string[] {
  return consoleErrors.filter((l) => /Content Security Policy|Refused to/i.test(l));
}

const require = createRequire(import.meta.url);
let axeSource: string | null = null;

export interface AxeFinding {
  id: string;
  impact: string | null;
  help: string;
  nodes: string[];
}

/**
 * Runs axe-core in the page. It is evaluated through the DevTools protocol rather than added as a
 * <script>, so the app's CSP (no inline script) stays exactly as shipped.
 */
export async function runAxe(page: Page): Promise<AxeFinding[]> {
  axeSource ??= readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');
  const hasAxe = await page.evaluate(() => 'axe' in window);
  if (!hasAxe) await page.evaluate(axeSource);
  return page.evaluate(async () => {
    interface AxeCheck { data?: { fgColor?: string; bgColor?: string; contrastRatio?: number } | null }
    interface AxeResult { violations: Array<{ id: string; impact: string | null; help: string; nodes: Array<{ target: string[]; any: AxeCheck[] }> }> }
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<AxeResult> } }).axe;
    const result = await axe.run(document, { resultTypes: ['violations'] });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      // For contrast findings, the colours and ratio axe measured, so the fix is obvious.
      nodes: v.nodes.map((n) => {
        const d = n.any.find((c) => c.data?.contrastRatio !== undefined)?.data;
        return n.target.join(' ') + (d ? ` [${d.fgColor} on ${d.bgColor}: ${d.contrastRatio}]` : '');
      }),
    }));
  });
}
