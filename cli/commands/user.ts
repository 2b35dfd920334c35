// `panform user add|list|remove|reset`: accounts and roles, in the same database the server uses.
// Passwords are typed at a prompt (twice), or read from standard input for scripts.
import { userInfo } from 'node:os';
import { Command, Option } from 'commander';
import type { AccountListEntry as UserListEntry } from '#server/routes/internal-users';
import { InputError, UsageError } from '../errors.ts';

const ROLE_CHOICES = ['admin', 'author', 'reviewer', 'bench'] as const;

interface DataOption {
  data?: string;
}

type Role = (typeof ROLE_CHOICES)[number];

/** Who changes accounts, for the audit list: the system user running the command. */
function actor(): string {
  let name = process.env.USER ?? '';
  try {
    name = userInfo().username;
  } catch {
    // keep $USER
  }
  return `panform user (${name || 'unknown'})`;
}

/** The account changes `panform user` makes, on the database itself or through the running server. */
interface Accounts {
  list(): Promise<UserListEntry[]>;
  exists(email: string): Promise<boolean>;
  add(input: { email: string; role: Role; name: string; password: string }): Promise<void>;
  remove(email: string): Promise<boolean>;
  reset(email: string, password: string): Promise<void>;
  close(): Promise<void>;
}

/** The database directly; while `panform serve` holds the PGlite folder, the server over the local channel. */
async function openAccounts(opts: DataOption): Promise<Accounts> {
  const { openMigratedDatabase, DatabaseLockedError } = await import('#server/db/client');
  let handle;
  try {
    handle = await openMigratedDatabase(opts.data ? { dataDir: opts.data } : {});
  } catch (e) {
    if (e instanceof DatabaseLockedError) return serverAccounts(e.dataDir, e.lock);
    throw new InputError(`cannot open the database: ${(e as Error).message}`);
  }
  const db = handle.db;
  const [{ addAccount, removeAccount, resetPassword, AccountRuleError }, { findUserByEmail, DuplicateUserError }, { accountList }] = await Promise.all([
    import('#server/auth/accounts'),
    import('#server/auth/users'),
    import('#server/routes/internal-users'),
  ]);
  const rule = (e: unknown): never => {
    if (e instanceof DuplicateUserError || e instanceof AccountRuleError) throw new InputError(e.message);
    throw e;
  };
  return {
    list: () => accountList({ db }),
    exists: async (email) => (await findUserByEmail(db, email)) !== undefined,
    async add(input) {
      await addAccount(db, input, actor()).catch(rule);
    },
    async remove(email) {
      const user = await findUserByEmail(db, email);
      if (!user) return false;
      await removeAccount(db, user, actor()).catch(rule);
      return true;
    },
    async reset(email, password) {
      const user = await findUserByEmail(db, email);
      if (!user) throw new InputError(`no account for ${email}`);
      await resetPassword(db, user, password, actor());
    },
    close: () => handle.close(),
  };
}

function serverAccounts(dataDir: string, lock: import('#server/db/client').LockInfo | null): Accounts {
  if (!lock?.port) {
    throw new InputError(
      lock ? `the database in ${dataDir} is in use by another Panform process (pid ${lock.pid}) that is not a server` : `the database in ${dataDir} is in use by another user's Panform process`,
      [],
      'wait for it to finish, then run this command again',
    );
  }
  const call = async (body: Record<string, unknown>): Promise<{ ok: boolean; message?: string; error?: string; users?: UserListEntry[] }> => {
    const { LOAD_TOKEN_HEADER } = await import('#server/routes/internal-load');
    let res: Response;
    try {
      res = await fetch(`http://127.0.0.1:${lock.port}/api/internal/users`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', [LOAD_TOKEN_HEADER]: lock.token },
        body: JSON.stringify({ ...body, by: actor() }),
        signal: AbortSignal.timeout(60_000),
      });
    } catch (e) {
      throw new InputError(`the Panform server (pid ${lock.pid}, port ${lock.port}) holds ${dataDir} but did not answer: ${(e as Error).message}`);
    }
    const out = (await res.json().catch(() => null)) as { ok: boolean; message?: string; error?: string; users?: UserListEntry[] } | null;
    if (!out) throw new InputError(`the process on port ${lock.port} did not answer as a Panform server (HTTP ${res.status}); nothing was changed`);
    return out;
  };
  const must = async (body: Record<string, unknown>) => {
    const out = await call(body);
    if (!out.ok) throw new InputError(out.message ?? 'the server refused the change');
    return out;
  };
  return {
    list: async () => (await must({ action: 'list' })).users ?? [],
    exists: async (email) => ((await must({ action: 'list' })).users ?? []).some((u) => u.email === email),
    async add(input) {
      await must({ action: 'add', ...input });
    },
    async remove(email) {
      const out = await call({ action: 'remove', email });
      if (!out.ok && out.error === 'not_found') return false;
      if (!out.ok) throw new InputError(out.message ?? 'the server refused the change');
      return true;
    },
    async reset(email, password) {
      await must({ action: 'reset', email, password });
    },
    close: async () => {},
  };
}

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const c of process.stdin) chunks.push(c as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}

