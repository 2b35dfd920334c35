// A Panform server for tests: in-memory PGlite, migrated, the demo formulas loaded, one account
// per role, listening on a random loopback port. The clock is a number the test moves forward.
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { resolve } from 'node:path';
import { appInternals, createApp, type AppOptions } from '../../server/app.ts';
import type { ScryptParams } from '../../server/auth/password.ts';
import { createUser } from '../../server/auth/users.ts';
import type { OutgoingMail } from '../../server/context.ts';
import { migrateDatabase, openDatabase, type DatabaseHandle } from '../../server/db/client.ts';
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

/** One database per test file (creating it takes seconds); apps can be made more than once over it. */
export async function openTestDatabase(): Promise<DatabaseHandle> {
  const handle = await openDatabase({ memory: true });
  await migrateDatabase(handle);
  await loadFolder(handle, resolve('formulas'), { git: false });
  for (const role of ROLES) {
    await createUser(handle.db, { email: emailOf(role), name: `Test ${role}`, role, password: PASSWORD }, TEST_SCRYPT);
  }
  return handle;
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
