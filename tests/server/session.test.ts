// Signing in and out, sessions that expire, and the limits on failed sign-ins.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { appInternals } from '../../server/app.ts';
import { DEFAULT_LIMITS, type SignInLimits } from '../../server/auth/rate-limit.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { limitHitsTable } from '../../server/db/schema.ts';
import { emailOf, getJson, openTestDatabase, PASSWORD, sendJson, sessionCookie, startTestServer, type TestServer } from './harness.ts';

let handle: DatabaseHandle;
beforeAll(async () => {
  handle = await openTestDatabase();
}, 180_000);
afterAll(async () => {
  await handle?.close();
});

describe('signing in', () => {
  let t: TestServer;
  beforeAll(async () => {
    t = await startTestServer(handle);
  });
  afterAll(async () => t?.close());

  it('answers a right e-mail and password with the user, their permissions and an httpOnly SameSite=Lax cookie', async () => {
    const { status, body, res } = await sendJson(`${t.url}/api/session`, 'POST', { email: emailOf('bench'), password: PASSWORD });
    expect(status).toBe(200);
    expect(body).toMatchObject({ user: { email: 'bench@tidewater.example', role: 'bench' }, permissions: ['read:formula:active', 'read:plan', 'read:catalog', 'read:record', 'write:record'] });
    const set = res.headers.getSetCookie()[0];
    expect(set).toMatch(/^panform_session=[A-Za-z0-9_-]{43};/);
    expect(set).toMatch(/HttpOnly/);
    expect(set).toMatch(/SameSite=Lax/);
    expect(set).not.toMatch(/Secure/);
    expect(set).toMatch(/Max-Age=1209600/); // 14 days, the SESSION_DAYS default
  });

  it('accepts the e-mail address in any case and with spaces around it', async () => {
    const { status } = await sendJson(`${t.url}/api/session`, 'POST', { email: '  Reviewer@Tidewater.EXAMPLE ', password: PASSWORD });
    expect(status).toBe(200);
  });

  it('refuses a wrong password and an unknown address alike, with 401', async () => {
    const wrong = await sendJson(`${t.url}/api/session`, 'POST', { email: emailOf('admin'), password: 'not the password' });
    const unknown = await sendJson(`${t.url}/api/session`, 'POST', { email: 'ghost@tidewater.example', password: PASSWORD });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.res.headers.getSetCookie()).toEqual([]);
  });

  it('shows who is signed in at /api/me and nobody without a cookie', async () => {
    const cookie = await t.signIn('author');
    expect(await getJson(`${t.url}/api/me`, cookie)).toMatchObject({ status: 200, body: { user: { role: 'author' } } });
    expect(await getJson(`${t.url}/api/me`)).toMatchObject({ status: 401, body: { error: 'unauthenticated' } });
    expect(await getJson(`${t.url}/api/me`, 'panform_session=made-up-token')).toMatchObject({ status: 401 });
  });

  it('keeps the units setting on the account: metric at first, US once chosen, in /api/me and at the next sign-in', async () => {
    const cookie = await t.signIn('reviewer');
    expect((await getJson(`${t.url}/api/me`, cookie)).body).toMatchObject({ unitSystem: 'metric' });
    const saved = await sendJson(`${t.url}/api/me/preferences`, 'PUT', { unitSystem: 'us' }, { cookie });
    expect(saved).toMatchObject({ status: 200, body: { unitSystem: 'us', user: { role: 'reviewer' } } });
    expect((await getJson(`${t.url}/api/me`, cookie)).body).toMatchObject({ unitSystem: 'us' });
    const again = await sendJson(`${t.url}/api/session`, 'POST', { email: emailOf('reviewer'), password: PASSWORD });
    expect(again.body).toMatchObject({ unitSystem: 'us' });
    // Another person's setting is their own.
    expect((await getJson(`${t.url}/api/me`, await t.signIn('bench'))).body).toMatchObject({ unitSystem: 'metric' });
    const wrong = await sendJson(`${t.url}/api/me/preferences`, 'PUT', { unitSystem: 'imperial' }, { cookie });
    expect(wrong).toMatchObject({ status: 422, body: { message: 'unitSystem must be one of metric, us; got "imperial"' } });
    expect((await sendJson(`${t.url}/api/me/preferences`, 'PUT', { unitSystem: 'us' })).status).toBe(401);
    await sendJson(`${t.url}/api/me/preferences`, 'PUT', { unitSystem: 'metric' }, { cookie });
  });

  it('ends the session on sign-out: the old cookie no longer works and is cleared', async () => {
    const cookie = await t.signIn('author');
    const out = await fetch(`${t.url}/api/session`, { method: 'DELETE', headers: { cookie } });
    expect(out.status).toBe(204);
    expect(out.headers.getSetCookie()[0]).toMatch(/^panform_session=;.*Expires=Thu, 01 Jan 1970/);
    expect((await getJson(`${t.url}/api/me`, cookie)).status).toBe(401);
  });

  it('lets a session expire after SESSION_DAYS', async () => {
    const cookie = await t.signIn('reviewer');
    t.clock.now += 13.9 * 24 * 3600 * 1000;
    expect((await getJson(`${t.url}/api/me`, cookie)).status).toBe(200);
    t.clock.now += 0.2 * 24 * 3600 * 1000;
    expect((await getJson(`${t.url}/api/me`, cookie)).status).toBe(401);
  });

  it('marks the cookie Secure when the request came over HTTPS through a trusted proxy', async () => {
    const proxied = await startTestServer(handle, { envVars: { TRUST_PROXY: 'loopback', PANFORM_PUBLIC_URL: 'https://panform.tidewater.example' } });
    try {
      const { res } = await sendJson(`${proxied.url}/api/session`, 'POST', { email: emailOf('bench'), password: PASSWORD }, { 'x-forwarded-proto': 'https' });
      expect(res.status).toBe(200);
      expect(res.headers.getSetCookie()[0]).toMatch(/; Secure/);
    } finally {
      await proxied.close();
    }
  });
});

