// Formulas (read-only): list with search and filters, one formula with its tables and figures for
// the reference batch or a scaled one, its revision history and the diff between two revisions,
// and the newest changes across formulas.
import { createHash } from 'node:crypto';
import { and, desc, eq, inArray } from 'drizzle-orm';
import { Router, type Request, type Response } from 'express';
import type {
  FormulaWater,
  ChangeListResponse, FormulaDetail, FormulaListResponse, FormulaSummary, RevisionDiffResponse, RevisionCommit, RevisionListResponse, RevisionSummary,
} from '#shared/api';
import { AllergenError, allergenSummary, formulaIngredientNames } from '#shared/allergens';
import { computeCost } from '#shared/cost';
import { diffFormulas } from '#shared/diff';
import { normalizeFormula, type Catalog, type CatalogItem, type Formula } from '#shared/model';
import { canSeeFormulaStatus, roleHasPermission, type Role } from '#shared/permissions';
import { productLabel } from '#shared/product-label';
import { scaleFormula, ScaleError, type ScaleTarget } from '#shared/scale';
import type { FormulaFile } from '#shared/schema/shapes';
import { FORMULA_STATUSES } from '#shared/schema/vocabulary';
import { matchesSearch, searchWords } from '#shared/search';
import { BatchError, parseBatch } from '#shared/batch';
import { requirePermission } from '../auth/guards.ts';
import type { ServerContext } from '../context.ts';
import { formulaRevisionsTable, formulasTable } from '../db/schema.ts';
import { forbidden, HttpError, invalid, notFound } from '../http/errors.ts';
import { queryInteger, queryString } from '../http/query.ts';
import { pickFigures } from '#shared/figures';
import type { FormulaEntry, Snapshot } from './data.ts';
import { formulaCautions } from '#shared/cautions';
import { planMixWater } from '#shared/dough-water';
import { parseTemperatureArgument, parseTemperatureDeltaArgument, QuantityError } from '#shared/units';


/** A catalog entry without its price, for roles that may not see costs. */
export function withoutPrice(item: CatalogItem): CatalogItem {
  const { costPerKg: _price, costDate: _date, ...rest } = item;
  return rest;
}

export function visibleCatalog(catalog: Catalog, role: Role, names?: Iterable<string>): Catalog {
  const withCost = roleHasPermission(role, 'read:cost');
  const out: Catalog = {};
  const visit = (name: string) => {
    const item = catalog[name];
    if (!item || out[name]) return;
    out[name] = withCost ? item : withoutPrice(item);
    for (const c of item.components ?? []) visit(c);
    if (item.fedWith) visit(item.fedWith);
  };
  for (const name of names ?? Object.keys(catalog)) visit(name);
  return out;
}

/**
 * The formula, if the role may see it. A formula beyond the role answers exactly like an unknown
 * one (404, same message), so a bench account cannot learn that a draft exists by trying ids.
 */
function visibleFormula(snapshot: Snapshot, id: string, role: Role): FormulaEntry {
  const entry = snapshot.formulas.get(id);
  if (!entry || !canSeeFormulaStatus(role, entry.status)) throw notFound(`no formula "${id}"; it may not have been loaded yet`);
  return entry;
}

/**
 * The catalog entries a role may list: with drafts hidden, an ingredient that only hidden
 * formulas use stays out too (its name would tell of the draft); entries no formula uses stay.
 */
export function catalogNamesFor(snapshot: Snapshot, role: Role): string[] {
  const all = Object.keys(snapshot.catalog);
  if (roleHasPermission(role, 'read:formula:draft')) return all;
  const hiddenOnly = new Set<string>();
  const used = new Set<string>();
  // A blend's components and a levain's feed count as used by the formula that uses the blend.
  const add = (target: Set<string>, name: string) => {
    if (target.has(name)) return;
    target.add(name);
    const item = snapshot.catalog[name];
    for (const c of item?.components ?? []) add(target, c);
    if (item?.fedWith) add(target, item.fedWith);
  };
  for (const f of snapshot.formulas.values()) {
    if (!f.formula) continue;
    const target = canSeeFormulaStatus(role, f.status) ? used : hiddenOnly;
    for (const name of formulaIngredientNames(f.formula)) add(target, name);
  }
  return all.filter((name) => used.has(name) || !hiddenOnly.has(name));
}

