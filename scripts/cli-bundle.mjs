// How the CLI is bundled: one definition, used by scripts/build.mjs for dist/cli and by the
// tests that run the CLI as shipped from a private folder.
import { build } from 'esbuild';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { generateValidatorsModule } from './standalone-validators.mjs';

// Small pure-JavaScript packages are bundled in: loading one file is much faster than resolving
// dozens (yaml alone is ~60 CommonJS files). Packages that read files beside their own code
// (WASM, fonts, PDF metrics), or that only the server and prompts use, stay outside.
export const EXTERNAL = [
  '@electric-sql/pglite', '@electric-sql/pglite/*', 'drizzle-orm', 'drizzle-orm/*', 'pg', 'express', 'helmet',
  'pdfkit', 'nodemailer', '@fontsource/*', 'cli-progress', '@inquirer/prompts',
];

// The schema validators as standalone code generated at build time, so the CLI starts without
// loading and running the ajv compiler (and TypeBox) every time (scripts/standalone-validators.mjs).
const standaloneValidators = {
  name: 'standalone-validators',
  setup(b) {
    b.onLoad({ filter: /shared[\\/]schema[\\/]validators\.ts$/ }, () => ({ contents: generateValidatorsModule(), loader: 'js' }));
  },
};

// commander loads child_process (and with it the network modules) at start, for subcommands that
// are separate programs; Panform has none. In the quick bundle it gets child_process on first use.
const lazyChildProcess = {
  name: 'lazy-child-process',
  setup(b) {
    b.onResolve({ filter: /^(node:)?child_process$/ }, (args) =>
      /[\\/]commander[\\/]/.test(args.importer) ? { path: 'child_process', namespace: 'lazy-child-process' } : undefined,
    );
    b.onLoad({ filter: /.*/, namespace: 'lazy-child-process' }, () => ({
      contents: "module.exports = new Proxy({}, { get: (_, key) => require('node:child_process')[key] });",
      loader: 'js',
    }));
  },
};

/**
 * The quick commands: files in, numbers out, run many times a night. Each also ships as a
 * CommonJS bundle of its own (quick-<command>.cjs) that cli/launch.ts starts from a V8 code cache;
 * "version" answers `panform --version`.
 */
export const QUICK_COMMANDS = ['check', 'scale', 'temp', 'convert', 'sheet', 'cost', 'label'];

/** The entry of one quick bundle: the program with that command alone. */
function quickEntry(name) {
  const table = name === 'version' ? '{}' : `{ ${JSON.stringify(name)}: async () => command }`;
  return [
    "import { runCli } from './cli/program.ts';",
    ...(name === 'version' ? [] : [`import * as command from './cli/commands/${name}.ts';`]),
    `const table = ${table};`,
    'export function run(argv) { return runCli(argv, table); }',
  ].join('\n');
}

/**
 * Builds the CLI into `outdir`:
 * - index.js + chunks/: every command as ES modules, code-split (each command loads only what it
 *   needs);
 * - quick-<command>.cjs: each quick command as one CommonJS file;
 * - launch.cjs: cli/launch.ts, which picks one of the two;
 * - panform.cjs: runs launch.cjs from this folder (what bin/panform.js loads, and what tests run).
 */
export async function buildCliBundle({ root = process.cwd(), outdir, logLevel = 'warning', plugins = [] }) {
  const common = {
    absWorkingDir: root,
    bundle: true,
    platform: 'node',
    target: 'node20',
    external: EXTERNAL,
    sourcemap: false,
    logLevel,
    plugins: [...plugins, standaloneValidators],
  };
  const quick = (name) =>
    build({
      ...common,
      stdin: { contents: quickEntry(name), resolveDir: root, sourcefile: `quick-${name}.ts`, loader: 'ts' },
      plugins: [...common.plugins, lazyChildProcess],
      write: false,
      outfile: join(outdir, `quick-${name}.cjs`),
      format: 'cjs',
      // Code run from a vm.Script has no loader for import(): the external packages these commands
      // load on demand (pdfkit, nodemailer) are CommonJS and are required instead.
      supported: { 'dynamic-import': false },
      define: { 'import.meta.url': '__panformModuleUrl' },
      // Smaller and plain ASCII: less to read and hash before the code cache is used (a file with
      // one non-ASCII character is read as a two-byte string). Names are kept for messages.
      minifyWhitespace: true,
      minifySyntax: true,
      charset: 'ascii',
      banner: { js: "var __panformModuleUrl = require('node:url').pathToFileURL(__filename).href;" },
    }).then((r) => {
      // esbuild leaves non-ASCII characters in regular expressions, where a \uXXXX escape means the same.
      const text = r.outputFiles[0].text.replace(/[^\x00-\x7f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
      mkdirSync(outdir, { recursive: true });
      writeFileSync(join(outdir, `quick-${name}.cjs`), text);
    });
  await Promise.all([
    build({
      ...common,
      entryPoints: [join(root, 'cli', 'index.ts')],
      outdir,
      splitting: true,
      format: 'esm',
      // Bundled CommonJS packages call require() for Node's built-ins.
      banner: { js: "import { createRequire as __panformCreateRequire } from 'node:module'; const require = __panformCreateRequire(import.meta.url);" },
      chunkNames: 'chunks/[name]-[hash]',
    }),
    ...[...QUICK_COMMANDS, 'version'].map(quick),
    build({ ...common, entryPoints: [join(root, 'cli', 'launch.ts')], outfile: join(outdir, 'launch.cjs'), format: 'cjs' }),
  ]);
  writeFileSync(join(outdir, 'panform.cjs'), "'use strict';\n// Runs the CLI built in this folder (scripts/cli-bundle.mjs).\nrequire('./launch.cjs').launch(__dirname);\n");
}