/** The new password: from standard input (first line) or typed twice at a prompt. */
async function newPassword(fromStdin: boolean, email: string): Promise<string> {
  const { checkNewPassword } = await import('#server/auth/password');
  let password: string;
  if (fromStdin) {
    password = (await readStdin()).split(/\r?\n/)[0] ?? '';
  } else {
    if (!process.stdin.isTTY) throw new UsageError('no terminal to type a password in', 'pipe it in with --password-stdin');
    const { password: ask } = await import('@inquirer/prompts');
    password = await ask({
      message: `New password for ${email}:`,
      mask: '*',
      validate: (v) => checkNewPassword(v) ?? true,
    });
    const again = await ask({ message: 'Type it again:', mask: '*' });
    if (again !== password) throw new InputError('the two passwords differ; nothing was changed');
  }
  const problem = checkNewPassword(password);
  if (problem) throw new InputError(problem);
  return password;
}

async function checkEmail(email: string): Promise<string> {
  const { isEmail, normalizeEmail } = await import('#server/auth/users');
  const e = normalizeEmail(email);
  if (!isEmail(e)) throw new UsageError(`not an e-mail address: "${email}"`, 'e.g. ines@tidewater.example');
  return e;
}

const dataOption = () => new Option('--data <dir>', 'PGlite data folder (default PANFORM_DATA or var/data; DATABASE_URL for PostgreSQL)');

const add = new Command('add')
  .description('create an account')
  .argument('<email>', 'the e-mail address to sign in with')
  .addOption(new Option('--role <role>', 'what the account may see').choices(ROLE_CHOICES).makeOptionMandatory())
  .option('--name <name>', 'the person\'s name, as shown in the viewer')
  .option('--password-stdin', 'read the password from standard input instead of prompting')
  .addOption(dataOption())
  .addHelpText('after', '\nExample:\n  $ panform user add ines@tidewater.example --role author --name "Ines Calloway"\n  $ printf "%s\\n" "$PASSWORD" | panform user add bench@tidewater.example --role bench --password-stdin')
  .action(async (email: string, raw: { role: (typeof ROLE_CHOICES)[number]; name?: string; passwordStdin?: boolean } & DataOption) => {
    const opts = { email: await checkEmail(email), role: raw.role, name: raw.name ?? '', stdin: raw.passwordStdin === true, data: raw.data };
    const password = await newPassword(opts.stdin, opts.email);
    const accounts = await openAccounts(opts);
    try {
      if (await accounts.exists(opts.email)) {
        throw new InputError(`an account for ${opts.email} already exists`, [], `change its password with \`panform user reset ${opts.email}\``);
      }
      await accounts.add({ email: opts.email, role: opts.role, name: opts.name, password });
    } finally {
      await accounts.close();
    }
    process.stdout.write(`Added ${opts.email} (${opts.role}).\n`);
  });

export type { UserListEntry };

const list = new Command('list')
  .description('list the accounts')
  .option('--json', 'print JSON')
  .addOption(dataOption())
  .addHelpText('after', '\nExample:\n  $ panform user list\n  $ panform user list --json')
  .action(async (raw: { json?: boolean } & DataOption) => {
    const accounts = await openAccounts(raw);
    let users: UserListEntry[];
    try {
      users = await accounts.list();
    } finally {
      await accounts.close();
    }
    if (raw.json) {
      process.stdout.write(`${JSON.stringify(users, null, 2)}\n`);
      return;
    }
    if (users.length === 0) {
      process.stdout.write('No accounts yet. Add one with `panform user add EMAIL --role admin`.\n');
      return;
    }
    const w = Math.max(5, ...users.map((u) => u.email.length));
    const lines = [`${'email'.padEnd(w)}  ${'role'.padEnd(8)}  name`, ...users.map((u) => `${u.email.padEnd(w)}  ${u.role.padEnd(8)}  ${u.name}`)];
    process.stdout.write(`${lines.join('\n')}\n`);
  });

const remove = new Command('remove')
  .description('remove an account (it is signed out everywhere)')
  .argument('<email>')
  .addOption(dataOption())
  .addHelpText('after', '\nExample:\n  $ panform user remove jonah@tidewater.example')
  .action(async (email: string, raw: DataOption) => {
    const e = await checkEmail(email);
    const accounts = await openAccounts(raw);
    let removed: boolean;
    try {
      removed = await accounts.remove(e);
    } finally {
      await accounts.close();
    }
    if (!removed) throw new InputError(`no account for ${e}`, [], 'see the accounts with `panform user list`');
    process.stdout.write(`Removed ${e}.\n`);
  });

const reset = new Command('reset')
  .description('set a new password for an account (it is signed out everywhere)')
  .argument('<email>')
  .option('--password-stdin', 'read the password from standard input instead of prompting')
  .addOption(dataOption())
  .addHelpText('after', '\nExample:\n  $ panform user reset ines@tidewater.example\n  $ printf "%s\\n" "$PASSWORD" | panform user reset ines@tidewater.example --password-stdin')
  .action(async (email: string, raw: { passwordStdin?: boolean } & DataOption) => {
    const e = await checkEmail(email);
    const accounts = await openAccounts(raw);
    try {
      // Check the account first so nobody types a password for nothing.
      if (!(await accounts.exists(e))) throw new InputError(`no account for ${e}`, [], `add it with \`panform user add ${e} --role ROLE\``);
      const password = await newPassword(raw.passwordStdin === true, e);
      await accounts.reset(e, password);
    } finally {
      await accounts.close();
    }
    process.stdout.write(`New password set for ${e}; its sessions are signed out.\n`);
  });

export const command = new Command('user')
  .description('manage accounts and roles: add, list, remove, reset')
  .addCommand(add.exitOverride())
  .addCommand(list.exitOverride())
  .addCommand(remove.exitOverride())
  .addCommand(reset.exitOverride())
  .addHelpText('after', '\nExample:\n  $ panform user add ines@tidewater.example --role author\n  $ panform user list');
