// The viewer's initial JavaScript: the entry script of dist/web/index.html plus everything it
// imports statically (modulepreload links and `import ... from` in the chunks), each gzipped
// with zlib. Lazy chunks (dynamic `import()`) are not initial and are left out.
import { existsSync, readFileSync } from 'node:fs';
import { join, posix } from 'node:path';
import { gzipSync } from 'node:zlib';

/** Static import specifiers of an ES module (minified or not); dynamic import() excluded. */
export function staticImports(code) {
  const out = new Set();
  // `import x from "y"`, `import{a as b}from"./y.js"`, `import "./y.js"`, `export * from "./y.js"`, `export{a}from"./y.js"`
  const re = /(?:^|[;\s}])(?:import|export)\s*(?:[\w$*{}\s,]+?\s*from\s*)?["']([^"']+)["']/g;
  for (const m of code.matchAll(re)) out.add(m[1]);
  return [...out];
}

function resolveAsset(webRoot, fromFile, spec) {
  if (/^[a-z]+:/i.test(spec)) return null; // external URL
  const rel = spec.startsWith('/') ? spec.slice(1) : posix.join(posix.dirname(fromFile), spec);
  const path = join(webRoot, rel);
  return existsSync(path) ? rel : null;
}

/**
 * @returns {{ files: { file: string, bytes: number, gzip: number }[], bytes: number, gzip: number, css: { bytes: number, gzip: number } }}
 */
export function measureInitialJs(webRoot) {
  const html = readFileSync(join(webRoot, 'index.html'), 'utf8');
  const entries = [];
  for (const m of html.matchAll(/<script\b[^>]*\bsrc=["']([^"']+)["'][^>]*>/g)) entries.push(m[1]);
  for (const m of html.matchAll(/<link\b[^>]*rel=["']modulepreload["'][^>]*href=["']([^"']+)["'][^>]*>/g)) entries.push(m[1]);
  const seen = new Set();
  const queue = entries.map((e) => resolveAsset(webRoot, 'index.html', e)).filter(Boolean);
  const files = [];
  while (queue.length > 0) {
    const rel = queue.shift();
    if (seen.has(rel)) continue;
    seen.add(rel);
    const buf = readFileSync(join(webRoot, rel));
    files.push({ file: rel, bytes: buf.length, gzip: gzipSync(buf).length });
    for (const spec of staticImports(buf.toString('utf8'))) {
      const next = resolveAsset(webRoot, rel, spec);
      if (next && next.endsWith('.js') && !seen.has(next)) queue.push(next);
    }
  }
  let cssBytes = 0;
  let cssGzip = 0;
  for (const m of html.matchAll(/<link\b[^>]*rel=["']stylesheet["'][^>]*href=["']([^"']+)["'][^>]*>/g)) {
    const rel = resolveAsset(webRoot, 'index.html', m[1]);
    if (!rel) continue;
    const buf = readFileSync(join(webRoot, rel));
    cssBytes += buf.length;
    cssGzip += gzipSync(buf).length;
  }
  return {
    files,
    bytes: files.reduce((a, f) => a + f.bytes, 0),
    gzip: files.reduce((a, f) => a + f.gzip, 0),
    css: { bytes: cssBytes, gzip: cssGzip },
  };
}


