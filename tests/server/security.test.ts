// What stops misuse before a handler runs: cross-site writes, bodies that are not JSON or too
// large, malformed fields; the security headers; and how the viewer's files are served.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { emailOf, openTestDatabase, PASSWORD, sendJson, startTestServer, type TestServer } from './harness.ts';

let handle: DatabaseHandle;
let t: TestServer;
let web: string;
beforeAll(async () => {
  handle = await openTestDatabase();
  web = mkdtempSync(join(tmpdir(), 'panform-web-'));
  mkdirSync(join(web, 'assets'));
  writeFileSync(join(web, 'index.html'), '<!doctype html><title>Panform</title><div id="root"></div>');
  writeFileSync(join(web, 'assets', 'index-abc123.js'), 'console.log(1)');
  t = await startTestServer(handle, { webDir: web });
}, 180_000);
afterAll(async () => {
  await t?.close();
  await handle?.close();
  rmSync(web, { recursive: true, force: true });
});

const signInBody = { email: emailOf('admin'), password: PASSWORD };

describe('cross-site requests', () => {
  it.each([
    [{ origin: 'http://evil.example' }],
    [{ origin: 'null' }],
    [{ 'sec-fetch-site': 'cross-site' }],
    [{ 'sec-fetch-site': 'same-site' }],
  ])('refuses a sign-in sent with %o', async (headers) => {
    const r = await sendJson(`${t.url}/api/session`, 'POST', signInBody, headers);
    expect(r.status).toBe(403);
    expect(r.res.headers.getSetCookie()).toEqual([]);
  });

  it.each([
    [{ origin: 'http://panform.tidewater.example' }],
    [{ 'sec-fetch-site': 'same-origin' }],
    [{}],
  ])('accepts a sign-in sent with %o', async (headers) => {
    expect((await sendJson(`${t.url}/api/session`, 'POST', signInBody, headers)).status).toBe(200);
  });

  it('accepts the server\'s own origin', async () => {
    expect((await sendJson(`${t.url}/api/session`, 'POST', signInBody, { origin: t.url })).status).toBe(200);
  });

  it('refuses a cross-site sign-out', async () => {
    const cookie = await t.signIn('bench');
    const res = await fetch(`${t.url}/api/session`, { method: 'DELETE', headers: { cookie, origin: 'http://evil.example' } });
    expect(res.status).toBe(403);
    expect((await fetch(`${t.url}/api/me`, { headers: { cookie } })).status).toBe(200);
  });
});

describe('malformed bodies', () => {
  it.each([
    ['application/x-www-form-urlencoded', 'email=a%40b.example&password=x'],
    ['text/plain', JSON.stringify(signInBody)],
    ['multipart/form-data; boundary=x', '--x--'],
  ])('refuses a %s body with 415', async (type, body) => {
    const res = await fetch(`${t.url}/api/session`, { method: 'POST', headers: { 'content-type': type }, body });
    expect(res.status).toBe(415);
    expect(await res.json()).toMatchObject({ error: 'invalid' });
  });

  it('refuses a body that is not JSON with 400', async () => {
    const r = await sendJson(`${t.url}/api/session`, 'POST', '{"email": "admin@tidewater.example", ');
    expect(r.status).toBe(400);
    expect(r.body).toMatchObject({ error: 'invalid', message: 'the request body is not valid JSON' });
  });

  it('refuses a JSON string or number at the top level with 400 (strict JSON)', async () => {
    expect((await sendJson(`${t.url}/api/session`, 'POST', '"just a string"')).status).toBe(400);
  });

  it.each([
    [{ email: 5, password: 'x' }, ['email']],
    [{ email: 'a@b.example', password: ['x'] }, ['password']],
    [{ email: null }, ['email', 'password']],
    [{}, ['email', 'password']],
    [{ email: '', password: '' }, ['email', 'password']],
    [{ email: 'a@b.example', password: 'x'.repeat(300) }, ['password']],
  ])('answers %o with 422 and one issue per bad field', async (body, fields) => {
    const r = await sendJson(`${t.url}/api/session`, 'POST', body);
    expect(r.status).toBe(422);
    expect((r.body as { issues: { path: string }[] }).issues.map((i) => i.path)).toEqual(fields);
  });

  it('answers a JSON array with 422', async () => {
    expect((await sendJson(`${t.url}/api/session`, 'POST', [1, 2])).status).toBe(422);
  });

  it('refuses a huge body with 413 before reading it all', async () => {
    const r = await sendJson(`${t.url}/api/session`, 'POST', { email: 'a@b.example', password: 'x'.repeat(200_000) });
    expect(r.status).toBe(413);
    expect(r.body).toMatchObject({ error: 'payload_too_large' });
  });

  it('refuses a huge reset request and confirm body alike', async () => {
    expect((await sendJson(`${t.url}/api/password-reset`, 'POST', { email: 'y'.repeat(50_000) })).status).toBe(413);
    expect((await sendJson(`${t.url}/api/password-reset/confirm`, 'POST', { token: 1, password: 2 })).status).toBe(422);
  });
});

