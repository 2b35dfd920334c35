// `panform friction`: what the bench's records say about each mixer's friction, per mixer and
// product, next to what the plan files say. Reads the database the server uses (or asks the
// server holding it over the local channel). Changes nothing: the baker edits the plan file.
import { Command, Option } from 'commander';
import type { FrictionResponse } from '#shared/api';
import type { FrictionProposal } from '#shared/friction';
import { InputError, UsageError } from '../errors.ts';
import { renderTable } from '../print/table.ts';

export interface FrictionOptions {
  mixer?: string;
  formula?: string;
  date?: string;
  data?: string;
  json: boolean;
}

export function toFrictionOptions(raw: { mixer?: string; formula?: string; date?: string; data?: string; json?: boolean }): FrictionOptions {
  if (raw.date !== undefined && !/^[0-9]{4}-[0-9]{2}-[0-9]{2}$/.test(raw.date)) throw new UsageError(`--date must be a bake day like 2026-12-03; got "${raw.date}"`);
  return { mixer: raw.mixer, formula: raw.formula, date: raw.date, data: raw.data, json: raw.json === true };
}

/** The friction table, from the database directly or from the server holding the PGlite folder. */
export async function collectFriction(o: FrictionOptions): Promise<FrictionResponse> {
  const { openMigratedDatabase, DatabaseLockedError } = await import('#server/db/client');
  let handle;
  try {
    handle = await openMigratedDatabase(o.data ? { dataDir: o.data } : {});
  } catch (e) {
    if (e instanceof DatabaseLockedError) return fromServer(o, e.dataDir, e.lock);
    throw new InputError(`cannot open the database: ${(e as Error).message}`);
  }
  try {
    const [{ DataCache }, { frictionResponse }] = await Promise.all([import('#server/routes/data'), import('#server/records/friction')]);
    const snapshot = await new DataCache(handle.db).snapshot();
    return await frictionResponse(handle.db, snapshot, 'admin', o);
  } finally {
    await handle.close();
  }
}

async function fromServer(o: FrictionOptions, dataDir: string, lock: import('#server/db/client').LockInfo | null): Promise<FrictionResponse> {
  if (!lock?.port) {
    throw new InputError(
      lock ? `the database in ${dataDir} is in use by another Panform process (pid ${lock.pid}) that is not a server` : `the database in ${dataDir} is in use by another user's Panform process`,
      [],
      'wait for it to finish, then run this command again',
    );
  }
  const { LOAD_TOKEN_HEADER } = await import('#server/routes/internal-load');
  const query = new URLSearchParams();
  for (const k of ['mixer', 'formula', 'date'] as const) if (o[k]) query.set(k, o[k]);
  let res: Response;
  try {
    res = await fetch(`http://127.0.0.1:${lock.port}/api/internal/friction?${query}`, { headers: { [LOAD_TOKEN_HEADER]: lock.token }, signal: AbortSignal.timeout(60_000) });
  } catch (e) {
    throw new InputError(`the Panform server (pid ${lock.pid}, port ${lock.port}) holds ${dataDir} but did not answer: ${(e as Error).message}`);
  }
  const out = (await res.json().catch(() => null)) as FrictionResponse | null;
  if (!res.ok || !out || !Array.isArray(out.proposals)) throw new InputError(`the process on port ${lock.port} did not answer as a Panform server (HTTP ${res.status})`);
  return out;
}

const deg = (v: number | null) => (v === null ? '' : `${v.toFixed(1)} °C`);

const STATUS: Record<FrictionProposal['status'], string> = { propose: 'change proposed', agrees: 'plan agrees', 'too few': 'too few mixes' };

export function renderFriction(r: FrictionResponse): string {
  if (r.proposals.length === 0) return 'No mix has been recorded yet: the bench records the dough temperature off the mixer on the bake-day page.\n';
  const rows = r.proposals.map((p) => [
    p.mixer,
    p.title,
    p.outliers.length > 0 ? `${p.used} of ${p.mixes}` : String(p.mixes),
    p.current ? deg(p.current.rise) : '',
    deg(p.rise),
    p.friction === null ? '' : deg(p.friction),
    STATUS[p.status],
  ]);
  const out = [
    renderTable({
      title: `Friction learned from the bench records (${r.rule}; at least ${r.minimum} mixes):`,
      head: ['mixer', 'product', 'mixes', 'plan rise', 'records rise', 'straight-dough friction', ''],
      rows,
      align: ['left', 'left', 'right', 'right', 'right', 'right', 'left'],
    }),
    '',
  ];
  for (const p of r.proposals) {
    let line = `${p.mixer} · ${p.title}: ${p.basis}`;
    if (p.outliers.length > 0) line += `; left out: ${p.outliers.map((o) => `${o.date} rise ${deg(o.rise)} (record ${o.recordId})`).join(', ')}`;
    if (p.change) line += `\n  to use it: ${p.change}`;
    out.push(line);
  }
  out.push('', 'Nothing changes by itself: the plan files keep their values until you edit them.');
  return `${out.join('\n')}\n`;
}

export const command = new Command('friction')
  .description("each mixer's friction per product as the bench's recorded dough temperatures show it, beside the plan's value")
  .option('--mixer <name>', 'only this mixer')
  .option('--formula <id>', 'only this formula')
  .option('--date <yyyy-mm-dd>', "compare with this bake day's plan (default: the newest plan with each mixer)")
  .option('--json', 'print JSON (as GET /api/friction)')
  .addOption(new Option('--data <dir>', 'PGlite data folder (default PANFORM_DATA or var/data; DATABASE_URL for PostgreSQL)'))
  .addHelpText('after', '\nExample:\n  $ panform friction\n  $ panform friction --mixer spiral --json')
  .action(async (raw: { mixer?: string; formula?: string; date?: string; data?: string; json?: boolean }) => {
    const o = toFrictionOptions(raw);
    const r = await collectFriction(o);
    process.stdout.write(o.json ? `${JSON.stringify(r, null, 2)}\n` : renderFriction(r));
  });
