#!/usr/bin/env node
// The `floe-ledger` command (package.json "bin"): runs the TypeScript command line in
// src/cli/main.ts through tsx's loader, so the CLI and the app share one source.
import { register } from 'tsx/esm/api';

register();
const { runCli } = await import('../src/cli/main.ts');
process.exitCode = await runCli(process.argv.slice(2));
