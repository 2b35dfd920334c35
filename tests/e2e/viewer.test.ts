// End to end: the built viewer served by the real server (in-memory PGlite with the demo bakery),
// driven in headless Chromium. Each test opens its own browser context, signed in from a saved
// sign-in of its role (or signed out), so the tests run alone and in any order; each fails on an
// error raised in its own page. Expected figures are fixed values worked by hand from the demo
// files (formulas/harbour-ciabatta.yaml, formulas/ingredients.yaml), not computed by the code the
// page runs. Screenshots of every page land in test-results/screenshots/.
import { execFileSync } from 'node:child_process';
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { Role } from '#shared/permissions';
import { appInternals } from '../../server/app.ts';
import { createUser } from '../../server/auth/users.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { loadFolder } from '../../server/load/index.ts';
import { emailOf, openTestDatabase, PASSWORD, startTestServer, TEST_SCRYPT, type TestServer } from '../server/harness.ts';
import { CONTEXT_OPTIONS, hasChromium, launchBrowser, printPreview, screenshot, type Browser } from './support/browser.ts';
import { ensureViewerBuilt } from './support/viewer-build.ts';

const chromiumHere = hasChromium();
if (!chromiumHere && !process.env.CI) {
  process.stderr.write('tests/e2e: /usr/bin/chromium is missing; skipping the viewer tests (apt-get install chromium to run them)\n');
}

/** Grams as the viewer prints them: whole grams from 100 g, thousands set apart by a narrow space. */
const g = (text: string) => `${text.replace(/ /g, '\u202f')} g`;

// harbour-ciabatta (formulas/harbour-ciabatta.yaml): flour 100, water 78, fine salt 2.2, instant
// yeast 0.35 → total 180.55 %; loss 2 %; yield 10 × 320 g; a poolish of 30 % of the flour at 100 %
// hydration with 0.1 % instant yeast. Worked by hand with the baker's percent method (Gisslen,
// Professional Baking, Wiley: each line = flour × percent; flour = dough ÷ total %) and the loss
// as docs/arithmetic.md defines it (mixed dough = divided dough ÷ (1 − loss)):
const CIABATTA = {
  // 10 × 320 g = 3200 g ÷ 0.98 = 3265.31 g mixed ÷ 1.8055 = 1808.53 g flour
  writtenFlour: g('1 809'),
  // 60 × 320 g = 19 200 g ÷ 0.98 = 19 591.84 g ÷ 1.8055 = 10 851.20 g flour
  sixtyFlour: g('10 851'),
  // water 0.78 × 10 851.20 = 8463.93 g
  sixtyWater: g('8 464'),
  // poolish: flour 0.30 × 10 851.20 = 3255.36 g, as much water, yeast 0.1 % of it = 3.26 g → 6513.97 g
  sixtyPoolish: g('6 514'),
  // by mixed dough, 25 kg: flour 25 000 ÷ 1.8055 = 13 846.58 g; salt 0.022 × that = 304.62 g
  mix25Salt: g('305'),
  // Water for the written batch at DDT 25 °C (the formula's), room 30 and tap 20 typed, flour 20 from
  // the 3 December plan, the spiral's rise 4.33 °C (its straight-dough friction 13 °C ÷ 3), the poolish
  // at its 20 °C ripening temperature: 4 × 25 − (30 + 20 + 20 + 4 × 4.33) = 12.68 °C (the multiplier
  // method, Cook's Illustrated, "Precise Water Temperature for the Perfect Loaf": n = 4 with a pre-ferment).
  waterTemperature: '12.7 °C',
  // Ice from tap water at 20 °C: the final dough's water is (0.78 − 0.30) × 1808.53 = 868.09 g;
  // ice = W·(T_tap − T_w)/(T_tap + L/c) = 868.09 × 7.32 / (20 + 333.55/4.186) = 63.75 g, with
  // L = 333.55 J/g (CRC Handbook of Chemistry and Physics, enthalpy of fusion of water) and
  // c = 4.186 J/(g·K) (NIST SP 811, App. B.8, calorie at 15 °C).
  ice: '63.7 g',
  // Cost at 60 pieces, catalog prices of 2026-11-02 per kg: bread flour 0.92, water 0.003, fine
  // salt 0.60, instant yeast 9.80. 10.8512 kg × 0.92 = 9.9831; 8.4639 × 0.003 = 0.0254; 0.238 73 ×
  // 0.60 = 0.1432; 0.037 98 × 9.80 = 0.3722; total 10.5239 ÷ 60 = 0.1754 per piece.
  costPerPiece: '0.18',
};

