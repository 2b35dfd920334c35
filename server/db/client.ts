// Opening the database: embedded PostgreSQL (PGlite) in a data directory, or a PostgreSQL server
// when DATABASE_URL is set. Both give the same drizzle query API (the PgDatabase base).
//
// Exactly one process owns a PGlite directory. It takes a lock file inside the directory
// (`panform.lock`, mode 600) holding its pid, the port it serves on (once known) and a random
// token for the local load channel (`panform load` hands its work to the running server with it).
// A lock whose pid is dead is stale and is taken over.
//
// Always `await handle.close()`: an open PGlite keeps the Node process alive.
import { randomBytes } from 'node:crypto';
import { closeSync, cpSync, existsSync, mkdirSync, openSync, readFileSync, renameSync, rmSync, statSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { setFlagsFromString } from 'node:v8';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import { privateDir, tightenTree } from '../private-files.ts';
import * as schema from './schema.ts';
import { fileOrderMigrationTime, lastMigrationTime, restoreFileOrder } from './file-order.ts';

export type Schema = typeof schema;
/** The drizzle API both drivers share. */
export type Database = PgDatabase<PgQueryResultHKT, Schema>;

export interface DatabaseHandle {
  db: Database;
  kind: 'pglite' | 'postgres';
  /** The PGlite data directory (absolute), or null for memory and for a PostgreSQL server. */
  dataDir: string | null;
  /** The lock this process holds on the data directory, or null. */
  lock: HeldLock | null;
  close(): Promise<void>;
}

export interface OpenOptions {
  /** PGlite data directory; default PANFORM_DATA, else `var/data`. */
  dataDir?: string;
  /** A PostgreSQL connection string; default DATABASE_URL. */
  url?: string;
  /** PGlite in memory (tests). */
  memory?: boolean;
  /** Environment to read PANFORM_DATA and DATABASE_URL from (default process.env). */
  env?: NodeJS.ProcessEnv;
}

export const DEFAULT_DATA_DIR = 'var/data';
export const LOCK_FILE = 'panform.lock';

export interface LockInfo {
  pid: number;
  /** The port of the server holding the directory, once it listens; null for other processes. */
  port: number | null;
  /** Secret for the local load channel (`x-panform-load-token`). */
  token: string;
  startedAt: string;
}

export interface HeldLock {
  path: string;
  info: LockInfo;
  /** Records the port the owning server listens on, so `panform load` can hand loads to it. */
  setPort(port: number): void;
  release(): void;
}

/** The data directory is held by another live process (lock null: held by another user). */
export class DatabaseLockedError extends Error {
  constructor(
    readonly dataDir: string,
    readonly lock: LockInfo | null,
  ) {
    super(
      lock
        ? `the database in ${dataDir} is in use by another Panform process (pid ${lock.pid}${lock.port ? `, serving on port ${lock.port}` : ''})`
        : `the database in ${dataDir} is in use by a Panform process of another user`,
    );
    this.name = 'DatabaseLockedError';
  }
}

function removeStaleLock(path: string, seen: LockInfo | null): void {
  const mutex = `${path}.takeover`;
  try {
    mkdirSync(mutex);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    // Someone else is clearing it; a mutex left by a process that died mid-way is removed.
    const age = Date.now() - (statSync(mutex, { throwIfNoEntry: false })?.mtimeMs ?? Date.now());
    if (age > 10_000) rmSync(mutex, { recursive: true, force: true });
    else sleepSync(50);
    return;
  }
  try {
    let now: LockInfo | null = null;
    try {
      now = JSON.parse(readFileSync(path, 'utf8')) as LockInfo;
    } catch {
      now = null;
    }
    const same = seen === null ? now === null || !lockAlive(now, path) : now !== null && now.token === seen.token && !lockAlive(now, path);
    if (same) rmSync(path, { force: true });
  } finally {
    rmSync(mutex, { recursive: true, force: true });
  }
}

function sleepSync(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** Where the database is, from options and environment, without opening anything. */
export function resolveTarget(opts: OpenOptions = {}): { kind: 'memory' } | { kind: 'postgres'; url: string } | { kind: 'pglite'; dataDir: string } {
  const env = opts.env ?? process.env;
  if (opts.memory) return { kind: 'memory' };
  if (opts.url) return { kind: 'postgres', url: opts.url };
  if (opts.dataDir) return { kind: 'pglite', dataDir: resolve(opts.dataDir) };
  if (env.DATABASE_URL) return { kind: 'postgres', url: env.DATABASE_URL };
  return { kind: 'pglite', dataDir: resolve(env.PANFORM_DATA || DEFAULT_DATA_DIR) };
}

/** Lock files this process holds. */
const heldHere = new Set<string>();

/**
 * Whether the process that wrote a lock still runs. A lock carrying this process's own pid that
 * this process does not hold was left by an earlier run that had the same pid (a container
 * restarted): stale.
 */
function lockAlive(lock: LockInfo, path: string): boolean {
  if (lock.pid === process.pid) return heldHere.has(path);
  return pidAlive(lock.pid);
}

function pidAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** The lock in a data directory if a live process holds it; null when free or stale. */
export function readLiveLock(dataDir: string): LockInfo | null {
  const path = join(dataDir, LOCK_FILE);
  let info: LockInfo;
  try {
    info = JSON.parse(readFileSync(path, 'utf8')) as LockInfo;
  } catch {
    return null;
  }
  if (!info || typeof info.pid !== 'number' || !lockAlive(info, path)) return null;
  return info;
}

/** Takes the lock of a data directory, taking over a stale one. Throws DatabaseLockedError. */
export function acquireLock(dataDir: string): HeldLock {
  // A data directory is private to its owner: it holds password hashes and sessions.
  privateDir(dataDir);
  const path = join(dataDir, LOCK_FILE);
  const info: LockInfo = { pid: process.pid, port: null, token: randomBytes(32).toString('hex'), startedAt: new Date().toISOString() };
  for (let attempt = 0; attempt < 6; attempt++) {
    let fd: number;
    try {
      fd = openSync(path, 'wx', 0o600);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      let existing: LockInfo | null = null;
      try {
        existing = JSON.parse(readFileSync(path, 'utf8')) as LockInfo;
      } catch (re) {
        const code = (re as NodeJS.ErrnoException).code;
        if (code === 'ENOENT') continue; // released meanwhile: try again
        // Another user's lock (mode 600): held, by someone we cannot ask.
        if (code === 'EACCES' || code === 'EPERM') throw new DatabaseLockedError(dataDir, null);
        // Half-written by a process taking it right now: wait a moment before calling it stale.
        if (attempt < 3) {
          sleepSync(50);
          continue;
        }
      }
      if (existing && typeof existing.pid === 'number' && lockAlive(existing, path)) throw new DatabaseLockedError(dataDir, existing);
      // Stale. Only one process at a time may clear a stale lock (a directory made atomically is
      // the mutex); it clears it only if it is still the same stale lock, so two processes taking
      // over at once cannot remove each other's fresh lock.
      removeStaleLock(path, existing);
      continue;
    }
    try {
      writeSync(fd, JSON.stringify(info));
    } finally {
      closeSync(fd);
    }
    heldHere.add(path);
    let released = false;
    return {
      path,
      info,
      setPort(port: number) {
        info.port = port;
        const tmp = `${path}.${process.pid}.tmp`;
        writeFileSync(tmp, JSON.stringify(info), { mode: 0o600 });
        renameSync(tmp, path);
      },
      release() {
        if (released) return;
        released = true;
        heldHere.delete(path);
        try {
          const now = JSON.parse(readFileSync(path, 'utf8')) as LockInfo;
          if (now.pid === info.pid && now.token === info.token) unlinkSync(path);
        } catch {
          // already gone
        }
      },
    };
  }
  throw new Error(`could not take the lock ${path}; another process keeps changing it`);
}

/** The committed migrations folder (drizzle/), found from this module upward (works bundled too). */
export function migrationsFolder(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 8; i++) {
    if (existsSync(join(dir, 'drizzle', 'meta', '_journal.json'))) return join(dir, 'drizzle');
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  throw new Error('cannot find the drizzle/ migrations folder next to the Panform installation');
}

/**
 * A handle around a driver's database: `close()` runs once, closes the client and then releases
 * the data directory's lock, if any.
 */
export function makeHandle(parts: {
  db: unknown;
  kind: DatabaseHandle['kind'];
  dataDir?: string | null;
  lock?: HeldLock | null;
  closeClient: () => Promise<void>;
}): DatabaseHandle {
  const lock = parts.lock ?? null;
  let closed = false;
  return {
    db: parts.db as Database,
    kind: parts.kind,
    dataDir: parts.dataDir ?? null,
    lock,
    async close() {
      if (closed) return;
      closed = true;
      try {
        await parts.closeClient();
      } finally {
        lock?.release();
      }
    },
  };
}

export async function openDatabase(opts: OpenOptions = {}): Promise<DatabaseHandle> {
  const target = resolveTarget(opts);
  if (target.kind === 'postgres') {
    const [{ drizzle }, pg] = await Promise.all([import('drizzle-orm/node-postgres'), import('pg')]);
    const pool = new pg.default.Pool({ connectionString: target.url, max: 10 });
    // An idle client losing its connection must not crash the process.
    pool.on('error', () => {});
    return makeHandle({ db: drizzle({ client: pool, schema }), kind: 'postgres', closeClient: () => pool.end() });
  }
  const [{ PGlite }, { drizzle }] = await Promise.all([import('@electric-sql/pglite'), import('drizzle-orm/pglite')]);
  baselineWasmCompiler();
  if (target.kind === 'memory') {
    const client = new PGlite();
    await client.waitReady;
    return makeHandle({ db: drizzle({ client, schema }), kind: 'pglite', closeClient: () => client.close() });
  }
  const lock = acquireLock(target.dataDir);
  let client: InstanceType<typeof PGlite>;
  try {
    // A new folder starts as a copy of the prepared empty database when there is one: creating a
    // database (initdb) takes seconds and leaves the process holding hundreds of MB.
    const seed = existsSync(join(target.dataDir, 'PG_VERSION')) ? null : databaseSeed();
    if (seed) {
      cpSync(seed, target.dataDir, { recursive: true, filter: (from) => !from.endsWith(LOCK_FILE) });
      // An installed package has lost the seed's empty folders (npm packs files only).
      for (const folder of EMPTY_DATA_FOLDERS) mkdirSync(join(target.dataDir, folder), { recursive: true, mode: 0o700 });
    }
    client = new PGlite(target.dataDir, { startParams: [...PGlite.defaultStartParams, ...PGLITE_SETTINGS] });
    await client.waitReady;
    // PGlite writes its files 666 whatever the umask. The folder (700) already keeps others out;
    // the files themselves are made 600 once open (a new database, or one an older version left
    // open) and again on closing (files added while serving).
    tightenTree(target.dataDir);
  } catch (e) {
    lock.release();
    throw e;
  }
  const dataDir = target.dataDir;
  return makeHandle({
    db: drizzle({ client, schema }),
    kind: 'pglite',
    dataDir,
    lock,
    closeClient: async () => {
      await client.close();
      tightenTree(dataDir);
    },
  });
}

/**
 * The folders of a PostgreSQL data directory that are empty in a new database. `npm pack` keeps
 * files only, so a seed from an installed package lacks them, and PostgreSQL will not start
 * without them.
 */
export const EMPTY_DATA_FOLDERS = [
  'pg_commit_ts', 'pg_dynshmem', 'pg_logical/mappings', 'pg_logical/snapshots', 'pg_notify', 'pg_replslot', 'pg_serial',
  'pg_snapshots', 'pg_stat', 'pg_stat_tmp', 'pg_tblspc', 'pg_twophase', 'pg_wal/archive_status', 'pg_wal/summaries',
];

/**
 * The prepared empty database a new PGlite folder starts from (scripts/prepare-database.mjs, run
 * by `npm run build`), found from this module upward; null when not built.
 */
export function databaseSeed(): string | null {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 8; i++) {
    const seed = join(dir, 'dist', 'pglite-seed');
    if (existsSync(join(seed, 'PG_VERSION'))) return seed;
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  return null;
}

/**
 * PostgreSQL settings for the embedded database. Its shared buffers sit in the server's own
 * memory, all of them resident from the start (PostgreSQL's default is 128 MB). The server keeps
 * what it serves in its own snapshot and reads the database again only after a load, and the
 * files behind the buffers stay in the system's file cache: loading 1,000 formulas (about 40 MB on
 * disk) took the same CPU with 4, 8 or 16 MB (docs/performance.md, 3 December 2026).
 */
export const PGLITE_SETTINGS = ['-c', 'shared_buffers=8MB'];

/**
 * PGlite is PostgreSQL compiled to WebAssembly. Node's engine compiles each of its functions with
 * a baseline compiler (Liftoff) when first called, and by default compiles the busiest again with
 * its optimizing compiler (TurboFan) on background threads. Those recompilations of PostgreSQL's
 * large functions took 1.5 to 2 s of CPU during a first start and left 50 to 90 MB in the
 * threads' memory pools, more than the server's whole JavaScript heap: a first start held 250 to
 * 280 MB, about 160 to 190 MB on baseline code alone. The server answers from its own snapshot,
 * so the database's queries are few and small, and loads were no slower on baseline code
 * (docs/performance.md, 3 December 2026). Process-wide, set before PGlite compiles its module; a
 * PostgreSQL server (node-postgres) is not affected.
 */
function baselineWasmCompiler(): void {
  setFlagsFromString('--liftoff-only');
}

/** Applies the committed migrations in drizzle/ with the migrator for the handle's driver. */
export async function migrateDatabase(handle: DatabaseHandle, folder = migrationsFolder()): Promise<void> {
  if (handle.kind === 'pglite') {
    const { migrate } = await import('drizzle-orm/pglite/migrator');
    await migrateWithDataSteps(handle.db, folder, () => migrate(handle.db as unknown as Parameters<typeof migrate>[0], { migrationsFolder: folder }));
    return;
  }
  const { migrate } = await import('drizzle-orm/node-postgres/migrator');
  // Several processes may start against one server: serialize migrations with an advisory lock
  // held on one pooled connection while the migrator runs on another.
  const pool = (handle.db as unknown as { $client: import('pg').Pool }).$client;
  const holder = await pool.connect();
  try {
    await holder.query('select pg_advisory_lock(726101)');
    await migrateWithDataSteps(handle.db, folder, () => migrate(handle.db as unknown as Parameters<typeof migrate>[0], { migrationsFolder: folder }));
  } finally {
    try {
      await holder.query('select pg_advisory_unlock(726101)');
    } finally {
      holder.release();
    }
  }
}

/** The SQL migrations, then the data steps SQL cannot do (re-reading stored YAML) for those just applied. */
async function migrateWithDataSteps(db: Database, folder: string, migrate: () => Promise<void>): Promise<void> {
  const fileOrderAt = fileOrderMigrationTime(folder);
  const before = await lastMigrationTime(db);
  await migrate();
  if (fileOrderAt !== null && before > 0 && before < fileOrderAt) await restoreFileOrder(db);
}

/** Opens and migrates in one step; closes again if migrating fails. */
export async function openMigratedDatabase(opts: OpenOptions = {}): Promise<DatabaseHandle> {
  const handle = await openDatabase(opts);
  try {
    await migrateDatabase(handle);
  } catch (e) {
    await handle.close();
    throw e;
  }
  return handle;
}
