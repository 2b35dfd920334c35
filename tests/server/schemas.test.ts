// GET /schemas/<kind>.schema.json: the file formats at a stable address for editors in a bakery's
// own repository: public (no session), JSON Schema's media type, cacheable, the shipped files.
import { readFileSync } from 'node:fs';
import { get } from 'node:http';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { SCHEMA_MAX_AGE, SCHEMA_NAMES } from '../../server/routes/schemas.ts';
import { openTestDatabase, startTestServer, type TestServer } from './harness.ts';
import { ROOT } from '../cli/arithmetic-cli.ts';

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

describe('GET /schemas/<kind>.schema.json', () => {
  it.each(SCHEMA_NAMES)('serves %s to anyone, as application/schema+json, cacheable', async (name) => {
    const res = await fetch(`${t.url}/schemas/${name}`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^application\/schema\+json/);
    expect(res.headers.get('cache-control')).toBe(`public, max-age=${SCHEMA_MAX_AGE}`);
    expect(res.headers.get('access-control-allow-origin')).toBe('*');
    expect(await res.text()).toBe(readFileSync(join(ROOT, 'shared', 'schema', name), 'utf8'));
    // Unchanged since the editor's last fetch: 304, no body. (Through node:http: fetch adds
    // "Cache-Control: no-cache" to a request with If-None-Match, which asks for the whole file.)
    const again = await new Promise<number | undefined>((ok, fail) =>
      get(`${t.url}/schemas/${name}`, { headers: { 'if-none-match': res.headers.get('etag')! } }, (r) => {
        r.resume();
        ok(r.statusCode);
      }).on('error', fail),
    );
    expect(again).toBe(304);
  });

  it('answers 404 in plain words for any other name', async () => {
    for (const path of ['/schemas/nope.json', '/schemas/..%2Fpackage.json', '/schemas/formula.schema.json.bak']) {
      const res = await fetch(`${t.url}${path}`);
      expect(res.status, path).toBe(404);
    }
    const res = await fetch(`${t.url}/schemas/nope.json`);
    expect(await res.text()).toContain('/schemas/formula.schema.json');
  });
});
