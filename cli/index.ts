// The `panform` entry (compiled to dist/cli/index.js; bin/panform.js starts it).
import { runCli } from './program.ts';

process.exitCode = await runCli(process.argv);
