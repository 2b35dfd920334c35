// The e2e tests drive the built viewer (dist/web). Build them when missing or older than their sources. Only the Vite half of scripts/build.mjs runs here: the CLI half deletes and rewrites
// dist/cli, which other suites may be running at the same moment.
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

const SOURCES = ['src', 'shared', 'index.html', 'vite.config.ts', 'package.json'];

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
  return newest;
}

export function viewerBuildIsStale(root = process.cwd()): boolean {
  const built = resolve(root, 'dist/web/index.html');
  if (!existsSync(built)) return true;
  const builtAt = statSync(built).mtimeMs;
  return SOURCES.some((s) => newestMtime(resolve(root, s)) > builtAt);
}

export function ensureViewerBuilt(root = process.cwd()): void {
  if (!viewerBuildIsStale(root)) return;
  execFileSync(process.execPath, [resolve(root, 'scripts/build-viewer.mjs'), '--quiet'], {
    cwd: root,
    // vitest runs with NODE_ENV=test, which would make Vite build React's development runtime.
    env: { ...process.env, NODE_ENV: 'production' },
    stdio: ['ignore', 'ignore', 'pipe'],
    timeout: 240_000,
  });
}
