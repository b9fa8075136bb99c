// Floe Ledger command line: `npm run cli -- <command> [options]`. A small dispatcher over the
// commands in ./commands/; each command parses its own options and returns an exit code.

import { realpathSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { EXIT_FAILURE, EXIT_OK, EXIT_USAGE, UsageError, type CliIO, type Command } from './command.ts';
import { COMMANDS } from './commands/index.ts';
import { visible } from './terminalText.ts';

export const PROGRAM = 'floe-ledger';

/**
 * `summary FILE | head -1`: the reader closes the pipe and the next write fails with EPIPE,
 * asynchronously, after the command has set its exit code. Nobody reads any more, so later
 * output is dropped quietly instead of ending in a stack trace.
 */
let pipeGuarded = false;
function quietOnClosedPipe() {
  if (pipeGuarded) return;
  pipeGuarded = true;
  for (const stream of [process.stdout, process.stderr]) {
    stream.on('error', (e: NodeJS.ErrnoException) => {
      if (e.code === 'EPIPE') return;
      throw e;
    });
  }
}

const processIO: CliIO = {
  stdout: (line) => process.stdout.write(`${line}\n`),
  stderr: (line) => process.stderr.write(`${line}\n`),
};

export function overview(commands: readonly Command[] = COMMANDS): string {
  const width = Math.max(...commands.map((c) => c.name.length));
  return [
    `Usage: npm run cli -- <command> [options]`,
    '',
    'Commands:',
    ...commands.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    `  ${'help'.padEnd(width)}  this list; "help <command>" or "<command> --help" for one command`,
  ].join('\n');
}

/** Run the CLI on argv (without node and script) and return the exit code. */
export async function runCli(argv: readonly string[], io: CliIO = processIO, commands: readonly Command[] = COMMANDS): Promise<number> {
  if (io === processIO) quietOnClosedPipe();
  const [name, ...rest] = argv;
  if (name === undefined) {
    io.stderr(overview(commands));
    return EXIT_USAGE;
  }
  if (name === 'help' || name === '--help' || name === '-h') {
    const target = rest[0] ? commands.find((c) => c.name === rest[0]) : undefined;
    if (rest[0] && !target) {
      io.stderr(`${PROGRAM}: unknown command "${rest[0]}"`);
      return EXIT_USAGE;
    }
    io.stdout(target ? target.usage : overview(commands));
    return EXIT_OK;
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    io.stderr(`${PROGRAM}: unknown command "${name}"`);
    io.stderr(overview(commands));
    return EXIT_USAGE;
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    io.stdout(command.usage);
    return EXIT_OK;
  }
  try {
    return await command.run([...rest], io);
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr(`${PROGRAM} ${command.name}: ${visible(e.message)}`);
      io.stderr(`Run "npm run cli -- ${command.name} --help" for usage.`);
      return EXIT_USAGE;
    }
    io.stderr(`${PROGRAM} ${command.name}: ${visible(e instanceof Error ? e.message : String(e))}`);
    return EXIT_FAILURE;
  }
}

function isEntryPoint(): boolean {
  const script = process.argv[1];
  if (!script) return false;
  try {
    return realpathSync(script) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isEntryPoint()) {
  process.exitCode = await runCli(process.argv.slice(2));
}
