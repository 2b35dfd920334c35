// vitest globalSetup: builds the CLI once per test run, as scripts/build.mjs builds dist/cli
// (scripts/cli-bundle.mjs), into a private folder; tests that run `panform` as a process get its
// entry with inject('panformCli') (tests/cli/arithmetic-cli.ts). A private folder, not dist/cli:
// a rebuild of dist/ while tests run never changes the CLI under them.
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { TestProject } from 'vitest/node';
import { buildCliBundle } from '../../scripts/cli-bundle.mjs';

declare module 'vitest' {
  export interface ProvidedContext {
    /** `node <panformCli> <command> ...` runs the CLI built for this test run. */
    panformCli: string;
  }
}

export default async function setup(project: TestProject): Promise<() => void> {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  // Inside node_modules, so the bundle's bare imports (pdfkit, express ...) resolve as from dist/.
  const outdir = mkdtempSync(join(root, 'node_modules', '.cache-panform-cli-'));
  try {
    await buildCliBundle({ root, outdir, logLevel: 'silent' });
  } catch (e) {
    rmSync(outdir, { recursive: true, force: true });
    throw e;
  }
  project.provide('panformCli', join(outdir, 'index.js'));
  return () => rmSync(outdir, { recursive: true, force: true });
}