describe('limits on failed sign-ins', () => {
  let t: TestServer;
  afterEach(async () => {
    await t?.close();
    // The counts live in the database: each test starts from none.
    await handle.db.delete(limitHitsTable);
  });
  const signIn = (email: string, password: string, from?: string) =>
    sendJson(`${t.url}/api/session`, 'POST', { email, password }, from ? { 'x-forwarded-for': from } : {});
  const proxied = (limits: Partial<SignInLimits> = {}) => startTestServer(handle, { envVars: { TRUST_PROXY: 'loopback' }, limits: { ...DEFAULT_LIMITS, ...limits } });

  it('answers 429 after 5 failures for one account from one address, even with the right password, until the window has passed', async () => {
    t = await startTestServer(handle, { limits: { ...DEFAULT_LIMITS, slowdownStepMs: 0 } });
    for (let i = 0; i < 5; i++) expect((await signIn(emailOf('bench'), `guess ${i} wrong`)).status).toBe(401);
    const blocked = await signIn(emailOf('bench'), PASSWORD);
    expect(blocked.status).toBe(429);
    expect(blocked.body).toMatchObject({ error: 'rate_limited' });
    expect(Number(blocked.res.headers.get('retry-after'))).toBe(900); // the 15-minute window
    // Another account from the same address is not locked out by this one's failures.
    expect((await signIn(emailOf('admin'), PASSWORD)).status).toBe(200);
    t.clock.now += 15 * 60 * 1000 + 1;
    expect((await signIn(emailOf('bench'), PASSWORD)).status).toBe(200);
  });

  it('lets the right password through from an address that has not failed: five wrong from five addresses lock nobody out', async () => {
    t = await proxied();
    for (let i = 0; i < 5; i++) expect((await signIn(emailOf('admin'), 'wrong password', `203.0.113.${i + 1}`)).status).toBe(401);
    const verdict = await appInternals(t.app).limiters.signIn.attempt(emailOf('admin'), '198.51.100.7');
    expect(verdict).toMatchObject({ allowed: true, delayMs: 0 });
    expect((await signIn(emailOf('admin'), PASSWORD, '198.51.100.8')).status).toBe(200);
    // An address that did fail is slowed down on that account, not shut out.
    const again = await appInternals(t.app).limiters.signIn.attempt(emailOf('admin'), '203.0.113.1');
    expect(again.allowed).toBe(true);
    expect(again.allowed && again.delayMs).toBeGreaterThan(0);
  });

  it('slows an address down after 20 failures on made-up accounts, and still lets the right password in from it', async () => {
    t = await proxied({ slowdownStepMs: 5, slowdownMaxMs: 40 });
    for (let i = 0; i < 20; i++) expect((await signIn(`guess${i}@tidewater.example`, 'wrong password', '192.0.2.10')).status).toBe(401);
    const verdict = await appInternals(t.app).limiters.signIn.attempt('someone@tidewater.example', '192.0.2.10');
    expect(verdict).toMatchObject({ allowed: true, delayMs: 5 });
    expect((await signIn(emailOf('bench'), PASSWORD, '192.0.2.10')).status).toBe(200);
    // Another address behind nothing of this is not slowed at all.
    expect(await appInternals(t.app).limiters.signIn.attempt(emailOf('bench'), '192.0.2.11')).toMatchObject({ allowed: true, delayMs: 0 });
  });

  it('keeps a lock however many other addresses and accounts fail meanwhile (counted in the database)', async () => {
    t = await startTestServer(handle, { limits: { ...DEFAULT_LIMITS, slowdownStepMs: 0 } });
    const { signIn: throttle } = appInternals(t.app).limiters;
    for (let i = 0; i < 5; i++) expect(await throttle.attempt(emailOf('reviewer'), '198.51.100.20')).toMatchObject({ allowed: true });
    // The old in-memory limiter kept a bounded number of keys and dropped the oldest first.
    await Promise.all(Array.from({ length: 200 }, (_, i) => throttle.attempt(`flood${i}@tidewater.example`, `10.9.${i >> 8}.${i & 255}`)));
    expect(await throttle.attempt(emailOf('reviewer'), '198.51.100.20')).toMatchObject({ allowed: false });
  });

  it('clears an account\'s failures from an address when it signs in from there', async () => {
    t = await startTestServer(handle, { limits: { ...DEFAULT_LIMITS, slowdownStepMs: 0 } });
    for (let round = 0; round < 3; round++) {
      for (let i = 0; i < 4; i++) await signIn(emailOf('author'), 'wrong password');
      expect((await signIn(emailOf('author'), PASSWORD)).status).toBe(200);
    }
  });

  it('counts guesses sent all at once: no more than 5 are tried', async () => {
    t = await startTestServer(handle, { limits: { ...DEFAULT_LIMITS, slowdownStepMs: 0 } });
    const answers = await Promise.all(Array.from({ length: 12 }, (_, i) => signIn(emailOf('reviewer'), `parallel guess ${i}`)));
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses.filter((s) => s === 401)).toHaveLength(5);
    expect(statuses.filter((s) => s === 429)).toHaveLength(7);
  });

  it('does not count successful sign-ins against the address', async () => {
    t = await startTestServer(handle);
    for (let i = 0; i < 25; i++) expect((await signIn(emailOf('admin'), PASSWORD)).status).toBe(200);
  });

  it('counts the client address from X-Forwarded-For only behind a trusted proxy', async () => {
    t = await startTestServer(handle, { limits: { ...DEFAULT_LIMITS, pair: { max: 2, windowMs: 60_000 }, slowdownStepMs: 0 } });
    // Untrusted: a forged X-Forwarded-For does not give a fresh address.
    for (let i = 0; i < 2; i++) await signIn(emailOf('bench'), 'wrong password', `10.0.0.${i}`);
    expect((await signIn(emailOf('bench'), PASSWORD, '10.0.0.99')).status).toBe(429);
  });
});

describe('the session cookie', () => {
  it('is read from a Cookie header among other cookies', async () => {
    const t = await startTestServer(handle);
    try {
      const res = await fetch(`${t.url}/api/session`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: emailOf('admin'), password: PASSWORD }),
      });
      const cookie = sessionCookie(res);
      expect((await getJson(`${t.url}/api/me`, `theme=dark; ${cookie}; lang=en`)).status).toBe(200);
    } finally {
      await t.close();
    }
  });
});
