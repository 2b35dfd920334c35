// The CLI built as scripts/build.mjs builds it (esbuild, standalone schema validators), into a
// private folder, so the fault tests run `panform` as shipped and start it in a fraction of the
// time a TypeScript loader needs: a kill then lands inside the load, not in the start-up.
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { buildCliBundle } from '../../scripts/cli-bundle.mjs';

export interface CliBuild {
  /** `node <entry> <command> ...` runs the CLI. */
  entry: string;
  dispose(): void;
}

export async function buildCliForTests(root = process.cwd()): Promise<CliBuild> {
  // Inside node_modules, so the bundle's bare imports resolve as they do from dist/.
  const outdir = mkdtempSync(join(root, 'node_modules', '.cache-panform-faults-'));
  try {
    await buildCliBundle({ root, outdir, logLevel: 'silent' });
  } catch (e) {
    rmSync(outdir, { recursive: true, force: true });
    throw e;
  }
  return { entry: join(outdir, 'panform.cjs'), dispose: () => rmSync(outdir, { recursive: true, force: true }) };
}
