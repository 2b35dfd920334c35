#!/usr/bin/env node
// Launcher for the compiled CLI: `npm install` builds dist/ (the `prepare` script).
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const entry = new URL('../dist/cli/index.js', import.meta.url);
if (!existsSync(fileURLToPath(entry))) {
  process.stderr.write('panform: the CLI is not built yet. Run `npm run build` (or `npm install`) in the project folder.\n');
  process.exit(2);
}
await import(entry.href);
