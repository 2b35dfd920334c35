import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { acquireLock, DatabaseLockedError, LOCK_FILE, migrateDatabase, openDatabase, readLiveLock, resolveTarget } from '../../server/db/client.ts';
import { forEachDatabase } from '../setup/databases.ts';

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});
function scratch(): string {
  const d = mkdtempSync('/tmp/panform-db-test-');
  dirs.push(d);
  return d;
}

/** A pid that certainly ran and has exited. */
function deadPid(): number {
  const r = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
  return Number(r.stdout);
}

const TABLES = ['formulas', 'formula_revisions', 'catalog', 'plans', 'users', 'sessions', 'password_resets', 'loads'];

forEachDatabase('the migrations', (setup) => {
  it('create every table, and applying them again changes nothing', async () => {
    const h = await setup.fresh();
    for (const t of TABLES) {
      const rows = await h.db.execute(sql.raw(`select count(*)::int as n from ${t}`));
      expect((rows as unknown as { rows: { n: number }[] }).rows[0].n).toBe(0);
    }
    await migrateDatabase(h);
    const applied = await h.db.execute(sql.raw('select count(*)::int as n from drizzle.__drizzle_migrations'));
    const journal = JSON.parse(readFileSync(new URL('../../drizzle/meta/_journal.json', import.meta.url), 'utf8')) as { entries: unknown[] };
    expect((applied as unknown as { rows: { n: number }[] }).rows[0].n).toBe(journal.entries.length);
  });
});

describe('resolveTarget', () => {
  it.each([
    [{ memory: true }, {}, { kind: 'memory' }],
    [{}, { DATABASE_URL: 'postgres://p@db.tidewater.example/panform' }, { kind: 'postgres', url: 'postgres://p@db.tidewater.example/panform' }],
    [{ dataDir: '/srv/data' }, { DATABASE_URL: 'postgres://p@db.tidewater.example/panform' }, { kind: 'pglite', dataDir: '/srv/data' }],
    [{}, { PANFORM_DATA: '/srv/pf' }, { kind: 'pglite', dataDir: '/srv/pf' }],
  ])('picks the database from options %o and environment %o', (opts, env, expected) => {
    expect(resolveTarget({ ...opts, env })).toEqual(expected);
  });

  it('defaults to var/data under the working folder', () => {
    expect(resolveTarget({ env: {} })).toEqual({ kind: 'pglite', dataDir: join(process.cwd(), 'var/data') });
  });
});

describe('the lock on a PGlite data directory', () => {
  it('is a file readable only by its owner, holding the pid, the port once known and a token', () => {
    const d = scratch();
    const lock = acquireLock(d);
    const path = join(d, LOCK_FILE);
    expect(statSync(path).mode & 0o777).toBe(0o600);
    const info = JSON.parse(readFileSync(path, 'utf8'));
    expect(info).toMatchObject({ pid: process.pid, port: null });
    expect(info.token).toMatch(/^[0-9a-f]{64}$/);
    lock.setPort(43123);
    expect(JSON.parse(readFileSync(path, 'utf8')).port).toBe(43123);
    expect(statSync(path).mode & 0o777).toBe(0o600);
    expect(readLiveLock(d)).toMatchObject({ pid: process.pid, port: 43123 });
    lock.release();
    expect(existsSync(path)).toBe(false);
  });

  it('refuses a second holder while the first lives', () => {
    const d = scratch();
    const lock = acquireLock(d);
    let err: unknown;
    try {
      acquireLock(d);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(DatabaseLockedError);
    expect((err as DatabaseLockedError).lock?.token).toBe(lock.info.token);
    lock.release();
  });

  it('takes over a lock whose process has died', () => {
    const d = scratch();
    writeFileSync(join(d, LOCK_FILE), JSON.stringify({ pid: deadPid(), port: 4000, token: 'x'.repeat(64), startedAt: '2026-12-01T00:00:00Z' }), { mode: 0o600 });
    expect(readLiveLock(d)).toBeNull();
    const lock = acquireLock(d);
    expect(JSON.parse(readFileSync(join(d, LOCK_FILE), 'utf8')).pid).toBe(process.pid);
    lock.release();
  });

  it('takes over a lock carrying its own pid that it does not hold (left by an earlier run with the same pid)', () => {
    const d = scratch();
    writeFileSync(join(d, LOCK_FILE), JSON.stringify({ pid: process.pid, port: null, token: 'y'.repeat(64), startedAt: '2026-12-01T00:00:00Z' }));
    const lock = acquireLock(d);
    expect(lock.info.token).not.toBe('y'.repeat(64));
    lock.release();
  });

  it('makes openDatabase refuse a held directory before touching it', async () => {
    const d = scratch();
    const lock = acquireLock(d);
    await expect(openDatabase({ dataDir: d })).rejects.toBeInstanceOf(DatabaseLockedError);
    expect(existsSync(join(d, 'PG_VERSION'))).toBe(false);
    lock.release();
  });
});

describe('a PGlite data directory', () => {
  it('is private to its owner: folders 700, files 600, and one left open to others is tightened on opening', async () => {
    const d = join(scratch(), 'data');
    const modes = () => {
      const out: { path: string; mode: number; dir: boolean }[] = [];
      const walk = (p: string) => {
        const st = statSync(p);
        out.push({ path: p, mode: st.mode & 0o777, dir: st.isDirectory() });
        if (st.isDirectory()) for (const n of readdirSync(p)) walk(join(p, n));
      };
      walk(d);
      return out;
    };
    const first = await openDatabase({ dataDir: d });
    await first.close();
    const made = modes();
    expect(made.filter((m) => !m.dir).length).toBeGreaterThan(10);
    expect(made.filter((m) => m.mode !== (m.dir ? 0o700 : 0o600))).toEqual([]);
    // As an older version, or a loose umask, left it: database files 666, folders 777.
    for (const m of made) chmodSync(m.path, m.dir ? 0o777 : 0o666);
    const again = await openDatabase({ dataDir: d });
    await again.close();
    expect(modes().filter((m) => m.mode !== (m.dir ? 0o700 : 0o600))).toEqual([]);
  }, 120_000);
});
