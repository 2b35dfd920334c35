// Builds the CLI + server bundle (esbuild, code-split so each command loads only what it needs)
// and the viewer (Vite). Run by `npm run build` and by `prepare` on `npm install`.
import { build } from 'esbuild';
import { rmSync } from 'node:fs';

const onlyCli = process.argv.includes('--cli');
rmSync('dist/cli', { recursive: true, force: true });
await build({
  entryPoints: ['cli/index.ts'],
  outdir: 'dist/cli',
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  packages: 'external',
  sourcemap: false,
  logLevel: 'warning',
  chunkNames: 'chunks/[name]-[hash]',
});
if (!onlyCli) {
  const { build: viteBuild } = await import('vite');
  await viteBuild({ logLevel: 'warn' });
}
