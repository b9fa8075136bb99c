// Drives Debian's Chromium through playwright-core. No browser is ever downloaded.
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { serveDirectory, type StaticServer } from './server';

export const CHROMIUM_FLAGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
];

export function chromiumPath(): string {
  const path = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
  if (!existsSync(path)) {
    throw new Error(
      `Chromium not found at ${path}. The browser tests use Debian's Chromium: ` +
        `install it with "sudo apt-get update && sudo apt-get install -y chromium", ` +
        `or set CHROMIUM_PATH to another Chromium binary.`,
    );
  }
  return path;
}

export interface LaunchOptions {
  /** Reuse a profile folder (to test persistence across a relaunch); a fresh one otherwise. */
  userDataDir?: string;
  offline?: boolean;
  /** Keep service workers out of this run (to load the app from the network as a baseline). */
  blockServiceWorkers?: boolean;
  /** Emulate a touch screen (touch events, `page.touchscreen`). */
  hasTouch?: boolean;
}

export interface Browser {
  context: BrowserContext;
  userDataDir: string;
  close: (opts?: { keepProfile?: boolean }) => Promise<void>;
}

export async function launchChromium(opts: LaunchOptions = {}): Promise<Browser> {
  const userDataDir = opts.userDataDir ?? (await mkdtemp(join(tmpdir(), 'floe-e2e-')));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: chromiumPath(),
    headless: true,
    args: CHROMIUM_FLAGS,
    viewport: { width: 1280, height: 800 },
    acceptDownloads: true,
    offline: opts.offline ?? false,
    serviceWorkers: opts.blockServiceWorkers ? 'block' : 'allow',
    hasTouch: opts.hasTouch ?? false,
  });
  return {
    context,
    userDataDir,
    close: async ({ keepProfile = false } = {}) => {
      await context.close().catch(() => undefined);
      if (!keepProfile) await rm(userDataDir, { recursive: true, force: true });
    },
  };
}

/** Messages the page wrote to the console as errors, and uncaught exceptions. */
export function collectConsoleErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (msg) => {
    if (msg.type() === 'error') errors.push(msg.text());
  });
  page.on('pageerror', (err) => errors.push(`uncaught: ${err.message}`));
  return errors;
}

export interface AppSession {
  server: StaticServer;
  browser: Browser;
  page: Page;
  consoleErrors: string[];
  close: () => Promise<void>;
}

export const DIST_DIR = resolve(import.meta.dirname, '../../../dist');

/** Serve the built app, start a fresh Chromium, and open the app in one page. */
export async function openApp(opts: LaunchOptions & { path?: string; initScript?: string } = {}): Promise<AppSession> {
  const server = await serveDirectory(DIST_DIR);
  const browser = await launchChromium(opts);
  if (opts.initScript) await browser.context.addInitScript(opts.initScript);
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  const consoleErrors = collectConsoleErrors(page);
  await page.goto(server.url + (opts.path ?? ''));
  return {
    server,
    browser,
    page,
    consoleErrors,
    close: async () => {
      await browser.close();
      await server.close();
    },
  };
}
