// How the CLI is bundled: one definition, used by scripts/build.mjs for dist/cli and by the
// tests (tests/setup/cli-build.ts), which run the CLI as shipped.
import { build } from 'esbuild';
import { join } from 'node:path';

// Small pure-JavaScript packages are bundled in: loading one file is faster than resolving
// dozens. Packages that read files beside their own code (WASM, fonts, PDF metrics, sharp's native
// library), or that only the server and prompts use, stay outside. The packages named here are
// exactly the `dependencies` in package.json, what an installed Panform needs at run time
// (tests/install/package.test.ts checks); everything else is a devDependency.
export const EXTERNAL = [
  '@electric-sql/pglite', '@electric-sql/pglite/*', 'drizzle-orm', 'drizzle-orm/*', 'pg', 'express', 'helmet',
  'pdfkit', 'nodemailer', '@fontsource/*', 'cli-progress', '@inquirer/prompts',
  'sharp', 'multer', 'file-type', 'csv-stringify', 'csv-stringify/*', '@aws-sdk/client-s3',
];

/**
 * Builds the CLI into `outdir` as ES modules: index.js and chunks/, code-split so that a command
 * loads only its own code (cli/command-table.ts imports the command named on the command line).
 * `node <outdir>/index.js <command> ...` runs it; bin/panform.js imports dist/cli/index.js.
 */
export async function buildCliBundle({ root = process.cwd(), outdir, logLevel = 'warning' }) {
  await build({
    absWorkingDir: root,
    entryPoints: [join(root, 'cli', 'index.ts')],
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    external: EXTERNAL,
    sourcemap: false,
    logLevel,
    // Bundled CommonJS packages call require() for Node's built-ins.
    banner: { js: "import { createRequire as __panformCreateRequire } from 'node:module'; const require = __panformCreateRequire(import.meta.url);" },
    chunkNames: 'chunks/[name]-[hash]',
  });
}
