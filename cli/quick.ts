// The quick commands (check, scale, temp, convert, sheet, cost, label and --version) as one
// CommonJS bundle, dist/cli/quick.cjs, which cli/launch.ts compiles with a V8 code cache: these
// are the commands a bench runs many times a night, and most of their start is compiling code.
import { QUICK_COMMANDS } from './quick-commands.ts';
import { runCli } from './program.ts';

/** Whether this bundle runs the command named first on the command line. */
export function handles(name: string | undefined): boolean {
  return name !== undefined && (Object.hasOwn(QUICK_COMMANDS, name) || name === '--version' || name === '-V');
}

export function run(argv: string[]): Promise<number> {
  return runCli(argv, QUICK_COMMANDS);
}
