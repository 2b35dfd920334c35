// The CLI built as scripts/build.mjs builds it (esbuild, standalone schema validators), into a
// private folder, so the fault tests run `panform` as shipped and start it in a fraction of the
// time a TypeScript loader needs: a kill then lands inside the load, not in the start-up.
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { build, type Plugin } from 'esbuild';

export interface CliBuild {
  /** `node <entry> <command> ...` runs the CLI. */
  entry: string;
  dispose(): void;
}

export async function buildCliForTests(root = process.cwd()): Promise<CliBuild> {
  const { generateValidatorsModule } = (await import(pathToFileURL(join(root, 'scripts', 'standalone-validators.mjs')).href)) as {
    generateValidatorsModule(): string;
  };
  const standalone: Plugin = {
    name: 'standalone-validators',
    setup(b) {
      b.onLoad({ filter: /shared[\\/]schema[\\/]validators\.ts$/ }, () => ({ contents: generateValidatorsModule(), loader: 'js' }));
    },
  };
  // Inside node_modules, so the bundle's bare imports resolve as they do from dist/.
  const outdir = mkdtempSync(join(root, 'node_modules', '.cache-panform-faults-'));
  try {
    await build({
      entryPoints: [join(root, 'cli', 'index.ts')],
      outdir,
      bundle: true,
      splitting: true,
      format: 'esm',
      platform: 'node',
      target: 'node20',
      packages: 'external',
      logLevel: 'silent',
      chunkNames: 'chunks/[name]-[hash]',
      plugins: [standalone],
    });
  } catch (e) {
    rmSync(outdir, { recursive: true, force: true });
    throw e;
  }
  return { entry: join(outdir, 'index.js'), dispose: () => rmSync(outdir, { recursive: true, force: true }) };
}
