// `panform load [paths..]`: check every file, then load them all into the database in one
// transaction. While `panform serve` holds the PGlite data directory, the load is handed to the
// server over the local load channel (its port and token are in the directory's lock file).
import { Command } from 'commander';
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { userInfo } from 'node:os';
import { formatFinding, type Finding } from '#shared/parse';
import { InputError, UsageError } from '../errors.ts';
import { defaultFormulasFolder } from '../files.ts';
import { fitText } from '../print/width.ts';
import type { LoadProgress, LoadSummary, KindSummary } from '../../server/load/index.ts';
import type { InternalLoadResponse } from '../../server/routes/internal-load.ts';
import type { LockInfo } from '../../server/db/client.ts';

export interface LoadCommandOptions {
  paths: string[];
  /** PGlite data directory (default PANFORM_DATA, else var/data); DATABASE_URL is used when unset. */
  data?: string;
  by: string;
  json: boolean;
  /** Show a progress bar (a terminal, and not --json). */
  progress: boolean;
  /** Runs inside the load's transaction (tests kill the process there); not on the command line. */
  inTransaction?: () => Promise<void>;
}

export interface LoadReport {
  /** Where the data went: a PGlite directory or a PostgreSQL server (password hidden). */
  database: string;
  /** `direct`: this process wrote; `server`: handed to the running server. */
  via: 'direct' | 'server';
  summary: LoadSummary;
  warnings: Finding[];
}


function hidePassword(url: string): string {
  try {
    const u = new URL(url);
    if (u.password) u.password = '***';
    return u.toString();
  } catch {
    return 'a PostgreSQL server';
  }
}

/** Hands the load to the server that holds the directory. */
async function handToServer(dataDir: string, lock: LockInfo | null, paths: string[], by: string): Promise<LoadSummary> {
  if (!lock) {
    throw new InputError(`the database in ${dataDir} is in use by another user's Panform process`, [], 'load as that user, or stop that process and load again');
  }
  if (!lock.port) {
    throw new InputError(
      `the database in ${dataDir} is in use by another Panform process (pid ${lock.pid}) that does not take loads`,
      [],
      'wait for it to finish (another load, or a `panform user` command), then load again',
    );
  }
  const { LOAD_TOKEN_HEADER } = await import('../../server/routes/internal-load.ts');
  let res: Response;
  try {
    res = await fetch(`http://127.0.0.1:${lock.port}/api/internal/load`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', [LOAD_TOKEN_HEADER]: lock.token },
      body: JSON.stringify({ paths, by }),
      signal: AbortSignal.timeout(10 * 60_000),
    });
  } catch (e) {
    throw new InputError(
      `the Panform server (pid ${lock.pid}, port ${lock.port}) holds ${dataDir} but did not answer: ${(e as Error).message}`,
      [],
      'check that `panform serve` is running, or stop it and load again',
    );
  }
  let body: InternalLoadResponse;
  try {
    body = (await res.json()) as InternalLoadResponse;
  } catch {
    throw new InputError(`the process on port ${lock.port} did not answer as a Panform server (HTTP ${res.status}); nothing was loaded`);
  }
  if (!body.ok) throw new InputError(`the server did not load: ${body.message}`, body.findings ?? []);
  if (resolve(body.dataDir) !== resolve(dataDir)) {
    throw new InputError(`the server on port ${lock.port} holds ${body.dataDir}, not ${dataDir}`);
  }
  return body.summary;
}

async function progressBar(enabled: boolean): Promise<{ update: (p: LoadProgress) => void; stop: () => void }> {
  if (!enabled) return { update: () => {}, stop: () => {} };
  const { SingleBar, Presets } = await import('cli-progress');
  const bar = new SingleBar(
    { format: '{phase} [{bar}] {value}/{total}', stream: process.stderr, clearOnComplete: true, hideCursor: true },
    Presets.shades_classic,
  );
  let started = false;
  return {
    update(p) {
      if (p.phase !== 'write') return;
      if (!started) {
        bar.start(Math.max(p.total, 1), 0, { phase: 'loading' });
        started = true;
      }
      bar.update(Math.min(p.done, p.total), { phase: 'loading' });
    },
    stop() {
      if (started) bar.stop();
    },
  };
}

