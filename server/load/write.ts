// Writing a checked load into the database in ONE transaction: the catalog, the formulas (a new
// revision only when the file's content changed; a formula whose file disappeared is kept and
// marked removed and retired), the plans, and a row in `loads` with the summary. A load that dies
// part-way leaves the previous state untouched, because nothing is committed until the end.
import { eq, inArray, sql } from 'drizzle-orm';
import type { FormulaFigures } from '#shared/api';
import { sameFigures } from '#shared/figures';
import type { Database } from '../db/client.ts';
import { LOADS_CHANNEL } from '../db/listen.ts';
import { catalogTable, formulaRevisionsTable, formulasTable, loadsTable, plansTable } from '../db/schema.ts';
import { contentHash, type CheckResult } from './check.ts';
import type { LoadInput } from './read.ts';

export interface KindSummary {
  /** New, or back in the folder after being removed. */
  added: string[];
  /** Content changed (for formulas: a new revision). */
  changed: string[];
  unchanged: string[];
  /** Formulas: marked removed and retired (kept). Plans and catalog entries: deleted. */
  removed: string[];
}

export interface LoadSummary {
  loadId: number;
  by: string;
  gitCommit: string | null;
  files: number;
  /** A load of whole folders (removals detected) or of single files. */
  complete: boolean;
  formulas: KindSummary;
  catalog: KindSummary;
  plans: KindSummary;
  /** Formulas whose reference figures changed without a new revision (the catalog changed). */
  refigured: string[];
  startedAt: string;
  finishedAt: string;
}

export interface LoadProgress {
  phase: 'read' | 'check' | 'write' | 'done';
  done: number;
  total: number;
}

export interface WriteOptions {
  /** Who loads: a user's name or e-mail. */
  by?: string;
  onProgress?: (p: LoadProgress) => void;
  /** Runs inside the transaction before the load row is finished (tests use it to kill a load mid-way). */
  inTransaction?: () => Promise<void>;
  /** The clock (tests). */
  now?: () => Date;
}

const CHUNK = 250;

function chunks<T>(xs: T[], size = CHUNK): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < xs.length; i += size) out.push(xs.slice(i, i + size));
  return out;
}

const excluded = (column: string) => sql.raw(`excluded."${column}"`);

const emptyKind = (): KindSummary => ({ added: [], changed: [], unchanged: [], removed: [] });

type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
type Checked = Extract<CheckResult, { ok: true }>;
type CheckedFormulas = Checked['formulas'];
type CheckedPlans = Checked['plans'];

export async function writeLoad(
  db: Database,
  input: LoadInput,
  checked: Extract<CheckResult, { ok: true }>,
  opts: WriteOptions = {},
): Promise<LoadSummary> {
  const now = opts.now ?? (() => new Date());
  const startedAt = now();
  const by = opts.by ?? '';
  const total = (checked.catalog ? Object.keys(checked.catalog.raw).length : 0) + checked.formulas.length + checked.plans.length;
  let done = 0;
  const progress = (n: number) => {
    done += n;
    opts.onProgress?.({ phase: 'write', done, total });
  };
  opts.onProgress?.({ phase: 'write', done: 0, total });

  return db.transaction(async (tx) => {
    // Two loads against one PostgreSQL server (two sites) wait for each other instead of interleaving.
    await tx.execute(sql`select pg_advisory_xact_lock(726102)`);
    const [loadRow] = await tx
      .insert(loadsTable)
      .values({ startedAt, by, gitCommit: input.gitCommit, files: input.files.length })
      .returning({ id: loadsTable.id });
    const loadId = loadRow.id;

    let catalog = emptyKind();
    if (checked.catalog) {
      catalog = await writeCatalog(tx, checked.catalog.raw, startedAt);
      progress(Object.keys(checked.catalog.raw).length);
    }
    const formulas = await writeFormulas(tx, checked.formulas, { loadId, startedAt, complete: input.complete }, progress);
    const plans = await writePlans(tx, checked.plans, startedAt, input.complete);
    progress(checked.plans.length);

    if (opts.inTransaction) await opts.inTransaction();

    const finishedAt = now();
    const summary: LoadSummary = {
      loadId,
      by,
      gitCommit: input.gitCommit,
      files: input.files.length,
      complete: input.complete,
      formulas: formulas.summary,
      catalog,
      plans,
      refigured: formulas.refigured,
      startedAt: startedAt.toISOString(),
      finishedAt: finishedAt.toISOString(),
    };
    await tx.update(loadsTable).set({ finishedAt, summary }).where(eq(loadsTable.id, loadId));
    // Every server listening on the database hears of the load when it commits (server/db/listen.ts).
    await tx.execute(sql`select pg_notify(${LOADS_CHANNEL}, ${String(loadId)})`);
    opts.onProgress?.({ phase: 'done', done: total, total });
    return summary;
  });
}

