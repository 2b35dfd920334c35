// Accounts for admins through the API: add (with a link to set a password), change a role,
// remove, send a reset link, and the audit list of who changed what.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AccountListResponse, AccountSummary, AuditListResponse } from '#shared/api';
import { appInternals } from '../../server/app.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { emailOf, getJson, openTestDatabase, sendJson, sessionCookie, startTestServer, type TestServer } from './harness.ts';

let handle: DatabaseHandle;
let t: TestServer;
let admin: string;
beforeAll(async () => {
  handle = await openTestDatabase();
  t = await startTestServer(handle);
  admin = await t.signIn('admin');
}, 180_000);
afterAll(async () => {
  await t?.close();
  await handle?.close();
});

const asAdmin = (method: string, path: string, body?: unknown) => sendJson(`${t.url}${path}`, method, body, { cookie: admin });

async function linkFor(email: string): Promise<string> {
  await appInternals(t.app).idle();
  const mail = t.outbox.filter((m) => m.to === email).at(-1);
  if (!mail) throw new Error(`no mail to ${email}`);
  return /token=([A-Za-z0-9_-]+)/.exec(mail.text)![1];
}

describe('accounts through the API', () => {
  it('adds an account (201), mails the person a link, and they sign in with the password they chose', async () => {
    const added = await asAdmin('POST', '/api/users', { email: ' Nell@Tidewater.example ', name: 'Nell Ashdown', role: 'bench' });
    expect(added.status).toBe(201);
    expect((added.body as { user: AccountSummary }).user).toMatchObject({ email: 'nell@tidewater.example', name: 'Nell Ashdown', role: 'bench' });
    const token = await linkFor('nell@tidewater.example');
    expect(t.outbox.at(-1)!.subject).toBe('Panform: your new account');
    expect((await sendJson(`${t.url}/api/password-reset/confirm`, 'POST', { token, password: 'flour on my hands' })).status).toBe(204);
    const signedIn = await sendJson(`${t.url}/api/session`, 'POST', { email: 'nell@tidewater.example', password: 'flour on my hands' });
    expect(signedIn.status).toBe(200);
    const list = (await getJson(`${t.url}/api/users`, admin)).body as AccountListResponse;
    expect(list.users.map((u) => u.email)).toContain('nell@tidewater.example');
    expect(JSON.stringify(list)).not.toMatch(/scrypt|password_hash|passwordHash/);
  });

  it('refuses a second account for one address (409) and a role that does not exist (422)', async () => {
    expect((await asAdmin('POST', '/api/users', { email: emailOf('bench'), name: '', role: 'bench' })).status).toBe(409);
    expect((await asAdmin('POST', '/api/users', { email: 'x@tidewater.example', name: '', role: 'owner' })).status).toBe(422);
    expect((await asAdmin('POST', '/api/users', { email: 'not an address', name: '', role: 'bench' })).status).toBe(422);
  });

  it('changes a role: the person\'s open session has the new role on its next request', async () => {
    await asAdmin('POST', '/api/users', { email: 'odile@tidewater.example', name: 'Odile Vance', role: 'bench' });
    await sendJson(`${t.url}/api/password-reset/confirm`, 'POST', { token: await linkFor('odile@tidewater.example'), password: 'rye and caraway' });
    const cookie = sessionCookie((await sendJson(`${t.url}/api/session`, 'POST', { email: 'odile@tidewater.example', password: 'rye and caraway' })).res);
    const id = ((await getJson(`${t.url}/api/me`, cookie)).body as { user: { id: number } }).user.id;
    const changed = await asAdmin('PATCH', `/api/users/${id}`, { role: 'reviewer' });
    expect(changed).toMatchObject({ status: 200, body: { user: { role: 'reviewer' } } });
    expect((await getJson(`${t.url}/api/me`, cookie)).body).toMatchObject({ user: { role: 'reviewer' } });

    // Removed: signed out at once.
    expect((await asAdmin('DELETE', `/api/users/${id}`)).status).toBe(204);
    expect((await getJson(`${t.url}/api/me`, cookie)).status).toBe(401);
    expect((await asAdmin('DELETE', `/api/users/${id}`)).status).toBe(404);
  });

  it('keeps one admin at least: the only admin cannot be demoted or removed (409)', async () => {
    const me = ((await getJson(`${t.url}/api/me`, admin)).body as { user: { id: number } }).user.id;
    expect((await asAdmin('PATCH', `/api/users/${me}`, { role: 'bench' })).status).toBe(409);
    expect((await asAdmin('DELETE', `/api/users/${me}`)).status).toBe(409);
  });

  it('sends a reset link on request (202) and lists every change with who made it', async () => {
    const list = (await getJson(`${t.url}/api/users`, admin)).body as AccountListResponse;
    const bench = list.users.find((u) => u.email === emailOf('bench'))!;
    expect((await asAdmin('POST', `/api/users/${bench.id}/password-reset`)).status).toBe(202);
    expect(await linkFor(emailOf('bench'))).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const audit = (await getJson(`${t.url}/api/audit`, admin)).body as AuditListResponse;
    const seen = audit.entries.map((e) => `${e.actor} ${e.action} ${e.target} ${e.detail}`.trim());
    expect(seen).toEqual(
      expect.arrayContaining([
        `${emailOf('admin')} account.add nell@tidewater.example as bench`,
        `${emailOf('admin')} account.role odile@tidewater.example bench → reviewer`,
        `${emailOf('admin')} account.remove odile@tidewater.example was reviewer`,
        `${emailOf('admin')} account.reset-link ${emailOf('bench')}`,
      ]),
    );
    // Newest first.
    expect(audit.entries[0].action).toBe('account.reset-link');
  });
});
