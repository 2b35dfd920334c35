// Password reset by e-mail link: one-time, expiring, silent about which addresses have accounts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appInternals } from '../../server/app.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { emailOf, getJson, openTestDatabase, PASSWORD, sendJson, startTestServer, type TestServer } from './harness.ts';

let handle: DatabaseHandle;
let t: TestServer;
beforeAll(async () => {
  handle = await openTestDatabase();
  t = await startTestServer(handle);
}, 180_000);
afterAll(async () => {
  await t?.close();
  await handle?.close();
});

/** Asks for a link and returns the token from the e-mail. */
async function requestToken(email: string): Promise<string> {
  const before = t.outbox.length;
  const r = await sendJson(`${t.url}/api/password-reset`, 'POST', { email });
  expect(r.status).toBe(202);
  await appInternals(t.app).idle();
  expect(t.outbox.length).toBe(before + 1);
  const mail = t.outbox[t.outbox.length - 1];
  expect(mail.to).toBe(email);
  const m = /http:\/\/panform\.tidewater\.example\/reset-password\?token=([A-Za-z0-9_-]+)/.exec(mail.text);
  expect(m).not.toBeNull();
  return m![1];
}

const confirm = (token: string, password: string) => sendJson(`${t.url}/api/password-reset/confirm`, 'POST', { token, password });
const signIn = (email: string, password: string) => sendJson(`${t.url}/api/session`, 'POST', { email, password });

describe('password reset', () => {
  it('mails a link that sets a new password once, and signs the account out everywhere', async () => {
    const email = emailOf('reviewer');
    const oldSession = await t.signIn('reviewer');
    const token = await requestToken(email);
    expect((await confirm(token, 'a brand new password')).status).toBe(204);
    expect((await getJson(`${t.url}/api/me`, oldSession)).status).toBe(401);
    expect((await signIn(email, PASSWORD)).status).toBe(401);
    expect((await signIn(email, 'a brand new password')).status).toBe(200);

    const again = await confirm(token, 'yet another password');
    expect(again.status).toBe(422);
    expect(again.body).toMatchObject({ error: 'invalid' });
    expect((await signIn(email, 'yet another password')).status).toBe(401);
  });

  it('says whether a link still works before any password is typed, and changes nothing by asking', async () => {
    const check = (token: string) => sendJson(`${t.url}/api/password-reset/check`, 'POST', { token });
    const token = await requestToken(emailOf('admin'));
    expect(await check(token)).toMatchObject({ status: 200, body: { valid: true } });
    expect((await check(token)).status).toBe(200); // asking twice does not spend it
    expect((await confirm(token, 'a long admin password')).status).toBe(204);
    const spent = await check(token);
    expect(spent).toMatchObject({ status: 422, body: { message: expect.stringMatching(/^this reset link does not work: it was used already, it expired/) } });
    const late = await requestToken(emailOf('admin'));
    t.clock.now += 60 * 60 * 1000 + 1;
    expect((await check(late)).status).toBe(422);
    expect((await check('x'.repeat(43))).status).toBe(422);
    await confirm(await requestToken(emailOf('admin')), PASSWORD);
  });

  it('refuses a link used after an hour', async () => {
    const token = await requestToken(emailOf('author'));
    t.clock.now += 60 * 60 * 1000 + 1;
    expect((await confirm(token, 'too late a password')).status).toBe(422);
    expect((await signIn(emailOf('author'), PASSWORD)).status).toBe(200);
  });

  it('stops an older link working once a newer one has been used', async () => {
    const first = await requestToken(emailOf('bench'));
    const second = await requestToken(emailOf('bench'));
    expect((await confirm(second, 'the second password')).status).toBe(204);
    expect((await confirm(first, 'the first password!')).status).toBe(422);
  });

  it('answers 202 for an address without an account and sends nothing', async () => {
    const before = t.outbox.length;
    const r = await sendJson(`${t.url}/api/password-reset`, 'POST', { email: 'nobody@tidewater.example' });
    expect(r.status).toBe(202);
    await appInternals(t.app).idle();
    expect(t.outbox.length).toBe(before);
  });

  it('refuses a new password that is too short, and keeps the link usable', async () => {
    const token = await requestToken(emailOf('admin'));
    const short = await confirm(token, 'short');
    expect(short.status).toBe(422);
    expect(short.body).toMatchObject({ issues: [{ path: 'password' }] });
    expect((await confirm(token, 'a long admin password')).status).toBe(204);
  });

  it('refuses a made-up token', async () => {
    expect((await confirm('x'.repeat(43), 'a fine new password')).status).toBe(422);
  });
});
