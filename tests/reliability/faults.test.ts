// Fault tests with real processes on a real PGlite data directory:
// - a `panform load` killed (SIGKILL) at a random moment after it opened the database leaves the
//   database at the old state or the new one, never in between, and the next load works;
// - `panform serve` keeps answering while a load is handed to it and after a load that fails;
// - 50 clients reading formulas and plans for a few seconds get no error (the bench runs the long
//   version: 200 clients for 30 s, `npm run bench`);
// - the server stops cleanly and starts again on the same directory, also after being killed.
// The CLI is built as shipped, once per test run (tests/setup/cli-build.ts), and runs as a separate process, like a baker's
// terminal would start it.
import { spawn, type ChildProcess } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { generateFormulaYaml, writeGeneratedFolder } from '../../bench/generate-formulas.mjs';
import { createUser } from '../../server/auth/users.ts';
import { LOCK_FILE, migrateDatabase, openDatabase } from '../../server/db/client.ts';
import { loadFolder } from '../../server/load/index.ts';
import { readLoadedState } from '../setup/databases.ts';
import { TEST_SCRYPT } from '../server/harness.ts';
import { fuzzRuns } from './generators.ts';

const ROOT = process.cwd();
let cli: { entry: string };
const USER = { email: 'night-shift@tidewater.example', password: 'proof-box-at-26-degrees', role: 'bench' as const };
/** Kills per run of the suite: 4, or more with PANFORM_FUZZ_RUNS (npm run test:large). */
const KILLS = process.env.PANFORM_FUZZ_RUNS ? Math.min(25, Math.max(4, Math.round(fuzzRuns(1000) / 1000))) : 4;
const SLOW = 600_000;


let work: string;
let base: string;
let folderA: string;
let folderB: string;
let folderBad: string;
let before: State;
let after: State;
/** How long the reference load of B ran once it had opened the database, ms. */
let dbPhaseMs = 2000;
const children = new Set<ChildProcess>();

function run(args: string[], opts: { env?: NodeJS.ProcessEnv } = {}) {
  const child = spawn(process.execPath, [cli.entry, ...args], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', DATABASE_URL: '', ...opts.env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  let output = '';
  child.stdout!.on('data', (c: Buffer) => (output += c.toString()));
  child.stderr!.on('data', (c: Buffer) => (output += c.toString()));
  const exit = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.on('exit', (code, signal) => {
      children.delete(child);
      resolve({ code, signal });
    }),
  );
  return { child, exit, output: () => output };
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      srv.close(() => resolve(typeof addr === 'object' && addr ? addr.port : 0));
    });
  });
}

let copies = 0;
function copyOf(dir: string): string {
  const to = join(work, `copy-${copies++}`);
  cpSync(dir, to, { recursive: true });
  return to;
}

/** The loaded state with the moment a formula was marked removed reduced to whether it was. */
async function comparableState(h: Parameters<typeof readLoadedState>[0]) {
  const s = await readLoadedState(h);
  return { ...s, formulas: s.formulas.map((f) => ({ ...f, removedAt: f.removedAt !== null })) };
}
type State = Awaited<ReturnType<typeof comparableState>>;

async function stateOf(dataDir: string): Promise<State> {
  const h = await openDatabase({ dataDir });
  try {
    await migrateDatabase(h);
    return await comparableState(h);
  } finally {
    await h.close();
  }
}

async function waitFor(what: string, test: () => boolean | Promise<boolean>, timeoutMs = 180_000, stopIf?: () => string | null): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    if (await test()) return;
    const stop = stopIf?.();
    if (stop) throw new Error(`${what}: ${stop}`);
    if (Date.now() > deadline) throw new Error(`${what}: not after ${timeoutMs / 1000} s`);
    await sleep(25);
  }
}

