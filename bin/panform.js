#!/usr/bin/env node
// The `panform` command: runs the CLI that `npm run build` (also the `prepare` script of
// `npm install`) compiles into dist/cli/.
import { existsSync } from 'node:fs';

const entry = new URL('../dist/cli/index.js', import.meta.url);
if (!existsSync(entry)) {
  process.stderr.write('panform: the CLI is not built yet. Run `npm run build` (or `npm install`) in the project folder.\n');
  process.exit(2);
}
await import(entry.href);
