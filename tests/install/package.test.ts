// Panform as a bakery gets it: packed (`npm pack`), installed as a command into a temporary
// prefix (`npm install -g --prefix`), and used from folders outside Panform's tree: `--version`,
// `check` and `sheet` on a copy of the demo, then `panform new bakery` and the loop in it: a
// commit runs the check (a broken file is refused), the sample plan prints, `git diff` shows a
// formula's figures through the diff driver, `panform serve --formulas .` serves the sample to a
// signed-in account, and `panform load` after a merged change shows the team the new figures.
//
// Packed once per run. The package's file list is the real one (`npm pack --dry-run` of this
// project); the files are copied into a staging folder with this run's CLI build (tests/setup/
// cli-build.ts) as dist/cli, so the test never rewrites dist/ under other suites. The install
// takes Panform's run-time dependencies from npm's cache where it can (`--prefer-offline`); npm
// still asks the registry for their listings (versions), which `npm ci` does not keep: CI has the
// network for `npm ci` anyway.
import { execFile, spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { ROOT } from '../cli/arithmetic-cli.ts';
import { ensureViewerBuilt } from '../e2e/support/viewer-build.ts';
import { EXTERNAL } from '../../scripts/cli-bundle.mjs';

const run = promisify(execFile);

let work: string;
let prefix: string;
let env: NodeJS.ProcessEnv;
let packed: string[];
const servers: ChildProcess[] = [];

/** Runs a command with the installed panform first on PATH; resolves with its exit code and output. */
async function sh(cmd: string, args: string[], cwd: string, input?: string): Promise<{ code: number; out: string; err: string }> {
  return new Promise((resolve) => {
    const child = execFile(cmd, args, { cwd, env, timeout: 120_000, maxBuffer: 16 * 1024 * 1024 }, (e, stdout, stderr) => {
      const code = e ? (typeof (e as { code?: unknown }).code === 'number' ? (e as { code: number }).code : 1) : 0;
      resolve({ code, out: stdout, err: stderr });
    });
    // A command that exits without reading its input must not fail the test on a closed pipe.
    child.stdin?.on('error', () => {});
    child.stdin?.end(input ?? '');
  });
}

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'panform-install-'));
  prefix = join(work, 'prefix');
  // The viewer and the empty database are part of the package: make sure they are built.
  ensureViewerBuilt(ROOT);
  if (!existsSync(join(ROOT, 'dist', 'pglite-seed', 'PG_VERSION'))) {
    const { prepareDatabaseSeed } = await import('../../scripts/prepare-database.mjs');
    await prepareDatabaseSeed();
  }
  // What `files` in package.json packs, listed by npm itself.
  const listing = await run('npm', ['pack', '--dry-run', '--json', '--ignore-scripts'], { cwd: ROOT, maxBuffer: 64 * 1024 * 1024 });
  packed = (JSON.parse(listing.stdout) as [{ files: { path: string }[] }])[0].files.map((f) => f.path);
  const stage = join(work, 'stage');
  for (const path of packed) {
    if (path.startsWith('dist/cli/')) continue;
    mkdirSync(dirname(join(stage, path)), { recursive: true });
    cpSync(join(ROOT, path), join(stage, path));
  }
  cpSync(dirname(inject('panformCli')), join(stage, 'dist', 'cli'), { recursive: true });
  chmodSync(join(stage, 'bin', 'panform.js'), 0o755);
  const tarball = (await run('npm', ['pack', '--ignore-scripts', '--pack-destination', work], { cwd: stage, maxBuffer: 64 * 1024 * 1024 })).stdout.trim().split('\n').pop()!;
  await run('npm', ['install', '--global', '--prefix', prefix, '--prefer-offline', '--no-audit', '--no-fund', '--loglevel=error', join(work, tarball)], {
    cwd: work,
    timeout: 600_000,
  });
  env = {
    ...process.env,
    PATH: `${join(prefix, 'bin')}:${process.env.PATH}`,
    NO_COLOR: '1',
    // Git needs a name for commits: set here for this test's repository only.
    GIT_AUTHOR_NAME: 'Ines Calloway',
    GIT_AUTHOR_EMAIL: 'ines@tidewater.example',
    GIT_COMMITTER_NAME: 'Ines Calloway',
    GIT_COMMITTER_EMAIL: 'ines@tidewater.example',
    GIT_CONFIG_NOSYSTEM: '1',
    PANFORM_DATA: '',
    DATABASE_URL: '',
    PORT: '',
  };
  delete env.NODE_ENV;
}, 900_000);

afterAll(() => {
  for (const s of servers) if (s.exitCode === null) s.kill('SIGKILL');
  if (work) rmSync(work, { recursive: true, force: true });
});

