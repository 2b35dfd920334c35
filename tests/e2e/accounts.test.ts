// Accounts in the browser, on two servers sharing one PostgreSQL 15 database: the owner adds a
// person on one server, the person sets a password from the e-mailed link and signs in on the
// other; a role change and a removal show on both at once.
import { resolve } from 'node:path';
import { expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { createUser } from '../../server/auth/users.ts';
import type { OutgoingMail } from '../../server/context.ts';
import { loadFolder } from '../../server/load/index.ts';
import type { RunningServer } from '../../server/start.ts';
import { forEachDatabase } from '../setup/databases.ts';
import { emailOf, PASSWORD, TEST_SCRYPT } from '../server/harness.ts';
import { startSharedServers } from '../server/shared-servers.ts';
import { CONTEXT_OPTIONS, hasChromium, launchBrowser, screenshot } from './support/browser.ts';
import { ensureViewerBuilt } from './support/viewer-build.ts';

const chromiumHere = hasChromium();

async function signInOnPage(page: Page, base: string, email: string, password: string): Promise<void> {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/formulas$/);
}

forEachDatabase(
  'accounts in the browser',
  (setup) => {
    it.skipIf(setup.kind !== 'postgres' || (!chromiumHere && !process.env.CI))(
      'an owner adds a person on one server; the person sets a password from the link and signs in on the other',
      async () => {
        ensureViewerBuilt();
        const { url } = (await setup.freshTarget()) as { url: string };
        const seed = await setup.open({ url });
        await loadFolder(seed, resolve('formulas'), { git: false });
        await createUser(seed.db, { email: emailOf('admin'), name: 'Maren Quayle', role: 'admin', password: PASSWORD }, TEST_SCRYPT);
        const mail: OutgoingMail[] = [];
        const servers: RunningServer[] = [];
        const browser = await launchBrowser();
        try {
          servers.push(...(await startSharedServers(setup, url, 2, { mail, webDir: resolve('dist/web') })));
          const [a, b] = servers;
          const errors: string[] = [];
          const owner = await (await browser.newContext(CONTEXT_OPTIONS)).newPage();
          owner.on('pageerror', (e) => errors.push(e.message));
          await signInOnPage(owner, a.url, emailOf('admin'), PASSWORD);
          await owner.getByRole('link', { name: 'Accounts' }).click();
          await owner.getByRole('heading', { name: 'Accounts', level: 1 }).waitFor();
          const form = owner.getByRole('form', { name: 'Add an account' });
          await form.getByLabel('E-mail').fill('nell@tidewater.example');
          await form.getByLabel('Name').fill('Nell Ashdown');
          await form.getByLabel('Role').selectOption('bench');
          await form.getByRole('button', { name: 'Add the account' }).click();
          await owner.getByRole('status').filter({ hasText: 'nell@tidewater.example' }).waitFor();
          await owner.locator('[data-testid="account-row"][data-email="nell@tidewater.example"]').waitFor();
          await owner.getByTestId('audit-list').getByText('nell@tidewater.example').waitFor();
          await screenshot(owner, 'accounts-owner', { width: 1280, height: 800 });

          // The link arrives through the outbox table; the person opens it on the other server.
          const deadline = Date.now() + 10_000;
          while (!mail.some((m) => m.to === 'nell@tidewater.example')) {
            expect(Date.now()).toBeLessThan(deadline);
            await new Promise((r) => setTimeout(r, 50));
          }
          const link = /\/reset-password\?token=\S+/.exec(mail.find((m) => m.to === 'nell@tidewater.example')!.text)![0];
          const person = await (await browser.newContext(CONTEXT_OPTIONS)).newPage();
          person.on('pageerror', (e) => errors.push(e.message));
          await person.goto(`${b.url}${link}`);
          await person.getByLabel('New password').fill('flour on my hands');
          await person.getByLabel('The same again').fill('flour on my hands');
          await person.getByRole('button', { name: 'Set the new password' }).click();
          await person.waitForURL(/\/sign-in\?reset=done/);
          await signInOnPage(person, b.url, 'nell@tidewater.example', 'flour on my hands');
          await person.goto(`${b.url}/account`);
          await person.getByTestId('account-role').waitFor();
          expect(await person.getByTestId('account-role').getAttribute('data-role')).toBe('bench');
          expect(await person.getByRole('link', { name: 'Accounts' }).count()).toBe(0);

          // Removed on A: signed out on B at once.
          const row = owner.locator('[data-testid="account-row"][data-email="nell@tidewater.example"]');
          await row.getByRole('button', { name: 'Remove…' }).click();
          await row.getByRole('button', { name: 'Remove nell@tidewater.example' }).click();
          await row.waitFor({ state: 'detached' });
          const me = await person.request.get(`${b.url}/api/me`);
          expect(me.status()).toBe(401);
          expect(errors).toEqual([]);
        } finally {
          await browser.close();
          for (const s of servers) await s.close();
        }
      },
      240_000,
    );
  },
  { warm: false },
);
