// The file's order is the order everywhere: a baker writes ingredients in the order they go into
// the bowl. The milk buns' order (milk, egg, butter, sugar, salt, yeast) is neither alphabetical
// nor by length, so any surface that sorts, or a database column that reorders keys, shows here.
import { execFileSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import type { FormulaDetail, PlanDetail, RevisionDiffResponse } from '#shared/api';
import { compareText } from '#shared/text';
import { collectDiff } from '../../cli/commands/diff.ts';
import { collectScale, toScaleOptions } from '../../cli/commands/scale.ts';
import { collectSheet } from '../../cli/commands/sheet.ts';
import { migrateDatabase, openDatabase, type DatabaseHandle } from '../../server/db/client.ts';
import { fileOrderMigrationTime, lastMigrationTime, restoreFileOrder } from '../../server/db/file-order.ts';
import { formulasTable } from '../../server/db/schema.ts';
import { loadFolder } from '../../server/load/index.ts';
import { CHECK_MS } from '../../server/routes/data.ts';
import { getJson, openTestDatabase, startTestServer, type TestServer } from './harness.ts';

const ID = 'tidewater-milk-buns';
const FILE = resolve('formulas', `${ID}.yaml`);
const PLAN = resolve('formulas', 'plans', '2026-12-03.yaml');
const fileOrder = Object.keys((parse(readFileSync(FILE, 'utf8')) as { ingredients: Record<string, number> }).ingredients);
const flourOrder = Object.keys((parse(readFileSync(FILE, 'utf8')) as { flour: Record<string, number> }).flour);
const inFileOrder = (names: string[]) => names.filter((n) => fileOrder.includes(n));

let handle: DatabaseHandle;
let t: TestServer;
let cookie: string;
const dirs: string[] = [];
beforeAll(async () => {
  handle = await openTestDatabase();
  t = await startTestServer(handle);
  cookie = await t.signIn('reviewer');
}, 180_000);
afterAll(async () => {
  await t?.close();
  await handle?.close();
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

async function get<T>(path: string): Promise<T> {
  const r = await getJson(`${t.url}${path}`, cookie);
  expect(r.status, path).toBe(200);
  return r.body as T;
}

describe('the milk buns, from file to every output', () => {
  it('are written in an order that is neither alphabetical nor by length', () => {
    expect(fileOrder).toEqual(['whole milk', 'whole egg', 'unsalted butter', 'caster sugar', 'fine salt', 'fresh yeast']);
    expect(fileOrder).not.toEqual([...fileOrder].sort(compareText));
    expect(fileOrder).not.toEqual([...fileOrder].sort((a, b) => a.length - b.length || compareText(a, b)));
  });

  it('keep the order in the CLI, the API, the tablet and the printed sheets', async () => {
    const cli = collectScale(FILE, toScaleOptions({ units: 'metric' }));
    expect(inFileOrder(cli.result.finalDough.map((l) => l.ingredient))).toEqual(fileOrder);
    expect(inFileOrder(cli.result.overall.map((l) => l.ingredient))).toEqual(fileOrder);

    // The API feeds the tablet (the formula page draws formula.ingredients and scaled.finalDough).
    const api = await get<FormulaDetail>(`/api/formulas/${ID}`);
    expect(api.formula.ingredients.map((l) => l.ingredient)).toEqual(fileOrder);
    expect(api.formula.flour.map((l) => l.ingredient)).toEqual(flourOrder);
    expect(api.scaled.finalDough.map((l) => l.ingredient)).toEqual(cli.result.finalDough.map((l) => l.ingredient));

    const cliSheet = await collectSheet(PLAN);
    const apiSheet = (await get<PlanDetail>('/api/plans/2026-12-03')).sheet;
    for (const sheet of [cliSheet, apiSheet]) {
      const mix = sheet.mixes.find((m) => m.formula === ID)!;
      expect(inFileOrder(mix.ingredients.map((l) => l.ingredient))).toEqual(fileOrder);
    }

    // The server's Download PDF, read back as text: the milk bun mix's lines in the file's order.
    const res = await fetch(`${t.url}/api/plans/2026-12-03/sheet.pdf`, { headers: { cookie } });
    expect(res.status).toBe(200);
    const dir = mkdtempSync(join(tmpdir(), 'panform-order-'));
    dirs.push(dir);
    writeFileSync(join(dir, 'sheet.pdf'), Buffer.from(await res.arrayBuffer()));
    const text = execFileSync('/usr/bin/pdftotext', ['-layout', join(dir, 'sheet.pdf'), '-'], { encoding: 'utf8' });
    const block = text.slice(text.indexOf('whole milk'));
    const at = fileOrder.map((n) => block.indexOf(n));
    expect(at.every((i) => i >= 0)).toBe(true);
    expect([...at].sort((a, b) => a - b)).toEqual(at);
  });

  it('keep the order in a diff, from the CLI and from the stored revisions', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'panform-order-'));
    dirs.push(dir);
    const folder = join(dir, 'formulas');
    cpSync(resolve('formulas'), folder, { recursive: true });
    const changed = join(folder, `${ID}.yaml`);
    // Every ingredient a little more: each line shows up in the diff.
    writeFileSync(changed, readFileSync(FILE, 'utf8').replace(/^( {2}(?:whole milk|whole egg|unsalted butter|caster sugar|fine salt|fresh yeast): )([\d.]+)$/gm, (_, k, v) => `${k}${Number(v) + 1}`));
    const cli = await collectDiff({ paths: [FILE, changed], json: true });
    expect(cli.diffs[0].diff.ingredients.map((l) => l.ingredient)).toEqual(fileOrder);

    const before = await get<FormulaDetail>(`/api/formulas/${ID}`);
    await loadFolder(handle, changed, { git: false });
    t.clock.now += CHECK_MS;
    const diff = await get<RevisionDiffResponse>(`/api/formulas/${ID}/diff?from=${before.revision}&to=${before.revision + 1}`);
    expect(diff.diff.ingredients.map((l) => l.ingredient)).toEqual(fileOrder);
  });
});

describe('a database made before the content kept its order', () => {
  it('gets the file order back from each row\'s own text after the migration', async () => {
    const db = await openDatabase({ memory: true });
    try {
      await migrateDatabase(db);
      // The data step runs when a database crosses the file-order migration.
      expect(await lastMigrationTime(db.db)).toBeGreaterThanOrEqual(fileOrderMigrationTime(resolve('drizzle'))!);
      await loadFolder(db, resolve('formulas'), { git: false });
      const stored = async () => {
        const [row] = await db.db.select({ content: formulasTable.content }).from(formulasTable).where(eq(formulasTable.id, ID));
        return Object.keys((row.content as { ingredients: Record<string, number> }).ingredients);
      };
      expect(await stored()).toEqual(fileOrder);
      // As the rows were before the migration: through jsonb, shortest key first.
      for (const table of ['formulas', 'formula_revisions', 'plans']) {
        await db.db.execute(sql.raw(`alter table ${table} alter column content type jsonb using content::jsonb`));
        await db.db.execute(sql.raw(`alter table ${table} alter column content type json using content::json`));
      }
      expect(await stored()).not.toEqual(fileOrder);
      await restoreFileOrder(db.db);
      expect(await stored()).toEqual(fileOrder);
    } finally {
      await db.close();
    }
  }, 180_000);
});