/** The catalog file is always whole: entries no longer in it are deleted. */
async function writeCatalog(tx: Transaction, raw: Record<string, unknown>, startedAt: Date): Promise<KindSummary> {
  const catalog = emptyKind();
  const existing = new Map((await tx.select({ name: catalogTable.name, hash: catalogTable.contentHash }).from(catalogTable)).map((r) => [r.name, r.hash]));
  const rows: (typeof catalogTable.$inferInsert)[] = [];
  for (const [name, entry] of Object.entries(raw)) {
    const hash = contentHash(JSON.stringify(entry));
    const before = existing.get(name);
    existing.delete(name);
    if (before === hash) {
      catalog.unchanged.push(name);
      continue;
    }
    (before === undefined ? catalog.added : catalog.changed).push(name);
    rows.push({ name, content: entry, contentHash: hash, updatedAt: startedAt });
  }
  for (const part of chunks(rows)) {
    await tx
      .insert(catalogTable)
      .values(part)
      .onConflictDoUpdate({
        target: catalogTable.name,
        set: { content: excluded('content'), contentHash: excluded('content_hash'), updatedAt: excluded('updated_at') },
      });
  }
  const gone = [...existing.keys()];
  for (const part of chunks(gone)) await tx.delete(catalogTable).where(inArray(catalogTable.name, part));
  catalog.removed.push(...gone);
  return catalog;
}

/**
 * Formulas: compared with what is there; a new revision only when the text changed. With
 * `complete`, a formula whose file is gone is kept, marked removed and retired.
 */
