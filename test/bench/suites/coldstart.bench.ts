// Cold start at sea: a freshly started Chromium opens the app with no network, everything served by
// the service worker, until the observer can type. Baseline, measured in the same run: the same
// build and profile with service workers blocked, loaded from a loopback server (the fastest a
// network can be).
import { rm } from 'node:fs/promises';
import { DIST_DIR, launchChromium } from '../../e2e/harness/browser';
import { serveDirectory } from '../../e2e/harness/server';
import { waitForServiceWorkerControl } from '../../e2e/harness/pwa';
import { createCruise } from '../../e2e/harness/logFlow';
import { median, ratioRow, type BenchSuite } from '../bench-kit';

/** The log form's first field when the watch log has one; the shell's navigation otherwise. */
const FORM_FIELD = 'main form :is(input, select, textarea):not([disabled])';
const SHELL = 'nav[aria-label="Screens"] button';
const RUNS = 7;

/**
 * Milliseconds from the navigation's start to the moment the selector matches, taken inside the
 * page by a MutationObserver so that no polling from outside adds to it.
 */
async function timeToInteractive(opts: { userDataDir: string; offline: boolean; blockServiceWorkers: boolean; url: string; selector: string }): Promise<{ ms: number }> {
  const browser = await launchChromium({ userDataDir: opts.userDataDir, offline: opts.offline, blockServiceWorkers: opts.blockServiceWorkers });
  try {
    // No named functions inside: tsx (keepNames) would wrap them in a helper the page lacks.
    await browser.context.addInitScript((selector: string) => {
      const w = window as unknown as { __floeInteractiveAt?: number };
      // Attach once the parser is done (readyState "interactive" comes before module scripts
      // run), then note the first moment the selector matches.
      document.addEventListener(
        'readystatechange',
        () => {
          new MutationObserver((_records, observer) => {
            if (w.__floeInteractiveAt === undefined && document.querySelector(selector)) {
              w.__floeInteractiveAt = performance.now();
              observer.disconnect();
            }
          }).observe(document, { childList: true, subtree: true, attributes: true });
        },
        { once: true },
      );
    }, opts.selector);
    const page = browser.context.pages()[0] ?? (await browser.context.newPage());
    await page.goto(opts.url);
    const handle = await page.waitForFunction(() => (window as unknown as { __floeInteractiveAt?: number }).__floeInteractiveAt, null, { timeout: 60_000, polling: 50 });
    const ms = (await handle.jsonValue()) as number;
    return { ms };
  } finally {
    await browser.close({ keepProfile: true });
  }
}

export const suite: BenchSuite = {
  name: 'cold start from the service worker',
  async run() {
    const server = await serveDirectory(DIST_DIR);
    const profiles: string[] = [];
    try {
      // Install the app once (first visit online), then pick what "interactive" means for this build.
      const install = await launchChromium();
      profiles.push(install.userDataDir);
      const page = install.context.pages()[0] ?? (await install.context.newPage());
      await page.goto(server.url);
      await waitForServiceWorkerControl(page);
      await page.locator(SHELL).first().waitFor();
      // With a cruise set up, the watch log opens on the observation form: the start that matters.
      await createCruise(page, { name: 'Cold start trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] }).catch((err: unknown) => {
        console.log(`coldstart: no cruise could be set up (${String(err)}); measuring the shell`);
      });
      const selector = (await page.locator(FORM_FIELD).count()) > 0 ? FORM_FIELD : SHELL;
      const what = selector === FORM_FIELD ? 'interactive form' : 'interactive shell';
      await install.close({ keepProfile: true });

      const fromWorker: number[] = [];
      const fromNetwork: number[] = [];
      for (let i = 0; i < RUNS; i++) {
        // A new process each time. Subject: no network at all, only the service worker answers.
        // Baseline: the same profile (same database, so the same screen) with service workers
        // blocked, everything fetched from the loopback server.
        fromWorker.push((await timeToInteractive({ userDataDir: install.userDataDir, offline: true, blockServiceWorkers: false, url: server.url, selector })).ms);
        fromNetwork.push((await timeToInteractive({ userDataDir: install.userDataDir, offline: false, blockServiceWorkers: true, url: server.url, selector })).ms);
      }
      console.log(`coldstart: ${what}; service worker ms ${fromWorker.map((x) => x.toFixed(0)).join(' ')}; network ms ${fromNetwork.map((x) => x.toFixed(0)).join(' ')}`);
      return [ratioRow(`cold start to ${what}: service worker offline vs loopback network, worker blocked (median of ${RUNS})`, median(fromWorker), median(fromNetwork), 'ms', 1.5)];
    } finally {
      await server.close();
      await Promise.all(profiles.map((p) => rm(p, { recursive: true, force: true })));
    }
  },
};
