// The gzip size of the JavaScript the app ships (issue: offline and installable; target <= 450 KB).
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { absoluteRow, type BenchSuite } from '../bench-kit';

function jsFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return jsFiles(p);
    return /\.(m?js)$/.test(name) && !name.startsWith('sw') && !name.startsWith('workbox-') ? [p] : [];
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
