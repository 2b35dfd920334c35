import type { AddressInfo } from 'node:net';
import express from 'express';
import helmet, { type HelmetOptions } from 'helmet';
import { describe, expect, it } from 'vitest';
import { securityHeaders } from '../../server/http/security-headers.ts';

// securityHeaders works helmet's headers out once at start; a response must carry exactly the
// headers helmet itself would have set on it.
async function headersOf(middleware: express.RequestHandler): Promise<Record<string, string>> {
  const app = express();
  app.disable('x-powered-by');
  app.use(middleware);
  app.get('/', (_req, res) => {
    res.type('text/plain').send('ok');
  });
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  try {
    const res = await fetch(`http://127.0.0.1:${(server.address() as AddressInfo).port}/`);
    const out: Record<string, string> = {};
    res.headers.forEach((v, k) => {
      if (!['date', 'etag', 'content-length', 'connection', 'keep-alive'].includes(k)) out[k] = v;
    });
    return out;
  } finally {
    server.close();
  }
}

const options: HelmetOptions[] = [
  {},
  {
    contentSecurityPolicy: { useDefaults: false, directives: { defaultSrc: ["'self'"], styleSrc: ["'self'", "'unsafe-inline'"], upgradeInsecureRequests: [] } },
    strictTransportSecurity: { maxAge: 15_552_000 },
    referrerPolicy: { policy: 'same-origin' },
  },
  { strictTransportSecurity: false, contentSecurityPolicy: false, xFrameOptions: { action: 'deny' } },
];

describe('securityHeaders', () => {
  it.each(options.map((o) => [JSON.stringify(o), o]))('sets what helmet sets with %s', async (_, o) => {
    const expected = await headersOf(helmet(o));
    expect(Object.keys(expected).length).toBeGreaterThan(5);
    expect(await headersOf(securityHeaders(o))).toEqual(expected);
  });
});
