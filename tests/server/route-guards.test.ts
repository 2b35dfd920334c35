// Every route under /api, read from the app's routers themselves, must answer 401 without a
// session (unless listed as public) and follow the role matrix. A route added without an entry
// here, or without a guard, fails this suite.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { loadFolder } from '../../server/load/index.ts';
import { createInternalLoadRouter } from '../../server/routes/internal-load.ts';
import { ROLES, type Role } from '#shared/permissions';
import { openTestDatabase, startTestServer, type TestServer } from './harness.ts';

type Who = 'anonymous' | Role;
type Expect = Record<Who, number>;

interface Case {
  label: string;
  method: string;
  path: string;
  body?: unknown;
  expect: Expect;
}

const all = (status: number, anonymous = 401): Expect => ({ anonymous, admin: status, author: status, reviewer: status, bench: status });
const adminOnly = (admin: number): Expect => ({ anonymous: 401, admin, author: 403, reviewer: 403, bench: 403 });
const staffOnly = (bench: number, others = 200): Expect => ({ anonymous: 401, admin: others, author: others, reviewer: others, bench });

/** Cases for each route under /api ("METHOD /full/path" as the routers write it). */
const MATRIX: Record<string, Case[]> = {
  'POST /api/session': [
    { label: 'wrong password', method: 'POST', path: '/api/session', body: { email: 'nobody@tidewater.example', password: 'wrong wrong' }, expect: all(401, 401) },
  ],
  'DELETE /api/session': [{ label: 'sign out', method: 'DELETE', path: '/api/session', expect: all(204) }],
  'GET /api/me': [{ label: 'me', method: 'GET', path: '/api/me', expect: all(200) }],
  'POST /api/password-reset': [
    { label: 'reset request', method: 'POST', path: '/api/password-reset', body: { email: 'nobody@tidewater.example' }, expect: all(202, 202) },
  ],
  'PUT /api/me/preferences': [
    { label: 'units', method: 'PUT', path: '/api/me/preferences', body: { unitSystem: 'metric' }, expect: all(200) },
  ],
  'POST /api/password-reset/check': [
    { label: 'bad token', method: 'POST', path: '/api/password-reset/check', body: { token: 'nope' }, expect: all(422, 422) },
  ],
  'POST /api/password-reset/confirm': [
    { label: 'bad token', method: 'POST', path: '/api/password-reset/confirm', body: { token: 'nope', password: 'long enough password' }, expect: all(422, 422) },
  ],
  'GET /api/formulas': [
    { label: 'list', method: 'GET', path: '/api/formulas', expect: all(200) },
    { label: 'list drafts', method: 'GET', path: '/api/formulas?status=draft', expect: staffOnly(403) },
    { label: 'list retired', method: 'GET', path: '/api/formulas?status=retired', expect: staffOnly(403) },
  ],
  'GET /api/formulas/:id': [
    { label: 'active', method: 'GET', path: '/api/formulas/harbour-ciabatta', expect: all(200) },
    { label: 'draft (404 for bench: as if unknown)', method: 'GET', path: '/api/formulas/spelt-porridge-loaf', expect: staffOnly(404) },
    { label: 'retired (404 for bench: as if unknown)', method: 'GET', path: '/api/formulas/malted-grain-loaf', expect: staffOnly(404) },
    { label: 'unknown', method: 'GET', path: '/api/formulas/no-such-bread', expect: all(404) },
  ],
  'GET /api/formulas/:id/water': [
    { label: 'a bake day', method: 'GET', path: '/api/formulas/harbour-ciabatta/water?plan=2026-12-03', expect: all(200) },
    { label: 'no readings', method: 'GET', path: '/api/formulas/harbour-ciabatta/water', expect: all(422) },
    { label: 'draft (404 for bench: as if unknown)', method: 'GET', path: '/api/formulas/spelt-porridge-loaf/water?room=22&flour=20&rise=4', expect: staffOnly(404) },
  ],
  'GET /api/formulas/:id/revisions': [
    { label: 'active', method: 'GET', path: '/api/formulas/harbour-ciabatta/revisions', expect: staffOnly(403) },
    { label: 'draft', method: 'GET', path: '/api/formulas/spelt-porridge-loaf/revisions', expect: staffOnly(403) },
  ],
  'GET /api/formulas/:id/diff': [
    { label: 'two revisions', method: 'GET', path: '/api/formulas/harbour-ciabatta/diff?from=1&to=2', expect: staffOnly(403) },
  ],
  'GET /api/changes': [{ label: 'changes', method: 'GET', path: '/api/changes', expect: staffOnly(403) }],
  'GET /api/plans': [{ label: 'plans', method: 'GET', path: '/api/plans', expect: all(200) }],
  'GET /api/plans/:date': [
    { label: 'a plan', method: 'GET', path: '/api/plans/2026-12-03', expect: all(200) },
    { label: 'no plan', method: 'GET', path: '/api/plans/2030-01-01', expect: all(404) },
  ],
  'GET /api/plans/:date/sheet.pdf': [{ label: 'pdf', method: 'GET', path: '/api/plans/2026-12-03/sheet.pdf', expect: all(200) }],
  // Bench records: every role reads and writes them (a JSON body is refused: records are multipart); admins hide.
  'POST /api/plans/:date/records': [{ label: 'not multipart', method: 'POST', path: '/api/plans/2026-12-03/records', body: { target: 'poolish' }, expect: all(415) }],
  'GET /api/plans/:date/records': [
    { label: 'a day', method: 'GET', path: '/api/plans/2026-12-03/records', expect: all(200) },
    { label: 'no plan', method: 'GET', path: '/api/plans/2030-01-01/records', expect: all(404) },
  ],
  'GET /api/plans/:date/records.csv': [{ label: 'a day as CSV', method: 'GET', path: '/api/plans/2026-12-03/records.csv', expect: all(200) }],
  'GET /api/records.csv': [{ label: 'a month as CSV', method: 'GET', path: '/api/records.csv?from=2026-12-01&to=2026-12-31', expect: all(200) }],
  'GET /api/records/:id/photos/:n': [{ label: 'unknown record', method: 'GET', path: '/api/records/999999/photos/1', expect: all(404) }],
  'POST /api/records/:id/hide': [{ label: 'unknown record', method: 'POST', path: '/api/records/999999/hide', body: { reason: 'wrong day' }, expect: adminOnly(404) }],
  'GET /api/friction': [{ label: 'friction table', method: 'GET', path: '/api/friction', expect: all(200) }],
  'GET /api/catalog': [{ label: 'catalog', method: 'GET', path: '/api/catalog', expect: all(200) }],
  // Accounts: admins only; the cases change nothing (an unknown id, a role that does not exist).
  'GET /api/users': [{ label: 'accounts', method: 'GET', path: '/api/users', expect: adminOnly(200) }],
  'POST /api/users': [{ label: 'unknown role', method: 'POST', path: '/api/users', body: { email: 'new@tidewater.example', name: 'New', role: 'baker' }, expect: adminOnly(422) }],
  'PATCH /api/users/:id': [{ label: 'unknown account', method: 'PATCH', path: '/api/users/999999', body: { role: 'bench' }, expect: adminOnly(404) }],
  'DELETE /api/users/:id': [{ label: 'unknown account', method: 'DELETE', path: '/api/users/999999', expect: adminOnly(404) }],
  'POST /api/users/:id/password-reset': [{ label: 'unknown account', method: 'POST', path: '/api/users/999999/password-reset', expect: adminOnly(404) }],
  'GET /api/audit': [{ label: 'audit', method: 'GET', path: '/api/audit', expect: adminOnly(200) }],
  // The local load channel has its own guard (loopback and the lock file's token), not sessions.
  'POST /api/internal/load/': [{ label: 'load without its token', method: 'POST', path: '/api/internal/load', body: { folder: '/tmp' }, expect: all(401) }],
};

