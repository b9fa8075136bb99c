// The gzip size of the JavaScript the app ships: what loads before the watch log is interactive
// (target <= 450 KB), every chunk loaded later on demand (context, no target), and the whole.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { basename, join, relative, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { absoluteRow, type BenchRow, type BenchSuite } from '../bench-kit';

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

const gzipKb = (file: string): number => gzipSync(readFileSync(file), { level: 9 }).length / 1024;

/**
 * The chunks index.html starts with: its module script and modulepreload links, closed over the
 * static imports of each chunk (`import ... from "./x.js"` and `import "./x.js"`; a dynamic
 * `import("./x.js")` is a lazy chunk and not followed).
 */
export function firstLoadChunks(dist: string): string[] {
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const start = [...html.matchAll(/<(?:script[^>]*\ssrc|link[^>]*rel="modulepreload"[^>]*\shref)="\/?([^"]+\.js)"/g)].map((m) => join(dist, m[1] as string));
  const seen = new Set<string>();
  const queue = [...start];
  while (queue.length > 0) {
    const file = queue.pop() as string;
    if (seen.has(file)) continue;
    seen.add(file);
    const code = readFileSync(file, 'utf8');
    for (const m of code.matchAll(/(?:\bfrom\s*|\bimport\s*)["'](\.\.?\/[^"']+\.js)["']/g)) queue.push(resolve(file, '..', m[1] as string));
  }
  return [...seen];
}

export const suite: BenchSuite = {
  name: 'bundle size',
  async run() {
    const dist = resolve(import.meta.dirname, '../../../dist');
    const files = jsFiles(dist);
    if (files.length === 0) throw new Error(`no JavaScript in ${dist}: run "npm run build" first`);
    const first = new Set(firstLoadChunks(dist));
    const firstKb = [...first].reduce((sum, f) => sum + gzipKb(f), 0);
    const lazy = files.filter((f) => !first.has(f)).map((f) => ({ f, kb: gzipKb(f) })).sort((a, b) => b.kb - a.kb);
    const total = firstKb + lazy.reduce((s, x) => s + x.kb, 0);
    const rows: BenchRow[] = [absoluteRow(`first load, before the log form is interactive (${first.size} chunks), gzip`, firstKb, 'KB', 450)];
    for (const { f, kb } of lazy) {
      // Hashes change with every build; the name before the hash says which chunk it is.
      const name = relative(dist, f).replace(/-[\w-]{8}\.js$/, '.js');
      rows.push({ figure: `lazy chunk ${name || basename(f)}, gzip`, value: kb, baseline: null, unit: 'KB', ratio: null, target: 'on demand', met: true });
    }
    rows.push({ figure: 'app JavaScript in all, gzip', value: total, baseline: null, unit: 'KB', ratio: null, target: 'context', met: true });
    return rows;
  },
};
