// One set of checks for a folder: `panform check` (its collecting function) and a load (its
// check, before anything is written) read the files with one reader and check them with
// shared/check, so they report the same errors, with the same size limit, and both refuse text
// that cannot be stored (a NUL character, a lone surrogate) where it is written.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { MAX_FILE_BYTES } from '#shared/check/check-file';
import type { Finding } from '#shared/parse';
import { collectCheck } from '../../cli/commands/check.ts';
import { prepareLoad } from '../../server/load/index.ts';

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

/** A copy of the demo folder with some files changed. */
function demoWith(changes: Record<string, (text: string) => string>): string {
  const root = mkdtempSync(join(tmpdir(), 'panform-folder-check-'));
  dirs.push(root);
  const dir = join(root, 'formulas');
  cpSync(resolve('formulas'), dir, { recursive: true });
  for (const [file, change] of Object.entries(changes)) writeFileSync(join(dir, file), change(readFileSync(join(dir, file), 'utf8')));
  return dir;
}

/** Errors as a baker reads them, with the path from the formulas folder on. */
const errorsOf = (findings: Finding[]) =>
  findings.filter((f) => f.severity === 'error').map((f) => `${f.file.slice(f.file.lastIndexOf('formulas/'))}:${f.line}:${f.col} ${f.message}`).sort();

async function both(dir: string): Promise<{ check: string[]; load: string[] }> {
  const check = collectCheck({ paths: [dir] });
  const { checked } = await prepareLoad(dir, { git: false });
  return { check: errorsOf(check.findings), load: errorsOf(checked.findings) };
}

describe('checking a folder, by panform check and by a load', () => {
  it('passes the demo folder in both', async () => {
    expect(await both(resolve('formulas'))).toEqual({ check: [], load: [] });
  });

  it('refuses a NUL character and a lone surrogate, located where they are written, in both', async () => {
    const dir = demoWith({
      'tidewater-milk-buns.yaml': (t) => t.replace(/^notes: >\n/m, 'notes: "egg wash\\0 after shaping"\nx_notes: >\n').replace(/^x_notes: >\n(?: {2}.*\n)+/m, ''),
      'plans/2026-12-03.yaml': (t) => t.replace(/^notes: .*$/m, 'notes: "ciabatta first \\ud83d then the rest"'),
    });
    const { check, load } = await both(dir);
    expect(check).toEqual(load);
    expect(check).toEqual([
      expect.stringMatching(/^formulas\/plans\/2026-12-03\.yaml:\d+:\d+ the text of notes holds a lone surrogate \(\\ud83d\)/),
      expect.stringMatching(/^formulas\/tidewater-milk-buns\.yaml:\d+:\d+ the text of notes holds a NUL character/),
    ]);
    expect(check.every((line) => !/:1:1 /.test(line))).toBe(true);
  });

  it(`refuses a file over ${MAX_FILE_BYTES / 1024 / 1024} MB in both, and reads none of it into memory`, async () => {
    const dir = demoWith({ 'harbour-focaccia.yaml': (t) => `${t}# ${'x'.repeat(MAX_FILE_BYTES)}\n` });
    const { check, load } = await both(dir);
    expect(check).toEqual(load);
    expect(check).toEqual([expect.stringMatching(/^formulas\/harbour-focaccia\.yaml:1:1 the file is 2\.0 MB; a formula, catalog or plan file is a few kB/)]);
    expect(basename(dir)).toBe('formulas');
  });
});
