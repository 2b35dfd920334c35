// `panform new <dir>`: the starter repository passes `panform check`, its plan makes a sheet, its
// catalog names a source for every water content, a folder that is not empty is refused with
// nothing written, and git gets the diff driver and the pre-commit hook.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'yaml';
import { afterAll, describe, expect, it } from 'vitest';
import { collectCheck } from '../../cli/commands/check.ts';
import { collectNew, repositoryFiles, tomorrow } from '../../cli/commands/new.ts';
import { collectSheet } from '../../cli/commands/sheet.ts';
import { schemaReference } from '../../cli/commands/init.ts';
import { UsageError } from '../../cli/errors.ts';
import { toServeOptions } from '../../cli/commands/serve.ts';
import { defaultFormulasFolder } from '../../cli/files.ts';
import { buildCli } from './arithmetic-cli.ts';

const scratch = mkdtempSync(join(tmpdir(), 'panform-new-test-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

describe('panform new', () => {
  it('writes a repository that passes panform check and whose plan makes a sheet', async () => {
    const dir = join(scratch, 'plain');
    const r = await collectNew({ dir, git: false, json: false, planDate: '2026-12-04' });
    expect(r.git).toBeNull();
    expect(r.files).toEqual([
      '.githooks/pre-commit',
      '.gitignore',
      '.vscode/settings.json',
      'README.md',
      'ci/check.sh',
      'house-loaf.yaml',
      'ingredients.yaml',
      'plans/2026-12-04.yaml',
      'schemas/catalog.schema.json',
      'schemas/formula.schema.json',
      'schemas/plan.schema.json',
    ]);
    const report = collectCheck({ paths: [dir] });
    expect(report.findings).toEqual([]);
    expect(report.files).toBe(3);
    const sheet = await collectSheet(join(dir, 'plans', '2026-12-04.yaml'));
    expect(sheet.mixes.map((m) => m.formula)).toEqual(['house-loaf']);
    // Only the defaults the sheet assumes are said (as every default is); nothing late, nothing out of range.
    expect(sheet.warnings.filter((w) => !/\(default; common practice/.test(w))).toEqual([]);
    expect(sheet.orders.map((o) => o.late)).toEqual([0]);
    // No staging folder is left beside it.
    expect(readdirSync(scratch).filter((n) => n.startsWith('.'))).toEqual([]);
    // The hook and the CI script can run; the repository's files are ordinary repository files.
    expect(statSync(join(dir, '.githooks', 'pre-commit')).mode & 0o111).not.toBe(0);
    expect(statSync(join(dir, 'ci', 'check.sh')).mode & 0o111).not.toBe(0);
  });

  it('names a source for every water content in the starter catalog', () => {
    const catalog = parse(repositoryFiles('x', '2026-12-04').get('ingredients.yaml')!) as Record<string, { kind: string; water?: string; water_source?: string }>;
    const kinds = new Set(Object.values(catalog).map((e) => e.kind));
    for (const kind of ['flour', 'water', 'salt', 'yeast', 'culture']) expect(kinds, kind).toContain(kind);
    for (const [name, entry] of Object.entries(catalog)) {
      expect(entry.water_source, name).toBeTruthy();
      if (entry.kind !== 'culture') expect(entry.water, name).toMatch(/ %$/);
    }
  });

  it('maps every schema to its files for editors, with the schemas copied in', () => {
    const dir = join(scratch, 'plain');
    const settings = JSON.parse(readFileSync(join(dir, '.vscode', 'settings.json'), 'utf8')) as { 'yaml.schemas': Record<string, string[]> };
    for (const path of Object.keys(settings['yaml.schemas'])) expect(existsSync(join(dir, path)), path).toBe(true);
    // panform init in this repository points its schema line at the repository's copy.
    expect(schemaReference(dir, '/nowhere')).toBe('schemas/formula.schema.json');
  });

  it('refuses a folder that is not empty, and writes nothing', async () => {
    const dir = join(scratch, 'taken');
    mkdirSync(dir);
    writeFileSync(join(dir, 'notes.txt'), 'ours\n');
    const e = await collectNew({ dir, git: true, json: false }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(UsageError);
    expect((e as Error).message).toMatch(/is not empty/);
    expect(readdirSync(dir)).toEqual(['notes.txt']);
    expect(readdirSync(scratch).filter((n) => n.startsWith('.'))).toEqual([]);
  });

  it('takes an empty folder, and dates the sample plan tomorrow by default', async () => {
    const dir = join(scratch, 'empty');
    mkdirSync(dir);
    const r = await collectNew({ dir, git: false, json: false });
    expect(r.planFile).toBe(`plans/${tomorrow()}.yaml`);
    expect(existsSync(join(dir, r.planFile))).toBe(true);
    expect(tomorrow(new Date(2026, 11, 31, 23, 30))).toBe('2027-01-01');
  });

  it('sets up git: the diff driver for the formulas at the top and the hooks folder', async () => {
    const dir = join(scratch, 'with-git');
    const r = await collectNew({ dir, git: true, json: false });
    expect(r.git).toMatchObject({ hooksPath: '.githooks', attributes: '/*.yaml diff=panform' });
    const config = (key: string) => execFileSync('git', ['config', '--get', key], { cwd: dir, encoding: 'utf8' }).trim();
    expect(config('core.hooksPath')).toBe('.githooks');
    expect(config('diff.panform.textconv')).toMatch(/bin\/panform\.js diff --textconv$/);
    expect(config('panform.command')).toMatch(/bin\/panform\.js$/);
    expect(readFileSync(join(dir, '.gitattributes'), 'utf8')).toBe('/*.yaml diff=panform\n');
  });

  it('exits 2 through the CLI on a folder that is not empty, printing one line', async () => {
    const cli = await buildCli();
    const res = await cli.run(['new', join(scratch, 'taken')]);
    expect(res.code).toBe(2);
    expect(res.stderr).toMatch(/is not empty/);
    expect(res.stderr).not.toMatch(/\n\s+at /);
  });
});

describe('commands in a bakery repository', () => {
  it('default to the repository itself when it holds ingredients.yaml and no formulas/', () => {
    expect(defaultFormulasFolder(join(scratch, 'plain'))).toBe('.');
    // Panform's own clone keeps its demo in formulas/.
    expect(defaultFormulasFolder(join(__dirname, '..', '..'))).toBe('formulas');
    expect(defaultFormulasFolder(scratch)).toBe('formulas');
  });

  it('serve --formulas takes a folder, and refuses one that does not exist', () => {
    expect(toServeOptions({ formulas: join(scratch, 'plain') }).formulas).toBe(join(scratch, 'plain'));
    expect(() => toServeOptions({ formulas: join(scratch, 'nowhere') })).toThrow(UsageError);
  });
});
