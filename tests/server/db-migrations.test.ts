import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { join, relative } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const ROOT = new URL('../../', import.meta.url).pathname;
const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe('the committed migrations', () => {
  it('match server/db/schema.ts: generating again finds nothing to migrate', () => {
    const tmp = mkdtempSync('/tmp/panform-migrations-');
    dirs.push(tmp);
    const out = join(tmp, 'drizzle');
    cpSync(join(ROOT, 'drizzle'), out, { recursive: true });
    const before = readdirSync(out).sort();
    const r = spawnSync(
      join(ROOT, 'node_modules/.bin/drizzle-kit'),
      ['generate', '--dialect', 'postgresql', '--schema', './server/db/schema.ts', '--out', relative(ROOT, out)],
      { cwd: ROOT, encoding: 'utf8', timeout: 120_000 },
    );
    expect(r.status, r.stderr).toBe(0);
    // When this fails: run `npm run db:generate -- --name <what-changed>` and commit drizzle/.
    expect(r.stdout).toContain('No schema changes');
    expect(readdirSync(out).sort()).toEqual(before);
  }, 120_000);
});
