// The command table and the one error handler. Only the command named on the command line is imported, so a command
// starts without loading the others' dependencies (the database, the PDF library, the server).
import { Command, CommanderError } from 'commander';
import { ExitError } from './errors.ts';
import { formatFinding } from '#shared/findings';

type CommandModule = { command: Command };
const COMMANDS: Record<string, () => Promise<CommandModule>> = {
  check: () => import('./commands/check.ts'),
  scale: () => import('./commands/scale.ts'),
  temp: () => import('./commands/temp.ts'),
  convert: () => import('./commands/convert.ts'),
  sheet: () => import('./commands/sheet.ts'),
  diff: () => import('./commands/diff.ts'),
  load: () => import('./commands/load.ts'),
  user: () => import('./commands/user.ts'),
  serve: () => import('./commands/serve.ts'),
  init: () => import('./commands/init.ts'),
  cost: () => import('./commands/cost.ts'),
  label: () => import('./commands/label.ts'),
  'git-setup': () => import('./commands/git-setup.ts'),
};

export async function buildProgram(only?: string): Promise<Command> {
  const program = new Command('panform')
    .description("Dough formulas in baker's percent: check, scale, convert, compare and print batch sheets.")
    .version('0.1.0')
    .showSuggestionAfterError(true)
    .configureOutput({ outputError: (str, write) => write(str) })
    .exitOverride();
  // A command loads only itself; `--version` needs none; help and mistakes list them all.
  const names = only && COMMANDS[only] ? [only] : only === '--version' || only === '-V' ? [] : Object.keys(COMMANDS);
  const modules = await Promise.all(names.map((n) => COMMANDS[n]()));
  for (const m of modules) program.addCommand(m.command.exitOverride());
  program.addHelpText('after', '\nRun `panform <command> --help` for the options and an example of each command.');
  return program;
}

export function reportError(e: unknown): number {
  const err = process.stderr;
  if (e instanceof CommanderError) {
    // Commander has already printed its message (or the help text).
    if (e.code === 'commander.helpDisplayed' || e.code === 'commander.version' || e.code === 'commander.help') return 0;
    return e.exitCode === 0 ? 0 : 2;
  }
  if (e instanceof ExitError) {
    for (const f of e.findings) err.write(`${formatFinding(f)}\n`);
    if (e.message) err.write(`panform: ${e.message}\n`);
    if (e.suggestion) err.write(`  ${e.suggestion}\n`);
    return e.code;
  }
  const error = e as Error;
  err.write(`panform: internal error: ${error?.message ?? String(e)}\n${error?.stack ?? ''}\nThis is a bug in Panform; please report it with the command you ran.\n`);
  return 70;
}

export async function runCli(argv: string[]): Promise<number> {
  const program = await buildProgram(argv[2]);
  try {
    await program.parseAsync(argv);
    return typeof process.exitCode === 'number' ? process.exitCode : 0;
  } catch (e) {
    return reportError(e);
  }
}

