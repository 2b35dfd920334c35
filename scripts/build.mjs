// Builds the CLI + server bundle (esbuild, scripts/cli-bundle.mjs) into dist/cli and the viewer
// (Vite) into dist/web.
// Run by `npm run build` and by `prepare` on `npm install`; `--cli` builds the CLI alone.
import { renameSync, rmSync } from 'node:fs';
import { buildCliBundle } from './cli-bundle.mjs';

const onlyCli = process.argv.includes('--cli');
// Build beside the old bundle and swap only on success, so a failed build never leaves the
// CLI missing.
const next = `dist/cli-next-${process.pid}`;
try {
  await buildCliBundle({ outdir: next });
} catch (e) {
  // esbuild has printed its own located errors; anything else is shown here.
  if (!Array.isArray(e?.errors)) console.error(e);
  rmSync(next, { recursive: true, force: true });
  process.exitCode = 1;
}
if (process.exitCode !== 1) {
  rmSync('dist/cli', { recursive: true, force: true });
  renameSync(next, 'dist/cli');
  if (!onlyCli) {
    const { buildViewer } = await import('./build-viewer.mjs');
    await buildViewer();
    // The empty database a first start copies in (server/db/client.ts).
    const { prepareDatabaseSeed } = await import('./prepare-database.mjs');
    await prepareDatabaseSeed();
  }
}
