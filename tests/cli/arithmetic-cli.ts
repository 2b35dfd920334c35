// Builds the CLI the way scripts/build.mjs does, into a private folder per test file, so that
// tests running in parallel never see another file's build half-written; then runs it as
// `node panform.cjs <args>` (what bin/panform.js loads).
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildCliBundle } from '../../scripts/cli-bundle.mjs';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

export interface BuiltCli {
  /** The folder the CLI was built into. */
  dir: string;
  run(args: string[], opts?: { cwd?: string; input?: string }): Promise<CliRun>;
  dispose(): void;
}

export async function buildCli(): Promise<BuiltCli> {
  // Inside node_modules so the bundle's bare imports (pdfkit, express ...) resolve as in dist/.
  const outdir = mkdtempSync(join(ROOT, 'node_modules', '.cache-panform-cli-'));
  try {
    await buildCliBundle({ root: ROOT, outdir, logLevel: 'silent' });
  } catch (e) {
    rmSync(outdir, { recursive: true, force: true });
    throw e;
  }
  const entry = join(outdir, 'panform.cjs');
  return {
    dir: outdir,
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
