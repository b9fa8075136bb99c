// The shape every CLI command has, and the exit codes they share. One module per command in
// src/cli/commands/, registered in src/cli/commands/index.ts.

/** Where a command writes: lines without trailing newline. Tests pass a collector. */
export interface CliIO {
  stdout(line: string): void;
  stderr(line: string): void;
}

export const EXIT_OK = 0;
/** The command ran but found problems (e.g. validation errors in a file). */
export const EXIT_FAILURE = 1;
/** Bad usage or bad input on the command line: the message names the bad part. */
export const EXIT_USAGE = 2;

export interface Command {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Full help text printed by `<command> --help`. */
  usage: string;
  run(args: string[], io: CliIO): number | Promise<number>;
}

/** Thrown by commands for bad usage; the dispatcher prints it and exits with EXIT_USAGE. */
export class UsageError extends Error {
  override name = 'UsageError';
}
