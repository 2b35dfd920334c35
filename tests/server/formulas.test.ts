// What each role receives from the formula, plan and catalog routes: bench never gets a cost, a
// price, a draft or a retired formula; scaling on the server follows the shared arithmetic.
import { execFileSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CatalogResponse, ChangeListResponse, FormulaDetail, FormulaListResponse, PlanDetail, PlanListResponse, RevisionDiffResponse, RevisionListResponse } from '#shared/api';
import { loadFolder } from '../../server/load/index.ts';
import { CHECK_MS } from '../../server/routes/data.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { getJson, openTestDatabase, sendJson, startTestServer, type TestServer } from './harness.ts';

let handle: DatabaseHandle;
let t: TestServer;
const cookie: Record<string, string> = {};
beforeAll(async () => {
  handle = await openTestDatabase();
  t = await startTestServer(handle);
  for (const role of ['admin', 'author', 'reviewer', 'bench'] as const) cookie[role] = await t.signIn(role);
}, 180_000);
afterAll(async () => {
  await t?.close();
  await handle?.close();
});

const NOT_ACTIVE = ['spelt-porridge-loaf', 'malted-grain-loaf'];

/** Every key path in a JSON value whose key names a cost or a price and holds something (`cost: null` says only "not for you"). */
function costKeys(value: unknown, path = '$'): string[] {
  if (Array.isArray(value)) return value.flatMap((v, i) => costKeys(v, `${path}[${i}]`));
  if (value && typeof value === 'object') {
    return Object.entries(value).flatMap(([k, v]) => [...(/cost|price/i.test(k) && v !== null ? [`${path}.${k}`] : []), ...costKeys(v, `${path}.${k}`)]);
  }
  return [];
}

async function get<T>(path: string, role: string): Promise<T> {
  const r = await getJson(`${t.url}${path}`, cookie[role]);
  expect(r.status, `${path} as ${role}`).toBe(200);
  return r.body as T;
}

describe('a bench account', () => {
  it('never receives a cost, a price, a draft or a retired formula from anything it can open', async () => {
    const seen: { path: string; body: unknown }[] = [];
    const fetchAs = async (path: string) => {
      const body = await get<unknown>(path, 'bench');
      seen.push({ path, body });
      return body;
    };
    const list = (await fetchAs('/api/formulas')) as FormulaListResponse;
    expect(list.formulas.length).toBeGreaterThan(5);
    for (const f of list.formulas) {
      await fetchAs(`/api/formulas/${f.id}`);
      await fetchAs(`/api/formulas/${f.id}?pieces=7&piece=450g`);
      await fetchAs(`/api/formulas/${f.id}?mix=12kg`);
    }
    await fetchAs('/api/formulas?q=wheat');
    const plans = (await fetchAs('/api/plans')) as PlanListResponse;
    for (const p of plans.plans) await fetchAs(`/api/plans/${p.date}`);
    await fetchAs('/api/catalog');
    await fetchAs('/api/me');
    for (const { path, body } of seen) {
      expect(costKeys(body), path).toEqual([]);
      const text = JSON.stringify(body);
      for (const id of NOT_ACTIVE) expect(text, path).not.toContain(id);
      expect(text, path).not.toMatch(/"status":"(draft|retired)"/);
    }
  });

  it('is refused history and changes', async () => {
    for (const path of ['/api/changes', '/api/formulas/harbour-ciabatta/revisions', '/api/formulas?status=draft']) {
      const r = await getJson(`${t.url}${path}`, cookie.bench);
      expect(r.status, path).toBe(403);
      expect(r.body).toMatchObject({ error: 'forbidden' });
    }
  });

  it('cannot tell a draft from an id never loaded: both answer 404 with the same words', async () => {
    for (const id of [...NOT_ACTIVE, 'no-such-loaf']) {
      for (const suffix of ['', '/revisions', '/diff']) {
        const r = await getJson(`${t.url}/api/formulas/${id}${suffix}`, cookie.bench);
        // revisions and diff need read:history first: 403 for every id alike.
        const expected = suffix === '' ? 404 : 403;
        expect(r.status, `${id}${suffix}`).toBe(expected);
        if (expected === 404) expect(r.body).toEqual({ error: 'not_found', message: `no formula "${id}"; it may not have been loaded yet` });
      }
    }
  });
});

