// Builds the viewer with Vite into dist/web. Used by scripts/build.mjs and by the e2e tests;
// `node scripts/build-viewer.mjs` runs it alone.
import { fileURLToPath } from 'node:url';

export async function buildViewer({ root = process.cwd(), logLevel = 'warn' } = {}) {
  const { build } = await import('vite');
  await build({ root, logLevel });
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  await buildViewer({ logLevel: process.argv.includes('--quiet') ? 'error' : 'warn' });
}