describe('security headers', () => {
  it('sends a CSP that allows only this origin\'s scripts, and the usual helmet headers', async () => {
    const res = await fetch(`${t.url}/api/me`);
    const csp = res.headers.get('content-security-policy') ?? '';
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/script-src[^;]*unsafe/);
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("frame-ancestors 'self'");
    // Plain HTTP (a bakery LAN): upgrading would break every request, and HSTS means nothing.
    expect(csp).not.toContain('upgrade-insecure-requests');
    expect(res.headers.get('strict-transport-security')).toBeNull();
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('x-frame-options')).toBe('SAMEORIGIN');
    expect(res.headers.get('referrer-policy')).toBe('same-origin');
    expect(res.headers.get('x-powered-by')).toBeNull();
    expect(res.headers.get('cache-control')).toBe('private, no-cache');
  });

  it('adds HSTS and upgrade-insecure-requests when published over HTTPS', async () => {
    const s = await startTestServer(handle, { envVars: { PANFORM_PUBLIC_URL: 'https://panform.tidewater.example' } });
    try {
      const res = await fetch(`${s.url}/api/me`);
      expect(res.headers.get('content-security-policy')).toContain('upgrade-insecure-requests');
      expect(res.headers.get('strict-transport-security')).toMatch(/max-age=\d+/);
    } finally {
      await s.close();
    }
  });
});

describe('the viewer\'s files', () => {
  it('serves index.html for the viewer\'s pages, always revalidated (a new build is picked up at once)', async () => {
    for (const path of ['/', '/formulas/harbour-ciabatta', '/reset-password?token=abc']) {
      const res = await fetch(`${t.url}${path}`);
      expect(res.status, path).toBe(200);
      expect(res.headers.get('content-type')).toMatch(/text\/html/);
      expect(res.headers.get('cache-control')).toBe('no-cache');
      expect(await res.text()).toContain('<div id="root">');
    }
  });

  it('keeps hashed assets a year', async () => {
    const res = await fetch(`${t.url}/assets/index-abc123.js`);
    expect(res.status).toBe(200);
    expect(res.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
  });

  it('answers API paths with JSON, not the viewer', async () => {
    const res = await fetch(`${t.url}/api/nothing-here`);
    expect(res.status).toBe(404);
    expect(res.headers.get('content-type')).toMatch(/application\/json/);
  });

  it('does not answer other methods with the viewer', async () => {
    expect((await fetch(`${t.url}/formulas`, { method: 'POST' })).status).toBe(404);
  });
});

describe('odd request targets', () => {
  it('answers GET //[ (not a URL a browser sends) with 400 and logs no stack', async () => {
    const logged: string[] = [];
    const s = await startTestServer(handle, { webDir: web, log: (m) => logged.push(m) });
    try {
      for (const target of ['//[', '//[/formulas', '//%5B']) {
        const { status, body } = await new Promise<{ status: number; body: string }>((ok, fail) => {
          const req = http.request(`${s.url}/`, { path: target }, (res) => {
            let text = '';
            res.on('data', (c) => (text += c));
            res.on('end', () => ok({ status: res.statusCode ?? 0, body: text }));
          });
          req.on('error', fail);
          req.end();
        });
        expect([200, 400], target).toContain(status);
        if (target === '//[') expect(status).toBe(400);
        expect(body, target).not.toMatch(/at .*\.ts:\d+/);
      }
      expect(logged).toEqual([]);
    } finally {
      await s.close();
    }
  });
});
