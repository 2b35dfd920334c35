// Builds the CLI + server bundle (esbuild, code-split so each command loads only what it needs)
// and the viewer (Vite). Run by `npm run build` and by `prepare` on `npm install`.
import { build } from 'esbuild';
import { renameSync, rmSync } from 'node:fs';
import { generateValidatorsModule } from './standalone-validators.mjs';

const onlyCli = process.argv.includes('--cli');
// Build beside the old bundle and swap only on success, so a failed build never leaves the
// CLI missing.
const next = `dist/cli-next-${process.pid}`;
await build({
  entryPoints: ['cli/index.ts'],
  outdir: next,
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  packages: 'external',
  sourcemap: false,
  logLevel: 'warning',
  chunkNames: 'chunks/[name]-[hash]',
  // The schema validators as standalone code generated now, so the CLI starts without loading
  // and running the ajv compiler (and TypeBox) every time (scripts/standalone-validators.mjs).
  plugins: [
    {
      name: 'standalone-validators',
      setup(b) {
        b.onLoad({ filter: /shared[\\/]schema[\\/]validators\.ts$/ }, () => ({ contents: generateValidatorsModule(), loader: 'js' }));
      },
    },
  ],
});
rmSync('dist/cli', { recursive: true, force: true });
renameSync(next, 'dist/cli');
if (!onlyCli) {
  const { build: viteBuild } = await import('vite');
  await viteBuild({ logLevel: 'warn' });
}