// Each step runs processes (a hash at full cost, a database opening): minutes on a loaded machine.
describe('the package', { timeout: 120_000 }, () => {
  it('ships the built CLI, the viewer, the PGlite seed, the migrations, the schemas, bin/ and the README, and nothing else', () => {
    const tops = new Set(packed.map((p) => (p.startsWith('dist/') || p.startsWith('shared/') ? p.split('/').slice(0, 2).join('/') : p.split('/')[0])));
    expect([...tops].sort()).toEqual(['README.md', 'bin', 'dist/cli', 'dist/pglite-seed', 'dist/web', 'drizzle', 'package.json', 'shared/schema']);
    expect(packed.filter((p) => p.startsWith('shared/')).sort()).toEqual(['shared/schema/catalog.schema.json', 'shared/schema/formula.schema.json', 'shared/schema/plan.schema.json']);
    expect(packed).toContain('dist/web/index.html');
    expect(packed).toContain('drizzle/meta/_journal.json');
  });

  it('depends on exactly the packages the CLI bundle leaves outside', () => {
    const deps = Object.keys((JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { dependencies: Record<string, string> }).dependencies);
    const outside = EXTERNAL.filter((e) => !e.endsWith('/*') || e.startsWith('@fontsource/')).map((e) => e.replace(/\/\*$/, ''));
    const fonts = deps.filter((d) => d.startsWith('@fontsource/'));
    expect(deps.filter((d) => !d.startsWith('@fontsource/')).sort()).toEqual(outside.filter((e) => e !== '@fontsource').sort());
    // The print fonts: the faces server/print/fonts.ts reads.
    expect(fonts.sort()).toEqual(['@fontsource/atkinson-hyperlegible-next', '@fontsource/fraunces', '@fontsource/jetbrains-mono']);
  });

  it('installs only run-time dependencies: no build tools', () => {
    const installed = join(prefix, 'lib', 'node_modules', 'panform');
    const modules = readdirSync(join(installed, 'node_modules'));
    for (const tool of ['vite', 'esbuild', 'tsx', 'typescript', 'vitest', 'react', 'drizzle-kit']) expect(modules, tool).not.toContain(tool);
    expect(modules).toContain('express');
    expect(existsSync(join(installed, 'src'))).toBe(false);
    expect(existsSync(join(installed, 'formulas'))).toBe(false);
  });

  it('runs as `panform` from any folder: --version, check and sheet', async () => {
    const elsewhere = join(work, 'elsewhere');
    cpSync(join(ROOT, 'formulas'), join(elsewhere, 'demo'), { recursive: true });
    const version = await sh('panform', ['--version'], elsewhere);
    expect(version.out.trim()).toBe((JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string }).version);
    const check = await sh('panform', ['check', 'demo'], elsewhere);
    expect(check.code, check.out + check.err).toBe(0);
    expect(check.out).toMatch(/files checked, no problems/);
    const sheet = await sh('panform', ['sheet', 'demo/plans/2026-12-03.yaml'], elsewhere);
    expect(sheet.code, sheet.err).toBe(0);
    expect(sheet.out).toMatch(/^Batch sheet · Thursday 3 December 2026/);
  });
});

