// `panform serve`: the viewer and its API for the bakery's network. Opens the database (PGlite in
// a folder, or PostgreSQL from DATABASE_URL), applies the migrations, and listens until Ctrl+C.
import { statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { Command } from 'commander';
import { InputError, UsageError } from '../errors.ts';

interface RawOptions {
  port?: string;
  data?: string;
  host?: string;
  demo?: boolean;
  formulas?: string;
}

export interface ServeOptions {
  port?: number;
  dataDir?: string;
  host?: string;
  demo: boolean;
  /** The formulas folder to load on the first start (a database without formulas). */
  formulas?: string;
}

export function toServeOptions(raw: RawOptions): ServeOptions {
  let port: number | undefined;
  if (raw.port !== undefined) {
    if (!/^[0-9]+$/.test(raw.port.trim()) || Number(raw.port) > 65535) {
      throw new UsageError(`--port must be a whole number from 0 to 65535; got "${raw.port}"`, 'e.g. --port 8080');
    }
    port = Number(raw.port);
  }
  let formulas: string | undefined;
  if (raw.formulas !== undefined) {
    formulas = resolve(raw.formulas);
    if (!statSync(formulas, { throwIfNoEntry: false })?.isDirectory()) {
      throw new UsageError(`--formulas ${raw.formulas}: no such folder`, 'give the folder that holds ingredients.yaml, e.g. --formulas .');
    }
  }
  return { port, dataDir: raw.data, host: raw.host, demo: raw.demo === true, formulas };
}

/** A later start: the database keeps what it has; `panform load` brings the folder's changes in. */
function notLoaded(shown: string): string {
  return `The database has formulas already, so ${shown} was not loaded again; \`panform load ${shown}\` brings its changes in (with this server's --data or DATABASE_URL).\n`;
}

/** Beside the data folder: var/data's accounts in var/demo-accounts.txt, --data DIR's beside DIR. */
export const DEMO_ACCOUNTS_NAME = 'demo-accounts.txt';

async function serve(opts: ServeOptions): Promise<void> {
  const [{ readEnv, EnvError, redactUrl, envWarnings }, { openDatabase, migrateDatabase, DatabaseLockedError }, { startServer }] = await Promise.all([
    import('#server/env'),
    import('#server/db/client'),
    import('#server/start'),
  ]);
  let env;
  try {
    env = readEnv(process.env, { port: opts.port, dataDir: opts.dataDir });
  } catch (e) {
    if (e instanceof EnvError) throw new InputError(e.message, [], 'fix the variables above (or unset them for the defaults) and start again');
    throw e;
  }
  const out = process.stdout;
  for (const warning of envWarnings(env)) process.stderr.write(`panform serve: warning: ${warning}\n`);
  let handle;
  try {
    handle = env.databaseUrl && !opts.dataDir ? await openDatabase({ url: env.databaseUrl }) : await openDatabase({ dataDir: env.dataDir });
  } catch (e) {
    if (e instanceof DatabaseLockedError) {
      throw new InputError(e.message, [], e.lock?.port ? `Panform is probably already serving at http://localhost:${e.lock.port}` : 'stop that process first, or give another folder with --data');
    }
    throw new InputError(`cannot open the database ${env.databaseUrl && !opts.dataDir ? redactUrl(env.databaseUrl) : env.dataDir}: ${(e as Error).message}`);
  }
  let running;
  try {
    await migrateDatabase(handle);
    const shown = opts.formulas ? relative(process.cwd(), opts.formulas) || '.' : undefined;
    if (opts.demo) {
      const { seedDemo, findDemoFormulas, formatAccounts } = await import('#server/demo');
      const accountsFile = join(dirname(resolve(env.dataDir)), DEMO_ACCOUNTS_NAME);
      const formulasDir = opts.formulas ?? findDemoFormulas();
      if (!formulasDir) out.write('No ./formulas folder with an ingredients.yaml here: starting without the demo formulas.\n');
      const demo = await seedDemo(handle, { formulasDir, accountsFile });
      if (demo.loaded) {
        const s = demo.loaded;
        out.write(`Loaded the demo bakery: ${s.formulas.added.length} formulas, ${s.catalog.added.length} catalog entries, ${s.plans.added.length} plans.\n`);
      }
      if (demo.accounts) {
        out.write(`Demo accounts (shown once; also in ${relative(process.cwd(), accountsFile) || accountsFile}, readable only by you):\n${formatAccounts(demo.accounts)}\n`);
      }
      if (!demo.loaded && opts.formulas) out.write(notLoaded(shown!));
    } else if (opts.formulas) {
      const { loadIfEmpty } = await import('#server/demo');
      const s = await loadIfEmpty(handle, opts.formulas, 'panform serve --formulas');
      if (s) out.write(`First start: loaded ${shown}: ${s.formulas.added.length} formulas, ${s.catalog.added.length} catalog entries, ${s.plans.added.length} plans.\n`);
      else out.write(notLoaded(shown!));
    }
    running = await startServer({ handle, env, host: opts.host, handleSignals: true });
  } catch (e) {
    await handle.close();
    const { LoadCheckError, LoadPathError } = await import('#server/load/index');
    const what = opts.formulas ? `the formulas in ${relative(process.cwd(), opts.formulas) || '.'}` : 'the demo formulas';
    if (e instanceof LoadCheckError) {
      throw new InputError(`${what} could not be loaded: ${e.message}`, e.findings, `fix them (\`panform check ${opts.formulas ? relative(process.cwd(), opts.formulas) || '.' : 'formulas'}\`) and start again`);
    }
    if (e instanceof LoadPathError) throw new InputError(`${what} could not be loaded: ${e.message}`);
    if ((e as NodeJS.ErrnoException).code === 'EADDRINUSE') {
      throw new InputError(`port ${env.port} is already in use`, [], 'stop what uses it, or pick another with --port N (or PORT=N)');
    }
    if ((e as NodeJS.ErrnoException).code === 'EACCES') {
      throw new InputError(`not allowed to listen on port ${env.port}`, [], 'ports below 1024 need special rights; pick another with --port N');
    }
    throw e;
  }
  const where = handle.kind === 'postgres' ? 'PostgreSQL (DATABASE_URL)' : handle.dataDir;
  out.write(`Panform is serving on ${running.url} (data: ${where}).\n`);
  if (running.publicUrl !== running.url) out.write(`Links in e-mails point to ${running.publicUrl} (PANFORM_PUBLIC_URL).\n`);
  out.write('Press Ctrl+C to stop.\n');
  await running.closed;
  out.write('Panform stopped; the database is closed.\n');
}

export const command = new Command('serve')
  .description('serve the viewer and its API (PORT, default 3000; data from PANFORM_DATA or DATABASE_URL)')
  .option('--port <n>', 'port to listen on (default PORT or 3000)')
  .option('--data <dir>', 'PGlite data folder (default PANFORM_DATA or var/data)')
  .option('--host <address>', 'interface to listen on (default: all)')
  .option('--formulas <dir>', 'on the first start (a database without formulas): load this folder; later starts keep the database (`panform load` brings changes in)')
  .option('--demo', 'on an empty database: load ./formulas (or --formulas DIR) and create one demo account per role')
  .addHelpText(
    'after',
    `
Example:
  $ panform serve --port 8080 --data /srv/panform/data
  $ panform serve --formulas .   # in the bakery's repository: its files on the first start
  $ npm start          # panform serve --demo: the demo bakery on port 3000

Environment: PORT, PANFORM_DATA, DATABASE_URL, SMTP_URL, PANFORM_PUBLIC_URL, SESSION_DAYS,
TRUST_PROXY, NODE_ENV, PANFORM_OUTBOX, MAIL_FROM (see docs/operations.md).`,
  )
  .action(async (raw: RawOptions) => {
    await serve(toServeOptions(raw));
  });
