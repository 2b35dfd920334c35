import { existsSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COMMANDS } from '#cli/command-table';
import { QUICK_COMMANDS } from '../../scripts/cli-bundle.mjs';
import { buildCli, type BuiltCli } from './arithmetic-cli.ts';

// cli/launch.ts: each quick command runs from its own CommonJS bundle with a V8 code cache, the
// rest from the ES module build. A cache is only ever a speed-up: whatever is in the cache folder (or
// when it cannot be written), the command prints the same thing.
let cli: BuiltCli;
const scale = ['scale', 'harbour-ciabatta', '--pieces', '24', '--json'];

beforeAll(async () => {
  cli = await buildCli();
}, 120_000);
afterAll(() => cli?.dispose());

const cacheDir = () => join(cli.dir, 'cache');

describe('the launcher', () => {
  it('writes a cache for a quick command on its first run, and reuses it after', async () => {
    const first = await cli.run(scale);
    expect(first.code).toBe(0);
    const file = join(cacheDir(), 'scale.v8');
    expect(existsSync(file)).toBe(true);
    const written = statSync(file).mtimeMs;
    const second = await cli.run(scale);
    expect(second).toEqual(first);
    expect(statSync(file).mtimeMs).toBe(written);
  });

  it('replaces a damaged cache and prints the same', async () => {
    const good = await cli.run(scale);
    for (const junk of [Buffer.alloc(0), Buffer.from('not a code cache'), Buffer.alloc(300_000, 7)]) {
      writeFileSync(join(cacheDir(), 'scale.v8'), junk);
      expect(await cli.run(scale)).toEqual(good);
      expect(statSync(join(cacheDir(), 'scale.v8')).size).toBeGreaterThan(1000);
    }
  });

  it('has a bundle for each quick command, and each is a command of the program', () => {
    for (const name of [...QUICK_COMMANDS, 'version']) expect(existsSync(join(cli.dir, `quick-${name}.cjs`))).toBe(true);
    for (const name of QUICK_COMMANDS) expect(Object.keys(COMMANDS)).toContain(name);
  });

  it('runs the other commands from the module build', async () => {
    const r = await cli.run(['diff', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Usage: panform diff/);
    const help = await cli.run(['--help']);
    for (const name of ['check', 'scale', 'sheet', 'load', 'serve', 'git-setup']) expect(help.stdout).toMatch(new RegExp(`\\n  ${name}\\b`));
  });

  it('suggests the nearest command for a mistyped one', async () => {
    const r = await cli.run(['scael']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/Did you mean scale\?/);
  });

  it('runs without a cache where none can be written', async () => {
    // A file where the cache folder should be: nothing can be written under it (as with a
    // read-only installation, which this test cannot make when it runs as root).
    const dir = cacheDir();
    rmSync(dir, { recursive: true, force: true });
    writeFileSync(dir, 'in the way');
    try {
      const args = ['temp', '--ddt', '26', '--room', '22', '--flour', '20', '--friction', '12', '--json'];
      const r = await cli.run(args);
      expect(r.code).toBe(0);
      expect(JSON.parse(r.stdout)).toBeTypeOf('object');
      expect(await cli.run(args)).toEqual(r);
      expect(readdirSync(cli.dir).filter((f) => f.endsWith('.part'))).toEqual([]);
    } finally {
      rmSync(dir, { force: true });
    }
  });
});