describe('a bakery repository made by the installed panform', { timeout: 300_000 }, () => {
  let bakery: string;
  let planFile: string;
  const password = 'a long bakery password';

  it('panform new bakery: checked files, git with the diff driver and the hook', async () => {
    const res = await sh('panform', ['new', 'bakery'], work);
    expect(res.code, res.err).toBe(0);
    bakery = join(work, 'bakery');
    planFile = `plans/${readdirSync(join(bakery, 'plans'))[0]}`;
    // The hook's fallback is this installation, not Panform's source tree.
    const command = await sh('git', ['config', '--get', 'panform.command'], bakery);
    expect(command.out).toContain(join(prefix, 'lib', 'node_modules', 'panform', 'bin', 'panform.js'));
    expect((await sh('panform', ['check'], bakery)).out).toMatch(/^3 files checked, no problems/);
  });

  it('git commit runs the check: a clean commit goes in, a broken file is refused', async () => {
    expect((await sh('git', ['add', '.'], bakery)).code).toBe(0);
    const first = await sh('git', ['commit', '-q', '-m', 'Start the formulas repository'], bakery);
    expect(first.code, first.out + first.err).toBe(0);
    expect(first.out + first.err).toMatch(/pre-commit: panform check/);

    const formula = join(bakery, 'house-loaf.yaml');
    const good = readFileSync(formula, 'utf8');
    writeFileSync(formula, good.replace('  fine salt: 2\n', '  fine salt: two\n'));
    const broken = await sh('git', ['commit', '-q', '-a', '-m', 'Salt in words'], bakery);
    expect(broken.code).not.toBe(0);
    expect(broken.out + broken.err).toMatch(/house-loaf\.yaml:\d+:\d+ error ingredients\.fine salt is "two"/);
    expect((await sh('git', ['rev-list', '--count', 'HEAD'], bakery)).out.trim()).toBe('1');
    writeFileSync(formula, good);
  });

  it('prints the sample plan as a batch sheet', async () => {
    const sheet = await sh('panform', ['sheet', planFile], bakery);
    expect(sheet.code, sheet.err).toBe(0);
    expect(sheet.out).toMatch(/House loaf · mix 1 of 1/);
  });

  it('git diff shows a formula change with its figures (the diff driver)', async () => {
    const formula = join(bakery, 'house-loaf.yaml');
    writeFileSync(formula, readFileSync(formula, 'utf8').replace('  water: 72\n', '  water: 75\n'));
    const diff = await sh('git', ['--no-pager', 'diff', 'house-loaf.yaml'], bakery);
    // Hydration = water ÷ flour × 100: 72 and 75 of 100 flour (worked by hand).
    expect(diff.out).toContain('-#   hydration              72.0 %');
    expect(diff.out).toContain('+#   hydration              75.0 %');
    expect(diff.out).toContain('+  water: 75');
    // Held back until the loop below brings it to the viewer.
    await sh('git', ['stash', '-q'], bakery);
  });

  /** `panform serve --formulas .` in the bakery; resolves once it listens. */
  function serve(): Promise<{ url: string; out: () => string; stop: () => Promise<void> }> {
    return new Promise((resolve, reject) => {
      const child = spawn('panform', ['serve', '--formulas', '.', '--port', '0', '--host', '127.0.0.1'], { cwd: bakery, env, stdio: ['ignore', 'pipe', 'pipe'] });
      servers.push(child);
      let out = '';
      let err = '';
      const exited = new Promise<void>((r) => child.on('exit', () => r()));
      child.stdout!.on('data', (d: Buffer) => {
        out += d.toString();
        const m = /serving on (http:\/\/localhost:\d+)/.exec(out);
        if (m && out.includes('Press Ctrl+C')) {
          resolve({
            url: m[1].replace('localhost', '127.0.0.1'),
            out: () => out,
            stop: async () => {
              child.kill('SIGINT');
              await exited;
            },
          });
        }
      });
      child.stderr!.on('data', (d: Buffer) => (err += d.toString()));
      void exited.then(() => reject(new Error(`panform serve exited before listening:\n${out}\n${err}`)));
    });
  }

  async function signIn(url: string): Promise<string> {
    const res = await fetch(`${url}/api/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'ines@tidewater.example', password }),
    });
    expect(res.status).toBe(200);
    return res.headers.getSetCookie()[0].split(';')[0];
  }

  /** The hydration the viewer shows for the sample (water ÷ flour × 100, worked by hand: 72 or 75). */
  const hydrationOf = async (url: string, cookie: string) => {
    const res = await fetch(`${url}/api/formulas/house-loaf`, { headers: { cookie } });
    expect(res.status).toBe(200);
    return ((await res.json()) as { reference: { hydration: number } }).reference.hydration;
  };

  it('serve --formulas . loads the repository on the first start and serves it to a signed-in account; panform load brings a merged change in', async () => {
    const add = await sh('panform', ['user', 'add', 'ines@tidewater.example', '--role', 'author', '--name', 'Ines Calloway', '--password-stdin'], bakery, `${password}\n`);
    expect(add.code, add.err).toBe(0);
    const s = await serve();
    try {
      expect(s.out()).toMatch(/First start: loaded \.: 1 formulas, 9 catalog entries, 1 plans/);
      const anonymous = await fetch(`${s.url}/api/formulas`);
      expect(anonymous.status).toBe(401);
      const cookie = await signIn(s.url);
      const list = (await (await fetch(`${s.url}/api/formulas`, { headers: { cookie } })).json()) as { formulas: { id: string }[] };
      expect(list.formulas.map((f) => f.id)).toEqual(['house-loaf']);
      expect(await hydrationOf(s.url, cookie)).toBeCloseTo(72, 9);
      // The editor's schema address, without signing in.
      expect((await fetch(`${s.url}/schemas/formula.schema.json`)).headers.get('content-type')).toMatch(/^application\/schema\+json/);

      // The change is reviewed and merged (here: committed through the hook), then loaded.
      await sh('git', ['stash', 'pop', '-q'], bakery);
      const commit = await sh('git', ['commit', '-q', '-a', '-m', 'House loaf: water 75'], bakery);
      expect(commit.code, commit.out + commit.err).toBe(0);
      const load = await sh('panform', ['load'], bakery);
      expect(load.code, load.out + load.err).toBe(0);
      expect(load.out).toMatch(/through the\s+running server/);
      expect(load.out).toMatch(/~ house-loaf \(new revision\)/);
      expect(await hydrationOf(s.url, cookie)).toBeCloseTo(75, 9);
    } finally {
      await s.stop();
    }
    // A later start keeps the database and says how changes come in.
    const again = await serve();
    try {
      expect(again.out()).toMatch(/has formulas already, so \. was not loaded again; `panform load \.` brings its changes in/);
      expect(await hydrationOf(again.url, await signIn(again.url))).toBeCloseTo(75, 9);
    } finally {
      await again.stop();
    }
  });
});
