import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { networkInterfaces } from 'node:os';
import express from 'express';
import { afterAll, describe, expect, it } from 'vitest';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { createInternalLoadRouter, LOAD_TOKEN_HEADER, tokenMatches } from '../../server/routes/internal-load.ts';

const TOKEN = 'a1'.repeat(32);

describe('tokenMatches', () => {
  it.each([
    [TOKEN, true],
    ['a1'.repeat(31), false],
    [`${TOKEN}0`, false],
    ['', false],
    [undefined, false],
    [['a1'], false],
  ])('compares %o with the lock token: %s', (given, expected) => {
    expect(tokenMatches(given, TOKEN)).toBe(expected);
  });
});

/** A non-loopback IPv4 address of this machine, if it has one. */
function outsideAddress(): string | undefined {
  for (const list of Object.values(networkInterfaces())) {
    for (const a of list ?? []) if (a.family === 'IPv4' && !a.internal) return a.address;
  }
  return undefined;
}

describe('the load channel', () => {
  const servers: Server[] = [];
  afterAll(async () => {
    for (const s of servers) await new Promise<void>((r) => s.close(() => r()));
  });
  // The requests below are refused before the database is touched.
  const handle = {} as DatabaseHandle;
  const listen = async (host: string) => {
    const app = express();
    app.use('/api/internal/load', createInternalLoadRouter({ handle, dataDir: '/nonexistent', token: TOKEN, log: () => {} }));
    const server = await new Promise<Server>((resolve) => {
      const s = app.listen(0, host, () => resolve(s));
    });
    servers.push(server);
    return (server.address() as AddressInfo).port;
  };

  const address = outsideAddress();
  it.skipIf(!address)('refuses a request that does not come from this machine, even with the token', async () => {
    const port = await listen(address!);
    const res = await fetch(`http://${address}:${port}/api/internal/load`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', [LOAD_TOKEN_HEADER]: TOKEN },
      body: JSON.stringify({ folder: '/tmp' }),
    });
    expect(res.status).toBe(403);
    expect(await res.json()).toMatchObject({ ok: false, error: 'forbidden' });
  });

  it('asks for paths or a folder', async () => {
    const port = await listen('127.0.0.1');
    const res = await fetch(`http://127.0.0.1:${port}/api/internal/load`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', [LOAD_TOKEN_HEADER]: TOKEN },
      body: JSON.stringify({ paths: [] }),
    });
    expect(res.status).toBe(422);
    expect(await res.json()).toMatchObject({ ok: false, error: 'invalid' });
  });
});
