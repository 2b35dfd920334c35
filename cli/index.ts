// Every command as ES modules (compiled to dist/cli/index.js; cli/launch.ts starts it for the
// commands that quick.cjs does not run).
import { COMMANDS } from './command-table.ts';
import { runCli } from './program.ts';

process.exitCode = await runCli(process.argv, COMMANDS);
