// Panform servers for a test, each with its own connection pool on one PostgreSQL database, as a
// bakery group runs them: listening on loopback, cheap hashes, no slow-down, mail collected.
import type { AppOptions } from '../../server/app.ts';
import { DEFAULT_LIMITS } from '../../server/auth/rate-limit.ts';
import type { OutgoingMail } from '../../server/context.ts';
import { readEnv } from '../../server/env.ts';
import { startServer, type RunningServer } from '../../server/start.ts';
import type { DatabaseSetup } from '../setup/databases.ts';
import { TEST_SCRYPT } from './harness.ts';

export async function startSharedServers(setup: DatabaseSetup, url: string, count: number, opts: Partial<AppOptions> & { mail?: OutgoingMail[] } = {}): Promise<RunningServer[]> {
  const { mail, ...appOptions } = opts;
  const servers: RunningServer[] = [];
  for (let i = 0; i < count; i++) {
    servers.push(
      await startServer({
        handle: await setup.open({ url }),
        env: readEnv({ PORT: '0', NODE_ENV: 'test', DATABASE_URL: url }),
        host: '127.0.0.1',
        scrypt: TEST_SCRYPT,
        limits: { ...DEFAULT_LIMITS, slowdownStepMs: 0 },
        webDir: null,
        sendMail: async (m) => {
          mail?.push(m);
        },
        log: () => {},
        ...appOptions,
      }),
    );
  }
  return servers;
}
