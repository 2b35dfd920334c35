// The API over each database setup (PGlite and PostgreSQL 15): the same sign-in, formula, plan,
// history and reset paths, so DATABASE_URL serves exactly what the embedded database does.
import { resolve } from 'node:path';
import { expect, it } from 'vitest';
import type { FormulaDetail, FormulaListResponse, PlanDetail, RevisionListResponse } from '#shared/api';
import { appInternals } from '../../server/app.ts';
import { createUser } from '../../server/auth/users.ts';
import { loadFolder } from '../../server/load/index.ts';
import { forEachDatabase } from '../setup/databases.ts';
import { emailOf, getJson, PASSWORD, sendJson, startTestServer, TEST_SCRYPT } from './harness.ts';

forEachDatabase('the API', (setup) => {
  it('signs in, serves formulas, plans and history, resets a password and signs out', async () => {
    const handle = await setup.fresh();
    await loadFolder(handle, resolve('formulas'), { git: false });
    for (const role of ['author', 'bench'] as const) {
      await createUser(handle.db, { email: emailOf(role), role, password: PASSWORD }, TEST_SCRYPT);
    }
    const t = await startTestServer(handle);
    try {
      const bench = await t.signIn('bench');
      const author = await t.signIn('author');
      const list = (await getJson(`${t.url}/api/formulas`, bench)).body as FormulaListResponse;
      expect(list.formulas.length).toBe(9);
      const detail = (await getJson(`${t.url}/api/formulas/harbour-ciabatta?pieces=60`, bench)).body as FormulaDetail;
      expect(detail.scaled.pieces).toBe(60);
      expect(detail.cost).toBeNull();
      const withCost = (await getJson(`${t.url}/api/formulas/harbour-ciabatta`, author)).body as FormulaDetail;
      expect(withCost.cost?.total).toBeGreaterThan(0);
      const plan = (await getJson(`${t.url}/api/plans/2026-12-04`, bench)).body as PlanDetail;
      expect(plan.sheet.mixes.length).toBeGreaterThan(0);
      const revisions = (await getJson(`${t.url}/api/formulas/spelt-porridge-loaf/revisions`, author)).body as RevisionListResponse;
      expect(revisions.revisions.map((r) => r.revision)).toEqual([1]);

      expect((await sendJson(`${t.url}/api/password-reset`, 'POST', { email: emailOf('bench') })).status).toBe(202);
      await appInternals(t.app).idle();
      const token = /token=([A-Za-z0-9_-]+)/.exec(t.outbox[0].text)![1];
      expect((await sendJson(`${t.url}/api/password-reset/confirm`, 'POST', { token, password: 'the new bench password' })).status).toBe(204);
      expect((await getJson(`${t.url}/api/me`, bench)).status).toBe(401);
      expect((await sendJson(`${t.url}/api/password-reset/confirm`, 'POST', { token, password: 'the new bench password' })).status).toBe(422);

      t.clock.now += 15 * 24 * 3600 * 1000;
      expect((await getJson(`${t.url}/api/me`, author)).status).toBe(401);
    } finally {
      await t.close();
    }
  }, 180_000);
});
