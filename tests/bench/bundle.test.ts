// The bench's reading of the viewer build: which scripts load before the first page is shown.
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { measureInitialJs, staticImports } from '../../bench/lib/bundle.mjs';
import { median, percentile } from '../../bench/lib/stats.mjs';

describe('staticImports', () => {
  it.each([
    ['minified named imports', 'import{a as b,c as $d}from"./x-1.js";', ['./x-1.js']],
    ['a bare side-effect import after a statement', 'let q=1;import"./y.js";', ['./y.js']],
    ['re-exports', 'export*from"./z.js";export{k}from"./w.js"', ['./z.js', './w.js']],
    ['a default import across lines', 'import React from \'react\'\nimport { x } from "./app.js"', ['react', './app.js']],
    ['dynamic imports, which load later', 'const p=()=>import("./lazy.js");', []],
    ['a property named import', 'obj.import("./nope.js")', []],
  ])('finds %s', (_, code, expected) => {
    expect(staticImports(code)).toEqual(expected);
  });
});

describe('measureInitialJs', () => {
  const root = mkdtempSync(join(tmpdir(), 'panform-bundle-'));
  afterAll(() => rmSync(root, { recursive: true, force: true }));

  it('adds up the entry script and its static imports, gzipped, and leaves lazy chunks out', () => {
    mkdirSync(join(root, 'assets'));
    const files: Record<string, string> = {
      'assets/index.js': 'import{r}from"./react.js";import"./shared.js";const l=()=>import("./lazy.js");r(l);',
      'assets/react.js': `export const r=(x)=>x;${'/* react */'.repeat(50)}`,
      'assets/shared.js': 'import{r}from"./react.js";r(1);',
      'assets/lazy.js': `export default 1;${'/* a big page */'.repeat(500)}`,
      'assets/index.css': 'body{margin:0}',
    };
    for (const [f, text] of Object.entries(files)) writeFileSync(join(root, f), text);
    writeFileSync(
      join(root, 'index.html'),
      '<html><head><script type="module" crossorigin src="/assets/index.js"></script><link rel="modulepreload" crossorigin href="/assets/react.js"><link rel="stylesheet" href="/assets/index.css"></head></html>',
    );
    const r = measureInitialJs(root);
    const initial = ['assets/index.js', 'assets/react.js', 'assets/shared.js'];
    expect(r.files.map((f) => f.file).sort()).toEqual(initial.sort());
    expect(r.gzip).toBe(initial.reduce((a, f) => a + gzipSync(Buffer.from(files[f])).length, 0));
    expect(r.css.gzip).toBe(gzipSync(Buffer.from(files['assets/index.css'])).length);
  });
});

describe('median and percentile', () => {
  it.each([
    [[3, 1, 2], 2],
    [[4, 1, 3, 2], 2.5],
    [[7], 7],
  ])('gives the median of %j as %d', (xs, m) => {
    expect(median(xs)).toBe(m);
  });

  it('gives the nearest-rank 99th percentile', () => {
    const xs = Array.from({ length: 200 }, (_, i) => i + 1);
    expect(percentile(xs, 99)).toBe(198);
    expect(percentile(xs, 50)).toBe(100);
  });
});
