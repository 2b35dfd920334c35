// Builds the viewer with Vite: the browser's build into dist/web and the server's first render of
// a formula page into dist/ssr (src/ssr/entry-server.tsx, loaded by server/ssr.ts). Used by
// scripts/build.mjs and by the e2e tests; `node scripts/build-viewer.mjs` runs it alone.
import { fileURLToPath } from 'node:url';

export async function buildViewer({ root = process.cwd(), logLevel = 'warn' } = {}) {
  const { build } = await import('vite');
  await build({ root, logLevel });
  await build({ root, logLevel, build: { ssr: 'src/ssr/entry-server.tsx', outDir: 'dist/ssr', emptyOutDir: true, copyPublicDir: false } });
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  await buildViewer({ logLevel: process.argv.includes('--quiet') ? 'error' : 'warn' });
}