beforeAll(async () => {
  cli = { entry: inject('panformCli') };
  work = mkdtempSync(join(tmpdir(), 'panform-faults-'));
  folderA = join(work, 'formulas-a');
  folderB = join(work, 'formulas-b');
  folderBad = join(work, 'formulas-bad');
  writeGeneratedFolder(folderA, 40);
  cpSync(folderA, folderB, { recursive: true });
  // The new side: three formulas changed, one removed, one added.
  for (const i of [0, 1, 2]) writeFileSync(join(folderB, `generated-${String(i).padStart(4, '0')}.yaml`), generateFormulaYaml(i, 1));
  unlinkSync(join(folderB, 'generated-0005.yaml'));
  writeFileSync(join(folderB, 'generated-0100.yaml'), generateFormulaYaml(100));
  cpSync(folderB, folderBad, { recursive: true });
  writeFileSync(join(folderBad, 'generated-0003.yaml'), generateFormulaYaml(3).replace(/fine salt: [0-9.]+/, 'fine salt: a pinch'));

  base = join(work, 'base');
  const h = await openDatabase({ dataDir: base });
  try {
    await migrateDatabase(h);
    await loadFolder(h, folderA, { git: false });
    await createUser(h.db, { email: USER.email, name: 'Night shift', role: USER.role, password: USER.password }, TEST_SCRYPT);
    before = await comparableState(h);
  } finally {
    await h.close();
  }

  // The reference: the same load, not interrupted, gives the new state and the time it takes.
  const ref = copyOf(base);
  const load = run(['load', folderB, '--data', ref, '--json']);
  await waitFor('the reference load opening the database', () => existsSync(join(ref, LOCK_FILE)), 180_000, () => (load.child.exitCode !== null ? load.output() : null));
  const opened = Date.now();
  const { code } = await load.exit;
  dbPhaseMs = Date.now() - opened;
  if (code !== 0) throw new Error(`the reference load failed:\n${load.output()}`);
  after = await stateOf(ref);
  rmSync(ref, { recursive: true, force: true });
}, SLOW);

afterAll(async () => {
  for (const c of children) c.kill('SIGKILL');
  if (work) rmSync(work, { recursive: true, force: true });
});

describe('a load killed at a random moment', () => {
  it('differs between the old and the new state (the test would prove nothing otherwise)', () => {
    expect(after.loads).toBe(before.loads + 1);
    expect(after.formulas).not.toEqual(before.formulas);
  });

  it(`leaves the database at the old or the new state, never between (${KILLS} kills)`, { timeout: SLOW * 2 }, async () => {
    const outcomes = { old: 0, new: 0 };
    let lastDir = '';
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: 1200 }), async (permille) => {
        const dir = copyOf(base);
        const load = run(['load', folderB, '--data', dir, '--json']);
        await waitFor('the load opening the database', () => existsSync(join(dir, LOCK_FILE)) || load.child.exitCode !== null);
        await sleep((dbPhaseMs * permille) / 1000);
        load.child.kill('SIGKILL');
        await load.exit;
        const state = await stateOf(dir);
        const same = (a: State, b: State) => JSON.stringify(a) === JSON.stringify(b);
        if (same(state, before)) outcomes.old++;
        else if (same(state, after)) outcomes.new++;
        else expect(state, `killed ${permille / 10} % into the load: neither the old nor the new state`).toEqual(after);
        if (lastDir) rmSync(lastDir, { recursive: true, force: true });
        lastDir = dir;
      }),
      { numRuns: KILLS, endOnFailure: true },
    );
    expect(outcomes.old + outcomes.new).toBe(KILLS);
    // The directory a load was killed in takes the next load like any other.
    const h = await openDatabase({ dataDir: lastDir });
    try {
      await migrateDatabase(h);
      await loadFolder(h, folderB, { git: false });
      const state = await comparableState(h);
      expect(state.formulas).toEqual(after.formulas);
      expect(state.revisions).toEqual(after.revisions);
    } finally {
      await h.close();
    }
  });
});

