// Prints one closing line over every test report of this run: "tests: N passed, N failed[, N skipped]".
// Vitest's own closing lines differ by project; CI reads this plain line.
import { existsSync, readFileSync } from 'node:fs';

let passed = 0;
let failed = 0;
let skipped = 0;
for (const file of ['test-results/unit.json', 'test-results/e2e.json']) {
  if (!existsSync(file)) continue;
  const report = JSON.parse(readFileSync(file, 'utf8'));
  passed += report.numPassedTests ?? 0;
  failed += report.numFailedTests ?? 0;
  skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
}
console.log(`tests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 ? 1 : 0);
