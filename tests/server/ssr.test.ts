import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { ServerContext } from '../../server/context.ts';
import { createPageRenderer, jsonForScript } from '../../server/ssr.ts';

// server/ssr.ts: the formula page rendered into index.html (exercised end to end in
// tests/e2e/viewer.test.ts); here the parts that must hold without a viewer build.
const dir = mkdtempSync(join(tmpdir(), 'panform-ssr-'));
const web = join(dir, 'web');
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('jsonForScript', () => {
  it('cannot close the script element or break a line in it', () => {
    const text = jsonForScript({ note: '</script><script>alert(1)</script> & \u2028' });
    expect(text).not.toMatch(/[<>&\u2028]/);
    expect(JSON.parse(text)).toEqual({ note: '</script><script>alert(1)</script> & \u2028' });
  });
});

describe('createPageRenderer without the server build', () => {
  it('serves the plain page, read afresh each time', async () => {
    const { mkdirSync } = await import('node:fs');
    mkdirSync(web, { recursive: true });
    writeFileSync(join(web, 'index.html'), '<title>a</title><div id="root"></div>');
    const logs: string[] = [];
    const pages = createPageRenderer(web, {} as ServerContext, (m) => logs.push(m));
    const user = { id: 1, email: 'b@x.example', name: 'B', role: 'bench' as const };
    expect(await pages.page('/formulas/harbour-ciabatta', '', user)).toBe('<title>a</title><div id="root"></div>');
    writeFileSync(join(web, 'index.html'), '<title>b</title><div id="root"></div>');
    expect(await pages.page('/formulas', '', null)).toBe('<title>b</title><div id="root"></div>');
    expect(logs).toEqual([]);
  });
});
