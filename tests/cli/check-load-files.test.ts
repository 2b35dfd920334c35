// One rule for which files a folder holds and in which order they are checked (shared/files.ts,
// walked by listYamlFiles in server/load/read.ts): `panform check` and a load see the same files
// and report the same findings for the same folder.
import { cpSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, dirname, join, relative } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { collectCheck } from '../../cli/commands/check.ts';
import { checkLoadInput } from '../../server/load/check.ts';
import { readLoadInput } from '../../server/load/read.ts';
import { fileKindOf, orderableFormula, orderFiles } from '#shared/files';

const ROOT = new URL('../../', import.meta.url).pathname;
const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

/** A copy of tests/fixtures/check (errors of every kind) with a hidden file, a nested folder and a linked file added. */
function folder(): string {
  const root = mkdtempSync(join(tmpdir(), 'panform-files-'));
  dirs.push(root);
  const dir = join(root, 'formulas');
  cpSync(join(ROOT, 'tests/fixtures/check'), dir, { recursive: true });
  writeFileSync(join(dir, '.draft.yaml'), 'id: draft\n');
  mkdirSync(join(dir, 'old'));
  cpSync(join(dir, 'loss-100.yaml'), join(dir, 'old', 'loss-100.yaml'));
  writeFileSync(join(dir, 'notes.txt'), 'not a formula\n');
  return dir;
}

/** A finding as `<folder>/<path>:line:col severity message`, whichever shell reported it. */
const line = (dir: string, f: { file: string; line: number; col: number; severity: string; message: string }) => {
  const file = f.file.startsWith('/') ? [basename(dir), relative(dir, f.file)].join('/') : f.file;
  // check names the folder as the user reaches it from here, a load by its recorded path.
  const message = f.message.replaceAll(`${relative(process.cwd(), dir)}/`, `${basename(dir)}/`);
  return `${file}:${f.line}:${f.col} ${f.severity} ${message}`;
};

describe('check and load read a folder by one rule', () => {
  it('see the same files, in the same order of kinds', async () => {
    const dir = folder();
    const checked = collectCheck({ paths: [dir] }).checked.map((p) => relative(dirname(dir), p));
    const loaded = (await readLoadInput([dir], { git: false })).files.map((f) => f.path);
    expect([...checked].sort()).toEqual([...loaded].sort());
    expect(loaded).toContain('formulas/old/loss-100.yaml');
    expect(loaded).not.toContain('formulas/.draft.yaml');
    expect(loaded.map((p) => fileKindOf(p))).toEqual(orderFiles(loaded).map((f) => f.kind));
  });

  it('report the same findings', async () => {
    const dir = folder();
    const fromCheck = collectCheck({ paths: [dir] }).findings.map((f) => line(dir, f));
    const input = await readLoadInput([dir], { git: false });
    const fromLoad = checkLoadInput(input).findings.map((f) => line(dir, f));
    // A load also refuses two files with one id (the copy in old/), which check leaves to the load.
    const loadOnly = fromLoad.filter((l) => !fromCheck.includes(l));
    expect(loadOnly).toEqual(['formulas/old/loss-100.yaml:1:5 error the id "loss-100" is also used by formulas/loss-100.yaml'].filter((l) => fromLoad.includes(l)));
    expect(fromCheck.filter((l) => !fromLoad.includes(l))).toEqual([]);
  });
});

describe('shared/files.ts', () => {
  it('names the kind by where a file lies and orders catalog, formulas, plans', () => {
    expect(orderFiles(['f/plans/2026-12-03.yaml', 'f/b.yaml', 'f/ingredients.yaml', 'f/a.yml'])).toEqual([
      { path: 'f/ingredients.yaml', kind: 'catalog' },
      { path: 'f/a.yml', kind: 'formula' },
      { path: 'f/b.yaml', kind: 'formula' },
      { path: 'f/plans/2026-12-03.yaml', kind: 'plan' },
    ]);
    expect(fileKindOf('elsewhere/my-catalog.yaml', './elsewhere/my-catalog.yaml')).toBe('catalog');
    expect(fileKindOf('C:\\bakery\\formulas\\plans\\2026-12-03.yaml')).toBe('plan');
  });

  it('lets plans order only the formulas directly in their folder', () => {
    expect(orderableFormula('harbour-ciabatta.yaml')).toBe(true);
    expect(orderableFormula('old/harbour-ciabatta.yaml')).toBe(false);
  });
});
