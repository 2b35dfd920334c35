// `panform serve --demo` on a fresh data folder, end to end, then `panform user` on the same
// folder: the demo accounts, the lock while the server runs, and adding, listing, resetting and
// removing accounts. One data folder for the file: creating one takes seconds to a minute.
import type { ChildProcess } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildCli, ROOT, type BuiltCli } from './arithmetic-cli.ts';
import { startServe as startServeIn } from './serve-process.ts';

let cli: BuiltCli;
let dir: string;
let data: string;
let server: ChildProcess | undefined;

beforeAll(async () => {
  cli = await buildCli();
  dir = mkdtempSync(join(tmpdir(), 'panform-serve-'));
  data = join(dir, 'data');
  cpSync(join(ROOT, 'formulas'), join(dir, 'formulas'), { recursive: true });
}, 180_000);
afterAll(() => {
  if (server && server.exitCode === null) server.kill('SIGKILL');
  cli?.dispose();
  rmSync(dir, { recursive: true, force: true });
});

/** Starts `panform serve --demo` from source in `dir` and resolves with its output once it listens. */
function startServe() {
  return startServeIn(dir, data, (child) => {
    server = child;
  });
}

describe('panform serve --demo', () => {
  let accounts: Map<string, string>;

  it('loads the demo bakery, prints one account per role once, writes them to a private file, and serves', async () => {
    const s = await startServe();
    const out = s.stdout();
    expect(out).toMatch(/Loaded the demo bakery: 11 formulas/);
    // Beside --data DIR, not in ./var.
    const file = join(dir, 'demo-accounts.txt');
    expect(statSync(file).mode & 0o777).toBe(0o600);
    expect(existsSync(join(dir, 'var'))).toBe(false);
    accounts = new Map([...readFileSync(file, 'utf8').matchAll(/^\s+(\w+)\s+(\S+@tidewater\.example)\s+(\S+)$/gm)].map((m) => [m[1], m[3]]));
    expect([...accounts.keys()].sort()).toEqual(['admin', 'author', 'bench', 'reviewer']);
    for (const [role, password] of accounts) expect(out).toContain(password), expect(password).toMatch(/^[A-Za-z0-9]{16}$/), expect(role).toBeTruthy();

    const signIn = await fetch(`${s.url}/api/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'bench@tidewater.example', password: accounts.get('bench') }),
    });
    expect(signIn.status).toBe(200);
    const cookie = signIn.headers.getSetCookie()[0].split(';')[0];
    const adminSignIn = await fetch(`${s.url}/api/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'admin@tidewater.example', password: accounts.get('admin') }),
    });
    const adminCookie = adminSignIn.headers.getSetCookie()[0].split(';')[0];
    const list = (await (await fetch(`${s.url}/api/formulas`, { headers: { cookie } })).json()) as { formulas: unknown[] };
    expect(list.formulas.length).toBe(9); // the 11 demo formulas less one draft and one retired
    const page = await fetch(`${s.url}/plans/2026-12-03`);
    expect(page.status).toBe(200);
    expect(await page.text()).toMatch(/<div id="root">/);

    // While the server holds the folder, `panform user` hands its changes to it.
    const listed = await cli.run(['user', 'list', '--json', '--data', data]);
    expect(listed.code, listed.stderr).toBe(0);
    expect((JSON.parse(listed.stdout) as { email: string }[]).map((u) => u.email)).toContain('bench@tidewater.example');
    const added = await cli.run(['user', 'add', 'odile@tidewater.example', '--role', 'bench', '--password-stdin', '--data', data], { input: 'rye and caraway\n' });
    expect(added.code, added.stderr).toBe(0);
    const odile = await fetch(`${s.url}/api/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'odile@tidewater.example', password: 'rye and caraway' }),
    });
    expect(odile.status).toBe(200);
    const odileCookie = odile.headers.getSetCookie()[0].split(';')[0];
    expect((await fetch(`${s.url}/api/me`, { headers: { cookie: odileCookie } })).status).toBe(200);
    const removed = await cli.run(['user', 'remove', 'odile@tidewater.example', '--data', data]);
    expect(removed.code, removed.stderr).toBe(0);
    // Signed out at once, though the server keeps sessions in memory for a moment.
    expect((await fetch(`${s.url}/api/me`, { headers: { cookie: odileCookie } })).status).toBe(401);
    const audit = (await (await fetch(`${s.url}/api/audit`, { headers: { cookie: adminCookie } })).json()) as { entries: { action: string; actor: string; target: string }[] };
    expect(audit.entries.slice(0, 2).map((e) => `${e.action} ${e.target}`)).toEqual(['account.remove odile@tidewater.example', 'account.add odile@tidewater.example']);
    expect(audit.entries[0].actor).toMatch(/^panform user \(/);

    server!.kill('SIGTERM');
    expect(await s.exited).toBe(0);
    expect(s.stdout()).toMatch(/Panform stopped; the database is closed/);
  }, 300_000);

  it('keeps the accounts on the next start and prints no passwords', async () => {
    const s = await startServe();
    expect(s.stdout()).not.toMatch(/Demo accounts/);
    expect(s.stdout()).not.toMatch(/Loaded the demo bakery/);
    server!.kill('SIGINT');
    expect(await s.exited).toBe(0);
  }, 300_000);
});

describe('panform user', () => {
  it('adds, lists, resets and removes accounts', async () => {
    const add = await cli.run(['user', 'add', 'Ines@Tidewater.example', '--role', 'author', '--name', 'Ines Calloway', '--password-stdin', '--data', data], { input: 'a long enough password\n' });
    expect(add).toMatchObject({ code: 0 });
    expect(add.stdout).toContain('Added ines@tidewater.example (author).');

    const again = await cli.run(['user', 'add', 'ines@tidewater.example', '--role', 'bench', '--password-stdin', '--data', data], { input: 'another long password\n' });
    expect(again.code).toBe(1);
    expect(again.stderr).toMatch(/already exists/);

    const list = await cli.run(['user', 'list', '--json', '--data', data]);
    expect(list.code).toBe(0);
    const users = JSON.parse(list.stdout) as { email: string; role: string; name: string }[];
    expect(users.map((u) => u.email)).toEqual([
      'admin@tidewater.example', 'author@tidewater.example', 'bench@tidewater.example', 'ines@tidewater.example', 'reviewer@tidewater.example',
    ]);
    expect(users.find((u) => u.email === 'ines@tidewater.example')).toMatchObject({ role: 'author', name: 'Ines Calloway' });

    const short = await cli.run(['user', 'reset', 'ines@tidewater.example', '--password-stdin', '--data', data], { input: 'short\n' });
    expect(short.code).toBe(1);
    expect(short.stderr).toMatch(/at least 10 characters/);
    const reset = await cli.run(['user', 'reset', 'ines@tidewater.example', '--password-stdin', '--data', data], { input: 'a different long password\n' });
    expect(reset.code).toBe(0);

    expect((await cli.run(['user', 'remove', 'ines@tidewater.example', '--data', data])).code).toBe(0);
    const gone = await cli.run(['user', 'remove', 'ines@tidewater.example', '--data', data]);
    expect(gone.code).toBe(1);
    expect(gone.stderr).toMatch(/no account for ines@tidewater.example/);
  }, 300_000);

  it.each([
    [['user', 'add', 'not-an-address', '--role', 'bench', '--password-stdin']],
    [['user', 'add', 'a@tidewater.example', '--role', 'baker', '--password-stdin']],
    [['user', 'add', 'a@tidewater.example', '--password-stdin']],
  ])('treats %j as misuse (exit 2)', async (args) => {
    const r = await cli.run([...args, '--data', data], { input: 'a long enough password\n' });
    expect(r.code).toBe(2);
  });

  it('asks for --password-stdin when there is no terminal to type in', async () => {
    const r = await cli.run(['user', 'add', 'b@tidewater.example', '--role', 'bench', '--data', data]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--password-stdin/);
  });
});
