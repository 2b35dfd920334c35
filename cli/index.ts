// Every command as ES modules (compiled to dist/cli/index.js; cli/launch.ts starts it for the
// commands that have no quick bundle).
import { COMMANDS } from './command-table.ts';
import { runCli } from './program.ts';

process.exitCode = await runCli(process.argv, COMMANDS);
