// A test-only page that loads the real src/db module in Chromium, for the store's browser tests
// and benchmarks. The app has no screen that saves yet (the log form is built in parallel),
// and the production build must carry no test handle; so the same source is bundled here, by
// Vite, into dist-e2e-db/ and served on its own origin. See docs/dev/db.md.
import { mkdir, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { build } from 'vite';
import { serveDirectory, type StaticServer } from './server';
import type { DbPageApi } from '../db-page/entry';

export type { DbPageApi };

const ROOT = resolve(import.meta.dirname, '../../..');
export const DB_PAGE_DIR = join(ROOT, 'dist-e2e-db');

let built: Promise<void> | null = null;

/** One entry of the page bundled by Vite into dist-e2e-db/ as an ES module. */
function bundle(entry: string, fileName: string, emptyOutDir: boolean) {
  return build({
    configFile: false,
    root: ROOT,
    logLevel: 'warn',
    cacheDir: join(ROOT, '.vite-cache'),
    // Library mode leaves process.env.NODE_ENV in place, and a dependency that reads it (React,
    // reached through the import session's modules) would stop the page with "process is not defined".
    define: { 'process.env.NODE_ENV': JSON.stringify('production') },
    build: { outDir: DB_PAGE_DIR, emptyOutDir, target: 'es2022', minify: false, lib: { entry: join(ROOT, entry), formats: ['es'], fileName: () => fileName } },
  });
}

/** Bundles test/e2e/db-page/entry.ts (and with it src/db) into dist-e2e-db/, and its import worker. */
export function buildDbPage(): Promise<void> {
  built ??= (async () => {
    await bundle('test/e2e/db-page/entry.ts', 'db-page.js', true);
    // The import worker of the page: the app's import session, run off the page as the app runs it.
    await bundle('test/e2e/db-page/import-worker.ts', 'import-worker.js', false);
    await mkdir(DB_PAGE_DIR, { recursive: true });
    await writeFile(
      join(DB_PAGE_DIR, 'index.html'),
      '<!doctype html><html><head><meta charset="utf-8"><title>db test page</title></head><body><script type="module" src="./db-page.js"></script></body></html>\n',
    );
    // A page of the same origin that does not touch the store (to set things up before it opens).
    await writeFile(join(DB_PAGE_DIR, 'blank.html'), '<!doctype html><html><head><meta charset="utf-8"><title>blank</title></head><body></body></html>\n');
  })();
  return built;
}

export async function serveDbPage(): Promise<StaticServer> {
  await buildDbPage();
  return serveDirectory(DB_PAGE_DIR);
}

/** Opens the page and waits until `window.floeDbPage` is there. */
export async function gotoDbPage(page: Page, url: string): Promise<void> {
  await page.goto(url);
  await page.waitForFunction(() => document.body.dataset.ready === 'yes');
}
