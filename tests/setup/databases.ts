// Database test suites written once, run against each setup: PGlite (always) and PostgreSQL 15.
//
//   forEachDatabase('loading', (setup) => {
//     it('...', async () => { const h = await setup.fresh(); ... });
//   });
//
// PostgreSQL: PANFORM_TEST_DATABASE_URL names a server to use (CI may start one); otherwise a
// throwaway cluster is started in /tmp with Debian's PostgreSQL 15 binaries (as user `postgres`
// when running as root) and stopped after the suite. Without the binaries the PostgreSQL suite is
// skipped with a message, or fails when CI is set.
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, it } from 'vitest';
import { migrateDatabase, openDatabase, type DatabaseHandle, type OpenOptions } from '../../server/db/client.ts';

import { createDatabase, PG_BIN, startCluster, type Cluster } from './postgres-cluster.ts';

export { PG_BIN };
/** Creating a database takes seconds, and much longer on a busy machine. */
const SETUP_TIMEOUT = 180_000;

export interface DatabaseSetup {
  name: 'PGlite' | 'PostgreSQL 15';
  kind: 'pglite' | 'postgres';
  /**
   * An empty, migrated database opened in this process; closed after the suite. The suite's one
   * database is reused and emptied on each call (creating a database costs seconds), so a test
   * uses one at a time.
   */
  fresh(): Promise<DatabaseHandle>;
  /**
   * Where a fresh, migrated database lives, for a child process: `{ dataDir }` (PGlite on disk) or
   * `{ url }` (PostgreSQL). Not left open.
   */
  freshTarget(): Promise<OpenOptions>;
  /** Opens an existing target in this process (migrated); closed after the suite unless closed before. */
  open(target: OpenOptions): Promise<DatabaseHandle>;
}

function stripDatabase(url: string): string {
  const u = new URL(url);
  u.pathname = '';
  return u.toString().replace(/\/$/, '');
}

/** Runs `body` once per available database setup, each in its own describe block. */
export function forEachDatabase(title: string, body: (setup: DatabaseSetup) => void, options: { warm?: boolean } = {}): void {
  // Open the suite's shared database before the tests (default), for suites that call fresh().
  const warm = options.warm ?? true;
  describe(`${title} (PGlite)`, () => {
    const handles: DatabaseHandle[] = [];
    const dirs: string[] = [];
    afterAll(async () => {
      for (const h of handles) await h.close();
      for (const d of dirs) rmSync(d, { recursive: true, force: true });
    });
    const open = async (target: OpenOptions) => {
      const h = await openDatabase(target);
      handles.push(h);
      await migrateDatabase(h);
      return h;
    };
    // Created before the tests (hooks may take longer than a test); reused and emptied by fresh().
    let shared: Promise<DatabaseHandle> | null = null;
    let used = false;
    beforeAll(async () => {
      if (!warm) return;
      shared ??= open({ memory: true });
      await shared;
    }, SETUP_TIMEOUT);
    body({
      name: 'PGlite',
      kind: 'pglite',
      async fresh() {
        shared ??= open({ memory: true });
        const h = await shared;
        if (used) await truncateAll(h);
        used = true;
        return h;
      },
      async freshTarget() {
        const dir = mkdtempSync('/tmp/panform-pglite-');
        dirs.push(dir);
        const dataDir = join(dir, 'data');
        const h = await openDatabase({ dataDir });
        try {
          await migrateDatabase(h);
        } finally {
          await h.close();
        }
        return { dataDir };
      },
      open,
    });
  });

  const given = process.env.PANFORM_TEST_DATABASE_URL;
  const haveBinaries = existsSync(join(PG_BIN, 'initdb')) && existsSync(join(PG_BIN, 'pg_ctl'));
  if (!given && !haveBinaries) {
    if (process.env.CI) {
      describe(`${title} (PostgreSQL 15)`, () => {
        it('has PostgreSQL 15 to test against', () => {
          throw new Error(`PostgreSQL 15 is required in CI: install it (apt-get install -y postgresql) or set PANFORM_TEST_DATABASE_URL; ${PG_BIN}/initdb not found`);
        });
      });
    } else {
      process.stderr.write(`[databases] ${title}: PostgreSQL 15 not found at ${PG_BIN}; its suite is skipped (set CI to make this fail)\n`);
      describe.skip(`${title} (PostgreSQL 15, not installed)`, () => body(unavailable()));
    }
    return;
  }

  describe(`${title} (PostgreSQL 15)`, () => {
    let cluster: Cluster | null = null;
    let base = '';
    const handles: DatabaseHandle[] = [];
    beforeAll(async () => {
      if (given) base = stripDatabase(given);
      else {
        cluster = await startCluster();
        base = cluster.base;
      }
    }, SETUP_TIMEOUT);
    afterAll(async () => {
      for (const h of handles) await h.close();
      cluster?.stop();
    });
    const open = async (target: OpenOptions) => {
      const h = await openDatabase(target);
      handles.push(h);
      await migrateDatabase(h);
      return h;
    };
    let shared: Promise<DatabaseHandle> | null = null;
    let used = false;
    beforeAll(async () => {
      if (!warm) return;
      shared ??= createDatabase(base).then((url) => open({ url }));
      await shared;
    }, SETUP_TIMEOUT);
    body({
      name: 'PostgreSQL 15',
      kind: 'postgres',
      async fresh() {
        shared ??= createDatabase(base).then((url) => open({ url }));
        const h = await shared;
        if (used) await truncateAll(h);
        used = true;
        return h;
      },
      async freshTarget() {
        const url = await createDatabase(base);
        const h = await openDatabase({ url });
        try {
          await migrateDatabase(h);
        } finally {
          await h.close();
        }
        return { url };
      },
      open,
    });
  });
}

