import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { collectCheck, command, printCheck, type CheckOptions } from '../../cli/commands/check.ts';
import { UsageError } from '../../cli/errors.ts';
import { parseFlags } from './flags.ts';

// Most cases call the collecting function in-process (flags read by the command's own options);
// a few run the built CLI (built once per test run, tests/setup/cli-build.ts) for the exit codes
// and what it prints.
const ROOT = new URL('../../', import.meta.url).pathname;

function run(args: string[], cwd = ROOT) {
  const r = spawnSync(process.execPath, [inject('panformCli'), 'check', ...args], { cwd, encoding: 'utf8' });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** `panform check <args>` as the action collects it, run from the project folder. */
function check(args: string[]) {
  const { operands, options } = parseFlags<{ catalog?: string }>(command, args);
  const opts: Pick<CheckOptions, 'paths' | 'catalog'> = { paths: operands, catalog: options.catalog };
  const cwd = process.cwd();
  process.chdir(ROOT);
  try {
    return collectCheck(opts);
  } finally {
    process.chdir(cwd);
  }
}

let scratch: string;
beforeAll(() => {
  scratch = mkdtempSync(join(tmpdir(), 'panform-check-'));
});
afterAll(() => {
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

describe('panform check (collecting)', () => {
  it('finds no problems in the demo bakery', () => {
    const r = check([]);
    expect(r.findings).toEqual([]);
    expect(printCheck(r)).toBe('15 files checked, no problems\n');
  });

  it('gives one sorted finding per problem and a count', () => {
    const r = check(['tests/fixtures/check']);
    expect(r.errors).toBe(15);
    expect(r.warnings).toBe(0);
    expect(r.files).toBe(16);
    const lines = printCheck(r).trimEnd().split('\n');
    expect(lines.at(-1)).toBe('15 errors, 0 warnings in 16 files');
    expect(lines).toContain('tests/fixtures/check/loss-100.yaml:6:7 error loss is 100 %; it must be below 100 % (it is the share of mixed dough lost before dividing)');
    expect(lines).toContain(
      'tests/fixtures/check/plans/2026-12-03.yaml:8:16 error order 2 names formula "good-laof", which is not in tests/fixtures/check/; did you mean "good-loaf"?',
    );
    const files = r.findings.map((f) => f.file);
    expect(files).toEqual([...files].sort((a, b) => a.localeCompare(b)));
  });

  it('counts warnings, which are not errors', () => {
    const dir = join(scratch, 'warn');
    cpSync(join(ROOT, 'tests/fixtures/check/ingredients.yaml'), join(dir, 'ingredients.yaml'));
    writeFileSync(
      join(dir, 'salty.yaml'),
      'id: salty\ntitle: Salty\nstatus: active\ncategory: lean\nyield: { pieces: 1, piece: 500 g }\nflour: { bread flour: 100 }\ningredients: { water: 70, fine salt: 4 }\n',
    );
    const r = check([dir]);
    expect(printCheck(r)).toBe(`${join(dir, 'salty.yaml')}:7:38 warning salt is 4 % of the flour; bread usually has 1.5-3 % (common practice)\n0 errors, 1 warning in 2 files\n`);
    expect(r.errors).toBe(0);
  });

  it('locates each finding with its JSON pointer', () => {
    const r = check(['tests/fixtures/check/loss-100.yaml']);
    expect(r).toMatchObject({ files: 1, errors: 1, warnings: 0, checked: ['tests/fixtures/check/loss-100.yaml'] });
    expect(r.findings).toEqual([
      {
        file: 'tests/fixtures/check/loss-100.yaml',
        line: 6,
        col: 7,
        severity: 'error',
        message: 'loss is 100 %; it must be below 100 % (it is the share of mixed dough lost before dividing)',
        pointer: '/loss',
      },
    ]);
  });

  it('checks a formula against the catalog given with --catalog', () => {
    const dir = join(scratch, 'elsewhere');
    cpSync(join(ROOT, 'tests/fixtures/check/good-loaf.yaml'), join(dir, 'good-loaf.yaml'));
    expect(printCheck(check([join(dir, 'good-loaf.yaml')]))).toMatch(/warning no ingredient catalog/);
    const r = check([join(dir, 'good-loaf.yaml'), '--catalog', 'tests/fixtures/check/ingredients.yaml']);
    expect(printCheck(r)).toBe('2 files checked, no problems\n');
  });

  it('reports binary and broken files as findings', () => {
    const dir = join(scratch, 'bytes');
    cpSync(join(ROOT, 'tests/fixtures/check/ingredients.yaml'), join(dir, 'ingredients.yaml'));
    writeFileSync(join(dir, 'noise.yaml'), Buffer.from([0xff, 0xfe, 0x00, 0x41, 0x3a, 0x0a, 0x80, 0x81, 0x7b, 0x5b]));
    writeFileSync(join(dir, 'half.yaml'), 'id: half\ntitle: "Half');
    const r = check([dir]);
    expect(r.errors).toBeGreaterThan(0);
    expect(printCheck(r)).toMatch(/noise\.yaml:1:1 error this is not a text file \(binary content\)/);
  });

  it.each([
    ['a path that does not exist', ['no/such/folder'], /^no such file or folder: no\/such\/folder$/],
    ['a catalog that does not exist', ['--catalog', 'nope.yaml'], /^--catalog nope.yaml: no such file$/],
  ])('refuses misuse: %s', (_, args, message) => {
    expect(() => check(args)).toThrow(UsageError);
    expect(() => check(args)).toThrow(message);
  });
});

describe('panform check (the built CLI)', () => {
  it('finds no problems in the demo bakery and exits 0', () => {
    const r = run([]);
    expect(r.stderr).toBe('');
    expect(r.stdout).toBe('15 files checked, no problems\n');
    expect(r.code).toBe(0);
  });

  it('prints one line per finding and a count, and exits 1 on errors; never a stack trace', () => {
    const r = run(['tests/fixtures/check']);
    expect(r.code).toBe(1);
    expect(r.stdout.trimEnd().split('\n').at(-1)).toBe('15 errors, 0 warnings in 16 files');
    expect(r.stdout).toMatch(/binary\.yaml:1:1 error this is not a text file \(binary content\)/);
    expect(r.stdout + r.stderr).not.toMatch(/internal error|\n\s+at /);
    expect(r.stderr).toBe('');
  });

  it('prints files, findings, errors and warnings as JSON with --json', () => {
    const r = run(['tests/fixtures/check/loss-100.yaml', '--json']);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout)).toMatchObject({ files: 1, errors: 1, warnings: 0, checked: ['tests/fixtures/check/loss-100.yaml'] });
  });

  it.each([
    ['a path that does not exist', ['no/such/folder'], /panform: no such file or folder: no\/such\/folder/],
    ['an unknown option', ['--frobnicate'], /unknown option '--frobnicate'/],
  ])('exits 2 on misuse: %s', (_, args, message) => {
    const r = run(args);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(r.stdout).toBe('');
  });

  it('exits 2 when there is no formulas/ folder to check by default', () => {
    const r = run([], scratch);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/no such file or folder: formulas/);
  });

  it('shows an example in --help', () => {
    const r = run(['--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/\$ panform check formulas\/harbour-ciabatta\.yaml/);
  });
});