/** Checks, then loads; returns what changed. */
export async function collectLoad(options: LoadCommandOptions): Promise<LoadReport> {
  const given = options.paths.length > 0 ? options.paths : [defaultFormulasFolder()];
  // The server's working folder may differ: it gets absolute paths.
  const paths = given.map((p) => resolve(p));
  const { prepareLoad, applyLoad, LoadPathError } = await import('../../server/load/index.ts');
  let prepared: Awaited<ReturnType<typeof prepareLoad>>;
  try {
    prepared = await prepareLoad(given);
  } catch (e) {
    if (e instanceof LoadPathError) {
      throw new UsageError(e.message, options.paths.length === 0 ? 'run panform load in the project folder, or give the folder or files to load' : undefined);
    }
    throw e;
  }
  const { input, checked } = prepared;
  if (!checked.ok) {
    const errors = checked.findings.filter((f) => f.severity === 'error').length;
    throw new InputError(`nothing loaded: ${errors} error${errors === 1 ? '' : 's'} in the files`, checked.findings, 'fix them (`panform check` shows the same list), then load again');
  }
  const warnings = checked.findings.filter((f) => f.severity === 'warning');

  const { DatabaseLockedError, migrateDatabase, openDatabase, resolveTarget } = await import('../../server/db/client.ts');
  const target = resolveTarget({ dataDir: options.data });
  const database = target.kind === 'postgres' ? hidePassword(target.url) : target.kind === 'pglite' ? target.dataDir : 'memory';
  let handle: Awaited<ReturnType<typeof openDatabase>>;
  if (options.progress) {
    const fresh = target.kind === 'pglite' && !existsSync(join(target.dataDir, 'PG_VERSION'));
    process.stderr.write(`${checked.formulas.length} formulas checked; opening ${database}${fresh ? ' (a new database takes a few seconds to create)' : ''}\n`);
  }
  try {
    handle = await openDatabase({ dataDir: options.data });
  } catch (e) {
    if (e instanceof DatabaseLockedError) {
      const summary = await handToServer(e.dataDir, e.lock, paths, options.by);
      return { database, via: 'server', summary, warnings };
    }
    throw new InputError(`cannot open the database ${database}: ${(e as Error).message}`);
  }
  const bar = await progressBar(options.progress);
  try {
    await migrateDatabase(handle);
    const summary = await applyLoad(handle, input, checked, { by: options.by, onProgress: bar.update, inTransaction: options.inTransaction });
    return { database, via: 'direct', summary, warnings };
  } finally {
    bar.stop();
    await handle.close();
  }
}

function kindLine(label: string, k: KindSummary, removedWord: string): string {
  const parts: string[] = [];
  if (k.added.length) parts.push(`${k.added.length} added`);
  if (k.changed.length) parts.push(`${k.changed.length} changed`);
  if (k.removed.length) parts.push(`${k.removed.length} ${removedWord}`);
  parts.push(`${k.unchanged.length} unchanged`);
  return `  ${label.padEnd(9)} ${parts.join(', ')}`;
}

export function printLoad(r: LoadReport): string {
  const s = r.summary;
  const out: string[] = [];
  for (const w of r.warnings) out.push(formatFinding(w));
  const where = r.via === 'server' ? `${r.database} (through the running server)` : r.database;
  out.push(`Loaded ${s.files} file${s.files === 1 ? '' : 's'} into ${where}: load ${s.loadId}${s.gitCommit ? ` at commit ${s.gitCommit.slice(0, 10)}` : ''}`);
  out.push(kindLine('formulas', s.formulas, 'removed (kept, retired)'));
  // Long lists (a first load) are cut short; --json has them all.
  const names = (mark: string, ids: string[], note = '') => {
    const shown = ids.length > 12 ? ids.slice(0, 10) : ids;
    const lines = shown.map((id) => `    ${mark} ${id}${note}`);
    if (shown.length < ids.length) lines.push(`    ${mark} … and ${ids.length - shown.length} more`);
    return lines;
  };
  out.push(...names('+', s.formulas.added), ...names('~', s.formulas.changed, ' (new revision)'), ...names('-', s.formulas.removed, ' (kept, retired)'));
  if (s.refigured.length) out.push(`    figures updated for the catalog change: ${s.refigured.join(', ')}`);
  if (s.catalog.added.length + s.catalog.changed.length + s.catalog.removed.length + s.catalog.unchanged.length > 0) {
    out.push(kindLine('catalog', s.catalog, 'removed'));
    out.push(...names('+', s.catalog.added), ...names('~', s.catalog.changed), ...names('-', s.catalog.removed));
  }
  out.push(kindLine('plans', s.plans, 'removed'));
  out.push(...names('+', s.plans.added), ...names('~', s.plans.changed), ...names('-', s.plans.removed));
  if (!s.complete) out.push('  (single files: formulas and plans not named were left as they are)');
  return `${out.join('\n')}\n`;
}

function defaultBy(): string {
  try {
    return userInfo().username;
  } catch {
    return process.env.USER ?? '';
  }
}

export const command = new Command('load')
  .description('check formulas, the catalog and plans, then load them into the database in one transaction')
  .argument('[paths...]', 'folders or files to load (default: formulas/, or . when it holds ingredients.yaml)')
  .option('--data <dir>', 'PGlite data directory (default: PANFORM_DATA, else var/data; DATABASE_URL selects a PostgreSQL server)')
  .option('--by <name>', 'who loads, for the log of loads (default: your user name)')
  .option('--json', 'print what changed as JSON', false)
  .addHelpText(
    'after',
    `
Everything is checked first; on any error nothing is loaded. A formula gets a new
revision only when its file changed; a formula whose file is gone is kept, retired.
While \`panform serve\` runs on the same data directory, the load is handed to it.

Examples:
  $ panform load                                  # formulas/ into var/data
  $ panform load formulas --data /srv/panform/data
  $ DATABASE_URL=postgres://panform@db.tidewater.example/panform \\
      panform load --json
`,
  )
  .action(async (paths: string[], flags: { data?: string; by?: string; json?: boolean }) => {
    const json = flags.json === true;
    const options: LoadCommandOptions = {
      paths: paths ?? [],
      data: flags.data,
      by: flags.by ?? defaultBy(),
      json,
      progress: !json && process.stderr.isTTY === true,
    };
    const report = await collectLoad(options);
    process.stdout.write(json ? `${JSON.stringify(report, null, 2)}\n` : fitText(printLoad(report)));
  });