function usable(entry: FormulaEntry): Formula {
  if (!entry.formula) {
    throw new HttpError(500, { error: 'internal', message: `the stored formula "${entry.id}" cannot be read: ${entry.problem ?? 'unknown problem'}; load it again` });
  }
  return entry.formula;
}

/** `?pieces=N[&piece=W]`, `?mix=W` or `?flour=W` (shared/batch.ts); none: the formula's own yield. */
export function readScaleTarget(req: Request, formula: Formula): ScaleTarget {
  try {
    return parseBatch({ pieces: queryString(req, 'pieces', 40), piece: queryString(req, 'piece', 40), mix: queryString(req, 'mix', 40), flour: queryString(req, 'flour', 40) }) ?? {
      by: 'pieces',
      pieces: formula.yield.pieces,
    };
  } catch (e) {
    if (e instanceof BatchError) throw invalid(e.hint ? `${e.message} (${e.hint})` : e.message, [{ path: e.field, message: e.message }]);
    throw e;
  }
}

function scaleOr422(formula: Formula, catalog: Catalog, target: ScaleTarget) {
  try {
    return scaleFormula(formula, catalog, target);
  } catch (e) {
    if (e instanceof ScaleError) throw invalid(e.message);
    throw e;
  }
}

function temperatureQuery(req: Request, name: string, delta = false): number | undefined {
  const text = queryString(req, name, 20);
  if (text === undefined || text.trim() === '') return undefined;
  try {
    return delta ? parseTemperatureDeltaArgument(text) : parseTemperatureArgument(text);
  } catch (e) {
    if (e instanceof QuantityError) throw invalid(`${name}: ${e.message}; expected ${e.expected}`, [{ path: name, message: e.message }]);
    throw e;
  }
}

/**
 * The water for a batch of one formula (shared/dough-water.ts, as the sheet, `scale` and the viewer
 * work it out): room, flour, tap and the mixer's rise from the query, else from a plan's conditions
 * and mixer (`plan`, `mixer`); pre-ferments measured tonight as `preferment`, repeated in order.
 */
export function formulaWater(snapshot: Snapshot, formula: Formula, req: Request, mayReadPlans: boolean): FormulaWater {
  const target = readScaleTarget(req, formula);
  const scaled = scaleOr422(formula, snapshot.catalog, target);
  let plan: FormulaWater['plan'] = null;
  let base: { room?: number; flour?: number; tap?: number; rise?: number; prefermentDefault?: number } = {};
  const date = queryString(req, 'plan', 10);
  if (date !== undefined) {
    const entry = mayReadPlans ? snapshot.plans.find((p) => p.date === date) : undefined;
    if (!entry?.plan) throw notFound(`no plan for ${date}`);
    const name = queryString(req, 'mixer', 100) ?? entry.plan.orders.find((o) => o.formula === formula.id && o.mixer)?.mixer;
    const mixer = entry.plan.mixers.find((m) => m.name === name) ?? (name === undefined ? entry.plan.mixers[0] : undefined);
    if (!mixer) throw invalid(`the plan for ${date} has no mixer "${name}"; mixers: ${entry.plan.mixers.map((m) => m.name).join(', ')}`, [{ path: 'mixer', message: 'not in the plan' }]);
    const c = entry.plan.conditions;
    base = { room: c.room, flour: c.flour, tap: c.tapWater, rise: mixer.rise, prefermentDefault: c.preferment };
    plan = { date, mixer: mixer.name };
  }
  const friction = temperatureQuery(req, 'friction', true);
  const rise = temperatureQuery(req, 'rise', true) ?? (friction === undefined ? base.rise : friction / 3);
  const room = temperatureQuery(req, 'room') ?? base.room;
  const flour = temperatureQuery(req, 'flour') ?? base.flour;
  const missing = Object.entries({ room, flour, 'rise (or friction)': rise }).filter(([, v]) => v === undefined).map(([k]) => k);
  if (missing.length > 0) {
    throw invalid(`the water temperature needs ${missing.join(', ')}, or a plan to take them from (?plan=YYYY-MM-DD)`, missing.map((m) => ({ path: m, message: 'missing' })));
  }
  const ddt = temperatureQuery(req, 'ddt');
  if (ddt === undefined && formula.doughTemperature === undefined) throw invalid(`${formula.id} has no dough_temperature; give ddt`, [{ path: 'ddt', message: 'missing' }]);
  const raw = (req.query as Record<string, unknown>).preferment;
  const texts = raw === undefined ? [] : Array.isArray(raw) ? raw : [raw];
  if (texts.length > formula.preferments.length || texts.some((t) => typeof t !== 'string' || t.length > 20)) {
    throw invalid(`give preferment at most once per pre-ferment (${formula.preferments.length}), in the formula's order`, [{ path: 'preferment', message: 'too many' }]);
  }
  const measured = (texts as string[]).map((t) => {
    if (t.trim() === '') return undefined;
    try {
      return parseTemperatureArgument(t);
    } catch (e) {
      if (e instanceof QuantityError) throw invalid(`preferment: ${e.message}; expected ${e.expected}`, [{ path: 'preferment', message: e.message }]);
      throw e;
    }
  });
  const water = planMixWater(formula, scaled, snapshot.catalog, {
    ddt, room: room!, flour: flour!, tap: temperatureQuery(req, 'tap') ?? base.tap, rise: rise!, prefermentDefault: base.prefermentDefault, measured,
  });
  return { formula: formula.id, target, plan, water };
}