describe('the server under loads, load and restarts', () => {
  let dataDir: string;
  let server: ReturnType<typeof run> | null = null;
  let baseUrl = '';
  let cookie = '';

  async function startServer(): Promise<void> {
    const port = await freePort();
    baseUrl = `http://127.0.0.1:${port}`;
    const s = run(['serve', '--port', String(port), '--host', '127.0.0.1', '--data', dataDir], { env: { NODE_ENV: 'test' } });
    server = s;
    await waitFor(
      'the server answering',
      async () => {
        try {
          return (await fetch(`${baseUrl}/api/me`, { signal: AbortSignal.timeout(2000) })).status === 401;
        } catch {
          return false;
        }
      },
      180_000,
      () => (s.child.exitCode !== null ? `exited ${s.child.exitCode}:\n${s.output()}` : null),
    );
  }

  async function signIn(): Promise<string> {
    const res = await fetch(`${baseUrl}/api/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: USER.email, password: USER.password }),
    });
    expect(res.status).toBe(200);
    return res.headers.getSetCookie().find((c) => c.startsWith('panform_session='))!.split(';')[0];
  }

  const get = (path: string, c = cookie) => fetch(`${baseUrl}${path}`, { headers: { cookie: c } });
  const revisionOf = async (id: string) => ((await (await get(`/api/formulas/${id}`)).json()) as { revision: number }).revision;

  /** GETs formulas and plans from `clients` loops until stopped; counts answers by status. */
  function readers(clients: number, paths: string[]) {
    let stop = false;
    const statuses: Record<string, number> = {};
    const failures: string[] = [];
    const loops = Array.from({ length: clients }, async (_, i) => {
      for (let n = i; !stop; n++) {
        const path = paths[n % paths.length];
        try {
          const res = await get(path);
          await res.arrayBuffer();
          statuses[res.status] = (statuses[res.status] ?? 0) + 1;
          if (res.status !== 200) failures.push(`${path}: ${res.status}`);
        } catch (e) {
          failures.push(`${path}: ${(e as Error).message}`);
        }
      }
    });
    return {
      async stop() {
        stop = true;
        await Promise.all(loops);
        return { statuses, failures, total: Object.values(statuses).reduce((a, b) => a + b, 0) };
      },
    };
  }

  beforeAll(async () => {
    dataDir = copyOf(base);
    await startServer();
    cookie = await signIn();
  }, SLOW);

  afterAll(async () => {
    if (server && server.child.exitCode === null) {
      server.child.kill('SIGKILL');
      await server.exit;
    }
  });

  it('keeps answering while a load is handed to it, and the load lands', { timeout: SLOW }, async () => {
    expect(await revisionOf('generated-0000')).toBe(1);
    const reading = readers(8, ['/api/formulas/generated-0001', '/api/formulas', '/api/plans', '/api/formulas/generated-0004?pieces=30']);
    const load = run(['load', folderB, '--data', dataDir, '--json']);
    const { code } = await load.exit;
    const r = await reading.stop();
    expect(code, load.output()).toBe(0);
    expect(JSON.parse(load.output()).via).toBe('server');
    expect(r.failures.length, r.failures.slice(0, 5).join('\n')).toBe(0);
    expect(r.total).toBeGreaterThan(0);
    expect(await revisionOf('generated-0000')).toBe(2);
    expect((await get('/api/formulas/generated-0100')).status).toBe(200);
  });

  it('keeps answering after a load that fails, and changes nothing', { timeout: SLOW }, async () => {
    const reading = readers(8, ['/api/formulas/generated-0001', '/api/formulas', '/api/plans']);
    const load = run(['load', folderBad, '--data', dataDir]);
    const { code } = await load.exit;
    const r = await reading.stop();
    expect(code).toBe(1);
    expect(load.output()).toMatch(/generated-0003\.yaml:\d+:\d+/);
    expect(r.failures.length, r.failures.slice(0, 5).join('\n')).toBe(0);
    expect(await revisionOf('generated-0000')).toBe(2);
    expect(await revisionOf('generated-0003')).toBe(1);
  });

  it('answers 50 clients reading formulas and plans for 3 s without an error', { timeout: SLOW }, async () => {
    const plans = ((await (await get('/api/plans')).json()) as { plans: { date: string }[] }).plans;
    expect(plans.length).toBeGreaterThan(0);
    const reading = readers(50, [
      '/api/formulas',
      '/api/formulas/generated-0001',
      '/api/formulas/generated-0003?pieces=40',
      '/api/formulas/generated-0004?mix=25000',
      '/api/plans',
      ...plans.map((p) => `/api/plans/${p.date}`),
      '/api/formulas?q=loaf',
    ]);
    await sleep(3000);
    const r = await reading.stop();
    expect(r.failures.length, `${r.failures.length} of ${r.total} requests failed, e.g.\n${r.failures.slice(0, 5).join('\n')}`).toBe(0);
    expect(r.total).toBeGreaterThan(0);
  });

  it('stops cleanly and starts again on the same directory, sessions kept', { timeout: SLOW }, async () => {
    const revision = await revisionOf('generated-0000');
    server!.child.kill('SIGTERM');
    const { code } = await server!.exit;
    expect(code).toBe(0);
    expect(existsSync(join(dataDir, LOCK_FILE))).toBe(false);
    await startServer();
    expect((await get('/api/me')).status).toBe(200);
    expect(await revisionOf('generated-0000')).toBe(revision);
  });

  it('starts again after being killed, taking over the lock the dead process left', { timeout: SLOW }, async () => {
    const revision = await revisionOf('generated-0000');
    server!.child.kill('SIGKILL');
    await server!.exit;
    expect(existsSync(join(dataDir, LOCK_FILE))).toBe(true);
    await startServer();
    expect((await get('/api/me')).status).toBe(200);
    expect(await revisionOf('generated-0000')).toBe(revision);
    expect((await get('/api/formulas')).status).toBe(200);
  });
});