async function writeFormulas(
  tx: Transaction,
  formulas: CheckedFormulas,
  at: { loadId: number; startedAt: Date; complete: boolean },
  progress: (n: number) => void,
): Promise<{ summary: KindSummary; refigured: string[] }> {
  const { loadId, startedAt, complete } = at;
  const summary = emptyKind();
  const refigured: string[] = [];
  const existing = new Map(
    (
      await tx
        .select({
          id: formulasTable.id,
          hash: formulasTable.contentHash,
          revision: formulasTable.revision,
          removedAt: formulasTable.removedAt,
          figures: formulasTable.figures,
          path: formulasTable.path,
        })
        .from(formulasTable)
    ).map((r) => [r.id, r]),
  );
  const formulaRows: (typeof formulasTable.$inferInsert)[] = [];
  const revisionRows: (typeof formulaRevisionsTable.$inferInsert)[] = [];
  const figureOnly: { id: string; figures: FormulaFigures; path: string }[] = [];
  const loadedIds = new Set<string>();
  const changedIds = new Set<string>();
  for (const f of formulas) {
    const id = f.value.id;
    loadedIds.add(id);
    const before = existing.get(id);
    const contentChanged = !before || before.hash !== f.hash;
    const revision = !before ? 1 : contentChanged ? before.revision + 1 : before.revision;
    if (!before || before.removedAt) summary.added.push(id);
    else if (contentChanged) summary.changed.push(id);
    else summary.unchanged.push(id);
    if (contentChanged) {
      changedIds.add(id);
      revisionRows.push({
        formulaId: id,
        revision,
        contentHash: f.hash,
        content: f.raw,
        source: f.file.text,
        figures: f.figures,
        gitCommit: f.file.gitCommit,
        gitAuthor: f.file.gitAuthor,
        gitDate: f.file.gitDate ? new Date(f.file.gitDate) : null,
        gitMessage: f.file.gitMessage,
        loadId,
        loadedAt: startedAt,
      });
    }
    if (contentChanged || before?.removedAt) {
      formulaRows.push({
        id,
        title: f.value.title,
        status: f.value.status,
        category: f.value.category,
        tags: f.value.tags,
        content: f.raw,
        source: f.file.text,
        contentHash: f.hash,
        figures: f.figures,
        revision,
        path: f.file.path,
        removedAt: null,
        updatedAt: startedAt,
      });
    } else if (before && (!sameFigures(before.figures, f.figures) || before.path !== f.file.path)) {
      if (!sameFigures(before.figures, f.figures)) refigured.push(id);
      figureOnly.push({ id, figures: f.figures, path: f.file.path });
    }
  }
  for (const part of chunks(revisionRows)) await tx.insert(formulaRevisionsTable).values(part);
  // A changed formula's current row copies its new revision inside the database, so the content,
  // text and figures cross into it once, not twice (a load of many formulas is bound by that).
  const fromRevision = formulaRows.filter((r) => changedIds.has(r.id));
  for (const part of chunks(fromRevision)) {
    const meta = JSON.stringify(part.map((r) => ({ id: r.id, title: r.title, status: r.status, category: r.category, tags: r.tags, path: r.path })));
    await tx.execute(sql`
      insert into formulas (id, title, status, category, tags, content, source, content_hash, figures, revision, path, removed_at, updated_at)
      select m.id, m.title, m.status, m.category, m.tags, r.content, r.source, r.content_hash, r.figures, r.revision, m.path, null, r.loaded_at
      from jsonb_to_recordset(${meta}::jsonb) as m(id text, title text, status text, category text, tags jsonb, path text)
      join formula_revisions r on r.formula_id = m.id and r.load_id = ${loadId}
      on conflict (id) do update set
        title = excluded.title, status = excluded.status, category = excluded.category, tags = excluded.tags,
        content = excluded.content, source = excluded.source, content_hash = excluded.content_hash,
        figures = excluded.figures, revision = excluded.revision, path = excluded.path,
        removed_at = excluded.removed_at, updated_at = excluded.updated_at`);
    progress(part.length);
  }
  // Back in the folder unchanged after being removed: no new revision, the row as it is.
  for (const part of chunks(formulaRows.filter((r) => !changedIds.has(r.id)))) {
    await tx
      .insert(formulasTable)
      .values(part)
      .onConflictDoUpdate({
        target: formulasTable.id,
        set: {
          title: excluded('title'),
          status: excluded('status'),
          category: excluded('category'),
          tags: excluded('tags'),
          content: excluded('content'),
          source: excluded('source'),
          contentHash: excluded('content_hash'),
          figures: excluded('figures'),
          revision: excluded('revision'),
          path: excluded('path'),
          removedAt: excluded('removed_at'),
          updatedAt: excluded('updated_at'),
        },
      });
    progress(part.length);
  }
  for (const r of figureOnly) {
    await tx.update(formulasTable).set({ figures: r.figures, path: r.path }).where(eq(formulasTable.id, r.id));
  }
  progress(formulas.length - formulaRows.length);
  if (complete) {
    const gone = [...existing.values()].filter((r) => !loadedIds.has(r.id) && !r.removedAt).map((r) => r.id);
    for (const part of chunks(gone)) {
      await tx.update(formulasTable).set({ removedAt: startedAt, status: 'retired', updatedAt: startedAt }).where(inArray(formulasTable.id, part));
    }
    summary.removed.push(...gone);
  }
  return { summary, refigured };
}

/** Plans: one row per date; with `complete`, a plan whose file is gone is deleted. */
async function writePlans(tx: Transaction, plans: CheckedPlans, startedAt: Date, complete: boolean): Promise<KindSummary> {
  const summary = emptyKind();
  const existingPlans = new Map((await tx.select({ date: plansTable.date, hash: plansTable.contentHash, path: plansTable.path }).from(plansTable)).map((r) => [r.date, r]));
  const planRows: (typeof plansTable.$inferInsert)[] = [];
  const loadedDates = new Set<string>();
  for (const p of plans) {
    const date = p.value.date;
    loadedDates.add(date);
    const before = existingPlans.get(date);
    if (before && before.hash === p.hash && before.path === p.file.path) {
      summary.unchanged.push(date);
      continue;
    }
    if (!before) summary.added.push(date);
    else if (before.hash !== p.hash) summary.changed.push(date);
    else summary.unchanged.push(date);
    planRows.push({ date, content: p.raw, source: p.file.text, contentHash: p.hash, path: p.file.path, updatedAt: startedAt });
  }
  for (const part of chunks(planRows)) {
    await tx
      .insert(plansTable)
      .values(part)
      .onConflictDoUpdate({
        target: plansTable.date,
        set: { content: excluded('content'), source: excluded('source'), contentHash: excluded('content_hash'), path: excluded('path'), updatedAt: excluded('updated_at') },
      });
  }
  if (complete) {
    const gone = [...existingPlans.keys()].filter((d) => !loadedDates.has(d));
    for (const part of chunks(gone)) await tx.delete(plansTable).where(inArray(plansTable.date, part));
    summary.removed.push(...gone);
  }
  return summary;
}