function unavailable(): DatabaseSetup {
  const no = () => Promise.reject(new Error('PostgreSQL 15 is not installed'));
  return { name: 'PostgreSQL 15', kind: 'postgres', fresh: no, freshTarget: no, open: no };
}

/** Empties every table (between property-test runs), keeping the schema. */
export async function truncateAll(h: DatabaseHandle): Promise<void> {
  const { sql } = await import('drizzle-orm');
  await h.db.execute(
    sql.raw('truncate table formulas, formula_revisions, catalog, plans, loads, sessions, password_resets, users, limit_hits, mail_outbox, audit_log, bench_records, record_photos, photo_blobs restart identity cascade'),
  );
}

/** What a load left in the database, in a comparable shape (ids, texts, revisions, catalog names, plans). */
export async function readLoadedState(h: DatabaseHandle) {
  const { asc } = await import('drizzle-orm');
  const { catalogTable, formulaRevisionsTable, formulasTable, loadsTable, plansTable } = await import('../../server/db/schema.ts');
  const formulas = await h.db
    .select({
      id: formulasTable.id,
      source: formulasTable.source,
      revision: formulasTable.revision,
      status: formulasTable.status,
      removedAt: formulasTable.removedAt,
      hash: formulasTable.contentHash,
    })
    .from(formulasTable)
    .orderBy(asc(formulasTable.id));
  const revisions = await h.db
    .select({ id: formulaRevisionsTable.formulaId, revision: formulaRevisionsTable.revision, hash: formulaRevisionsTable.contentHash })
    .from(formulaRevisionsTable)
    .orderBy(asc(formulaRevisionsTable.formulaId), asc(formulaRevisionsTable.revision));
  const catalog = await h.db.select({ name: catalogTable.name }).from(catalogTable).orderBy(asc(catalogTable.name));
  const plans = await h.db.select({ date: plansTable.date, source: plansTable.source }).from(plansTable).orderBy(asc(plansTable.date));
  const loads = await h.db.select({ id: loadsTable.id }).from(loadsTable);
  return { formulas, revisions, catalog: catalog.map((c) => c.name), plans, loads: loads.length };
}
