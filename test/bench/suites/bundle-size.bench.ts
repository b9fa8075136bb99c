// The gzip size of the JavaScript the app ships (issue: offline and installable; target <= 450 KB).
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { absoluteRow, type BenchSuite } from '../bench-kit';

/**
 * The service worker (dist/sw.js) and its workbox runtime (dist/workbox-<hash>.js) are left out:
 * the browser loads them apart from the app, and only at install or update time.
 */
const SERVICE_WORKER_FILES = /^(sw|workbox-[\w-]+)\.js$/;

function jsFiles(dir: string, top = true): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return jsFiles(p, false);
    if (top && SERVICE_WORKER_FILES.test(name)) return [];
    return /\.m?js$/.test(name) ? [p] : [];
  });
}

export const suite: BenchSuite = {
  name: 'bundle size',
  async run() {
    const dist = resolve(import.meta.dirname, '../../../dist');
    const files = jsFiles(dist);
    if (files.length === 0) throw new Error(`no JavaScript in ${dist}: run "npm run build" first`);
    const kb = files.reduce((sum, f) => sum + gzipSync(readFileSync(f), { level: 9 }).length, 0) / 1024;
    return [absoluteRow('app JavaScript, gzip', kb, 'KB', 450)];
  },
};
