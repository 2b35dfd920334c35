// The loaded formulas, catalog and plans, normalized once per load and kept in memory.
//
// Everything in these tables changes only through a load, and every load adds a row to `loads`
// in the same transaction. So one tiny query (the newest load id) tells whether the snapshot is
// still current; the formulas are read and normalized again only after a load. That query is
// asked at most every CHECK_MS: the embedded database answers on the server's only thread, and a
// query per request would cost more than building the answer. A load through this server's
// load channel invalidates at once (server/app.ts); on a PostgreSQL server every load is announced
// to every server (server/db/listen.ts); otherwise a load by another process shows within CHECK_MS.
// Revision history is not cached: it is read from the database when asked for.
import { desc, max } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import type { FormulaSummary } from '#shared/api';
import { pickFigures } from '#shared/figures';
import { normalizeCatalog, normalizeFormula, normalizePlan, type Catalog, type Formula, type Plan } from '#shared/model';
import type { CatalogFile, FormulaFile, PlanFile } from '#shared/schema/shapes';
import type { Database } from '../db/client.ts';
import { catalogTable, formulasTable, loadsTable, plansTable } from '../db/schema.ts';

/** A formula as the server holds it: what the list shows (FormulaSummary), and the rest. */
export interface FormulaEntry extends FormulaSummary {
  path: string;
  /** Null when the stored content no longer normalizes (it passed the schema when loaded). */
  formula: Formula | null;
  problem?: string;
  /** Lower-case text searched by `q`: id, title, tags and every ingredient name. */
  searchText: string;
}

export interface PlanEntry {
  date: string;
  plan: Plan | null;
  problem?: string;
  updatedAt: string;
  /** The file it was loaded from, relative to the loaded folder. */
  path: string;
}

export interface Snapshot {
  version: number;
  catalog: Catalog;
  formulas: Map<string, FormulaEntry>;
  /** Newest first. */
  plans: PlanEntry[];
  /**
   * Derived answers (formula details as sent, sheets, PDFs), dropped with the snapshot and bounded
   * in bytes: the least recently used go first.
   */
  memo: LRUCache<string, NonNullable<unknown>>;
}

function ingredientNames(f: Formula): string[] {
  const names = new Set<string>();
  for (const l of [...f.flour, ...f.ingredients]) names.add(l.ingredient);
  for (const p of f.preferments) {
    names.add(p.name);
    for (const l of p.ingredients) names.add(l.ingredient);
  }
  for (const s of f.soakers) {
    names.add(s.name);
    for (const l of s.ingredients) names.add(l.ingredient);
  }
  return [...names];
}

/** Bytes of derived answers kept per snapshot: thousands of formula details, a few sheets and PDFs. */
export const MEMO_BYTES = 32 * 1024 * 1024;

/** The bytes a kept answer holds: buffers as they are, anything else as its JSON. */
export function memoSize(value: unknown): number {
  if (Buffer.isBuffer(value)) return value.length || 1;
  const body = (value as { body?: unknown }).body;
  if (Buffer.isBuffer(body)) return body.length + 64;
  if (value instanceof Error) return 256 + value.message.length;
  return Math.max(1, JSON.stringify(value)?.length ?? 1);
}

export function newMemo(maxSize = MEMO_BYTES): LRUCache<string, NonNullable<unknown>> {
  return new LRUCache<string, NonNullable<unknown>>({ maxSize, sizeCalculation: memoSize });
}

/** How long a snapshot is served before the database is asked whether a load happened. */
export const CHECK_MS = 2_000;

export class DataCache {
  private current: Snapshot | null = null;
  private refreshing: Promise<Snapshot> | null = null;
  private checkedAt = -Infinity;
  private checking: Promise<number> | null = null;

  constructor(
    private readonly db: Database,
    private readonly now: () => number = Date.now,
  ) {}

  /** Makes the next request ask the database (after a load by this process). */
  invalidate(): void {
    this.checkedAt = -Infinity;
  }

  /** The newest load's id (0 before the first load). */
  async version(): Promise<number> {
    const rows = await this.db.select({ v: max(loadsTable.id) }).from(loadsTable);
    return rows[0]?.v ?? 0;
  }

  async snapshot(): Promise<Snapshot> {
    const t = this.now();
    if (this.current && t - this.checkedAt < CHECK_MS) return this.current;
    // Requests arriving while the newest load is being asked for share that one question.
    this.checking ??= this.version().finally(() => {
      this.checking = null;
    });
    const v = await this.checking;
    this.checkedAt = t;
    if (this.current && this.current.version === v) return this.current;
    // One rebuild at a time; concurrent requests wait for it.
    this.refreshing ??= this.read(v).finally(() => {
      this.refreshing = null;
    });
    const s = await this.refreshing;
    if (!this.current || s.version >= this.current.version) this.current = s;
    return s;
  }

  private async read(version: number): Promise<Snapshot> {
    const [catalogRows, formulaRows, planRows] = await Promise.all([
      this.db.select({ name: catalogTable.name, content: catalogTable.content }).from(catalogTable),
      this.db
        .select({
          id: formulasTable.id,
          title: formulasTable.title,
          status: formulasTable.status,
          category: formulasTable.category,
          tags: formulasTable.tags,
          content: formulasTable.content,
          figures: formulasTable.figures,
          revision: formulasTable.revision,
          path: formulasTable.path,
          removedAt: formulasTable.removedAt,
          updatedAt: formulasTable.updatedAt,
        })
        .from(formulasTable)
        .orderBy(formulasTable.title),
      this.db.select({ date: plansTable.date, content: plansTable.content, updatedAt: plansTable.updatedAt, path: plansTable.path }).from(plansTable).orderBy(desc(plansTable.date)),
    ]);
    const catalog = normalizeCatalog(Object.fromEntries(catalogRows.map((r) => [r.name, r.content])) as CatalogFile);
    const formulas = new Map<string, FormulaEntry>();
    for (const r of formulaRows) {
      let formula: Formula | null = null;
      let problem: string | undefined;
      try {
        formula = normalizeFormula(r.content as FormulaFile);
      } catch (e) {
        problem = (e as Error).message;
      }
      const status = r.removedAt ? 'retired' : r.status;
      const tags = r.tags ?? [];
      formulas.set(r.id, {
        id: r.id,
        title: r.title,
        status,
        category: r.category,
        tags,
        figures: pickFigures(r.figures),
        revision: r.revision,
        updatedAt: r.updatedAt.toISOString(),
        path: r.path,
        formula: formula && status !== formula.status ? { ...formula, status: status as Formula['status'] } : formula,
        problem,
        searchText: [r.id, r.title, ...tags, ...(formula ? ingredientNames(formula) : [])].join('\n').toLowerCase(),
      });
    }
    const plans: PlanEntry[] = planRows.map((r) => {
      try {
        return { date: r.date, plan: normalizePlan(r.content as PlanFile), updatedAt: r.updatedAt.toISOString(), path: r.path };
      } catch (e) {
        return { date: r.date, plan: null, problem: (e as Error).message, updatedAt: r.updatedAt.toISOString(), path: r.path };
      }
    });
    return { version, catalog, formulas, plans, memo: newMemo() };
  }
}