export function formulaDetail(entry: FormulaEntry, catalog: Catalog, role: Role, target: ScaleTarget): FormulaDetail {
  const formula = usable(entry);
  const scaled = scaleOr422(formula, catalog, target);
  const referenceTarget: ScaleTarget = { by: 'pieces', pieces: formula.yield.pieces };
  const ref = target.by === 'pieces' && target.pieces === formula.yield.pieces && target.pieceGrams === undefined ? scaled : scaleOr422(formula, catalog, referenceTarget);
  let allergens;
  let cautions;
  try {
    allergens = allergenSummary(formula, catalog);
    // No water temperatures are worked out here, so no ice; the viewer's water helper adds it.
    cautions = formulaCautions(formula, catalog, { ice: false });
  } catch (e) {
    if (e instanceof AllergenError) throw new HttpError(500, { error: 'internal', message: `the catalog's allergens cannot be worked out: ${e.message}` });
    throw e;
  }
  return {
    formula,
    catalog: visibleCatalog(catalog, role, formulaIngredientNames(formula)),
    scaled,
    reference: pickFigures(ref),
    allergens,
    cost: roleHasPermission(role, 'read:cost') ? computeCost(scaled, catalog) : null,
    label: roleHasPermission(role, 'read:label') ? productLabel(formula, catalog) : null,
    cautions,
    revision: entry.revision,
    updatedAt: entry.updatedAt,
    path: entry.path,
  };
}

type CommitColumns = { gitCommit: string | null; gitAuthor: string | null; gitDate: Date | null; gitMessage: string | null };

function revisionCommit(r: CommitColumns): RevisionCommit {
  return { gitCommit: r.gitCommit, gitAuthor: r.gitAuthor, gitDate: r.gitDate?.toISOString() ?? null, gitMessage: r.gitMessage };
}

const COMMIT_COLUMNS = {
  gitCommit: formulaRevisionsTable.gitCommit,
  gitAuthor: formulaRevisionsTable.gitAuthor,
  gitDate: formulaRevisionsTable.gitDate,
  gitMessage: formulaRevisionsTable.gitMessage,
};

/** What a revision's summary is made of (revisionSummary). */
const REVISION_COLUMNS = {
  revision: formulaRevisionsTable.revision,
  contentHash: formulaRevisionsTable.contentHash,
  ...COMMIT_COLUMNS,
  loadedAt: formulaRevisionsTable.loadedAt,
  figures: formulaRevisionsTable.figures,
};

