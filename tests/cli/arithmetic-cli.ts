// Runs the CLI built once for the whole test run (tests/setup/cli-build.ts) as a separate
// process: `node index.js <args>`, what bin/panform.js runs.
import { execFile } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { inject } from 'vitest';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

export interface BuiltCli {
  /** The entry file of the built CLI. */
  entry: string;
  run(args: string[], opts?: { cwd?: string; input?: string }): Promise<CliRun>;
  dispose(): void;
}

/** The CLI built for this test run (no build here; kept async and disposable for the callers). */
export async function buildCli(): Promise<BuiltCli> {
  const entry = inject('panformCli');
  return {
    entry,
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
      // The build belongs to the run; tests/setup/cli-build.ts removes it at the end.
    },
  };
}
