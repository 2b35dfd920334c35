// End to end: the built viewer served by the real server (in-memory PGlite with the demo bakery),
// driven in headless Chromium. Screenshots of every page land in test-results/screenshots/.
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { computeCost, formatMoney } from '#shared/cost';
import { parseCatalogText, parseFormulaText } from '#shared/parse';
import { scaleFormula, type ScaleTarget } from '#shared/scale';
import { planWater } from '#shared/temperature';
import { formatGrams, formatTemperature } from '#shared/units';
import { appInternals } from '../../server/app.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { loadFolder } from '../../server/load/index.ts';
import { emailOf, openTestDatabase, PASSWORD, startTestServer, type TestServer } from '../server/harness.ts';
import { hasChromium, launchBrowser, printPreview, screenshot, type Browser } from './support/browser.ts';
import { ensureViewerBuilt } from './support/viewer-build.ts';

const chromiumHere = hasChromium();
if (!chromiumHere && !process.env.CI) {
  process.stderr.write('tests/e2e: /usr/bin/chromium is missing; skipping the viewer tests (apt-get install chromium to run them)\n');
}

function readFormula(id: string) {
  const parsed = parseFormulaText(readFileSync(resolve('formulas', `${id}.yaml`), 'utf8'), `${id}.yaml`);
  if (!parsed.ok) throw new Error(`demo formula ${id} does not parse`);
  return parsed.value;
}
function readCatalog() {
  const parsed = parseCatalogText(readFileSync(resolve('formulas/ingredients.yaml'), 'utf8'), 'ingredients.yaml');
  if (!parsed.ok) throw new Error('demo catalog does not parse');
  return parsed.value;
}

/** The weight the viewer shows for an ingredient in one of the formula page's tables. */
async function weightIn(page: Page, table: 'overall' | 'final-dough', ingredient: string): Promise<string> {
  const cell = page.locator(`[data-testid="${table}"] tr[data-ingredient="${ingredient}"] [data-weight]`).first();
  return ((await cell.textContent()) ?? '').trim();
}

async function signIn(page: Page, base: string, role: 'bench' | 'reviewer' | 'author' | 'admin'): Promise<void> {
  // Whoever was signed in before (a test that stopped half-way) is forgotten first.
  await page.context().clearCookies();
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail').fill(emailOf(role));
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/formulas$/);
  await page.getByRole('heading', { name: 'Formulas', level: 1 }).waitFor();
}

async function signOut(page: Page, base: string): Promise<void> {
  await page.goto(`${base}/account`);
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
}

