import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import express from 'express';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateFormulaYaml, writeGeneratedFolder } from '../../bench/generate-formulas.mjs';
import { collectLoad, printLoad, type LoadCommandOptions } from '../../cli/commands/load.ts';
import { InputError, UsageError } from '../../cli/errors.ts';
import { acquireLock, migrateDatabase, openDatabase, type DatabaseHandle } from '../../server/db/client.ts';
import { formulasTable } from '../../server/db/schema.ts';
import { createInternalLoadRouter, LOAD_TOKEN_HEADER } from '../../server/routes/internal-load.ts';

const dirs: string[] = [];
function scratch(): string {
  const d = mkdtempSync('/tmp/panform-cli-load-');
  dirs.push(d);
  return d;
}
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

const options = (paths: string[], data: string): LoadCommandOptions => ({ paths, data, by: 'ines@tidewater.example', json: true, progress: false });

// One PGlite directory for the file (creating one takes seconds): first loaded directly, then held
// by a server that takes the loads handed to it.
let root: string;
let folder: string;
let dataDir: string;
beforeAll(() => {
  root = scratch();
  folder = join(root, 'formulas');
  dataDir = join(root, 'data');
  writeGeneratedFolder(folder, 6);
});

describe('panform load', () => {
  it('checks first and creates nothing when a file has an error', async () => {
    const bad = join(scratch(), 'formulas');
    writeGeneratedFolder(bad, 2);
    writeFileSync(join(bad, 'broken-loaf.yaml'), 'id: broken-loaf\ntitle: Broken\n');
    const data = join(bad, '..', 'data');
    const err = await collectLoad(options([bad], data)).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).findings.some((f) => f.file === 'formulas/broken-loaf.yaml')).toBe(true);
    expect(existsSync(data)).toBe(false);
  });

  it('refuses a path that does not exist as misuse', async () => {
    await expect(collectLoad(options([join(root, 'nowhere')], dataDir))).rejects.toBeInstanceOf(UsageError);
  });

  it('loads a folder directly when no process holds the directory, and prints what changed', async () => {
    const report = await collectLoad(options([folder], dataDir));
    expect(report.via).toBe('direct');
    expect(report.database).toBe(dataDir);
    expect(report.summary.formulas.added).toHaveLength(6);
    expect(report.summary.by).toBe('ines@tidewater.example');
    const text = printLoad(report);
    expect(text).toMatch(/^Loaded 8 files into .*: load 1\n {2}formulas {2}6 added, 0 unchanged\n/);
    expect(text).toContain('    + generated-0000\n');
    expect(existsSync(join(dataDir, 'panform.lock'))).toBe(false);
  }, 180_000);
});

describe('panform load while a server holds the directory', () => {
  let handle: DatabaseHandle;
  let server: Server;
  let port: number;
  beforeAll(async () => {
    handle = await openDatabase({ dataDir });
    await migrateDatabase(handle);
    const app = express();
    app.use('/api/internal/load', createInternalLoadRouter({ handle, dataDir, token: handle.lock!.info.token, log: () => {} }));
    server = await new Promise<Server>((resolve) => {
      const s = app.listen(0, '127.0.0.1', () => resolve(s));
    });
    port = (server.address() as AddressInfo).port;
    handle.lock!.setPort(port);
  }, 180_000);
  afterAll(async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()));
    await handle.close();
  });

  it('hands the load to the server, which writes it in its own process', async () => {
    writeFileSync(join(folder, 'generated-0001.yaml'), generateFormulaYaml(1, 1));
    const report = await collectLoad(options([folder], dataDir));
    expect(report.via).toBe('server');
    expect(report.summary.formulas.changed).toEqual(['generated-0001']);
    const [row] = await handle.db.select().from(formulasTable).where(eq(formulasTable.id, 'generated-0001'));
    expect(row.revision).toBe(2);
  });

  it('passes the findings back when the files have errors, and the server loads nothing', async () => {
    writeFileSync(join(folder, 'generated-0002.yaml'), generateFormulaYaml(2, 1).replace('id: generated-0002', 'id: another-id'));
    const err = await collectLoad(options([folder], dataDir)).catch((e: unknown) => e);
    writeFileSync(join(folder, 'generated-0002.yaml'), generateFormulaYaml(2));
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).findings[0]).toMatchObject({ file: 'formulas/generated-0002.yaml', severity: 'error' });
  });

  it.each([
    ['no token', {}],
    ['a wrong token', { [LOAD_TOKEN_HEADER]: 'f'.repeat(64) }],
  ])('answers 401 to a request with %s', async (_what, headers) => {
    const res = await fetch(`http://127.0.0.1:${port}/api/internal/load`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', ...headers },
      body: JSON.stringify({ folder }),
    });
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ ok: false, error: 'unauthenticated' });
  });

  it('refuses relative paths', async () => {
    const res = await fetch(`http://127.0.0.1:${port}/api/internal/load`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', [LOAD_TOKEN_HEADER]: handle.lock!.info.token },
      body: JSON.stringify({ paths: ['formulas'] }),
    });
    expect(res.status).toBe(422);
  });
});

describe('panform load while another process holds the directory without serving', () => {
  it('refuses with a clear message', async () => {
    const d = join(scratch(), 'data');
    const lock = acquireLock(d);
    try {
      const err = await collectLoad(options([folder], d)).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).message).toMatch(/in use by another Panform process \(pid \d+\) that does not take loads/);
    } finally {
      lock.release();
    }
  });
});
