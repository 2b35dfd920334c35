// Prepares the database a first start begins from: an empty PGlite data folder with every
// migration applied (dist/pglite-seed/). Creating a PGlite database (initdb in WebAssembly) takes
// seconds to a minute and leaves the process holding hundreds of MB; copying this folder in takes
// a fraction of a second and nothing more than opening an existing database. Run by `npm run build` (and so by `npm install`).
// A seed older than the newest migrations is fine: they are applied at start as on any database.
import { renameSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { PGlite } from '@electric-sql/pglite';
import { drizzle } from 'drizzle-orm/pglite';
import { migrate } from 'drizzle-orm/pglite/migrator';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
export const SEED_DIR = join(ROOT, 'dist', 'pglite-seed');

export async function prepareDatabaseSeed(dir = SEED_DIR) {
  // Built beside the old one and swapped in whole, so a failed build never leaves half a seed.
  const next = `${dir}-next-${process.pid}`;
  rmSync(next, { recursive: true, force: true });
  const client = new PGlite(next);
  try {
    await client.waitReady;
    await migrate(drizzle({ client }), { migrationsFolder: join(ROOT, 'drizzle') });
  } finally {
    await client.close();
  }
  rmSync(dir, { recursive: true, force: true });
  renameSync(next, dir);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await prepareDatabaseSeed();