describe('roles with read:cost', () => {
  it.each(['admin', 'author'])('%s receives the cost and catalog prices', async (role) => {
    const d = await get<FormulaDetail>('/api/formulas/harbour-ciabatta', role);
    expect(d.cost).not.toBeNull();
    expect(d.cost!.total).toBeGreaterThan(0);
    expect(Object.values(d.catalog).some((c) => typeof c.costPerKg === 'number')).toBe(true);
  });

  it('reviewer sees drafts and history but no cost', async () => {
    const d = await get<FormulaDetail>('/api/formulas/spelt-porridge-loaf', 'reviewer');
    expect(d.formula.status).toBe('draft');
    expect(costKeys(d)).toEqual([]);
    const list = await get<FormulaListResponse>('/api/formulas', 'reviewer');
    expect(list.formulas.map((f) => f.id)).toEqual(expect.arrayContaining(NOT_ACTIVE));
  });
});

describe('GET /api/formulas', () => {
  it('filters by status, category, tag and a search over ids, titles, tags and ingredients', async () => {
    const drafts = await get<FormulaListResponse>('/api/formulas?status=draft', 'author');
    expect(drafts.formulas.map((f) => f.id)).toEqual(['spelt-porridge-loaf']);
    const all = await get<FormulaListResponse>('/api/formulas', 'author');
    const category = all.formulas.find((f) => f.id === 'harbour-ciabatta')!.category;
    const byCategory = await get<FormulaListResponse>(`/api/formulas?category=${encodeURIComponent(category)}`, 'author');
    expect(byCategory.formulas.every((f) => f.category === category)).toBe(true);
    expect(byCategory.formulas.map((f) => f.id)).toContain('harbour-ciabatta');
    const tag = all.formulas.find((f) => f.id === 'harbour-ciabatta')!.tags[0];
    const byTag = await get<FormulaListResponse>(`/api/formulas?tag=${encodeURIComponent(tag)}`, 'author');
    expect(byTag.formulas.every((f) => f.tags.includes(tag))).toBe(true);
    const search = await get<FormulaListResponse>('/api/formulas?q=CIABATTA', 'author');
    expect(search.formulas.map((f) => f.id)).toEqual(['harbour-ciabatta']);
    const byIngredient = await get<FormulaListResponse>('/api/formulas?q=poolish', 'author');
    expect(byIngredient.formulas.map((f) => f.id)).toContain('harbour-ciabatta');
    const typos = await get<FormulaListResponse>('/api/formulas?q=harbor%20ciabata', 'author');
    expect(typos.formulas.map((f) => f.id)).toEqual(['harbour-ciabatta']);
    const none = await get<FormulaListResponse>('/api/formulas?q=ciabatta%20rye%20zzz', 'author');
    expect(none.formulas).toEqual([]);
    expect(all.categories.length).toBeGreaterThan(1);
  });

  it('offers bench only the categories and tags of active formulas', async () => {
    const bench = await get<FormulaListResponse>('/api/formulas', 'bench');
    expect(bench.formulas.every((f) => f.status === 'active')).toBe(true);
    expect(new Set(bench.categories)).toEqual(new Set(bench.formulas.map((f) => f.category)));
  });
});

