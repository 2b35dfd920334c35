// `panform friction`: the same table as GET /api/friction, through the server holding the PGlite
// folder (the local channel) and from the folder directly once the server has stopped; the text
// table names the line to change; misuse exits 2. One data folder for the file.
import type { ChildProcess } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FrictionResponse, PlanDetail } from '#shared/api';
import { renderFriction } from '../../cli/commands/friction.ts';
import { buildCli, ROOT, type BuiltCli } from './arithmetic-cli.ts';
import { startServe } from './serve-process.ts';

let cli: BuiltCli;
let dir: string;
let data: string;
let server: ChildProcess | undefined;

beforeAll(async () => {
  cli = await buildCli();
  dir = mkdtempSync(join(tmpdir(), 'panform-friction-'));
  data = join(dir, 'data');
  cpSync(join(ROOT, 'formulas'), join(dir, 'formulas'), { recursive: true });
}, 180_000);
afterAll(() => {
  if (server && server.exitCode === null) server.kill('SIGKILL');
  cli?.dispose();
  rmSync(dir, { recursive: true, force: true });
});

async function signIn(url: string, role: string, password: string): Promise<string> {
  const res = await fetch(`${url}/api/session`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: `${role}@tidewater.example`, password }) });
  expect(res.status).toBe(200);
  return res.headers.getSetCookie()[0].split(';')[0];
}

describe('panform friction', () => {
  it('prints what GET /api/friction answers, through the running server and from the folder', async () => {
    const s = await startServe(dir, data, (child) => {
      server = child;
    });
    const accounts = new Map([...readFileSync(join(dir, 'demo-accounts.txt'), 'utf8').matchAll(/^\s+(\w+)\s+(\S+@tidewater\.example)\s+(\S+)$/gm)].map((m) => [m[1], m[3]]));
    const bench = await signIn(s.url, 'bench', accounts.get('bench')!);
    const admin = await signIn(s.url, 'admin', accounts.get('admin')!);
    const plan = (await (await fetch(`${s.url}/api/plans/2026-12-03`, { headers: { cookie: bench } })).json()) as PlanDetail;
    const aim = plan.sheet.mixes.find((m) => m.formula === 'harbour-ciabatta')!.doughTemperature!;
    for (const [target, dough] of [['harbour-ciabatta/1', aim + 1], ['harbour-ciabatta/2', aim + 1.5], ['harbour-ciabatta/1', aim + 0.5], ['country-levain/1', 26]] as const) {
      const form = new FormData();
      form.append('target', target);
      form.append('dough_temperature', String(dough));
      form.append('initials', 'MK');
      const res = await fetch(`${s.url}/api/plans/2026-12-03/records`, { method: 'POST', headers: { cookie: bench }, body: form });
      expect(res.status, await res.clone().text()).toBe(201);
    }
    const api = (await (await fetch(`${s.url}/api/friction`, { headers: { cookie: admin } })).json()) as FrictionResponse;
    expect(api.proposals.map((p) => [p.mixer, p.formula, p.status])).toEqual([['spiral', 'country-levain', 'too few'], ['spiral', 'harbour-ciabatta', 'propose']]);

    // While the server holds the folder, the command asks it.
    const held = await cli.run(['friction', '--json', '--data', data]);
    expect(held.code, held.stderr).toBe(0);
    expect(JSON.parse(held.stdout)).toEqual(api);
    const text = await cli.run(['friction', '--mixer', 'spiral', '--formula', 'harbour-ciabatta', '--data', data]);
    expect(text.code, text.stderr).toBe(0);
    expect(text.stdout).toContain('spiral · Harbour ciabatta: from 3 mixes, 3 Dec');
    expect(text.stdout).toContain('to use it: in formulas/plans/2026-12-05.yaml, mixer spiral: friction: 13 °C becomes friction: 16 °C');
    expect(text.stdout).not.toContain('Country levain');

    server!.kill('SIGTERM');
    expect(await s.exited).toBe(0);
    // The folder free again: the command opens it itself and finds the same.
    const direct = await cli.run(['friction', '--json', '--data', data]);
    expect(direct.code, direct.stderr).toBe(0);
    expect(JSON.parse(direct.stdout)).toEqual(api);
  }, 300_000);

  it('treats a date that is not a day as misuse (exit 2)', async () => {
    const r = await cli.run(['friction', '--date', 'tomorrow', '--data', data]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--date must be a bake day like 2026-12-03/);
  });

  it('says so when nothing has been recorded', () => {
    expect(renderFriction({ minimum: 3, rule: 'r', proposals: [] })).toMatch(/No mix has been recorded yet/);
  });
});
