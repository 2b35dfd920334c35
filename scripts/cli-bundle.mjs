// How the CLI is bundled: one definition, used by scripts/build.mjs for dist/cli and by the
// tests that run the CLI as shipped from a private folder.
import { build } from 'esbuild';
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

/** Bundles cli/index.ts into `outdir` (code-split: each command loads only what it needs). */
export function buildCliBundle({ root = process.cwd(), outdir, logLevel = 'warning', plugins = [] }) {
  return build({
    absWorkingDir: root,
    entryPoints: [join(root, 'cli', 'index.ts')],
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    external: EXTERNAL,
    // Bundled CommonJS packages call require() for Node's built-ins.
    banner: { js: "import { createRequire as __panformCreateRequire } from 'node:module'; const require = __panformCreateRequire(import.meta.url);" },
    sourcemap: false,
    logLevel,
    chunkNames: 'chunks/[name]-[hash]',
    plugins: [...plugins, standaloneValidators],
  });
}