function revisionSummary(r: CommitColumns & { revision: number; contentHash: string; loadedAt: Date; figures: unknown }): RevisionSummary {
  return {
    revision: r.revision,
    contentHash: r.contentHash,
    ...revisionCommit(r),
    loadedAt: r.loadedAt.toISOString(),
    figures: pickFigures(r.figures),
  };
}

/** A JSON answer kept in memory as the bytes sent, with its ETag. */
export interface JsonAnswer {
  body: Buffer;
  etag: string;
}

/**
 * Sends a kept answer as it is: no conversion or hashing per request (on a busy bench this route is
 * asked thousands of times a second), 304 when the client has it already.
 */
export function sendJsonAnswer(req: Request, res: Response, answer: JsonAnswer): void {
  res.setHeader('ETag', answer.etag);
  if (req.fresh) {
    res.statusCode = 304;
    res.end();
    return;
  }
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  res.setHeader('Content-Length', answer.body.length);
  res.end(answer.body);
}

/**
 * GET /api/formulas/:id's answer (JSON text and its ETag). It depends only on the loaded data,
 * the target and whether costs are shown: made once per load and served from memory (the viewer
 * and many benches ask the same). The server's first render of a formula page uses it too.
 */
export async function formulaDetailAnswer(
  ctx: ServerContext,
  role: Role,
  id: string,
  targetFor: (formula: Formula) => ScaleTarget = (formula) => ({ by: 'pieces', pieces: formula.yield.pieces }),
): Promise<JsonAnswer> {
  const snapshot = await ctx.data.snapshot();
  const entry = visibleFormula(snapshot, id, role);
  const target = targetFor(usable(entry));
  const sees = `${roleHasPermission(role, 'read:cost') ? 'cost' : 'plain'}-${roleHasPermission(role, 'read:label') ? 'label' : 'nolabel'}`;
  const key = `detail:${entry.id}:${sees}:${JSON.stringify(target)}`;
  let cached = snapshot.memo.get(key) as JsonAnswer | undefined;
  if (!cached) {
    const body = Buffer.from(JSON.stringify(formulaDetail(entry, snapshot.catalog, role, target)));
    cached = { body, etag: `W/"${createHash('sha1').update(body).digest('base64url')}"` };
    snapshot.memo.set(key, cached);
  }
  return cached;
}

