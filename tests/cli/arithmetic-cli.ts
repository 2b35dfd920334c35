// Builds the CLI the way scripts/build.mjs does, into a private folder per test file, so that
// tests running in parallel never see another file's build half-written; then runs it as
// `node index.js <args>` (what bin/panform.js starts).
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build, type Plugin } from 'esbuild';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

export interface BuiltCli {
  run(args: string[], opts?: { cwd?: string; input?: string }): Promise<CliRun>;
  dispose(): void;
}

// Other commands are built in parallel by other people and may import files that do not exist
// yet; a dynamic import that cannot be resolved is left for run time (where only that command
// would fail) instead of failing the whole build. Static imports still must resolve.
const tolerateMissingDynamicImports: Plugin = {
  name: 'tolerate-missing-dynamic-imports',
  setup(b) {
    b.onResolve({ filter: /.*/ }, async (args) => {
      if (args.kind !== 'dynamic-import' || (args.pluginData as { again?: boolean } | undefined)?.again) return undefined;
      const r = await b.resolve(args.path, { kind: args.kind, importer: args.importer, resolveDir: args.resolveDir, pluginData: { again: true } });
      return r.errors.length > 0 ? { path: args.path, external: true } : r;
    });
  },
};

/** The build's own step: schema validators as standalone code (scripts/standalone-validators.mjs). */
async function standaloneValidators(): Promise<Plugin> {
  const mod = (await import(pathToFileURL(join(ROOT, 'scripts', 'standalone-validators.mjs')).href)) as { generateValidatorsModule(): string };
  return {
    name: 'standalone-validators',
    setup(b) {
      b.onLoad({ filter: /shared[\\/]schema[\\/]validators\.ts$/ }, () => ({ contents: mod.generateValidatorsModule(), loader: 'js' }));
    },
  };
}

export async function buildCli(): Promise<BuiltCli> {
  const validators = await standaloneValidators();
  // Inside node_modules so the bundle's bare imports (commander, yaml ...) resolve as in dist/.
  const outdir = mkdtempSync(join(ROOT, 'node_modules', '.cache-panform-cli-'));
  const built = build({
    entryPoints: [join(ROOT, 'cli/index.ts')],
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    packages: 'external',
    logLevel: 'silent',
    chunkNames: 'chunks/[name]-[hash]',
    plugins: [tolerateMissingDynamicImports, validators],
  });
  try {
    await built;
  } catch (e) {
    rmSync(outdir, { recursive: true, force: true });
    throw e;
  }
  const entry = join(outdir, 'index.js');
  return {
    run(args, opts = {}) {
      return new Promise((resolve) => {
        const child = execFile(process.execPath, [entry, ...args], { cwd: opts.cwd ?? ROOT, env: { ...process.env, NO_COLOR: '1' } }, (err, stdout, stderr) => {
          const code = err ? (typeof (err as { code?: unknown }).code === 'number' ? ((err as { code: number }).code) : 1) : 0;
          resolve({ code, stdout, stderr });
        });
        if (opts.input !== undefined) child.stdin?.end(opts.input);
        else child.stdin?.end();
      });
    },
    dispose() {
      rmSync(outdir, { recursive: true, force: true });
    },
  };
}
