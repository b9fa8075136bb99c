// The command registry. To add a command: write src/cli/commands/<name>.ts exporting a Command,
// and append it here; `help` and the dispatcher pick it up (see docs/dev/domain.md).

import type { Command } from '../command.ts';
import { polarisCommand } from './polaris.ts';

export const COMMANDS: readonly Command[] = [polarisCommand];
