import { mkdtempSync, mkdirSync, readFileSync, rmSync, unlinkSync, writeFileSync, existsSync } from 'node:fs';
import { parse as parseYaml } from 'yaml';
import { join } from 'node:path';
import fc from 'fast-check';
import { asc, eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { generateCatalogYaml, generateFormulaYaml, generatePlanYaml, writeGeneratedFolder } from '../../bench/generate-formulas.mjs';
import { formulaRevisionsTable, formulasTable } from '../../server/db/schema.ts';
import { loadFolder, LoadCheckError, contentHash } from '../../server/load/index.ts';
import { forEachDatabase, readLoadedState, truncateAll } from '../setup/databases.ts';

const tmpDirs: string[] = [];
afterAll(() => {
  for (const d of tmpDirs) rmSync(d, { recursive: true, force: true });
});
function tempFolder(count: number, plan = true): { dir: string; ids: string[] } {
  const root = mkdtempSync('/tmp/panform-load-test-');
  tmpDirs.push(root);
  const dir = join(root, 'formulas');
  const ids = writeGeneratedFolder(dir, count, { plan });
  return { dir, ids };
}

const opts = { git: false } as const;

forEachDatabase('loading a formulas folder', (setup) => {
  it('loads every formula, the catalog and the plans, with the figures of the reference batch', async () => {
    const h = await setup.fresh();
    const { dir, ids } = tempFolder(5);
    const summary = await loadFolder(h, dir, opts);
    expect(summary.formulas.added).toEqual(ids);
    expect(summary.plans.added).toEqual(['2026-12-03']);
    expect(summary.catalog.added.length).toBeGreaterThan(5);
    const [row] = await h.db.select().from(formulasTable).where(eq(formulasTable.id, 'generated-0000'));
    // generated-0000: 6 × 300 g, loss 1 %, total % = 100 + 64 + 1.8 + 0.3 = 166.1 (bench/generate-formulas.mjs, index 0)
    const figures = row.figures as { dividedDough: number; mixedDough: number; flour: number; hydration: number; totalPercent: number };
    expect(figures.dividedDough).toBeCloseTo(1800, 9); // D = N·P, docs/arithmetic.md
    expect(figures.mixedDough).toBeCloseTo(1800 / 0.99, 9); // M = D / (1 − loss)
    expect(figures.totalPercent).toBeCloseTo(166.1, 9);
    expect(figures.flour).toBeCloseTo(1800 / 0.99 / 1.661, 9); // F = M / (total % / 100)
    expect(figures.hydration).toBeCloseTo(64, 9);
    expect(row.path).toBe('formulas/generated-0000.yaml');
  });

  it('keeps the commit of a revision loaded from a git repository: author, date and message', async () => {
    const { execFileSync } = await import('node:child_process');
    const h = await setup.fresh();
    const { dir } = tempFolder(1, false);
    const git = (...args: string[]) =>
      execFileSync('git', ['-c', 'user.name=Ines Marlow', '-c', 'user.email=ines@tidewater.example', ...args], {
        cwd: dir,
        encoding: 'utf8',
        env: { ...process.env, GIT_AUTHOR_DATE: '2026-11-30T05:10:00+00:00', GIT_COMMITTER_DATE: '2026-11-30T05:10:00+00:00' },
      }).trim();
    git('init', '-q');
    git('add', '.');
    git('commit', '-qm', 'More water in the rolls: the new flour drinks more');
    await loadFolder(h, dir, { git: true });
    const [rev] = await h.db.select().from(formulaRevisionsTable).where(eq(formulaRevisionsTable.formulaId, 'generated-0000'));
    expect(rev.gitCommit).toBe(git('rev-parse', 'HEAD'));
    expect(rev.gitAuthor).toBe('Ines Marlow');
    expect(rev.gitDate?.toISOString()).toBe('2026-11-30T05:10:00.000Z');
    expect(rev.gitMessage).toBe('More water in the rolls: the new flour drinks more');
  });

  it('keeps one revision when the same files are loaded twice', async () => {
    const h = await setup.fresh();
    const { dir, ids } = tempFolder(3);
    await loadFolder(h, dir, opts);
    const second = await loadFolder(h, dir, opts);
    expect(second.formulas.unchanged).toEqual(ids);
    expect(second.formulas.added).toEqual([]);
    expect(second.formulas.changed).toEqual([]);
    const state = await readLoadedState(h);
    expect(state.revisions).toHaveLength(3);
    expect(state.formulas.every((f) => f.revision === 1)).toBe(true);
    expect(state.loads).toBe(2);
  });

  it('adds exactly one revision for a changed file', async () => {
    const h = await setup.fresh();
    const { dir } = tempFolder(3);
    await loadFolder(h, dir, opts);
    writeFileSync(join(dir, 'generated-0001.yaml'), generateFormulaYaml(1, 1));
    const summary = await loadFolder(h, dir, opts);
    expect(summary.formulas.changed).toEqual(['generated-0001']);
    expect(summary.formulas.unchanged).toEqual(['generated-0000', 'generated-0002']);
    const revs = await h.db.select().from(formulaRevisionsTable).where(eq(formulaRevisionsTable.formulaId, 'generated-0001')).orderBy(asc(formulaRevisionsTable.revision));
    expect(revs.map((r) => r.revision)).toEqual([1, 2]);
    expect(revs[1].source).toBe(generateFormulaYaml(1, 1));
    expect(revs[1].loadId).toBe(summary.loadId);
    const [row] = await h.db.select().from(formulasTable).where(eq(formulasTable.id, 'generated-0001'));
    expect(row.revision).toBe(2);
    expect(row.title).toBe('Generated loaf 1 (v1)');
  });

  it('loads nothing when any file has an error, and names the place of each error', async () => {
    const h = await setup.fresh();
    const { dir } = tempFolder(3);
    await loadFolder(h, dir, opts);
    const before = await readLoadedState(h);
    writeFileSync(join(dir, 'generated-0000.yaml'), generateFormulaYaml(0, 2)); // a good change ...
    writeFileSync(join(dir, 'broken-loaf.yaml'), 'id: broken-loaf\ntitle: Broken\nstatus: active\n'); // ... and a bad file
    const err = await loadFolder(h, dir, opts).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(LoadCheckError);
    const findings = (err as LoadCheckError).findings;
    expect(findings.length).toBeGreaterThan(0);
    expect(findings.every((f) => f.file === 'formulas/broken-loaf.yaml' && f.line >= 1)).toBe(true);
    expect(await readLoadedState(h)).toEqual(before);
  });

  it('keeps a formula whose file disappeared, marked removed and retired, and restores it without a new revision', async () => {
    const h = await setup.fresh();
    const { dir } = tempFolder(3, false);
    await loadFolder(h, dir, opts);
    const text = generateFormulaYaml(2);
    unlinkSync(join(dir, 'generated-0002.yaml'));
    const gone = await loadFolder(h, dir, opts);
    expect(gone.formulas.removed).toEqual(['generated-0002']);
    let [row] = await h.db.select().from(formulasTable).where(eq(formulasTable.id, 'generated-0002'));
    expect(row.removedAt).not.toBeNull();
    expect(row.status).toBe('retired');
    writeFileSync(join(dir, 'generated-0002.yaml'), text);
    const back = await loadFolder(h, dir, opts);
    expect(back.formulas.added).toEqual(['generated-0002']);
    [row] = await h.db.select().from(formulasTable).where(eq(formulasTable.id, 'generated-0002'));
    expect(row.removedAt).toBeNull();
    expect(row.status).toBe('draft'); // generated index 2 is a draft
    expect(row.revision).toBe(1);
  });

  it('loads a single file without retiring the others', async () => {
    const h = await setup.fresh();
    const { dir } = tempFolder(3);
    await loadFolder(h, dir, opts);
    writeFileSync(join(dir, 'generated-0000.yaml'), generateFormulaYaml(0, 1));
    const summary = await loadFolder(h, [join(dir, 'generated-0000.yaml')], opts);
    expect(summary.complete).toBe(false);
    expect(summary.formulas.changed).toEqual(['generated-0000']);
    expect(summary.formulas.removed).toEqual([]);
    const state = await readLoadedState(h);
    expect(state.formulas.filter((f) => f.removedAt === null)).toHaveLength(3);
  });

  it('updates the reference figures when only the catalog changed, without a new revision', async () => {
    const h = await setup.fresh();
    const { dir } = tempFolder(5);
    await loadFolder(h, dir, opts);
    // generated index 4 is enriched with whole milk; water content 88 % → 90 % changes effective hydration.
    writeFileSync(join(dir, 'ingredients.yaml'), generateCatalogYaml().replace('water: 88 %', 'water: 90 %'));
    const summary = await loadFolder(h, dir, opts);
    expect(summary.catalog.changed).toEqual(['whole milk']);
    expect(summary.refigured).toEqual(['generated-0004']);
    const [row] = await h.db.select().from(formulasTable).where(eq(formulasTable.id, 'generated-0004'));
    expect(row.revision).toBe(1);
  });

  it('leaves the database equal to the files after any sequence of edits and loads', async () => {
    const h = await setup.fresh();
    const POOL = 4;
    const op = fc.oneof(
      { weight: 4, arbitrary: fc.record({ t: fc.constant('write' as const), i: fc.integer({ min: 0, max: POOL - 1 }), v: fc.integer({ min: 0, max: 2 }) }) },
      { weight: 2, arbitrary: fc.record({ t: fc.constant('delete' as const), i: fc.integer({ min: 0, max: POOL - 1 }) }) },
      { weight: 1, arbitrary: fc.record({ t: fc.constant('plan' as const), on: fc.boolean() }) },
      { weight: 1, arbitrary: fc.record({ t: fc.constant('bad' as const) }) },
      { weight: 1, arbitrary: fc.record({ t: fc.constant('catalog' as const), extra: fc.boolean() }) },
      { weight: 3, arbitrary: fc.record({ t: fc.constant('load' as const) }) },
    );
    let checkedLoads = 0;
    const runs = Number(process.env.PANFORM_FUZZ_RUNS ?? 0) > 0 ? Math.min(50, Number(process.env.PANFORM_FUZZ_RUNS)) : 6;
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 1, maxLength: 10 }), async (ops) => {
        await truncateAll(h);
        const root = mkdtempSync('/tmp/panform-load-prop-');
        tmpDirs.push(root);
        const dir = join(root, 'formulas');
        mkdirSync(join(dir, 'plans'), { recursive: true });
        writeFileSync(join(dir, 'ingredients.yaml'), generateCatalogYaml());
        writeFileSync(join(dir, 'generated-0000.yaml'), generateFormulaYaml(0));
        // The model: what the files hold now, and what the database should hold after a good load.
        const files = new Map<string, string>([['generated-0000', generateFormulaYaml(0)]]);
        const lastLoaded = new Map<string, string>(); // id → hash of the last loaded text
        const revisions = new Map<string, number>();
        let everLoaded = new Set<string>();
        const id = (i: number) => `generated-${String(i).padStart(4, '0')}`;
        const load = async () => {
          const hasFiles = files.size > 0;
          if (!hasFiles) return; // a folder with no formulas keeps only the catalog; covered elsewhere
          await loadFolder(h, dir, opts);
          checkedLoads++;
          for (const [fid, text] of files) {
            const hash = contentHash(text);
            if (lastLoaded.get(fid) !== hash) revisions.set(fid, (revisions.get(fid) ?? 0) + 1);
            lastLoaded.set(fid, hash);
          }
          everLoaded = new Set([...everLoaded, ...files.keys()]);
          const state = await readLoadedState(h);
          const live = state.formulas.filter((f) => f.removedAt === null);
          expect(live.map((f) => [f.id, f.source])).toEqual([...files].sort(([a], [b]) => a.localeCompare(b)));
          const removed = state.formulas.filter((f) => f.removedAt !== null);
          expect(removed.map((f) => f.id).sort()).toEqual([...everLoaded].filter((x) => !files.has(x)).sort());
          expect(removed.every((f) => f.status === 'retired')).toBe(true);
          for (const f of state.formulas) {
            expect(state.revisions.filter((r) => r.id === f.id).map((r) => r.revision)).toEqual(
              Array.from({ length: revisions.get(f.id) ?? 0 }, (_, k) => k + 1),
            );
            expect(f.revision).toBe(revisions.get(f.id));
          }
          const planPath = join(dir, 'plans', '2026-12-03.yaml');
          expect(state.plans).toEqual(existsSync(planPath) ? [{ date: '2026-12-03', source: readFileSync(planPath, 'utf8') }] : []);
          const catalogNames = Object.keys(parseYaml(readFileSync(join(dir, 'ingredients.yaml'), 'utf8')) as object).sort();
          expect(state.catalog).toEqual(catalogNames);
        };
        for (const o of ops) {
          if (o.t === 'write') {
            const text = generateFormulaYaml(o.i, o.v);
            writeFileSync(join(dir, `${id(o.i)}.yaml`), text);
            files.set(id(o.i), text);
          } else if (o.t === 'delete') {
            rmSync(join(dir, `${id(o.i)}.yaml`), { force: true });
            files.delete(id(o.i));
          } else if (o.t === 'plan') {
            const planned = [...files.keys()].slice(0, 2);
            if (o.on && planned.length > 0) writeFileSync(join(dir, 'plans', '2026-12-03.yaml'), generatePlanYaml('2026-12-03', planned));
            else rmSync(join(dir, 'plans', '2026-12-03.yaml'), { force: true });
          } else if (o.t === 'catalog') {
            writeFileSync(join(dir, 'ingredients.yaml'), generateCatalogYaml() + (o.extra ? 'rolled oats: { kind: inclusion }\n' : ''));
          } else if (o.t === 'bad') {
            if (files.size === 0) continue;
            const before = await readLoadedState(h);
            writeFileSync(join(dir, 'bad-one.yaml'), 'id: bad-one\nyield: twelve\n');
            await expect(loadFolder(h, dir, opts)).rejects.toBeInstanceOf(LoadCheckError);
            rmSync(join(dir, 'bad-one.yaml'));
            expect(await readLoadedState(h)).toEqual(before);
          } else {
            // A plan naming a formula that is gone fails the check: drop it first, as a baker would.
            const planPath = join(dir, 'plans', '2026-12-03.yaml');
            if (existsSync(planPath)) {
              const planned = [...files.keys()].slice(0, 2);
              if (planned.length > 0) writeFileSync(planPath, generatePlanYaml('2026-12-03', planned));
              else rmSync(planPath);
            }
            await load();
          }
        }
        // Finally load whatever is there.
        const planPath = join(dir, 'plans', '2026-12-03.yaml');
        if (existsSync(planPath)) {
          const planned = [...files.keys()].slice(0, 2);
          if (planned.length > 0) writeFileSync(planPath, generatePlanYaml('2026-12-03', planned));
          else rmSync(planPath);
        }
        await load();
      }),
      { numRuns: runs },
    );
    expect(checkedLoads).toBeGreaterThanOrEqual(runs);
  });
});

