// Listening and shutting down: the real port in the default public address, and a shutdown
// that finishes requests, stops listening and closes the database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { readEnv } from '../../server/env.ts';
import { startServer } from '../../server/start.ts';
import { openTestDatabase, TEST_SCRYPT } from './harness.ts';

let handle: DatabaseHandle;
beforeAll(async () => {
  handle = await openTestDatabase();
}, 180_000);
afterAll(async () => {
  await handle?.close();
});

describe('startServer', () => {
  it('listens on a free port, links e-mails to it, and on close stops listening and closes the database', async () => {
    const running = await startServer({ handle, env: readEnv({ PORT: '0' }), host: '127.0.0.1', webDir: null, scrypt: TEST_SCRYPT, log: () => {} });
    expect(running.port).toBeGreaterThan(0);
    expect(running.publicUrl).toBe(`http://localhost:${running.port}`);
    const res = await fetch(`http://127.0.0.1:${running.port}/api/me`);
    expect(res.status).toBe(401);
    await running.close();
    await running.closed;
    expect(running.server.listening).toBe(false);
    await expect(fetch(`http://127.0.0.1:${running.port}/api/me`)).rejects.toThrow();
    // The handle is closed: PGlite refuses further queries.
    await expect(handle.db.execute('select 1')).rejects.toThrow();
  });
});