interface RouteLayer {
  rawPath?: string;
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: RouteLayer[] };
}

/** "METHOD /full/path" for every route of the app, descending into mounted routers. */
function routesOf(stack: RouteLayer[], prefix = ''): string[] {
  const out: string[] = [];
  for (const layer of stack) {
    if (layer.route) {
      for (const m of Object.keys(layer.route.methods)) if (m !== '_all') out.push(`${m.toUpperCase()} ${prefix}${layer.route.path}`);
    } else if (layer.handle?.stack) {
      const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
      out.push(...routesOf(layer.handle.stack, prefix + mount));
    }
  }
  return out;
}

let handle: DatabaseHandle;
let t: TestServer;
const cookies = new Map<Role, string>();
let folder: string;

beforeAll(async () => {
  handle = await openTestDatabase();
  // A second revision of one formula, so the diff route has two to compare.
  folder = mkdtempSync(join(tmpdir(), 'panform-routes-'));
  cpSync(resolve('formulas'), folder, { recursive: true });
  const file = join(folder, 'harbour-ciabatta.yaml');
  writeFileSync(file, readFileSync(file, 'utf8').replace(/^title: (.*)$/m, 'title: $1 (revised)'));
  await loadFolder(handle, folder, { git: false });
  t = await startTestServer(handle, { internalLoadRouter: createInternalLoadRouter({ handle, dataDir: folder, token: 'the-lock-file-token' }) });
}, 180_000);
afterAll(async () => {
  await t?.close();
  await handle?.close();
  rmSync(folder, { recursive: true, force: true });
});

