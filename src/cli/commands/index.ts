// The command registry. To add a command: write src/cli/commands/<name>.ts exporting a Command,
// and append it here; `help` and the dispatcher pick it up (see docs/dev/domain.md).

import type { Command } from '../command.ts';
import { convertCommand } from './convert.ts';
import { demoCommand } from './demo.ts';
import { mergeCommand } from './merge.ts';
import { polarisCommand } from './polaris.ts';
import { summaryCommand } from './summary.ts';
import { pullCommand, pushCommand } from './sync.ts';
import { validateCommand } from './validate.ts';

export const COMMANDS: readonly Command[] = [polarisCommand, demoCommand, validateCommand, summaryCommand, convertCommand, mergeCommand, pullCommand, pushCommand];
