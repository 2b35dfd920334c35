// Production plans and their batch sheets (JSON and PDF), and the ingredient catalog.
import { Router, type Request } from 'express';
import { resolveWindow, windowSheet } from '#shared/sheet/window';
import type { CatalogResponse, PlanDetail, PlanListResponse } from '#shared/api';
import type { Formula } from '#shared/model';
import { createHash } from 'node:crypto';
import { canSeeFormulaStatus, roleHasPermission, type Role } from '#shared/permissions';
import { buildSheet } from '#shared/sheet/build';
import { SheetError, type Sheet } from '#shared/sheet/types';
import { ScaleError } from '#shared/scale';
import { requirePermission } from '../auth/guards.ts';
import { readUnitSystem } from '../auth/users.ts';
import type { ServerContext } from '../context.ts';
import { HttpError, invalid, notFound } from '../http/errors.ts';
import { queryString } from '../http/query.ts';
import type { PlanEntry, Snapshot } from './data.ts';
import { catalogNamesFor, visibleCatalog } from './formulas.ts';
import { formulaIngredientNames } from '#shared/allergens';
import { sheetWithProposals } from './records.ts';

const DATE_RE = /^[0-9]{4}-[0-9]{2}-[0-9]{2}$/;

/**
 * Whether a role may see a plan: every formula it orders must be one the role may open. A plan
 * that orders a draft (a mistake the check reports) is, for such a role, as absent as one never
 * loaded: its sheet would carry the draft's quantities, and its order count or an error naming
 * the draft would tell the draft exists.
 */
export function planVisible(snapshot: Snapshot, entry: PlanEntry, role: Role): boolean {
  return (entry.plan?.orders ?? []).every((o) => {
    const f = snapshot.formulas.get(o.formula);
    return !f || canSeeFormulaStatus(role, f.status);
  });
}

export function planFor(snapshot: Snapshot, date: string, role: Role): { entry: PlanEntry; sheet: Sheet } {
  if (!DATE_RE.test(date)) throw invalid(`a plan is named by its date, like 2026-12-03; got "${date}"`, [{ path: 'date', message: 'not yyyy-mm-dd' }]);
  const entry = snapshot.plans.find((p) => p.date === date);
  if (!entry || !planVisible(snapshot, entry, role)) throw notFound(`no plan for ${date}; it may not have been loaded yet`);
  if (!entry.plan) throw new HttpError(500, { error: 'internal', message: `the stored plan for ${date} cannot be read: ${entry.problem ?? 'unknown problem'}; load it again` });
  const plan = entry.plan;
  const formulas: Record<string, Formula> = {};
  const missing: string[] = [];
  for (const o of plan.orders) {
    const f = snapshot.formulas.get(o.formula);
    if (!f || !f.formula) missing.push(o.formula);
    else formulas[o.formula] = f.formula;
  }
  if (missing.length > 0) throw invalid(`the plan for ${date} orders formulas that are not loaded: ${[...new Set(missing)].join(', ')}`);
  // Sheets depend only on the loaded data, so each is built once per load.
  const key = `sheet:${date}`;
  let sheet = snapshot.memo.get(key) as Sheet | Error | undefined;
  if (!sheet) {
    try {
      sheet = buildSheet({ plan, formulas, catalog: snapshot.catalog });
    } catch (e) {
      if (!(e instanceof SheetError || e instanceof ScaleError)) throw e;
      sheet = e;
    }
    snapshot.memo.set(key, sheet);
  }
  if (sheet instanceof Error) throw invalid(`the sheet for ${date} cannot be made: ${sheet.message}`);
  return { entry, sheet };
}

/**
 * The sheet cut to the window the query asks for (`from`, `to` or `shift`, as `panform sheet`'s
 * flags; shared/sheet/window.ts), with a memo key suffix; the whole sheet without them.
 */
function windowFor(req: Request, sheet: Sheet): { sheet: Sheet; key: string } {
  const ask = { from: queryString(req, 'from'), to: queryString(req, 'to'), shift: queryString(req, 'shift') };
  try {
    const w = resolveWindow(sheet, ask);
    return w ? { sheet: windowSheet(sheet, w), key: `:${w.from}:${w.to}` } : { sheet, key: '' };
  } catch (e) {
    if (e instanceof SheetError) throw invalid(e.message, [{ path: ask.shift !== undefined ? 'shift' : 'from', message: e.message }]);
    throw e;
  }
}

