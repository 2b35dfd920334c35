// Formula page render time in headless Chromium (Debian's /usr/bin/chromium through
// playwright-core): a signed-in browser opens /formulas/<id>?pieces=N and the time is taken from
// the start of navigation (the page's own time origin) to the scaled table on screen. Each run
// uses a fresh browser context. With `warmPaths`, the context first opens those pages (other
// formulas), as the bench tablet has opened Panform before: the viewer's files are then in the
// HTTP cache and Chromium keeps their compiled code; the measured load is still a full page load
// of a formula not opened before.
import { existsSync } from 'node:fs';
import { CHROMIUM, CHROMIUM_FLAGS as FLAGS } from './chromium.mjs';

export { CHROMIUM };

/**
 * Runs in each new document before its own scripts: notes the page's clock (origin: the start of
 * the navigation) at the first frame in which `selector` is laid out with a size. The page itself
 * takes the time, so the harness adds nothing to the page's work while it loads (waiting from the
 * outside with page.waitForFunction first injects Playwright's own script, which on a 2-core
 * machine costs the page more than a tenth of a second).
 */
function watchForVisible(selector) {
  const check = () => {
    const el = document.querySelector(selector);
    const box = el?.getBoundingClientRect();
    if (box && box.width > 0 && box.height > 0) globalThis.__benchVisibleAt = performance.now();
    else requestAnimationFrame(check);
  };
  requestAnimationFrame(check);
}

/** The time watchForVisible noted, asked for from outside only after the page has loaded. */
async function waitForVisible(page, selector) {
  await page.waitForLoadState('load', { timeout: 30_000 });
  const until = Date.now() + 30_000;
  for (;;) {
    const at = await page.evaluate(() => globalThis.__benchVisibleAt ?? null);
    if (typeof at === 'number') return at;
    if (Date.now() > until) throw new Error(`${selector} was not laid out within 30 s`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Why the render row cannot run here, or null when it can. */
export function renderUnavailable() {
  if (!existsSync(CHROMIUM)) return `${CHROMIUM} is not installed (apt-get install chromium)`;
  return null;
}

/**
 * @param {{ baseUrl: string, cookie: { name: string, value: string }, path: string, selector: string, runs: number, warmPaths?: string[], onCleanup: (fn: () => Promise<void>) => void }} o
 * @returns {Promise<{ times: number[], breakdowns: object[] }>}
 */
export async function measureRender({ baseUrl, cookie, path, selector, runs, warmPaths = [], onCleanup }) {
  const { chromium } = await import('playwright-core');
  const browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: FLAGS });
  let closed = false;
  const close = async () => {
    if (closed) return;
    closed = true;
    await browser.close();
  };
  onCleanup(close);
  const times = [];
  const breakdowns = [];
  try {
    for (let i = 0; i < runs; i++) {
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      await context.addInitScript(watchForVisible, selector);
      await context.addCookies([{ name: cookie.name, value: cookie.value, url: baseUrl }]);
      const page = await context.newPage();
      const errors = [];
      page.on('pageerror', (e) => errors.push(String(e?.message ?? e)));
      page.on('console', (m) => {
        if (m.type() === 'error') errors.push(m.text());
      });
      for (const warm of warmPaths) {
        await page.goto(`${baseUrl}${warm}`, { waitUntil: 'commit' });
        await page.waitForSelector(selector, { state: 'visible', timeout: 30_000 });
        // Chromium writes a script's compiled code to the cache after the page has settled.
        await page.waitForTimeout(300);
      }
      await page.goto(`${baseUrl}${path}`, { waitUntil: 'commit' });
      const visibleAt = await waitForVisible(page, selector).catch(async (e) => {
        // Say what the page showed instead, so a failure can be acted on.
        const text = await page.evaluate(() => document.body?.innerText ?? '').catch(() => '');
        throw new Error(
          `${selector} did not appear on ${page.url()} (${String(e?.message ?? e).split('\n')[0]}); the page said: ${JSON.stringify(text.slice(0, 300))}${errors.length ? `; errors: ${errors.slice(0, 3).join(' | ')}` : ''}`,
        );
      });
      times.push(visibleAt);
      // Where the time went, from the page's own timings: the document, its scripts, the API calls.
      breakdowns.push(
        await page.evaluate(() => {
          const nav = performance.getEntriesByType('navigation')[0];
          const res = performance.getEntriesByType('resource');
          const span = (kind) => {
            const xs = res.filter(kind);
            return xs.length ? { start: Math.min(...xs.map((r) => r.startTime)), end: Math.max(...xs.map((r) => r.responseEnd)), count: xs.length } : null;
          };
          return {
            documentEnd: nav ? nav.responseEnd : null,
            domContentLoaded: nav ? nav.domContentLoadedEventEnd : null,
            scripts: span((r) => r.initiatorType === 'script' || r.name.endsWith('.js')),
            api: span((r) => r.name.includes('/api/')),
            apiCalls: res.filter((r) => r.name.includes('/api/')).map((r) => ({ path: new URL(r.name).pathname, start: Math.round(r.startTime), end: Math.round(r.responseEnd) })),
          };
        }),
      );
      await context.close();
    }
  } finally {
    await close();
  }
  return { times, breakdowns };
}