/** The weight the viewer shows for an ingredient in one of the formula page's tables. */
async function weightIn(page: Page, table: 'overall' | 'final-dough', ingredient: string): Promise<string> {
  const cell = page.locator(`[data-testid="${table}"] tr[data-ingredient="${ingredient}"] [data-weight]`).first();
  return ((await cell.textContent()) ?? '').trim();
}

/** Waits until an ingredient's weight in a table reads `text` (the page recomputes as you type). */
async function waitForWeight(page: Page, table: 'overall' | 'final-dough', ingredient: string, text: string): Promise<void> {
  await page.waitForFunction(
    ([sel, want]) => document.querySelector(sel)?.textContent?.trim() === want,
    [`[data-testid="${table}"] tr[data-ingredient="${ingredient}"] [data-weight]`, text] as const,
  );
}

async function signInOnPage(page: Page, base: string, email: string, password = PASSWORD): Promise<void> {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/formulas$/);
  await page.getByRole('heading', { name: 'Formulas', level: 1 }).waitFor();
}

async function signOut(page: Page, base: string): Promise<void> {
  await page.goto(`${base}/account`);
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
}

type StorageState = Awaited<ReturnType<BrowserContext['storageState']>>;

// A real browser on a busy two-core machine: each step gets two minutes before it counts as hung.
describe.skipIf(!chromiumHere && !process.env.CI)('the viewer in a browser', { timeout: 120_000 }, () => {
  let handle: DatabaseHandle;
  let server: TestServer;
  let browser: Browser;
  let base: string;
  const signIns = new Map<Role, StorageState>();
  // An admin account of its own for the password-reset test, which ends all of the account's sessions.
  const resetEmail = 'reset-admin@tidewater.example';

  /** A sign-in per role, made once through the API and saved as the browser's storage state. */
  async function signedInState(role: Role): Promise<StorageState> {
    const saved = signIns.get(role);
    if (saved) return saved;
    const context = await browser.newContext(CONTEXT_OPTIONS);
    try {
      const res = await context.request.post(`${base}/api/session`, {
        data: { email: emailOf(role), password: PASSWORD },
        headers: { origin: base },
      });
      expect(res.status(), `signing in as ${role}`).toBe(200);
      const state = await context.storageState();
      signIns.set(role, state);
      return state;
    } finally {
      await context.close();
    }
  }

  /**
   * Runs `use` on a page of a fresh browser context, signed in as `role` (null: signed out), closes
   * the context, and fails when the page raised an error.
   */
  async function withPage(role: Role | null, use: (page: Page) => Promise<void>, options: { clock?: Date; viewport?: { width: number; height: number }; touch?: boolean } = {}): Promise<void> {
    const context = await browser.newContext({ ...CONTEXT_OPTIONS, ...(options.viewport ? { viewport: options.viewport } : {}), hasTouch: Boolean(options.touch), storageState: role ? await signedInState(role) : undefined });
    // The page's clock, when the test needs a fixed now (the bake-day list's today, the chart's line).
    if (options.clock) await context.clock.install({ time: options.clock });
    const errors: string[] = [];
    try {
      const page = await context.newPage();
      page.on('pageerror', (e) => errors.push(e.message));
      await use(page);
    } finally {
      await context.close();
    }
    expect(errors, 'errors raised in the page').toEqual([]);
  }

  beforeAll(async () => {
    if (!chromiumHere) throw new Error('/usr/bin/chromium is missing: CI must install it (apt-get install chromium)');
    ensureViewerBuilt();
    handle = await openTestDatabase();
    // A second revision of one formula, so there is a change to compare.
    const copy = mkdtempSync(join(tmpdir(), 'panform-e2e-formulas-'));
    try {
      cpSync(resolve('formulas'), copy, { recursive: true });
      const file = join(copy, 'tidewater-baguette.yaml');
      const text = readFileSync(file, 'utf8');
      const changed = text.replace(/^(\s+water:\s*)(\d+(?:\.\d+)?)/m, (_m, lead: string, n: string) => `${lead}${Number(n) + 2}`);
      if (changed === text) throw new Error('could not change the water of tidewater-baguette for the diff test');
      writeFileSync(file, changed);
      await loadFolder(handle, copy, { git: false });
    } finally {
      rmSync(copy, { recursive: true, force: true });
    }
    await createUser(handle.db, { email: resetEmail, name: 'Reset test', role: 'admin', password: PASSWORD }, TEST_SCRYPT);
    server = await startTestServer(handle, { webDir: resolve('dist/web') });
    base = server.url;
    browser = await launchBrowser();
  }, 300_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    await handle?.close();
  });

  it('sends a signed-out visitor to the sign-in page and back to where they were going', () =>
    withPage(null, async (page) => {
      await page.goto(`${base}/formulas/harbour-ciabatta`);
      await page.waitForURL(/\/sign-in\?next=/);
      await page.getByRole('heading', { name: 'Sign in' }).waitFor();
      await screenshot(page, 'sign-in-tablet-light', { width: 1280, height: 800, fullPage: false });
      await screenshot(page, 'sign-in-portrait-dark', { width: 800, height: 1280, scheme: 'dark', fullPage: false });
      await page.getByLabel('E-mail').fill(emailOf('bench'));
      await page.getByLabel('Password').fill('not the password');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('alert').waitFor();
      expect(await page.getByRole('alert').textContent()).toMatch(/do not match/);
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(/\/formulas\/harbour-ciabatta$/);
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
    }));

  it('shows bench staff only formulas in use, with no status filter, no changes and no costs', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/formulas`);
      await page.locator('[data-formula]').first().waitFor();
      const ids = await page.locator('[data-formula]').evaluateAll((els) => els.map((e) => e.getAttribute('data-formula')));
      expect(ids).toContain('harbour-ciabatta');
      expect(ids).not.toContain('spelt-porridge-loaf'); // draft
      expect(ids).not.toContain('malted-grain-loaf'); // retired
      expect(await page.getByLabel('Status').count()).toBe(0);
      expect(await page.getByRole('link', { name: 'Changes' }).count()).toBe(0);
      await screenshot(page, 'formulas-bench-tablet-light', { width: 1280, height: 800 });
      await screenshot(page, 'formulas-bench-portrait-dark', { width: 800, height: 1280, scheme: 'dark' });

      await page.goto(`${base}/formulas/harbour-ciabatta`);
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
      expect(await page.getByRole('heading', { name: 'Ingredient cost' }).count()).toBe(0);
      expect(await page.getByRole('link', { name: 'Changes' }).count()).toBe(0);
    }));

  it('opens a formula page straight from its address, scaled as the address says', () =>
    withPage('bench', async (page) => {
      // The page itself is the viewer's index.html for everyone (no one's data in it); the viewer
      // fetches the formula.
      const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
      const res = await fetch(`${base}/formulas/harbour-ciabatta?pieces=24`, { headers: { cookie } });
      expect(res.headers.get('cache-control')).toBe('no-cache');
      expect(await res.text()).not.toMatch(/Harbour ciabatta/);

      await page.goto(`${base}/formulas/harbour-ciabatta?pieces=24`);
      await page.locator('[data-testid="overall"] tbody tr').first().waitFor();
      await page.getByRole('button', { name: 'One piece more' }).click();
      await page.waitForURL(/pieces=25/);
      expect(await page.getByLabel('Pieces').inputValue()).toBe('25');
    }));

  it('can be used from the keyboard, with a visible focus ring', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/formulas`);
      await page.locator('[data-formula]').first().waitFor();
      await page.keyboard.press('Tab');
      expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Skip to the page');
      await page.keyboard.press('Tab');
      const ring = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement;
        const style = getComputedStyle(el);
        return { tag: el.tagName, outline: style.outlineStyle, width: parseFloat(style.outlineWidth), height: el.getBoundingClientRect().height };
      });
      expect(ring.tag).toBe('A');
      expect(ring.outline).toBe('solid');
      expect(ring.width).toBeGreaterThanOrEqual(2);
      expect(ring.height).toBeGreaterThanOrEqual(44); // touch targets of at least 44 px (docs/viewer.md)
      await screenshot(page, 'keyboard-focus', { width: 1280, height: 800, fullPage: false });
    }));

  it('narrows the list as a name is typed', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/formulas`);
      await page.locator('[data-formula]').first().waitFor();
      expect(await page.locator('[data-formula]').count()).toBeGreaterThan(3);
      await page.getByLabel('Find a formula').pressSequentially('ciab', { delay: 30 });
      await page.waitForURL(/q=ciab/);
      await page.waitForFunction(() => document.querySelectorAll('[data-formula]').length === 1);
      expect(await page.locator('[data-formula]').getAttribute('data-formula')).toBe('harbour-ciabatta');
      await screenshot(page, 'formulas-search', { width: 1280, height: 800, fullPage: false });
      await page.locator('[data-formula="harbour-ciabatta"]').click();
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
    }));

  it('notices a session that ended while the page was open, and signs in again without looping', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/formulas`);
      await page.locator('[data-formula="harbour-ciabatta"]').waitFor();
      await page.context().clearCookies();
      await page.locator('[data-formula="harbour-ciabatta"]').click();
      await page.getByRole('heading', { name: 'Signed out' }).waitFor();
      await page.getByRole('link', { name: 'Sign in' }).click();
      await page.getByRole('heading', { name: 'Sign in' }).waitFor();
      await page.getByLabel('E-mail').fill(emailOf('bench'));
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(/\/formulas\/harbour-ciabatta$/);
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
    }));

  it('scales a formula by pieces and by dough weight in the browser, and keeps the target in the URL', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/formulas/harbour-ciabatta`);
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
      expect(await page.title()).toBe('Harbour ciabatta · Panform');
      expect(await weightIn(page, 'overall', 'bread flour')).toBe(CIABATTA.writtenFlour);
      await screenshot(page, 'formula-bench-tablet-light', { width: 1280, height: 800 });
      await screenshot(page, 'formula-bench-portrait-light', { width: 800, height: 1280 });
      await screenshot(page, 'formula-bench-desktop-dark', { width: 1680, height: 1050, scheme: 'dark' });

      await page.getByLabel('Pieces').fill('60');
      await page.waitForURL(/pieces=60/);
      await waitForWeight(page, 'overall', 'bread flour', CIABATTA.sixtyFlour);
      expect(await weightIn(page, 'overall', 'water')).toBe(CIABATTA.sixtyWater);
      expect(await weightIn(page, 'final-dough', 'poolish')).toBe(CIABATTA.sixtyPoolish);
      expect(await page.getByTestId('batch-line').textContent()).toContain('60 × 320 g');

      // The target survives a reload: it lives in the URL.
      await page.reload();
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
      expect(await page.getByLabel('Pieces').inputValue()).toBe('60');
      expect(await weightIn(page, 'overall', 'bread flour')).toBe(CIABATTA.sixtyFlour);

      await page.getByRole('radio', { name: 'Dough weight' }).click();
      await page.getByLabel('Mixed dough').fill('25 kg');
      await page.waitForURL(/mix=25000/);
      await waitForWeight(page, 'overall', 'fine salt', CIABATTA.mix25Salt);
      // A bare number is grams, as on the command line, and the field says how it read it.
      await page.getByLabel('Mixed dough').fill('25000');
      await page.getByText('Read as 25.0 kg.').waitFor();
      expect(page.url()).toMatch(/mix=25000/);
      await page.getByLabel('Mixed dough').fill('25 kilos');
      await page.getByText(/^The dough weight: not a weight/).waitFor();
      await screenshot(page, 'formula-scaled-by-dough', { width: 1280, height: 800 });
    }));

  it('works out the water temperature and the ice from a bake day\'s conditions, and keeps the readings', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/formulas/harbour-ciabatta`);
      const helper = page.getByTestId('water-helper');
      await helper.waitFor();
      // Starts from the first bake day (3 December: flour 20 °C) and the ciabatta's spiral (friction 13 °C on a straight dough).
      await page.waitForFunction(() => (document.querySelector('[data-testid="water-mixer"]') as HTMLSelectElement | null)?.value === 'spiral');
      expect(await helper.getByLabel('Flour').inputValue()).toBe('20');
      expect(await helper.getByLabel('Mixer rise').inputValue()).toBe('4.33');
      await helper.getByLabel('Room').fill('30');
      await helper.getByLabel('Tap water').fill('20');
      await page.waitForFunction(
        (text) => document.querySelector('[data-testid="water-temperature"]')?.textContent?.trim() === text,
        CIABATTA.waterTemperature,
      );
      expect(await page.getByTestId('ice').textContent()).toContain(CIABATTA.ice);
      expect(await page.getByTestId('water-convention').textContent()).toMatch(/friction = n × the mixer's rise/);
      await screenshot(page, 'formula-water-helper', { width: 1280, height: 800, fullPage: false });
      // The readings stay on this device.
      await page.reload();
      await page.getByTestId('water-helper').getByLabel('Room').waitFor();
      expect(await page.getByTestId('water-helper').getByLabel('Room').inputValue()).toBe('30');
    }));

  it('prints a typical formula on one page', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/formulas/harbour-ciabatta?pieces=60`);
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
      // The water helper fills in once the bake day's plan has come: print the page as the bench would.
      await page.getByTestId('water-temperature').waitFor();
      const { pages } = await printPreview(page, 'formula-harbour-ciabatta');
      if (pages !== null) expect(pages).toBe(1);
    }));

  it('shows a formula and its print in US units once the person chooses them, and keys the choice with the arrows', () =>
    withPage('admin', async (page) => {
      await page.goto(`${base}/account`);
      const metric = page.getByRole('radio', { name: 'Metric: g, kg, °C' });
      await metric.focus();
      await page.keyboard.press('ArrowRight');
      const us = page.getByRole('radio', { name: 'US: oz, lb, °F' });
      expect(await us.getAttribute('aria-checked')).toBe('true');
      expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('US: oz, lb, °F');
      expect(await us.getAttribute('tabindex')).toBe('0');
      expect(await metric.getAttribute('tabindex')).toBe('-1');
      // Kept on the account: the server answers with it.
      await page.waitForFunction(async () => (await (await fetch('/api/me')).json()).unitSystem === 'us');

      await page.goto(`${base}/formulas/harbour-ciabatta`);
      await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
      // Flour of the written batch, 1808.53 g (above), ÷ 28.349 523 125 g/oz (NIST SP 811 App. B.8)
      // = 63.79 oz = 3 lb 15.79 oz.
      await waitForWeight(page, 'overall', 'bread flour', '3 lb 15.79 oz');
      // The water helper's readings are typed in °F too: the bake day's flour, 20 °C, is 68 °F
      // (NIST SP 811 App. B.8: t/°F = 1.8·t/°C + 32).
      const helper = page.getByTestId('water-helper');
      await page.waitForFunction(() => (document.querySelector('[data-testid="water-mixer"]') as HTMLSelectElement | null)?.value === 'spiral');
      expect(await helper.getByLabel('Flour').inputValue()).toBe('68');
      expect(await helper.getByTestId('water-temperature').textContent()).toMatch(/°F$/);
      const printed = await printPreview(page, 'formula-harbour-ciabatta-us');
      let text = '';
      try {
        text = execFileSync('pdftotext', [printed.pdf, '-'], { encoding: 'utf8' });
      } catch {
        // poppler-utils missing: the page itself was checked above.
      }
      if (text) {
        expect(text).toContain('3 lb 15.79 oz');
        // The batch line: 10 × 320 g = 11.29 oz pieces, mixed dough 3265.31 g = 7 lb 3.18 oz (NIST SP 811 App. B.8).
        expect(text).toContain('10 × 11.29 oz · mixed dough 7 lb 3.18 oz');
      }
      await screenshot(page, 'formula-us-units', { width: 1280, height: 800 });

      // Back to metric for the account, so the setting is left as found.
      await page.goto(`${base}/account`);
      await page.getByRole('radio', { name: 'Metric: g, kg, °C' }).click();
      await page.waitForFunction(async () => (await (await fetch('/api/me')).json()).unitSystem === 'metric');
    }));

  it('lists the ingredients for bench staff without prices, and with prices and their dates for the technical baker', async () => {
    await withPage('bench', async (page) => {
      await page.goto(`${base}/account`);
      await page.getByRole('link', { name: 'The ingredient list' }).click();
      await page.waitForURL(/\/ingredients$/);
      const milk = page.locator('[data-testid="ingredients"] tr[data-ingredient="whole milk"]');
      await milk.waitFor();
      // USDA SR28 NDB 01077, milk, whole: water 88.13 g per 100 g.
      expect(await milk.textContent()).toMatch(/88\.13 %USDA SR28 NDB 01077/);
      expect(await page.getByRole('columnheader', { name: 'Price per kg' }).count()).toBe(0);
      expect(await page.locator('[data-testid="price"]').count()).toBe(0);
      const salt = page.locator('[data-testid="ingredients"] tr[data-ingredient="fine salt"]');
      expect(await salt.getByRole('link', { name: 'Harbour ciabatta' }).count()).toBe(1);
      expect(await page.getByRole('link', { name: 'Spelt porridge loaf' }).count()).toBe(0); // a draft
      await screenshot(page, 'ingredients-bench', { width: 1280, height: 800 });
    });
    await withPage('author', async (page) => {
      await page.goto(`${base}/ingredients`);
      const flour = page.locator('[data-testid="ingredients"] tr[data-ingredient="bread flour"]');
      await flour.waitFor();
      expect(await page.getByRole('columnheader', { name: 'Price per kg' }).count()).toBe(1);
      // The catalog's price for bread flour: 0.92 per kg, dated 2026-11-02 (formulas/ingredients.yaml).
      expect(await flour.locator('[data-testid="price"]').textContent()).toMatch(/0\.92as of 2026-11-02/);
      await screenshot(page, 'ingredients-author', { width: 1280, height: 800 });
    });
  });

  it('gives the disabled sign-in button text of at least 4.5:1 contrast, light and dark', async () => {
    for (const scheme of ['light', 'dark'] as const) {
      await withPage(null, async (page) => {
        await page.emulateMedia({ colorScheme: scheme });
        await page.goto(`${base}/sign-in`);
        const button = page.getByRole('button', { name: 'Sign in' });
        expect(await button.isDisabled()).toBe(true);
        // WCAG 2.1 SC 1.4.3 and its definitions of relative luminance and contrast ratio.
        const ratio = await button.evaluate((el) => {
          const rgb = (c: string) => (c.match(/[\d.]+/g) ?? []).slice(0, 3).map(Number);
          const lum = ([r, g, b]: number[]) =>
            [r, g, b].map((v) => v / 255).map((v) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4)).reduce((s, v, i) => s + v * [0.2126, 0.7152, 0.0722][i], 0);
          const style = getComputedStyle(el);
          const [a, b] = [lum(rgb(style.color)), lum(rgb(style.backgroundColor))];
          return (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
        });
        expect(ratio, scheme).toBeGreaterThanOrEqual(4.5);
      });
    }
  });

  it('keeps the header on one line at 800 px wide for every role', async () => {
    for (const role of ['bench', 'reviewer', 'author', 'admin'] as const) {
      await withPage(role, async (page) => {
        await page.setViewportSize({ width: 800, height: 1000 });
        await page.goto(`${base}/formulas`);
        await page.getByRole('heading', { name: 'Formulas', level: 1 }).waitFor();
        const tops = await page.locator('header a').evaluateAll((els) => [...new Set(els.filter((e) => e.getClientRects().length > 0).map((e) => Math.round(e.getBoundingClientRect().top)))]);
        expect(tops, `${role}: header links on one row`).toHaveLength(1);
      });
    }
  });

  it('opens a bake day: builds with mix windows, mixes, pick list, timeline chart and the PDF', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/plans`);
      await page.locator('[data-plan="2026-12-03"]').click();
      await page.waitForURL(/\/plans\/2026-12-03$/);
      await page.getByTestId('timeline').waitFor();
      expect(await page.locator('[data-testid="timeline"] svg [data-step]').count()).toBeGreaterThan(10);
      expect(await page.getByTestId('sheet-build').count()).toBeGreaterThan(0);
      expect(await page.getByTestId('sheet-mix').count()).toBeGreaterThan(0);
      expect(await page.locator('[data-testid="pick-list"] tr[data-ingredient="bread flour"]').count()).toBe(1);
      expect(await page.getByTestId('sheet-build').first().textContent()).toMatch(/mix between .*\d\d:\d\d/);
      const href = await page.getByRole('link', { name: 'Download PDF' }).getAttribute('href');
      expect(href).toBe('/api/plans/2026-12-03/sheet.pdf');
      const pdf = await page.request.get(`${base}${href}`);
      expect(pdf.status()).toBe(200);
      expect(pdf.headers()['content-type']).toContain('application/pdf');
      await screenshot(page, 'plan-tablet-light', { width: 1280, height: 800 });
      await screenshot(page, 'plan-portrait-dark', { width: 800, height: 1280, scheme: 'dark', fullPage: false });
      await page.getByRole('radio', { name: 'Close up' }).click();
      await screenshot(page, 'plan-timeline-close-up', { width: 1280, height: 800, fullPage: false });
      await printPreview(page, 'plan-2026-12-03');
    }));

  it('lists the bake days today first and marked, then the days to come, with the products by title', () =>
    withPage(
      'bench',
      async (page) => {
        await page.goto(`${base}/plans`);
        await page.locator('[data-plan]').first().waitFor();
        // The demo bakery plans 3, 4 and 5 December 2026 (formulas/plans/); the clock says 4 December.
        const order = await page.locator('[data-plan]').evaluateAll((els) => els.map((e) => e.getAttribute('data-plan')));
        expect(order).toEqual(['2026-12-04', '2026-12-05', '2026-12-03']);
        const today = page.locator('[data-plan="2026-12-04"]');
        expect(await today.getAttribute('aria-current')).toBe('date');
        expect(await today.getByTestId('today').textContent()).toBe('Today');
        expect(await page.getByTestId('today').count()).toBe(1);
        expect(await page.getByRole('heading', { name: 'Days gone by' }).count()).toBe(1);
        // Titles, not file names (formulas/harbour-ciabatta.yaml's title).
        expect(await today.textContent()).toContain('Harbour ciabatta');
        expect(await today.textContent()).not.toContain('harbour-ciabatta');
      },
      { clock: new Date(2026, 11, 4, 9, 0) },
    ));

  it('shows a bar\'s times on a tap and on keyboard focus, a line for now, the steps with fold times, a close-up that fits a tablet', () =>
    withPage(
      'bench',
      async (page) => {
        await page.goto(`${base}/plans/2026-12-03`);
        await page.getByTestId('timeline').waitFor();
        // 04:40 on the night: the chart opens on the close-up of the production morning, with a line for now.
        expect(await page.getByTestId('timeline').getAttribute('data-view')).toBe('close');
        expect(await page.getByTestId('now-line').count()).toBe(1);
        expect(await page.getByTestId('now').textContent()).toMatch(/^Now 04:40/);
        // No sideways scrolling on a 768 px tablet: neither the page nor the close-up.
        const widths = await page.evaluate(() => {
          const chart = document.querySelector('[data-testid=timeline-scroller]') as HTMLElement;
          return [document.documentElement.scrollWidth, document.documentElement.clientWidth, chart.scrollWidth, chart.clientWidth];
        });
        expect(widths[0]).toBeLessThanOrEqual(widths[1]);
        expect(widths[2]).toBeLessThanOrEqual(widths[3]);
        const details = page.getByTestId('bar-details');
        expect(await details.textContent()).toMatch(/Tap a bar/);
        // A tap (a touch, no hover) on the focaccia's mix: its times from the plan (small spiral at 04:42, 8 minutes).
        const mix = page.getByRole('button', { name: 'Harbour focaccia 1/1: mix 04:42–04:50' });
        await mix.tap();
        expect(await details.textContent()).toMatch(/Harbour focaccia 1\/1 · mix · 04:42–04:50 · 8 min · small spiral/);
        expect(await mix.getAttribute('aria-pressed')).toBe('true');
        // The keyboard: Tab to the next bar shows its times.
        await page.keyboard.press('Tab');
        expect(await details.textContent()).toMatch(/Harbour focaccia 1\/1 · bulk fermentation · 04:50–06:10 .* fold at 05:10, 05:30, 05:50/);
        // Every step in words, folds included.
        await page.getByText(/Every step in time order/).click();
        expect(await page.getByTestId('step-list').textContent()).toContain('fold at 05:10, 05:30, 05:50');
        await screenshot(page, 'plan-tablet-portrait-bar', { width: 768, height: 1024, fullPage: false });
      },
      { clock: new Date(2026, 11, 3, 4, 40), viewport: { width: 768, height: 1024 }, touch: true },
    ));

  it('answers bench staff with a 403 page for changes and a not-found page for drafts and unknown pages', () =>
    withPage('bench', async (page) => {
      await page.goto(`${base}/changes`);
      await page.getByRole('heading', { name: 'Not for your role' }).waitFor();
      await screenshot(page, 'forbidden', { width: 1280, height: 800, fullPage: false });
      await page.goto(`${base}/formulas/spelt-porridge-loaf`);
      await page.getByRole('heading', { name: /Nothing on this shelf|Not for your role/ }).waitFor();
      await page.goto(`${base}/no-such-page`);
      await page.getByRole('heading', { name: 'Nothing on this shelf' }).waitFor();
      await screenshot(page, 'not-found', { width: 1280, height: 800, fullPage: false });
    }));

  it('shows who is signed in and signs out', () =>
    // Signs in on the page rather than from the saved sign-in: signing out ends that session.
    withPage(null, async (page) => {
      await signInOnPage(page, base, emailOf('bench'));
      await page.goto(`${base}/account`);
      expect(await page.getByTestId('account-role').getAttribute('data-role')).toBe('bench');
      expect(await page.getByTestId('account-email').textContent()).toBe(emailOf('bench'));
      await screenshot(page, 'account', { width: 1280, height: 800, fullPage: false });
      await signOut(page, base);
      await page.goto(`${base}/formulas`);
      await page.waitForURL(/\/sign-in/);
    }));

  it('shows a reviewer drafts, a status filter and the changes, still without costs', () =>
    withPage('reviewer', async (page) => {
      await page.goto(`${base}/formulas`);
      await page.locator('[data-formula]').first().waitFor();
      const ids = await page.locator('[data-formula]').evaluateAll((els) => els.map((e) => e.getAttribute('data-formula')));
      expect(ids).toContain('spelt-porridge-loaf');
      await page.getByLabel('Status').selectOption('draft');
      await page.waitForURL(/status=draft/);
      await page.waitForFunction(() => [...document.querySelectorAll('[data-formula]')].every((e) => e.getAttribute('data-formula') === 'spelt-porridge-loaf'));
      await screenshot(page, 'formulas-reviewer-drafts', { width: 1280, height: 800, fullPage: false });

      await page.goto(`${base}/formulas/spelt-porridge-loaf`);
      await page.getByRole('heading', { name: /spelt/i, level: 1 }).waitFor();
      expect(await page.getByRole('heading', { name: 'Ingredient cost' }).count()).toBe(0);
      expect(await page.getByRole('link', { name: 'Changes' }).count()).toBeGreaterThan(0);
      await screenshot(page, 'formula-draft-reviewer', { width: 1280, height: 800 });
    }));

  it('lists changes and compares two revisions side by side in baker\'s terms', () =>
    withPage('reviewer', async (page) => {
      await page.goto(`${base}/changes`);
      const row = page.locator('[data-change="tidewater-baguette@2"]');
      await row.waitFor();
      await screenshot(page, 'changes', { width: 1280, height: 800 });
      await row.click();
      await page.waitForURL(/\/changes\/tidewater-baguette\?from=1&to=2/);
      const diff = page.getByTestId('revision-diff');
      await diff.waitFor();
      const text = (await diff.textContent()) ?? '';
      expect(text).toMatch(/water/i);
      await screenshot(page, 'changes-diff-tablet-light', { width: 1280, height: 800 });
      await screenshot(page, 'changes-diff-portrait-dark', { width: 800, height: 1280, scheme: 'dark' });
    }));

  it('shows the cost per piece to the technical baker', () =>
    withPage('author', async (page) => {
      await page.goto(`${base}/formulas/harbour-ciabatta?pieces=60`);
      await page.getByRole('heading', { name: 'Ingredient cost' }).waitFor();
      expect(await page.getByTestId('cost-per-piece').textContent()).toBe(CIABATTA.costPerPiece);
      await screenshot(page, 'formula-author-cost', { width: 1280, height: 800 });
    }));

  it('opens every demo formula and bake day without a failing panel', () =>
    withPage('author', async (page) => {
      const ids = readdirSync(resolve('formulas'))
        .filter((f) => f.endsWith('.yaml') && f !== 'ingredients.yaml')
        .map((f) => f.replace(/\.yaml$/, ''));
      const dates = readdirSync(resolve('formulas/plans')).map((f) => f.replace(/\.yaml$/, ''));
      const broken: string[] = [];
      for (const path of [...ids.map((id) => `/formulas/${id}`), ...dates.map((d) => `/plans/${d}`)]) {
        await page.goto(`${base}${path}`);
        await page.locator('[data-testid="overall"], [data-testid="timeline"]').first().waitFor();
        // The formula page's cautions panel, or the bake-day page's (the sheet's own title).
        await page.getByRole('heading', { name: /^(Take care|Cautions)$/ }).first().waitFor();
        const text = (await page.locator('main').textContent()) ?? '';
        if (/could not be shown|Something went wrong|Cannot scale/.test(text)) broken.push(path);
      }
      expect(broken).toEqual([]);
    }));

  it('sets a new password from the e-mailed link, then signs in with it', () =>
    withPage(null, async (page) => {
      await page.goto(`${base}/sign-in`);
      await page.getByRole('link', { name: 'Forgot the password?' }).click();
      await page.waitForURL(/\/forgot-password$/);
      await page.getByLabel('E-mail').fill(resetEmail);
      await page.getByRole('button', { name: 'Send the link' }).click();
      await page.getByRole('status').waitFor();
      await screenshot(page, 'forgot-password', { width: 1280, height: 800, fullPage: false });
      await appInternals(server.app).idle();
      const mail = server.outbox.find((m) => m.to === resetEmail);
      const link = /\/reset-password\?token=\S+/.exec(mail?.text ?? '')?.[0];
      expect(link).toBeDefined();
      await page.goto(`${base}${link}`);
      await page.getByLabel('New password').fill('flour and water 2026');
      await page.getByLabel('The same again').fill('flour and water 2026');
      await screenshot(page, 'reset-password', { width: 800, height: 1280, scheme: 'dark', fullPage: false });
      await page.getByRole('button', { name: 'Set the new password' }).click();
      await page.waitForURL(/\/sign-in\?reset=done/);
      // The spent link says so as it opens, before any password is typed.
      await page.goto(`${base}${link}`);
      await page.getByTestId('reset-link-problem').waitFor();
      expect(await page.getByLabel('New password').count()).toBe(0);
      await page.goto(`${base}/sign-in`);
      await page.getByLabel('E-mail').fill(resetEmail);
      await page.getByLabel('Password').fill('flour and water 2026');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(/\/formulas$/);
    }));
});
