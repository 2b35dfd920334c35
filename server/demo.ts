// `panform serve --demo` (what `npm start` runs): on an empty database, load the demo bakery's
// formulas and create one account per role with a random password, written once to a file only
// its owner can read.
import { chmodSync, existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ROLES, type Role } from '#shared/permissions';
import { hashPassword, randomPassword, type ScryptParams } from './auth/password.ts';
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
  const accounts = (await countUsers(handle.db)) === 0 ? ROLES.map((role) => ({ email: demoEmail(role), name: DEMO_NAMES[role], role, password: randomPassword() })) : null;
  // The passwords are hashed on Node's thread pool while the formulas load on the main thread
  // (a quarter of a second each, so most of a first start otherwise), and the accounts are added
  // only once the load has succeeded, as before.
  const hashing = accounts ? hashOneAtATime(accounts.map((a) => a.password), opts.scrypt) : null;
  hashing?.catch(() => {}); // a failed load is the error to report
  const loaded = opts.formulasDir ? await loadIfEmpty(handle, opts.formulasDir, 'panform serve --demo') : null;

  if (accounts && hashing) {
    const hashes = await hashing;
    for (const [i, account] of accounts.entries()) await createUser(handle.db, { ...account, passwordHash: hashes[i]! });
    writeAccountsFile(opts.accountsFile, accounts);
  }
  return { loaded, accounts };
}

/** One after the other: each hash holds 32 MiB while it runs. */
async function hashOneAtATime(passwords: string[], params?: ScryptParams): Promise<string[]> {
  const hashes: string[] = [];
  for (const password of passwords) hashes.push(await hashPassword(password, params));
  return hashes;
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