async function call(c: Case, cookie: string | undefined): Promise<number> {
  const headers: Record<string, string> = {};
  if (cookie) headers.cookie = cookie;
  if (c.body !== undefined) headers['content-type'] = 'application/json';
  const res = await fetch(`${t.url}${c.path}`, { method: c.method, headers, body: c.body === undefined ? undefined : JSON.stringify(c.body) });
  await res.arrayBuffer();
  return res.status;
}

describe('the /api routes', () => {
  it('has a role-matrix entry for every route, and every entry is a route', () => {
    const routes = routesOf((t.app as unknown as { router: { stack: RouteLayer[] } }).router.stack).filter((r) => / \/api(\/|$)/.test(r));
    expect(routes.length).toBeGreaterThan(10);
    expect(routes.filter((r) => !(r in MATRIX))).toEqual([]);
    expect(Object.keys(MATRIX).filter((k) => !routes.includes(k))).toEqual([]);
  });

  const cases = Object.values(MATRIX).flat();

  it.each(cases.map((c) => [c.method, c.path, c]))('answers %s %s without a session as the matrix says', async (_m, _p, c) => {
    expect(await call(c, undefined)).toBe(c.expect.anonymous);
  });

  it.each(ROLES.flatMap((role) => cases.map((c) => [role, c.method, c.path, c] as const)))(
    'answers %s for %s %s as the matrix says',
    async (role, _m, _p, c) => {
      // Signing out ends the session: that case gets a session of its own.
      let cookie = cookies.get(role);
      if (!cookie || c.method === 'DELETE') {
        cookie = await t.signIn(role);
        if (c.method !== 'DELETE') cookies.set(role, cookie);
      }
      expect(await call(c, cookie)).toBe(c.expect[role]);
    },
  );

  it('answers an unknown /api path with a JSON 404, not the viewer', async () => {
    const res = await fetch(`${t.url}/api/no-such-thing`, { headers: { cookie: cookies.get('admin') ?? (await t.signIn('admin')) } });
    expect(res.status).toBe(404);
    expect(await res.json()).toMatchObject({ error: 'not_found' });
  });
});