describe('GET /api/formulas/:id', () => {
  it('gives the reference batch by default and scales by pieces with the shared arithmetic', async () => {
    const ref = await get<FormulaDetail>('/api/formulas/harbour-ciabatta', 'bench');
    expect(ref.scaled.pieces).toBe(ref.formula.yield.pieces);
    expect(ref.reference.mixedDough).toBeCloseTo(ref.scaled.mixedDough, 9);
    const d = await get<FormulaDetail>('/api/formulas/harbour-ciabatta?pieces=60&piece=320g', 'bench');
    // docs/arithmetic.md "Scaling": D = N·P, M = D / (1 − loss), F = M / (total % / 100)
    const divided = 60 * 320;
    const mixed = divided / (1 - d.formula.loss / 100);
    expect(d.scaled.dividedDough).toBeCloseTo(divided, 9);
    expect(d.scaled.mixedDough).toBeCloseTo(mixed, 9);
    expect(d.scaled.flour).toBeCloseTo(mixed / (d.scaled.totalPercent / 100), 9);
    expect(d.reference.mixedDough).toBeCloseTo(ref.scaled.mixedDough, 9);
  });

  it('sends the kept answer with an ETag, 304 when the client has it, headers only for HEAD', async () => {
    const url = `${t.url}/api/formulas/harbour-ciabatta`;
    const first = await fetch(url, { headers: { cookie: cookie.bench } });
    expect(first.status).toBe(200);
    expect(first.headers.get('content-type')).toBe('application/json; charset=utf-8');
    const etag = first.headers.get('etag');
    expect(etag).toMatch(/^W\/"/);
    const text = await first.text();
    expect(Number(first.headers.get('content-length'))).toBe(Buffer.byteLength(text));
    expect((JSON.parse(text) as FormulaDetail).formula.id).toBe('harbour-ciabatta');
    // Plain http: fetch adds "cache-control: no-cache" to a conditional request, which asks for a 200.
    const again = await new Promise<{ status: number; body: string }>((done, fail) => {
      http
        .get(url, { headers: { cookie: cookie.bench, 'if-none-match': etag! } }, (res) => {
          let body = '';
          res.on('data', (c) => (body += c));
          res.on('end', () => done({ status: res.statusCode ?? 0, body }));
        })
        .on('error', fail);
    });
    expect(again).toEqual({ status: 304, body: '' });
    const head = await fetch(url, { method: 'HEAD', headers: { cookie: cookie.bench } });
    expect(head.status).toBe(200);
    expect(head.headers.get('etag')).toBe(etag);
    expect(await head.text()).toBe('');
    // Costs shown or not is part of the answer: another role, another ETag.
    const author = await fetch(url, { headers: { cookie: cookie.author } });
    expect(author.headers.get('etag')).not.toBe(etag);
  });

  it('scales by mixed dough weight without loss', async () => {
    const d = await get<FormulaDetail>('/api/formulas/harbour-ciabatta?mix=25%20kg', 'bench');
    // docs/arithmetic.md "Scaling": with --mix no loss is applied
    expect(d.scaled.mixedDough).toBe(25_000);
    expect(d.scaled.dividedDough).toBe(25_000);
    expect(d.scaled.loss).toBe(0);
  });

  it('gives author, reviewer and admin the label (statement and nutrition, EU and US), and bench none', async () => {
    for (const role of ['author', 'reviewer', 'admin']) {
      const d = await get<FormulaDetail>('/api/formulas/tidewater-milk-buns', role);
      expect(d.label?.eu.statement?.text, role).toContain('whole MILK (25 %)');
      expect(d.label?.eu.nutrition?.ok, role).toBe(true);
      expect(d.label?.us.nutrition?.ok && d.label.us.nutrition.declaration.serving?.text, role).toBe('1 piece (75 g)');
    }
    expect((await get<FormulaDetail>('/api/formulas/tidewater-milk-buns', 'bench')).label).toBeNull();
  });

  it('gives the same nutrition as the shared arithmetic and the CLI use (one rule, shared/nutrition.ts)', async () => {
    const { nutritionDeclaration } = await import('#shared/nutrition');
    const d = await get<FormulaDetail>('/api/formulas/saltmere-seeded-rye', 'reviewer');
    const direct = nutritionDeclaration(d.formula, d.catalog, { rules: 'eu' });
    expect(d.label?.eu.nutrition).toEqual(direct);
  });

  it('lists the allergens with the caution to check local labelling rules', async () => {
    const d = await get<FormulaDetail>('/api/formulas/tidewater-milk-buns', 'bench');
    expect(d.allergens.codes).toEqual(expect.arrayContaining(['wheat', 'milk']));
    expect(d.cautions.map((c) => c.text).join(' ')).toMatch(/local food-safety and labelling rules/);
    expect(d.cautions.map((c) => c.text).join(' ')).toMatch(/Hot oven/);
  });

  it.each([
    ['pieces=abc', 'pieces'],
    ['pieces=0', 'pieces'],
    ['pieces=1.5', 'pieces'],
    ['pieces=1&pieces=2', 'pieces'],
    ['piece=banana', 'piece'],
    ['mix=-3kg', 'mix'],
    ['mix=0', 'mix'],
    ['pieces=10&mix=5kg', 'pieces'],
  ])('refuses ?%s with 422 naming the parameter', async (query, param) => {
    const r = await getJson(`${t.url}/api/formulas/harbour-ciabatta?${query}`, cookie.bench);
    expect(r.status).toBe(422);
    expect(r.body).toMatchObject({ error: 'invalid', issues: [{ path: param }] });
  });
});

describe('plans and the catalog', () => {
  it('builds the sheet of a stored plan', async () => {
    const d = await get<PlanDetail>('/api/plans/2026-12-03', 'bench');
    expect(d.plan.date).toBe('2026-12-03');
    expect(d.sheet.mixes.length).toBeGreaterThan(0);
    expect(d.sheet.totals.length).toBeGreaterThan(0);
  });

  it('sends the sheet as a PDF', async () => {
    const res = await fetch(`${t.url}/api/plans/2026-12-03/sheet.pdf`, { headers: { cookie: cookie.bench } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    expect(res.headers.get('content-disposition')).toMatch(/inline; filename="panform-sheet-2026-12-03.pdf"/);
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  });

  it('prints the PDF sheet in the units the person chose, as the viewer shows them', async () => {
    const pdfText = async () => {
      const res = await fetch(`${t.url}/api/plans/2026-12-03/sheet.pdf`, { headers: { cookie: cookie.reviewer } });
      expect(res.status).toBe(200);
      const dir = mkdtempSync(join(tmpdir(), 'panform-units-'));
      try {
        writeFileSync(join(dir, 'sheet.pdf'), Buffer.from(await res.arrayBuffer()));
        return execFileSync('/usr/bin/pdftotext', [join(dir, 'sheet.pdf'), '-'], { encoding: 'utf8' });
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    };
    const metric = await pdfText();
    expect(metric).toMatch(/\d kg|\d g\b/);
    expect((await sendJson(`${t.url}/api/me/preferences`, 'PUT', { unitSystem: 'us' }, { cookie: cookie.reviewer })).status).toBe(200);
    try {
      const us = await pdfText();
      expect(us).toMatch(/\d+ lb|\d+(\.\d+)? oz/);
      // 22 °C room = 71.6 °F (NIST SP 811, 4.2.1.1: t/°F = 1.8 t/°C + 32); warnings' own words stay as written.
      expect(us).toMatch(/room 71\.6 °F/);
      expect(metric).toMatch(/room 22\.0 °C/);
    } finally {
      await sendJson(`${t.url}/api/me/preferences`, 'PUT', { unitSystem: 'metric' }, { cookie: cookie.reviewer });
    }
  });

  it('cuts the sheet to one shift as panform sheet does (shared/sheet/window.ts), the PDF too', async () => {
    const { resolveWindow, windowSheet } = await import('#shared/sheet/window');
    const whole = await get<PlanDetail>('/api/plans/2026-12-03', 'bench');
    const night = await get<PlanDetail>('/api/plans/2026-12-03?shift=night', 'bench');
    expect(night.sheet.window).toEqual({ from: '2026-12-03T00:30', to: '2026-12-03T08:00', name: 'night' });
    expect(night.sheet).toEqual(windowSheet(whole.sheet, resolveWindow(whole.sheet, { shift: 'night' })!));
    const evening = await get<PlanDetail>('/api/plans/2026-12-03?from=10:00&to=16:00', 'bench');
    expect(evening.sheet.window).toEqual({ from: '2026-12-03T10:00', to: '2026-12-03T16:00' });
    const pdf = await fetch(`${t.url}/api/plans/2026-12-03/sheet.pdf?shift=night`, { headers: { cookie: cookie.bench } });
    expect(pdf.status).toBe(200);
    const bad = await getJson(`${t.url}/api/plans/2026-12-03?shift=evening`, cookie.bench);
    expect(bad.status).toBe(422);
    expect(bad.body).toMatchObject({ issues: [{ path: 'shift' }] });
  });

  it('answers 422 for a date that is not a date and 404 for a day without a plan', async () => {
    expect((await getJson(`${t.url}/api/plans/tomorrow`, cookie.bench)).status).toBe(422);
    expect((await getJson(`${t.url}/api/plans/2031-02-03`, cookie.bench)).status).toBe(404);
  });

  it('strips prices from the catalog for roles without read:cost, and the ingredients only drafts use', async () => {
    const bench = await get<{ catalog: Record<string, object> }>('/api/catalog', 'bench');
    const admin = await get<{ catalog: Record<string, object> }>('/api/catalog', 'admin');
    const usedBy = async (id: string, role: string) => Object.keys((await get<FormulaDetail>(`/api/formulas/${id}`, role)).catalog);
    const active = (await get<FormulaListResponse>('/api/formulas', 'bench')).formulas.map((f) => f.id);
    const activeNames = new Set((await Promise.all(active.map((id) => usedBy(id, 'admin')))).flat());
    const draftOnly = (await Promise.all(NOT_ACTIVE.map((id) => usedBy(id, 'admin')))).flat().filter((n) => !activeNames.has(n));
    // The demo's trial loaf is the only one with rolled oats; the retired loaf the only one with the malted blend.
    expect(draftOnly).toEqual(expect.arrayContaining(['rolled oats', 'malted grain blend', 'malted wheat flakes']));
    expect(Object.keys(bench.catalog)).toEqual(Object.keys(admin.catalog).filter((n) => !draftOnly.includes(n)));
    expect(costKeys(bench)).toEqual([]);
    expect(costKeys(admin).length).toBeGreaterThan(0);
  });

  it('names the formulas each ingredient is in, only those the role may open, and the water content with its source', async () => {
    const bench = await get<CatalogResponse>('/api/catalog', 'bench');
    const author = await get<CatalogResponse>('/api/catalog', 'author');
    expect(bench.usedBy['fine salt'].map((f) => f.id)).toContain('harbour-ciabatta');
    const benchIds = new Set(Object.values(bench.usedBy).flat().map((f) => f.id));
    for (const id of NOT_ACTIVE) expect(benchIds.has(id)).toBe(false);
    expect(Object.values(author.usedBy).flat().map((f) => f.id)).toEqual(expect.arrayContaining(NOT_ACTIVE));
    // USDA SR28 NDB 01077 (milk, whole): water 88.13 g per 100 g.
    expect(bench.catalog['whole milk']).toMatchObject({ water: 88.13, waterSource: expect.stringMatching(/^USDA SR28 NDB 01077/) });
    expect(author.catalog['bread flour'].costDate).toMatch(/^\d{4}-\d\d-\d\d$/);
    expect(bench.catalog['bread flour'].costDate).toBeUndefined();
  });
});

describe('history', () => {
  it('lists revisions, diffs two of them in baker\'s terms, and shows the change after a load', async () => {
    const before = await get<FormulaDetail>('/api/formulas/harbour-ciabatta', 'reviewer');
    const folder = mkdtempSync(join(tmpdir(), 'panform-history-'));
    try {
      cpSync(resolve('formulas'), folder, { recursive: true });
      const file = join(folder, 'harbour-ciabatta.yaml');
      writeFileSync(file, readFileSync(file, 'utf8').replace(/^  water: 78$/m, '  water: 80'));
      const git = (...args: string[]) => execFileSync('git', ['-c', 'user.name=Ines Marlow', '-c', 'user.email=ines@tidewater.example', ...args], { cwd: folder });
      git('init', '-q');
      git('add', '.');
      git('commit', '-qm', 'Ciabatta: two more points of water for the new flour');
      await loadFolder(handle, folder, { git: true });
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
    // A load by another process is seen once the server next checks (server/routes/data.ts CHECK_MS).
    t.clock.now += CHECK_MS;
    const after = await get<FormulaDetail>('/api/formulas/harbour-ciabatta', 'reviewer');
    expect(after.revision).toBe(before.revision + 1);
    // hydration is overall water / flour: two more points of water (docs/arithmetic.md, "Scaling")
    expect(after.reference.hydration - before.reference.hydration).toBeCloseTo(2, 9);

    const revisions = await get<RevisionListResponse>('/api/formulas/harbour-ciabatta/revisions', 'reviewer');
    expect(revisions.revisions.map((r) => r.revision)).toEqual([after.revision, before.revision]);
    const diff = await get<RevisionDiffResponse>('/api/formulas/harbour-ciabatta/diff', 'reviewer');
    expect(diff).toMatchObject({ formula: 'harbour-ciabatta', from: before.revision, to: after.revision });
    // Why it changed: the commit it was loaded from.
    expect(diff.commits.to).toMatchObject({ gitAuthor: 'Ines Marlow', gitMessage: 'Ciabatta: two more points of water for the new flour' });
    expect(diff.commits.to.gitDate).toMatch(/^\d{4}-\d\d-\d\dT/);
    expect(diff.diff.ingredients).toEqual(expect.arrayContaining([expect.objectContaining({ ingredient: 'water' })]));
    const changes = await get<ChangeListResponse>('/api/changes', 'reviewer');
    expect(changes.changes[0]).toMatchObject({ formula: 'harbour-ciabatta', revision: after.revision, gitMessage: 'Ciabatta: two more points of water for the new flour' });

    expect((await getJson(`${t.url}/api/formulas/harbour-ciabatta/diff?from=1&to=99`, cookie.reviewer)).status).toBe(404);
    expect((await getJson(`${t.url}/api/formulas/harbour-ciabatta/diff?from=x`, cookie.reviewer)).status).toBe(422);
  });
});

describe('a plan that orders a draft', () => {
  it('is, for bench, as absent as a plan never loaded: not listed, 404, nothing counted or named', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'panform-draft-plan-'));
    try {
      cpSync(resolve('formulas'), folder, { recursive: true });
      const plan = join(folder, 'plans', '2026-12-05.yaml');
      writeFileSync(
        plan,
        ['date: 2026-12-05', 'ready_by: "06:00"', 'conditions: { room: 22 °C, flour: 20 °C, tap_water: 12 °C }', 'mixers:', '  - { name: spiral, capacity: 50 kg, minimum: 8 kg, friction: 13 °C }', 'orders:', '  - { formula: harbour-ciabatta, pieces: 40, mixer: spiral }', '  - { formula: spelt-porridge-loaf, pieces: 12, mixer: spiral }', ''].join('\n'),
      );
      await loadFolder(handle, [plan], { git: false });
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
    t.clock.now += CHECK_MS;
    const reviewer = await get<PlanListResponse>('/api/plans', 'reviewer');
    expect(reviewer.plans.find((p) => p.date === '2026-12-05')).toMatchObject({
      orders: 2,
      formulas: ['harbour-ciabatta', 'spelt-porridge-loaf'],
      // The products by their titles (formulas/*.yaml), for the bake-day list.
      titles: ['Harbour ciabatta', 'Spelt porridge loaf (trial)'],
    });

    const bench = await get<PlanListResponse>('/api/plans', 'bench');
    expect(bench.plans.map((p) => p.date)).not.toContain('2026-12-05');
    for (const path of ['/api/plans/2026-12-05', '/api/plans/2026-12-05/sheet.pdf']) {
      const r = await getJson(`${t.url}${path}`, cookie.bench);
      expect(r.status, path).toBe(404);
      expect(r.body).toEqual({ error: 'not_found', message: 'no plan for 2026-12-05; it may not have been loaded yet' });
    }
  });
});
