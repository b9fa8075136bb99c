// Crashing the browser on purpose: SIGKILL of the browser process, as a power cut or an OS
// kill would leave it. Only the processes of the browser this test launched are touched.
import type { Page } from 'playwright-core';
import { launchChromium, type Browser } from './browser';

export interface Killable {
  browser: Browser;
  /** Process ids of that browser (browser process first), read at launch. */
  pids: number[];
}

export async function browserPids(b: Browser): Promise<number[]> {
  const br = b.context.browser();
  if (!br) throw new Error('the persistent context has no browser object to ask for its processes');
  const cdp = await br.newBrowserCDPSession();
  const { processInfo } = (await cdp.send('SystemInfo.getProcessInfo')) as { processInfo: { type: string; id: number }[] };
  await cdp.detach();
  const main = processInfo.find((p) => p.type === 'browser');
  if (!main) throw new Error('no browser process in SystemInfo.getProcessInfo');
  return [main.id, ...processInfo.filter((p) => p !== main && p.id > 0).map((p) => p.id)];
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** SIGKILLs the browser process now, then waits until all of its processes are gone. */
export async function killBrowser(k: Killable): Promise<void> {
  const [main] = k.pids;
  if (main === undefined) throw new Error('no browser pid');
  process.kill(main, 'SIGKILL');
  const deadline = Date.now() + 15_000;
  while (k.pids.some(alive)) {
    if (Date.now() > deadline) throw new Error(`browser processes still alive after SIGKILL: ${k.pids.filter(alive).join(', ')}`);
    await new Promise((r) => setTimeout(r, 50));
  }
  // Playwright's side of the connection is gone with the process; let it settle.
  await k.browser.context.close().catch(() => undefined);
}

/**
 * A browser on a kept profile with one page opened at `url`, and the pids to kill it by.
 * `initScript` runs in every page before the app's own scripts (see txProbe.ts).
 */
export async function launchKillable(userDataDir: string, url: string, initScript?: string): Promise<Killable & { page: Page }> {
  const browser = await launchChromium({ userDataDir });
  if (initScript) await browser.context.addInitScript(initScript);
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.goto(url);
  return { browser, page, pids: await browserPids(browser) };
}
