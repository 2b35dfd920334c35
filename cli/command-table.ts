// Which module each command lives in. Only the command named on the command line is imported, so
// a command starts without loading the others' dependencies (the database, the PDF library, the
// server). The quick ones are listed in cli/quick-commands.ts.
import type { Command } from 'commander';
import { QUICK_COMMANDS } from './quick-commands.ts';

export type CommandModule = { command: Command };
export type CommandTable = Record<string, () => Promise<CommandModule>>;

const OTHER_COMMANDS: CommandTable = {
  diff: () => import('./commands/diff.ts'),
  load: () => import('./commands/load.ts'),
  user: () => import('./commands/user.ts'),
  serve: () => import('./commands/serve.ts'),
  init: () => import('./commands/init.ts'),
  'git-setup': () => import('./commands/git-setup.ts'),
};

/** Every command, in the order `panform --help` lists them. */
export const COMMANDS: CommandTable = Object.fromEntries(
  ['check', 'scale', 'temp', 'convert', 'sheet', 'diff', 'load', 'user', 'serve', 'init', 'cost', 'label', 'git-setup'].map((n) => [n, QUICK_COMMANDS[n] ?? OTHER_COMMANDS[n]]),
);
