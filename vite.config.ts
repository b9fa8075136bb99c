import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import { existsSync, realpathSync } from 'node:fs';
import { resolve } from 'node:path';
import { pwa, stripCspInDev } from './src/app/pwa.config.ts';
import { shipServerCsp, shipServerOrigins } from './src/app/csp.config.ts';

// The ship servers the built app may connect to (src/app/csp.config.ts); none unless given.
const shipServers = shipServerOrigins(process.env.FLOE_SHIP_SERVER);

// One config for the app build and the unit/component/database tests.
// Browser (e2e) tests and benchmarks have their own configs because they need the built app
// and must run one file at a time on a 2-core machine.
export default defineConfig({
  plugins: [react(), pwa(), stripCspInDev(), shipServerCsp(shipServers)],
  // A build marker the app shows and the update test checks; CI or a release may set it.
  define: { __FLOE_BUILD__: JSON.stringify(process.env.FLOE_BUILD_ID ?? new Date().toISOString()) },
  // Keep the cache in the project, not in node_modules, so several checkouts that share one
  // node_modules (git worktrees) do not trample each other's optimised deps.
  cacheDir: '.vite-cache',
  server: {
    host: '127.0.0.1',
    port: 5173,
    // A checkout whose node_modules is a link (git worktrees sharing one install) must still be
    // allowed to serve files from the real folder, e.g. the basemap's `?url` imports.
    fs: { allow: ['.', ...(existsSync('node_modules') ? [realpathSync(resolve('node_modules'))] : [])] },
  },
  preview: { host: '127.0.0.1', port: 4173, strictPort: true },
  build: {
    target: 'es2022',
    sourcemap: true,
    chunkSizeWarningLimit: 2048,
  },
  worker: { format: 'es' },
  test: {
    reporters: ['default', ['json', { outputFile: 'test-results/unit.json' }]],
    // Property tests over the database take seconds; a loaded 2-core machine must not time them out.
    testTimeout: 30_000,
    projects: [
      {
        extends: true,
        test: {
          name: 'node',
          environment: 'node',
          include: ['test/domain/**/*.test.ts', 'test/format/**/*.test.ts', 'test/cli/**/*.test.ts', 'test/gps/**/*.test.ts', 'test/iceinfo/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'db',
          environment: 'node',
          include: ['test/db/**/*.test.ts', 'test/sync/**/*.test.ts'],
          setupFiles: ['test/setup/db.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'dom',
          environment: 'jsdom',
          include: ['test/features/**/*.test.{ts,tsx}', 'test/app/**/*.test.{ts,tsx}', 'test/state/**/*.test.ts'],
          setupFiles: ['test/setup/dom.ts'],
        },
      },
    ],
  },
});