export function formulasRouter(ctx: ServerContext): Router {
  const r = Router();

  r.get('/formulas', async (req, res) => {
    const user = requirePermission(req, 'read:formula:active');
    const q = queryString(req, 'q');
    const category = queryString(req, 'category');
    const tag = queryString(req, 'tag');
    const status = queryString(req, 'status');
    if (status !== undefined && status !== '' && !(FORMULA_STATUSES as readonly string[]).includes(status)) {
      throw invalid(`status must be one of ${FORMULA_STATUSES.join(', ')}; got "${status}"`, [{ path: 'status', message: 'unknown status' }]);
    }
    if (status && !canSeeFormulaStatus(user.role, status)) throw forbidden('read:formula:draft', `your role sees active formulas only, not ${status} ones`);
    const snapshot = await ctx.data.snapshot();
    const visible = [...snapshot.formulas.values()].filter((f) => canSeeFormulaStatus(user.role, f.status));
    const words = searchWords(q);
    const found = visible.filter(
      (f) =>
        (!status || f.status === status) &&
        (!category || f.category === category) &&
        (!tag || f.tags.includes(tag)) &&
        matchesSearch(words, f.searchText),
    );
    const formulas: FormulaSummary[] = found.map((f) => ({
      id: f.id,
      title: f.title,
      status: f.status,
      category: f.category,
      tags: f.tags,
      figures: f.figures,
      revision: f.revision,
      updatedAt: f.updatedAt,
    }));
    const body: FormulaListResponse = {
      formulas,
      categories: [...new Set(visible.map((f) => f.category))].sort(),
      tags: [...new Set(visible.flatMap((f) => f.tags))].sort(),
    };
    res.json(body);
  });

  r.get('/formulas/:id', async (req, res) => {
    const user = requirePermission(req, 'read:formula:active');
    const answer = await formulaDetailAnswer(ctx, user.role, req.params.id, (formula) => readScaleTarget(req, formula));
    sendJsonAnswer(req, res, answer);
  });

  r.get('/formulas/:id/water', async (req, res) => {
    const user = requirePermission(req, 'read:formula:active');
    const snapshot = await ctx.data.snapshot();
    const formula = usable(visibleFormula(snapshot, req.params.id, user.role));
    res.json(formulaWater(snapshot, formula, req, roleHasPermission(user.role, 'read:plan')));
  });

  r.get('/formulas/:id/revisions', async (req, res) => {
    const user = requirePermission(req, 'read:history');
    const snapshot = await ctx.data.snapshot();
    const entry = visibleFormula(snapshot, req.params.id, user.role);
    const rows = await ctx.db
      .select(REVISION_COLUMNS)
      .from(formulaRevisionsTable)
      .where(eq(formulaRevisionsTable.formulaId, entry.id))
      .orderBy(desc(formulaRevisionsTable.revision));
    const body: RevisionListResponse = { formula: entry.id, revisions: rows.map(revisionSummary) };
    res.json(body);
  });

  r.get('/formulas/:id/diff', async (req, res) => {
    const user = requirePermission(req, 'read:history');
    const snapshot = await ctx.data.snapshot();
    const entry = visibleFormula(snapshot, req.params.id, user.role);
    const to = queryInteger(req, 'to', { min: 1, max: 1_000_000 }) ?? entry.revision;
    const from = queryInteger(req, 'from', { min: 1, max: 1_000_000 }) ?? to - 1;
    if (from < 1) throw invalid(`"${entry.id}" has only revision ${to}; there is nothing to compare it with`, [{ path: 'from', message: 'no earlier revision' }]);
    const rows = await ctx.db
      .select({ revision: formulaRevisionsTable.revision, content: formulaRevisionsTable.content, ...COMMIT_COLUMNS })
      .from(formulaRevisionsTable)
      .where(and(eq(formulaRevisionsTable.formulaId, entry.id), inArray(formulaRevisionsTable.revision, [from, to])));
    const byRevision = new Map(rows.map((row) => [row.revision, row.content]));
    const commitOf = (n: number) => revisionCommit(rows.find((row) => row.revision === n)!);
    const missing = [from, to].filter((n) => !byRevision.has(n));
    if (missing.length > 0) throw notFound(`"${entry.id}" has no revision ${missing.join(' or ')}`);
    let before: Formula;
    let after: Formula;
    try {
      before = normalizeFormula(byRevision.get(from) as FormulaFile);
      after = normalizeFormula(byRevision.get(to) as FormulaFile);
    } catch (e) {
      throw new HttpError(500, { error: 'internal', message: `a stored revision of "${entry.id}" cannot be read: ${(e as Error).message}` });
    }
    const body: RevisionDiffResponse = {
      formula: entry.id,
      from,
      to,
      commits: { from: commitOf(from), to: commitOf(to) },
      diff: diffFormulas(before, after, snapshot.catalog),
    };
    res.json(body);
  });

  r.get('/changes', async (req, res) => {
    const user = requirePermission(req, 'read:history');
    const limit = queryInteger(req, 'limit', { min: 1, max: 500 }) ?? 50;
    const rows = await ctx.db
      .select({
        formula: formulaRevisionsTable.formulaId,
        title: formulasTable.title,
        status: formulasTable.status,
        ...REVISION_COLUMNS,
      })
      .from(formulaRevisionsTable)
      .innerJoin(formulasTable, eq(formulasTable.id, formulaRevisionsTable.formulaId))
      .orderBy(desc(formulaRevisionsTable.loadedAt), desc(formulaRevisionsTable.id))
      .limit(limit);
    const body: ChangeListResponse = {
      changes: rows.filter((row) => canSeeFormulaStatus(user.role, row.status)).map((row) => ({ ...revisionSummary(row), formula: row.formula, title: row.title })),
    };
    res.json(body);
  });

  return r;
}