describe('loadFolder paths', () => {
  it('refuses a folder with no formula, catalog or plan files', async () => {
    const root = mkdtempSync('/tmp/panform-load-empty-');
    tmpDirs.push(root);
    const { prepareLoad, LoadPathError } = await import('../../server/load/index.ts');
    await expect(prepareLoad(root, opts)).rejects.toBeInstanceOf(LoadPathError);
  });
});

describe('readLoadInput', () => {
  it('records the last commit and author of each committed file, and none for a file changed since', async () => {
    const { execFileSync } = await import('node:child_process');
    const { readLoadInput } = await import('../../server/load/index.ts');
    const root = mkdtempSync('/tmp/panform-load-git-');
    tmpDirs.push(root);
    const dir = join(root, 'formulas');
    writeGeneratedFolder(dir, 2, { plan: false });
    const git = (...args: string[]) =>
      execFileSync('git', ['-c', 'user.name=Ines Marlow', '-c', 'user.email=ines@tidewater.example', ...args], { cwd: root, encoding: 'utf8' }).trim();
    git('init', '-q');
    git('add', '.');
    git('commit', '-qm', 'first formulas');
    const head = git('rev-parse', 'HEAD');
    writeFileSync(join(dir, 'generated-0001.yaml'), generateFormulaYaml(1, 1));
    const input = await readLoadInput([dir]);
    expect(input.gitCommit).toBe(head);
    const byPath = Object.fromEntries(input.files.map((f) => [f.path, [f.gitCommit, f.gitAuthor]]));
    expect(byPath).toEqual({
      'formulas/ingredients.yaml': [head, 'Ines Marlow'],
      'formulas/generated-0000.yaml': [head, 'Ines Marlow'],
      'formulas/generated-0001.yaml': [null, null],
    });
  });

  it('records no git information outside a repository', async () => {
    const { readLoadInput } = await import('../../server/load/index.ts');
    const { dir } = tempFolder(1, false);
    const input = await readLoadInput([dir]);
    expect(input.gitCommit).toBeNull();
    expect(input.files.every((f) => f.gitCommit === null && f.gitAuthor === null)).toBe(true);
  });
});