// A real browser on a busy two-core machine: each step gets two minutes before it counts as hung.
// A test that fails is tried once more on a new tab (the tests share one browser, as a bench tablet
// would): on a loaded 2-core CI machine a tab has been seen to hang for minutes while a fresh one
// worked at once. A real fault fails both tries.
describe.skipIf(!chromiumHere && !process.env.CI)('the viewer in a browser', { timeout: 120_000, retry: 1 }, () => {
  let handle: DatabaseHandle;
  let server: TestServer;
  let browser: Browser;
  let page: Page;
  let base: string;
  const pageErrors: string[] = [];
  const catalog = readCatalog();

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
    server = await startTestServer(handle, { webDir: resolve('dist/web') });
    base = server.url;
    browser = await launchBrowser();
    page = browser.page;
    page.on('pageerror', (e) => pageErrors.push(e.message));
  }, 300_000);

  beforeEach(async () => {
    await page.bringToFront();
  });

  afterEach(async ({ task }) => {
    if (task.result?.state !== 'fail') return;
    // Signed-in state lives in the browser context and survives the new tab.
    await page.close().catch(() => {});
    page = await browser.context.newPage();
    page.on('pageerror', (e) => pageErrors.push(e.message));
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    await handle?.close();
  });

  it('sends a signed-out visitor to the sign-in page and back to where they were going', async () => {
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
  });

  it('shows bench staff only formulas in use, with no status filter, no changes and no costs', async () => {
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
  });

  it('sends a formula page rendered, and takes it over without a mismatch', async () => {
    // Signed in as bench from the test before: the server's HTML already holds the weights.
    const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
    const res = await fetch(`${base}/formulas/harbour-ciabatta?pieces=24`, { headers: { cookie } });
    expect(res.headers.get('cache-control')).toBe('private, no-cache');
    const html = await res.text();
    expect(html).toMatch(/<script type="application\/json" id="panform-state">/);
    expect(html).toMatch(/data-testid="overall"/);
    expect(html).toMatch(/<h1[^>]*>Harbour ciabatta<\/h1>/);
    expect(html).not.toMatch(/<script>/);
    // Signed out: the plain page, nothing of anyone's.
    const plain = await (await fetch(`${base}/formulas/harbour-ciabatta`)).text();
    expect(plain).not.toMatch(/panform-state/);

    const before = pageErrors.length;
    await page.goto(`${base}/formulas/harbour-ciabatta?pieces=24`);
    await page.locator('[data-testid="overall"] tbody tr').first().waitFor();
    await page.getByRole('button', { name: 'One piece more' }).click();
    await page.waitForURL(/pieces=25/);
    expect(await page.getByLabel('Pieces').inputValue()).toBe('25');
    expect(pageErrors.slice(before)).toEqual([]);
  });

  it('can be used from the keyboard, with a visible focus ring', async () => {
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
    expect(ring.height).toBeGreaterThanOrEqual(44); // large touch targets
    await screenshot(page, 'keyboard-focus', { width: 1280, height: 800, fullPage: false });
  });

  it('narrows the list as a name is typed', async () => {
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
  });

  it('notices a session that ended while the page was open, and signs in again without looping', async () => {
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
  });

  it('scales a formula by pieces and by dough weight in the browser, as shared scaleFormula does, and keeps the target in the URL', async () => {
    const formula = readFormula('harbour-ciabatta');
    const expectFor = (target: ScaleTarget) => scaleFormula(formula, catalog, target);
    await page.goto(`${base}/formulas/harbour-ciabatta`);
    await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
    expect(await page.title()).toBe('Harbour ciabatta · Panform');
    const written = expectFor({ by: 'pieces', pieces: formula.yield.pieces });
    expect(await weightIn(page, 'overall', 'bread flour')).toBe(formatGrams(written.overall.find((l) => l.ingredient === 'bread flour')!.grams));
    await screenshot(page, 'formula-bench-tablet-light', { width: 1280, height: 800 });
    await screenshot(page, 'formula-bench-portrait-light', { width: 800, height: 1280 });
    await screenshot(page, 'formula-bench-desktop-dark', { width: 1680, height: 1050, scheme: 'dark' });

    await page.getByLabel('Pieces').fill('60');
    await page.waitForURL(/pieces=60/);
    const sixty = expectFor({ by: 'pieces', pieces: 60 });
    const flour = formatGrams(sixty.overall.find((l) => l.ingredient === 'bread flour')!.grams);
    await page.waitForFunction(
      ([sel, text]) => document.querySelector(sel)?.textContent?.trim() === text,
      ['[data-testid="overall"] tr[data-ingredient="bread flour"] [data-weight]', flour] as const,
    );
    expect(await weightIn(page, 'overall', 'water')).toBe(formatGrams(sixty.overall.find((l) => l.ingredient === 'water')!.grams));
    expect(await weightIn(page, 'final-dough', 'poolish')).toBe(formatGrams(sixty.finalDough.find((l) => l.ingredient === 'poolish')!.grams));
    expect(await page.getByTestId('batch-line').textContent()).toContain('60 × 320 g');

    // The target survives a reload: it lives in the URL.
    await page.reload();
    await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
    expect(await page.getByLabel('Pieces').inputValue()).toBe('60');
    expect(await weightIn(page, 'overall', 'bread flour')).toBe(flour);

    await page.getByRole('radio', { name: 'Dough weight' }).click();
    await page.getByLabel('Mixed dough').fill('25');
    await page.waitForURL(/mix=25000/);
    const byMix = expectFor({ by: 'mix', grams: 25_000 });
    const salt = formatGrams(byMix.overall.find((l) => l.ingredient === 'fine salt')!.grams);
    await page.waitForFunction(
      ([sel, text]) => document.querySelector(sel)?.textContent?.trim() === text,
      ['[data-testid="overall"] tr[data-ingredient="fine salt"] [data-weight]', salt] as const,
    );
    await screenshot(page, 'formula-scaled-by-dough', { width: 1280, height: 800 });
  });

  it('works out the water temperature and the ice with shared/temperature', async () => {
    const formula = readFormula('harbour-ciabatta');
    await page.goto(`${base}/formulas/harbour-ciabatta`);
    const helper = page.getByTestId('water-helper');
    await helper.waitFor();
    await helper.getByLabel('Room').fill('30');
    await helper.getByLabel('Tap water').fill('20');
    const scaled = scaleFormula(formula, catalog, { by: 'pieces', pieces: formula.yield.pieces });
    const water = scaled.finalDough.filter((l) => l.source === 'ingredient' && l.ingredient === 'water').reduce((a, l) => a + l.grams, 0);
    const expected = planWater({ ddt: 25, room: 30, flour: 20, friction: 13, preferments: [20], tap: 20, waterGrams: water });
    expect(expected.ice).toBeGreaterThan(0);
    await page.waitForFunction(
      (text) => document.querySelector('[data-testid="water-temperature"]')?.textContent?.trim() === text,
      formatTemperature(expected.waterTemperature),
    );
    expect(await page.getByTestId('ice').textContent()).toContain(formatGrams(expected.ice!));
    await screenshot(page, 'formula-water-helper', { width: 1280, height: 800, fullPage: false });
  });

  it('prints a typical formula on one page', async () => {
    await page.goto(`${base}/formulas/harbour-ciabatta?pieces=60`);
    await page.getByRole('heading', { name: 'Harbour ciabatta', level: 1 }).waitFor();
    const { pages } = await printPreview(page, 'formula-harbour-ciabatta');
    if (pages !== null) expect(pages).toBe(1);
  });

  it('opens a bake day: builds with mix windows, mixes, pick list, timeline chart and the PDF', async () => {
    await page.goto(`${base}/plans`);
    await page.locator('[data-plan="2026-12-03"]').click();
    await page.waitForURL(/\/plans\/2026-12-03$/);
    await page.getByTestId('timeline').waitFor();
    expect(await page.locator('[data-testid="timeline"] svg [data-step]').count()).toBeGreaterThan(10);
    expect(await page.getByTestId('sheet-build').count()).toBeGreaterThan(0);
    expect(await page.getByTestId('sheet-mix').count()).toBeGreaterThan(0);
    expect(await page.locator('[data-testid="pick-list"] tr[data-ingredient="bread flour"]').count()).toBe(1);
    expect(await page.getByTestId('sheet-build').first().textContent()).toMatch(/Mix .*\d\d:\d\d/);
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
  });

  it('answers bench staff with a 403 page for changes and a not-found page for drafts and unknown pages', async () => {
    await page.goto(`${base}/changes`);
    await page.getByRole('heading', { name: 'Not for your role' }).waitFor();
    await screenshot(page, 'forbidden', { width: 1280, height: 800, fullPage: false });
    await page.goto(`${base}/formulas/spelt-porridge-loaf`);
    await page.getByRole('heading', { name: /Nothing on this shelf|Not for your role/ }).waitFor();
    await page.goto(`${base}/no-such-page`);
    await page.getByRole('heading', { name: 'Nothing on this shelf' }).waitFor();
    await screenshot(page, 'not-found', { width: 1280, height: 800, fullPage: false });
  });

  it('shows who is signed in and signs out', async () => {
    await page.goto(`${base}/account`);
    expect(await page.getByTestId('account-role').getAttribute('data-role')).toBe('bench');
    expect(await page.getByTestId('account-email').textContent()).toBe(emailOf('bench'));
    await screenshot(page, 'account', { width: 1280, height: 800, fullPage: false });
    await signOut(page, base);
    await page.goto(`${base}/formulas`);
    await page.waitForURL(/\/sign-in/);
  });

  it('shows a reviewer drafts, a status filter and the changes, still without costs', async () => {
    await signIn(page, base, 'reviewer');
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
  });

  it('lists changes and compares two revisions side by side in baker\'s terms', async () => {
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
    await signOut(page, base);
  });

  it('shows the cost per piece to the technical baker, as shared computeCost works it out', async () => {
    await signIn(page, base, 'author');
    await page.goto(`${base}/formulas/harbour-ciabatta?pieces=60`);
    await page.getByRole('heading', { name: 'Ingredient cost' }).waitFor();
    const formula = readFormula('harbour-ciabatta');
    const cost = computeCost(scaleFormula(formula, catalog, { by: 'pieces', pieces: 60 }), catalog);
    expect(await page.getByTestId('cost-per-piece').textContent()).toBe(formatMoney(cost.perPiece!, ''));
    await screenshot(page, 'formula-author-cost', { width: 1280, height: 800 });
  });

  it('opens every demo formula and bake day without a failing panel', async () => {
    const ids = readdirSync(resolve('formulas'))
      .filter((f) => f.endsWith('.yaml') && f !== 'ingredients.yaml')
      .map((f) => f.replace(/\.yaml$/, ''));
    const dates = readdirSync(resolve('formulas/plans')).map((f) => f.replace(/\.yaml$/, ''));
    const broken: string[] = [];
    for (const path of [...ids.map((id) => `/formulas/${id}`), ...dates.map((d) => `/plans/${d}`)]) {
      await page.goto(`${base}${path}`);
      await page.locator('[data-testid="overall"], [data-testid="timeline"]').first().waitFor();
      await page.getByRole('heading', { name: 'Take care' }).waitFor();
      const text = (await page.locator('main').textContent()) ?? '';
      if (/could not be shown|Something went wrong|Cannot scale/.test(text)) broken.push(path);
    }
    expect(broken).toEqual([]);
    await signOut(page, base);
  });

  it('sets a new password from the e-mailed link, then signs in with it', async () => {
    await page.context().clearCookies();
    await page.goto(`${base}/sign-in`);
    await page.getByRole('link', { name: 'Forgot the password?' }).click();
    await page.waitForURL(/\/forgot-password$/);
    await page.getByLabel('E-mail').fill(emailOf('admin'));
    await page.getByRole('button', { name: 'Send the link' }).click();
    await page.getByRole('status').waitFor();
    await screenshot(page, 'forgot-password', { width: 1280, height: 800, fullPage: false });
    await appInternals(server.app).idle();
    const mail = server.outbox.find((m) => m.to === emailOf('admin'));
    const link = /\/reset-password\?token=\S+/.exec(mail?.text ?? '')?.[0];
    expect(link).toBeDefined();
    await page.goto(`${base}${link}`);
    await page.getByLabel('New password').fill('flour and water 2026');
    await page.getByLabel('The same again').fill('flour and water 2026');
    await screenshot(page, 'reset-password', { width: 800, height: 1280, scheme: 'dark', fullPage: false });
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await page.waitForURL(/\/sign-in\?reset=done/);
    await page.getByLabel('E-mail').fill(emailOf('admin'));
    await page.getByLabel('Password').fill('flour and water 2026');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/formulas$/);
    await signOut(page, base);
  });

  it('raised no error in the page', () => {
    expect(pageErrors).toEqual([]);
  });
});
