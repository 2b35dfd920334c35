// Which module each quick command lives in (see cli/command-table.ts for all of them). These are
// the commands that read files and print numbers; they also ship as one CommonJS bundle that
// starts from a V8 code cache (cli/quick.ts, cli/launch.ts).
import type { CommandTable } from './command-table.ts';

export const QUICK_COMMANDS: CommandTable = {
  check: () => import('./commands/check.ts'),
  scale: () => import('./commands/scale.ts'),
  temp: () => import('./commands/temp.ts'),
  convert: () => import('./commands/convert.ts'),
  sheet: () => import('./commands/sheet.ts'),
  cost: () => import('./commands/cost.ts'),
  label: () => import('./commands/label.ts'),
};
