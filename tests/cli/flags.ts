// A command's flags read by commander itself, without running the command: tests then call the
// command's own `to…Options` and `collect…` functions in-process, as the action does, and keep
// the built CLI for what only it shows (exit codes, the one printed line, the tables).
import type { Command } from 'commander';
import { ExitError } from '../../cli/errors.ts';

const saved = new WeakSet<Command>();

/** `args` (without the command's name) split into operands and the raw option values. */
export function parseFlags<T>(cmd: Command, args: string[]): { operands: string[]; options: T } {
  // Commander keeps option values on the command: start each parse from its first state.
  if (saved.has(cmd)) cmd.restoreStateBeforeParse();
  else {
    cmd.saveStateBeforeParse();
    saved.add(cmd);
  }
  const { operands, unknown } = cmd.parseOptions(args);
  if (unknown.length > 0) throw new Error(`unknown arguments for ${cmd.name()}: ${unknown.join(' ')}`);
  return { operands, options: { ...cmd.opts() } as T };
}

/** What the CLI would print and exit with for a refused command: the first stderr line and the code. */
export async function refusal(run: () => unknown): Promise<{ code: number; line: string }> {
  try {
    await run();
  } catch (e) {
    if (e instanceof ExitError) return { code: e.code, line: `panform: ${e.message}` };
    throw e;
  }
  throw new Error('the command was not refused');
}
