import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeEach, afterEach, describe, expect, it } from 'vitest';
import { collectDiff, printDiff, textconv } from '../../cli/commands/diff.ts';
import { collectGitSetup } from '../../cli/commands/git-setup.ts';
import { InputError, UsageError } from '../../cli/errors.ts';

const ROOT = new URL('../../', import.meta.url).pathname;
const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});
function scratch(): string {
  const d = mkdtempSync('/tmp/panform-diff-test-');
  dirs.push(d);
  return d;
}

const CATALOG = 'bread flour: { kind: flour }\nwater: { kind: water }\nfine salt: { kind: salt }\ninstant yeast: { kind: yeast, yeast: instant }\n';
const loaf = (water: number, extra = '') => `id: test-loaf
title: Test loaf
status: active
category: lean
yield: { pieces: 10, piece: 500 g }
flour: { bread flour: 100 }
ingredients: { water: ${water}, fine salt: 2, instant yeast: 1 }
${extra}`;

const git = (cwd: string, ...args: string[]) =>
  execFileSync('git', ['-c', 'user.name=Ines Marlow', '-c', 'user.email=ines@tidewater.example', ...args], { cwd, encoding: 'utf8' });

let cwd: string;
beforeEach(() => {
  cwd = process.cwd();
});
afterEach(() => {
  process.chdir(cwd);
});

describe('panform diff OLD NEW', () => {
  it('prints ingredient changes with marks and the figures before and after', async () => {
    const d = scratch();
    writeFileSync(join(d, 'ingredients.yaml'), CATALOG);
    writeFileSync(join(d, 'old.yaml'), loaf(70));
    writeFileSync(join(d, 'test-loaf.yaml'), loaf(75));
    const report = await collectDiff({ paths: [join(d, 'old.yaml'), join(d, 'test-loaf.yaml')], json: false });
    const text = printDiff(report);
    expect(text).toContain('test-loaf: Test loaf (changed)');
    expect(text).toMatch(/~ water\s+70 % → 75 %\s+\(\+5\)/);
    // total % 173 → 178: 100 + 70 + 2 + 1 and 100 + 75 + 2 + 1 (docs/arithmetic.md)
    expect(text).toMatch(/~ total %\s+173\.00 %\s+178\.00 %\s+\+5\.00/);
    expect(text).toMatch(/~ hydration\s+70\.0 %\s+75\.0 %\s+\+5\.0/);
    // Same pieces, no loss: the dough weight stays 10 × 500 g.
    expect(text).toMatch(/ {3}dough weight \(mixed\)\s+5000 g\s+5000 g\n/);
    expect(report.diffs[0].diff.figures.rows.find((r) => r.key === 'flour')?.after).toBeCloseTo(5000 / 1.78, 9);
  });

  it('reads a "before" file kept away from the catalog against the other file\'s catalog', async () => {
    const project = scratch();
    const away = scratch();
    writeFileSync(join(project, 'ingredients.yaml'), CATALOG);
    writeFileSync(join(project, 'test-loaf.yaml'), loaf(75));
    writeFileSync(join(away, 'old.yaml'), loaf(70));
    const report = await collectDiff({ paths: [join(away, 'old.yaml'), join(project, 'test-loaf.yaml')], json: false });
    // total % 100 + 70 + 2 + 1 = 173 before (baker's percent: the sum of all percentages)
    expect(printDiff(report)).toMatch(/~ total %\s+173\.00 %\s+178\.00 %/);
  });

  it('says there is no catalog and exits 1 when neither file has one near it', async () => {
    const a = scratch();
    const b = scratch();
    writeFileSync(join(a, 'old.yaml'), loaf(70));
    writeFileSync(join(b, 'test-loaf.yaml'), loaf(75));
    const failure = collectDiff({ paths: [join(a, 'old.yaml'), join(b, 'test-loaf.yaml')], json: false });
    await expect(failure).rejects.toBeInstanceOf(InputError);
    await expect(failure).rejects.toMatchObject({ code: 1, message: expect.stringMatching(/^no ingredient catalog \(ingredients\.yaml\) beside /) });
  });

  it('refuses one file without --rev, and names the file that cannot be read', async () => {
    const d = scratch();
    writeFileSync(join(d, 'a.yaml'), loaf(70));
    writeFileSync(join(d, 'b.yaml'), 'id: [broken\n');
    await expect(collectDiff({ paths: [join(d, 'a.yaml')], json: false })).rejects.toBeInstanceOf(UsageError);
    await expect(collectDiff({ paths: [join(d, 'a.yaml'), join(d, 'b.yaml')], json: false })).rejects.toBeInstanceOf(InputError);
  });
});

