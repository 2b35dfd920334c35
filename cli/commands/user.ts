// `panform user add|list|remove|reset`: accounts and roles, in the same database the server uses.
// Passwords are typed at a prompt (twice), or read from standard input for scripts.
import { Command, Option } from 'commander';
import { InputError, UsageError } from '../errors.ts';

const ROLE_CHOICES = ['admin', 'author', 'reviewer', 'bench'] as const;

interface DataOption {
  data?: string;
}

async function openDb(opts: DataOption) {
  const { openMigratedDatabase, DatabaseLockedError } = await import('#server/db/client');
  try {
    return await openMigratedDatabase(opts.data ? { dataDir: opts.data } : {});
  } catch (e) {
    if (e instanceof DatabaseLockedError) {
      throw new InputError(
        `${e.message}; accounts cannot be changed while it holds the database`,
        [],
        'stop the server (Ctrl+C in its terminal), run this command, then start the server again',
      );
    }
    throw new InputError(`cannot open the database: ${(e as Error).message}`);
  }
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
    const { createUser, DuplicateUserError } = await import('#server/auth/users');
    const handle = await openDb(opts);
    try {
      await createUser(handle.db, { email: opts.email, role: opts.role, name: opts.name, password });
    } catch (e) {
      if (e instanceof DuplicateUserError) throw new InputError(e.message, [], `change its password with \`panform user reset ${opts.email}\``);
      throw e;
    } finally {
      await handle.close();
    }
    process.stdout.write(`Added ${opts.email} (${opts.role}).\n`);
  });

export interface UserListEntry {
  email: string;
  name: string;
  role: string;
  createdAt: string;
  passwordChangedAt: string;
}

const list = new Command('list')
  .description('list the accounts')
  .option('--json', 'print JSON')
  .addOption(dataOption())
  .addHelpText('after', '\nExample:\n  $ panform user list\n  $ panform user list --json')
  .action(async (raw: { json?: boolean } & DataOption) => {
    const { listUsers } = await import('#server/auth/users');
    const handle = await openDb(raw);
    let users: UserListEntry[];
    try {
      users = (await listUsers(handle.db)).map((u) => ({
        email: u.email,
        name: u.name,
        role: u.role,
        createdAt: u.createdAt.toISOString(),
        passwordChangedAt: u.passwordChangedAt.toISOString(),
      }));
    } finally {
      await handle.close();
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
    const { removeUser } = await import('#server/auth/users');
    const handle = await openDb(raw);
    let removed: boolean;
    try {
      removed = await removeUser(handle.db, e);
    } finally {
      await handle.close();
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
    const { findUserByEmail, setPassword } = await import('#server/auth/users');
    const handle = await openDb(raw);
    try {
      // Check the account first so nobody types a password for nothing.
      const user = await findUserByEmail(handle.db, e);
      if (!user) throw new InputError(`no account for ${e}`, [], `add it with \`panform user add ${e} --role ROLE\``);
      const password = await newPassword(raw.passwordStdin === true, e);
      await setPassword(handle.db, user.id, password);
    } finally {
      await handle.close();
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
