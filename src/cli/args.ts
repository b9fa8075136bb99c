// Option parsing for the commands, on node:util parseArgs, turning its exceptions into
// UsageError messages that name the bad option.

import { parseArgs } from 'node:util';
import { UsageError } from './command.ts';

export type OptionSpec = Record<string, { type: 'string' | 'boolean'; short?: string }>;

export interface ParsedArgs {
  values: Record<string, string | boolean | undefined>;
  positionals: string[];
}

/**
 * A string option's value may start with a dash (`--ice -1:new`, a negative share): join it to
 * its option so parseArgs takes it as the value and the command can say what is wrong with it.
 */
function joinDashValues(args: string[], options: OptionSpec): string[] {
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i] ?? '';
    const next = args[i + 1];
    const name = a.startsWith('--') ? a.slice(2) : undefined;
    const isKnownOption = (t: string) => t.startsWith('--') && Object.hasOwn(options, t.slice(2).split('=')[0] ?? '');
    if (name !== undefined && options[name]?.type === 'string' && next !== undefined && next.startsWith('-') && !isKnownOption(next)) {
      out.push(`${a}=${next}`);
      i++;
    } else {
      out.push(a);
    }
  }
  return out;
}

export function parseOptions(args: string[], options: OptionSpec, allowPositionals = false): ParsedArgs {
  try {
    const { values, positionals } = parseArgs({ args: joinDashValues(args, options), options, allowPositionals, strict: true });
    return { values: values as ParsedArgs['values'], positionals };
  } catch (e) {
    // parseArgs messages are clear ("Unknown option '--x'"); drop its hint about '--' which
    // does not apply to npm run.
    const msg = e instanceof Error ? e.message.replace(/\. To specify a positional argument.*$/s, '') : String(e);
    throw new UsageError(msg);
  }
}

/** A string option's value; UsageError when missing and required. */
export function stringOption(values: ParsedArgs['values'], name: string, required: true): string;
export function stringOption(values: ParsedArgs['values'], name: string, required?: false): string | undefined;
export function stringOption(values: ParsedArgs['values'], name: string, required = false): string | undefined {
  const v = values[name];
  if (typeof v === 'string') return v;
  if (required) throw new UsageError(`missing --${name}`);
  return undefined;
}