describe('panform diff --rev', () => {
  it('compares the working folder with a commit: changed, added and removed formulas', async () => {
    const d = scratch();
    const f = join(d, 'formulas');
    mkdirSync(f);
    writeFileSync(join(f, 'ingredients.yaml'), CATALOG);
    writeFileSync(join(f, 'test-loaf.yaml'), loaf(70));
    writeFileSync(join(f, 'gone-loaf.yaml'), loaf(65).replace('test-loaf', 'gone-loaf'));
    writeFileSync(join(f, 'same-loaf.yaml'), loaf(68).replace('test-loaf', 'same-loaf'));
    git(d, 'init', '-q');
    git(d, 'add', '.');
    git(d, 'commit', '-qm', 'first');
    writeFileSync(join(f, 'test-loaf.yaml'), loaf(72));
    unlinkSync(join(f, 'gone-loaf.yaml'));
    writeFileSync(join(f, 'new-loaf.yaml'), loaf(60).replace('test-loaf', 'new-loaf'));
    process.chdir(d);
    const report = await collectDiff({ paths: [], rev: 'HEAD', json: true });
    expect(report.diffs.map((e) => [e.path, e.diff.change])).toEqual([
      ['formulas/gone-loaf.yaml', 'removed'],
      ['formulas/new-loaf.yaml', 'added'],
      ['formulas/test-loaf.yaml', 'changed'],
    ]);
    const changed = report.diffs[2].diff;
    expect(changed.ingredients).toEqual([{ ingredient: 'water', change: 'changed', before: 70, after: 72, delta: 2 }]);
    expect(report.diffs[2].oldPath).toBe('HEAD:formulas/test-loaf.yaml');
    await expect(collectDiff({ paths: [], rev: 'no-such-rev', json: false })).rejects.toBeInstanceOf(UsageError);
  });
});

describe('panform diff --textconv and git-setup', () => {
  it('prints the figures above the YAML, and only the YAML for the catalog', () => {
    const d = scratch();
    writeFileSync(join(d, 'ingredients.yaml'), CATALOG);
    writeFileSync(join(d, 'test-loaf.yaml'), loaf(70));
    const out = textconv(join(d, 'test-loaf.yaml'));
    expect(out.split('\n').slice(0, 3)).toEqual([
      '# panform figures of the reference batch (10 × 500 g)',
      '#   total %                173.00 %',
      '#   hydration              70.0 %',
    ]);
    expect(out.endsWith(loaf(70))).toBe(true);
    expect(textconv(join(d, 'ingredients.yaml'))).toBe(CATALOG);
  });

  it('never fails on a broken file: it says why there are no figures', () => {
    const d = scratch();
    writeFileSync(join(d, 'broken.yaml'), 'id: broken\ntitle: [\n');
    const out = textconv(join(d, 'broken.yaml'));
    expect(out).toMatch(/^# panform: figures not available: line \d+: /);
    expect(out).toContain('title: [');
  });

  it('registers the diff driver once, and git diff then shows the figures', async () => {
    const d = scratch();
    mkdirSync(join(d, 'formulas'));
    writeFileSync(join(d, 'formulas', 'ingredients.yaml'), CATALOG);
    writeFileSync(join(d, 'formulas', 'test-loaf.yaml'), loaf(70));
    git(d, 'init', '-q');
    git(d, 'add', '.');
    git(d, 'commit', '-qm', 'first');
    process.chdir(d);
    const first = await collectGitSetup({ folder: 'formulas', json: false });
    expect(first.attributes).toMatchObject({ line: 'formulas/*.yaml diff=panform', added: true });
    expect(first.textconv).toMatch(/bin\/panform\.js diff --textconv$/);
    expect(git(d, 'config', 'diff.panform.textconv').trim()).toBe(first.textconv);
    const second = await collectGitSetup({ folder: 'formulas', json: false });
    expect(second.attributes.added).toBe(false);
    expect(readFileSync(join(d, '.gitattributes'), 'utf8')).toBe('formulas/*.yaml diff=panform\n');

    // Run the driver from the sources (the built CLI may be older than them).
    const loader = join(ROOT, 'node_modules/tsx/dist/loader.mjs');
    git(d, 'config', 'diff.panform.textconv', `${process.execPath} --import ${loader} ${join(ROOT, 'cli/index.ts')} diff --textconv`);
    writeFileSync(join(d, 'formulas', 'test-loaf.yaml'), loaf(75));
    const shown = git(d, '--no-pager', 'diff', '--', 'formulas/test-loaf.yaml');
    expect(shown).toContain('-#   hydration              70.0 %');
    expect(shown).toContain('+#   hydration              75.0 %');
    expect(shown).toContain('+ingredients: { water: 75, fine salt: 2, instant yeast: 1 }');
  }, 120_000);
});
