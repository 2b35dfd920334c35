// The program and the one error handler; cli/command-table.ts says where each command lives.
import { Command, CommanderError } from 'commander';
import { ExitError } from './errors.ts';
import { fitText, outputWidth, reflowParagraphs } from './print/width.ts';
import { formatFinding } from '#shared/findings';
import type { CommandTable } from './command-table.ts';
import packageJson from '../package.json' with { type: 'json' };

export async function buildProgram(only: string | undefined, table: CommandTable): Promise<Command> {
  const program = new Command('panform')
    .description("Dough formulas in baker's percent: check, scale, convert, compare and print batch sheets.")
    .version(packageJson.version)
    .showSuggestionAfterError(true)
    .configureOutput({ outputError: (str, write) => write(str) })
    .exitOverride();
  // A command loads only itself; `--version` needs none; help and mistakes list them all.
  const names = only && Object.hasOwn(table, only) ? [only] : only === '--version' || only === '-V' ? [] : Object.keys(table);
  const modules = await Promise.all(names.map((n) => table[n]()));
  for (const m of modules) program.addCommand(m.command.exitOverride());
  // Help fits the terminal (80 columns in a pipe): commander wraps its own columns to helpWidth,
  // and the examples and notes added after them are wrapped on their way out. Errors are left
  // whole, one line each, for scripts that read them.
  const width = outputWidth();
  for (const cmd of [program, ...program.commands]) {
    cmd.configureHelp({ helpWidth: width }).configureOutput({
      writeOut: (str) => process.stdout.write(fitText(reflowParagraphs(str), width)),
    });
  }
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

/** `panform sheet plan.yaml | head`: the reader has gone, so stop quietly as other tools do. */
function stopWhenReaderCloses(stream: NodeJS.WriteStream): void {
  stream.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw e;
  });
}

export async function runCli(argv: string[], table: CommandTable): Promise<number> {
  stopWhenReaderCloses(process.stdout);
  const program = await buildProgram(argv[2], table);
  try {
    await program.parseAsync(argv);
    return typeof process.exitCode === 'number' ? process.exitCode : 0;
  } catch (e) {
    return reportError(e);
  }
}

