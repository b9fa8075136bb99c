import { defineConfig } from 'vitest/config';

// Browser tests: the built app in Debian's Chromium. One file at a time: the machine has 2 cores
// and each file starts its own browser.
export default defineConfig({
  cacheDir: '.vite-cache',
  test: {
    name: 'e2e',
    include: ['test/e2e/**/*.e2e.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 90_000,
    hookTimeout: 120_000,
    reporters: ['default', ['json', { outputFile: 'test-results/e2e.json' }]],
  },
});
