// A Panform server for tests: in-memory PGlite, migrated, the demo formulas loaded, one account
// per role, listening on a random loopback port. The clock is a number the test moves forward.
import { createHash } from 'node:crypto';
import { closeSync, existsSync, mkdirSync, openSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { drizzle } from 'drizzle-orm/pglite';
import * as schema from '../../server/db/schema.ts';
import type { Server } from 'node:http';
import { resolve } from 'node:path';
import { appInternals, createApp, type AppOptions } from '../../server/app.ts';
import type { ScryptParams } from '../../server/auth/password.ts';
import { createUser } from '../../server/auth/users.ts';
import type { OutgoingMail } from '../../server/context.ts';
import { makeHandle, migrateDatabase, openDatabase, type Database, type DatabaseHandle } from '../../server/db/client.ts';
import { readEnv } from '../../server/env.ts';
import { loadFolder } from '../../server/load/index.ts';
import { ROLES, type Role } from '#shared/permissions';

/** Cheap hashes: tests sign in hundreds of times. Production uses server/auth/password.ts DEFAULT_SCRYPT. */
export const TEST_SCRYPT: ScryptParams = { N: 2 ** 10, r: 8, p: 1 };
export const PASSWORD = 'correct horse battery';
export const emailOf = (role: Role) => `${role}@tidewater.example`;

export interface TestServer {
  url: string;
  handle: DatabaseHandle;
  clock: { now: number };
  outbox: OutgoingMail[];
  app: ReturnType<typeof createApp>;
  server: Server;
  /** A fresh session cookie for a role's account. */
  signIn(role: Role): Promise<string>;
  close(): Promise<void>;
}

/**
 * One database per test file. Creating a PGlite database (initdb in WASM) takes from seconds to
 * most of a minute on a busy machine; so the migrated database with the demo data and the test
 * accounts is made once, kept as a dump in node_modules/.cache (keyed by everything that shapes
 * it), and each file starts from a copy of that dump.
 */
export async function openTestDatabase(): Promise<DatabaseHandle> {
  const dumpFile = join(CACHE_DIR, `db-${cacheKey()}.tar`);
  if (!existsSync(dumpFile)) await withBuildLock(dumpFile, () => buildDump(dumpFile));
  const client = new PGlite({ loadDataDir: new Blob([readFileSync(dumpFile)]) });
  await client.waitReady;
  return makeHandle({ db: drizzle({ client, schema }), kind: 'pglite', closeClient: () => client.close() });
}

async function buildDump(dumpFile: string): Promise<void> {
  const fresh = await openDatabase({ memory: true });
  try {
    await migrateDatabase(fresh);
    await loadFolder(fresh, resolve('formulas'), { git: false });
    for (const role of ROLES) {
      await createUser(fresh.db, { email: emailOf(role), name: `Test ${role}`, role, password: PASSWORD }, TEST_SCRYPT);
    }
    const client = (fresh.db as unknown as { $client: PGlite }).$client;
    const dump = await client.dumpDataDir('none');
    for (const old of readdirSync(CACHE_DIR)) if (/^db-.*\.tar$/.test(old)) rmSync(join(CACHE_DIR, old), { force: true });
    const tmp = `${dumpFile}.${process.pid}.tmp`;
    writeFileSync(tmp, Buffer.from(await dump.arrayBuffer()));
    renameSync(tmp, dumpFile);
  } finally {
    await fresh.close();
  }
}

/** Test files run in parallel: the first builds the dump, the others wait for it. */
async function withBuildLock(dumpFile: string, build: () => Promise<void>): Promise<void> {
  mkdirSync(CACHE_DIR, { recursive: true });
  const lock = join(CACHE_DIR, 'build.lock');
  for (;;) {
    if (existsSync(dumpFile)) return;
    let fd: number | undefined;
    try {
      fd = openSync(lock, 'wx');
    } catch {
      // Someone else builds; a lock older than 10 minutes is left from a killed run.
      const age = Date.now() - (statSync(lock, { throwIfNoEntry: false })?.mtimeMs ?? Date.now());
      if (age > 10 * 60_000) rmSync(lock, { force: true });
      await new Promise((r) => setTimeout(r, 250));
      continue;
    }
    try {
      closeSync(fd);
      if (!existsSync(dumpFile)) await build();
    } finally {
      rmSync(lock, { force: true });
    }
    return;
  }
}

const CACHE_DIR = resolve('node_modules/.cache/panform-tests');
const HARNESS_VERSION = '1';

/** A hash of what the prepared database depends on: migrations, demo files, loader and core code. */
function cacheKey(): string {
  const h = createHash('sha256').update(HARNESS_VERSION);
  const walk = (dir: string) => {
    for (const name of readdirSync(dir).sort()) {
      const p = join(dir, name);
      if (statSync(p).isDirectory()) walk(p);
      else h.update(p).update(readFileSync(p));
    }
  };
  for (const dir of ['drizzle', 'formulas', 'server/load', 'server/db', 'shared/schema']) walk(resolve(dir));
  for (const f of ['model', 'scale', 'parse', 'units']) h.update(readFileSync(resolve(`shared/${f}.ts`)));
  h.update(readFileSync(resolve('server/auth/users.ts'))).update(readFileSync(resolve('server/auth/password.ts')));
  return h.digest('hex').slice(0, 16);
}

export async function startTestServer(handle: DatabaseHandle, opts: Partial<AppOptions> & { envVars?: Record<string, string> } = {}): Promise<TestServer> {
  const clock = { now: Date.parse('2026-12-02T20:00:00Z') };
  const outbox: OutgoingMail[] = [];
  const env = readEnv({ NODE_ENV: 'test', PANFORM_PUBLIC_URL: 'http://panform.tidewater.example', ...opts.envVars });
  const app = createApp({
    handle,
    env,
    now: () => clock.now,
    scrypt: TEST_SCRYPT,
    sendMail: async (m) => {
      outbox.push(m);
    },
    webDir: null,
    log: () => {},
    ...opts,
  });
  const server = await new Promise<Server>((ok) => {
    const s = app.listen(0, '127.0.0.1', () => ok(s));
  });
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    handle,
    clock,
    outbox,
    app,
    server,
    async signIn(role) {
      const res = await fetch(`${url}/api/session`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: emailOf(role), password: PASSWORD }),
      });
      if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${await res.text()}`);
      return sessionCookie(res);
    },
    async close() {
      await appInternals(app).idle();
      await appInternals(app).stop();
      server.closeAllConnections();
      await new Promise<void>((ok) => server.close(() => ok()));
    },
  };
}

/** "panform_session=..." from a response's Set-Cookie. */
export function sessionCookie(res: Response): string {
  const set = res.headers.getSetCookie().find((c) => c.startsWith('panform_session='));
  if (!set) throw new Error('no session cookie in the response');
  return set.split(';')[0];
}

export async function getJson(url: string, cookie?: string): Promise<{ status: number; body: unknown }> {
  const res = await fetch(url, { headers: cookie ? { cookie } : {} });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null };
}

export async function sendJson(
  url: string,
  method: string,
  body: unknown,
  headers: Record<string, string> = {},
): Promise<{ status: number; body: unknown; res: Response }> {
  const res = await fetch(url, {
    method,
    headers: { 'content-type': 'application/json', ...headers },
    body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
  });
  const text = await res.text();
  let parsed: unknown = text;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch {
    // not JSON: keep the text
  }
  return { status: res.status, body: parsed, res };
}
