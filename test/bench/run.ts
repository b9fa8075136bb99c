// `npm run bench`: runs every benchmark suite and prints one table of figures, each against a
// baseline measured in the same run. Results are also written to bench-results/results.json.
// A suite is a module in test/bench/suites/ exporting `suite: BenchSuite`.
import { mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { formatTable, type BenchRow, type BenchSuite } from './bench-kit';

const dir = resolve(import.meta.dirname, 'suites');
const only = process.argv.slice(2);
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => only.length === 0 || only.some((o) => f.includes(o)))
  .sort();

const rows: BenchRow[] = [];
let failures = 0;
for (const file of files) {
  const mod = (await import(pathToFileURL(join(dir, file)).href)) as { suite: BenchSuite };
  process.stdout.write(`bench: ${mod.suite.name} ...\n`);
  try {
    const got = await mod.suite.run();
    rows.push(...got);
  } catch (err) {
    failures++;
    console.error(`bench: ${mod.suite.name} failed:`, err);
  }
}
console.log('\n' + formatTable(rows));
mkdirSync('bench-results', { recursive: true });
writeFileSync('bench-results/results.json', JSON.stringify({ at: new Date().toISOString(), rows }, null, 2));
console.log('\nwritten: bench-results/results.json');
process.exit(failures > 0 ? 1 : 0);
