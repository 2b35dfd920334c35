#!/usr/bin/env node
// Launcher for the compiled CLI: `npm install` builds dist/ (the `prepare` script). CommonJS
// (bin/package.json), like everything a quick command loads: it starts without Node's ES module
// loader (cli/launch.ts).
'use strict';
const { existsSync } = require('node:fs');
const { join } = require('node:path');

const entry = join(__dirname, '..', 'dist', 'cli', 'panform.cjs');
if (!existsSync(entry)) {
  process.stderr.write('panform: the CLI is not built yet. Run `npm run build` (or `npm install`) in the project folder.\n');
  process.exit(2);
}
require(entry);