export function plansRouter(ctx: ServerContext): Router {
  const r = Router();

  r.get('/plans', async (req, res) => {
    const user = requirePermission(req, 'read:plan');
    const snapshot = await ctx.data.snapshot();
    const body: PlanListResponse = {
      plans: snapshot.plans
        .filter((p) => planVisible(snapshot, p, user.role))
        .map((p) => {
          const formulas = [...new Set(p.plan?.orders.map((o) => o.formula) ?? [])];
          return {
            date: p.date,
            readyBy: p.plan?.readyBy ?? '',
            orders: p.plan?.orders.length ?? 0,
            formulas,
            titles: formulas.map((id) => snapshot.formulas.get(id)?.formula?.title ?? id),
            ...(p.plan?.notes ? { notes: p.plan.notes } : {}),
          };
        }),
    };
    res.json(body);
  });

  r.get('/plans/:date', async (req, res) => {
    const user = requirePermission(req, 'read:plan');
    const snapshot = await ctx.data.snapshot();
    const { entry, sheet: whole } = planFor(snapshot, req.params.date, user.role);
    const { sheet: cut } = windowFor(req, whole);
    const body: PlanDetail = { plan: entry.plan!, sheet: roleHasPermission(user.role, 'read:record') ? await sheetWithProposals(ctx, snapshot, cut, user.role) : cut };
    res.json(body);
  });

  r.get('/plans/:date/sheet.pdf', async (req, res) => {
    const user = requirePermission(req, 'read:plan');
    const snapshot = await ctx.data.snapshot();
    const { sheet: whole } = planFor(snapshot, req.params.date, user.role);
    const { sheet: plain, key: windowKey } = windowFor(req, whole);
    const sheet = roleHasPermission(user.role, 'read:record') ? await sheetWithProposals(ctx, snapshot, plain, user.role) : plain;
    const paper = queryString(req, 'paper') ?? 'a4';
    if (paper !== 'a4' && paper !== 'letter') throw invalid(`paper must be a4 or letter; got "${paper}"`, [{ path: 'paper', message: 'unknown paper size' }]);
    // Rendering takes a while: each PDF is made once per load.
    // Friction proposals change with the records, not with a load: they are part of the key.
    // Printed in the person's units, as the viewer shows them.
    const units = await readUnitSystem(ctx.db, user.id);
    const key = `pdf:${sheet.date}:${paper}:${units}${windowKey}:${sheet.frictionProposals ? createHash('sha256').update(JSON.stringify(sheet.frictionProposals)).digest('hex') : ''}`;
    let pdf = snapshot.memo.get(key) as Buffer | undefined;
    if (!pdf) {
      const { renderSheetPdf } = await import('../print/pdf.ts');
      pdf = await renderSheetPdf(sheet, { paper, units });
      snapshot.memo.set(key, pdf);
    }
    // The browser's PDF viewer is blocked by the page CSP (object-src 'none'), and a PDF runs no
    // page scripts: this response goes without one. nosniff stays.
    res.removeHeader('Content-Security-Policy');
    res
      .type('application/pdf')
      .set('Content-Disposition', `inline; filename="panform-sheet-${sheet.date}.pdf"`)
      .set('Cache-Control', 'private, no-cache')
      .send(pdf);
  });

  r.get('/catalog', async (req, res) => {
    const user = requirePermission(req, 'read:catalog');
    const snapshot = await ctx.data.snapshot();
    const catalog = visibleCatalog(snapshot.catalog, user.role, catalogNamesFor(snapshot, user.role));
    const usedBy: CatalogResponse['usedBy'] = {};
    for (const f of [...snapshot.formulas.values()].sort((a, b) => a.title.localeCompare(b.title))) {
      if (!f.formula || !canSeeFormulaStatus(user.role, f.status)) continue;
      for (const name of Object.keys(visibleCatalog(snapshot.catalog, user.role, formulaIngredientNames(f.formula)))) {
        (usedBy[name] ??= []).push({ id: f.id, title: f.title });
      }
    }
    const body: CatalogResponse = { catalog, usedBy };
    res.json(body);
  });

  return r;
}
