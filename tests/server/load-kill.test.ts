import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { generateFormulaYaml, writeGeneratedFolder } from '../../bench/generate-formulas.mjs';
import { loadFolder } from '../../server/load/index.ts';
import { forEachDatabase, readLoadedState } from '../setup/databases.ts';

const ROOT = new URL('../../', import.meta.url).pathname;
const tmpDirs: string[] = [];
afterAll(() => {
  for (const d of tmpDirs) rmSync(d, { recursive: true, force: true });
});

/** Runs `panform load`'s code in a child that stops inside the transaction; kills it there (SIGKILL). */
async function loadAndKill(folder: string, env: NodeJS.ProcessEnv, dataDir?: string): Promise<{ signal: NodeJS.Signals | null; output: string }> {
  const child = spawn(process.execPath, ['--import', 'tsx', join(ROOT, 'tests/server/load-kill-child.ts'), folder, dataDir ?? ''], {
    cwd: ROOT,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const exited = new Promise<NodeJS.Signals | null>((resolve) => child.on('exit', (_code, signal) => resolve(signal)));
  await new Promise<void>((resolve, reject) => {
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      if (output.includes('paused inside the transaction')) resolve();
    };
    child.stdout.on('data', onData);
    child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('exit', () => reject(new Error(`the load finished or failed before it could be killed:\n${output}`)));
  });
  child.kill('SIGKILL');
  return { signal: await exited, output };
}

forEachDatabase('a load killed inside its transaction', (setup) => {
  it('leaves the previous state intact, and the next load succeeds', async () => {
    const target = await setup.freshTarget();
    const root = mkdtempSync('/tmp/panform-kill-');
    tmpDirs.push(root);
    const dir = join(root, 'formulas');
    writeGeneratedFolder(dir, 12, { plan: false });

    let h = await setup.open(target);
    await loadFolder(h, dir, { git: false });
    const before = await readLoadedState(h);
    await h.close();

    // Edits the killed load was writing: changed, removed and new formulas.
    for (const i of [0, 1, 2]) writeFileSync(join(dir, `generated-${String(i).padStart(4, '0')}.yaml`), generateFormulaYaml(i, 1));
    unlinkSync(join(dir, 'generated-0005.yaml'));
    writeFileSync(join(dir, 'generated-0100.yaml'), generateFormulaYaml(100));

    const env: NodeJS.ProcessEnv = target.url ? { DATABASE_URL: target.url } : { DATABASE_URL: '' };
    const killed = await loadAndKill(dir, env, target.dataDir);
    expect(killed.signal).toBe('SIGKILL');

    // The PGlite directory's lock names a dead process: the next opener takes it over.
    h = await setup.open(target);
    expect(await readLoadedState(h)).toEqual(before);

    const summary = await loadFolder(h, dir, { git: false });
    expect(summary.formulas.changed).toEqual(['generated-0000', 'generated-0001', 'generated-0002']);
    expect(summary.formulas.added).toEqual(['generated-0100']);
    expect(summary.formulas.removed).toEqual(['generated-0005']);
    const after = await readLoadedState(h);
    expect(after.loads).toBe(before.loads + 1);
    await h.close();
  }, 240_000);
}, { warm: false });
