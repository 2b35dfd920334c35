// `panform serve --demo` (what `npm start` runs): on an empty database, load the demo bakery's
// formulas and create one account per role with a random password, written once to a file only
// its owner can read.
import { chmodSync, existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ROLES, type Role } from '#shared/permissions';
import { randomPassword, type ScryptParams } from './auth/password.ts';
import { countUsers, createUser } from './auth/users.ts';
import type { DatabaseHandle } from './db/client.ts';
import { formulasTable } from './db/schema.ts';
import { loadFolder, type LoadSummary } from './load/index.ts';

export interface DemoAccount {
  email: string;
  name: string;
  role: Role;
  password: string;
}

const DEMO_NAMES: Record<Role, string> = {
  admin: 'Maren Quayle',
  author: 'Ines Calloway',
  reviewer: 'Tobias Wrenfield',
  bench: 'Jonah Pell',
};

export const demoEmail = (role: Role) => `${role}@tidewater.example`;

/** The demo formulas: ./formulas when it exists, else the folder shipped with Panform. */
export function findDemoFormulas(cwd = process.cwd()): string | null {
  const here = join(cwd, 'formulas');
  if (existsSync(join(here, 'ingredients.yaml'))) return here;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 6; i++) {
    if (existsSync(join(dir, 'formulas', 'ingredients.yaml'))) return join(dir, 'formulas');
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  return null;
}

/**
 * The first start of `panform serve --formulas DIR` (and of --demo): loads the folder when the
 * database has no formula yet; null when it has (later starts leave it as it is: `panform load`
 * brings changes in).
 */
export async function loadIfEmpty(handle: DatabaseHandle, formulasDir: string, by: string): Promise<LoadSummary | null> {
  const anyFormula = await handle.db.select({ id: formulasTable.id }).from(formulasTable).limit(1);
  if (anyFormula.length > 0) return null;
  return loadFolder(handle, formulasDir, { by });
}

export interface DemoResult {
  /** The load, when the database had no formulas. */
  loaded: LoadSummary | null;
  /** The new accounts with their passwords, when the database had none. */
  accounts: DemoAccount[] | null;
}

export async function seedDemo(
  handle: DatabaseHandle,
  opts: { formulasDir: string | null; accountsFile: string; scrypt?: ScryptParams },
): Promise<DemoResult> {
  const loaded = opts.formulasDir ? await loadIfEmpty(handle, opts.formulasDir, 'panform serve --demo') : null;

  let accounts: DemoAccount[] | null = null;
  if ((await countUsers(handle.db)) === 0) {
    // One after the other: each hash holds 32 MiB while it runs.
    accounts = ROLES.map((role) => ({ email: demoEmail(role), name: DEMO_NAMES[role], role, password: randomPassword() }));
    for (const account of accounts) await createUser(handle.db, account, opts.scrypt);
    writeAccountsFile(opts.accountsFile, accounts);
  }
  return { loaded, accounts };
}

export function formatAccounts(accounts: DemoAccount[]): string {
  const width = Math.max(...accounts.map((a) => a.email.length));
  return accounts.map((a) => `  ${a.role.padEnd(8)} ${a.email.padEnd(width)}  ${a.password}`).join('\n');
}

function writeAccountsFile(path: string, accounts: DemoAccount[]): void {
  // A folder made here is private; one that exists (the user's choice) is left as it is.
  mkdirSync(dirname(path), { recursive: true, mode: 0o700 });
  const text = [
    '# Panform demo accounts, created by `panform serve --demo` on an empty database.',
    '# Shown once; keep this file private or delete it once you have signed in.',
    '# Change a password with `panform user reset EMAIL`.',
    formatAccounts(accounts),
    '',
  ].join('\n');
  writeFileSync(path, text, { mode: 0o600 });
  // An existing file keeps its mode on write: set it explicitly.
  chmodSync(path, 0o600);
}
