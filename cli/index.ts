// The `panform` program (compiled to dist/cli/index.js, which bin/panform.js runs).
import { COMMANDS } from './command-table.ts';
import { runCli } from './program.ts';

process.exitCode = await runCli(process.argv, COMMANDS);
