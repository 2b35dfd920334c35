// Which module each command lives in. Only the command named on the command line is imported, so
// a command starts without loading the others' dependencies (the database, the PDF library, the
// server).
import type { Command } from 'commander';

export type CommandModule = { command: Command };
export type CommandTable = Record<string, () => Promise<CommandModule>>;

/** Every command, in the order `panform --help` lists them. */
export const COMMANDS: CommandTable = {
  check: () => import('./commands/check.ts'),
  scale: () => import('./commands/scale.ts'),
  temp: () => import('./commands/temp.ts'),
  convert: () => import('./commands/convert.ts'),
  sheet: () => import('./commands/sheet.ts'),
  shift: () => import('./commands/shift.ts'),
  diff: () => import('./commands/diff.ts'),
  load: () => import('./commands/load.ts'),
  user: () => import('./commands/user.ts'),
  friction: () => import('./commands/friction.ts'),
  serve: () => import('./commands/serve.ts'),
  init: () => import('./commands/init.ts'),
  cost: () => import('./commands/cost.ts'),
  label: () => import('./commands/label.ts'),
  'git-setup': () => import('./commands/git-setup.ts'),
  new: () => import('./commands/new.ts'),
};
