// Two Panform servers on one PostgreSQL 15 database, as a bakery group runs them behind a reverse
// proxy: sign-in failures, sign-outs and loads are shared state, not per process.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { expect, it } from 'vitest';
import type { FormulaDetail } from '#shared/api';
import { collectLoad } from '../../cli/commands/load.ts';
import { createUser } from '../../server/auth/users.ts';
import { loadFolder } from '../../server/load/index.ts';
import type { RunningServer } from '../../server/start.ts';
import { forEachDatabase } from '../setup/databases.ts';
import { emailOf, getJson, PASSWORD, sendJson, sessionCookie, TEST_SCRYPT } from './harness.ts';
import { startSharedServers } from './shared-servers.ts';

forEachDatabase(
  'two servers on one database',
  (setup) => {
    it.skipIf(setup.kind !== 'postgres')(
      'count failures together, sign out everywhere at once, and show a load on both within a second',
      async () => {
        const { url } = (await setup.freshTarget()) as { url: string };
        const seed = await setup.open({ url });
        await loadFolder(seed, resolve('formulas'), { git: false });
        for (const role of ['admin', 'bench'] as const) await createUser(seed.db, { email: emailOf(role), role, password: PASSWORD }, TEST_SCRYPT);
        const servers: RunningServer[] = [];
        const folder = mkdtempSync(join(tmpdir(), 'panform-two-servers-'));
        try {
          servers.push(...(await startSharedServers(setup, url, 2)));
          const [a, b] = servers;
          const signIn = (s: RunningServer, password: string) => sendJson(`${s.url}/api/session`, 'POST', { email: emailOf('bench'), password });

          // Five wrong passwords spread over both servers count as five: the sixth try is refused on either.
          for (let i = 0; i < 5; i++) expect((await signIn(i % 2 === 0 ? a : b, `wrong guess ${i}`)).status).toBe(401);
          expect((await signIn(b, PASSWORD)).status).toBe(429);
          expect((await signIn(a, PASSWORD)).status).toBe(429);

          // Signed in on A, seen on B; signed out on A, refused on B at once.
          const res = await sendJson(`${a.url}/api/session`, 'POST', { email: emailOf('admin'), password: PASSWORD });
          const cookie = sessionCookie(res.res);
          expect((await getJson(`${b.url}/api/me`, cookie)).status).toBe(200);
          expect((await fetch(`${a.url}/api/session`, { method: 'DELETE', headers: { cookie } })).status).toBe(204);
          expect((await getJson(`${b.url}/api/me`, cookie)).status).toBe(401);

          // A load through the CLI shows on both within a second.
          const admin = sessionCookie((await sendJson(`${a.url}/api/session`, 'POST', { email: emailOf('admin'), password: PASSWORD })).res);
          const revision = async (s: RunningServer) => ((await getJson(`${s.url}/api/formulas/harbour-ciabatta`, admin)).body as FormulaDetail).revision;
          const before = await revision(a);
          expect(await revision(b)).toBe(before);
          cpSync(resolve('formulas'), folder, { recursive: true });
          const file = join(folder, 'harbour-ciabatta.yaml');
          writeFileSync(file, readFileSync(file, 'utf8').replace(/^  water: 78$/m, '  water: 80'));
          const saved = process.env.DATABASE_URL;
          process.env.DATABASE_URL = url;
          try {
            const report = await collectLoad({ paths: [folder], by: 'ines', json: true, progress: false });
            expect(report.summary.formulas.changed).toEqual(['harbour-ciabatta']);
          } finally {
            if (saved === undefined) delete process.env.DATABASE_URL;
            else process.env.DATABASE_URL = saved;
          }
          const loadedAt = Date.now();
          for (const s of servers) {
            while ((await revision(s)) === before) {
              expect(Date.now() - loadedAt, `${s.url} shows the load`).toBeLessThan(1_000);
              await new Promise((r) => setTimeout(r, 20));
            }
          }
        } finally {
          for (const s of servers) await s.close();
          rmSync(folder, { recursive: true, force: true });
        }
      },
      120_000,
    );
  },
  { warm: false },
);
