// Runs the command line in-process and collects what it prints, for the CLI tests.
import type { CliIO } from '../../src/cli/command.ts';
import { runCli } from '../../src/cli/main.ts';

export async function run(...argv: string[]): Promise<{ code: number; out: string[]; err: string[] }> {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { stdout: (l) => out.push(l), stderr: (l) => err.push(l) };
  const code = await runCli(argv, io);
  return { code, out, err };
}
