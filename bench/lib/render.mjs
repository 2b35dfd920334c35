// Formula page render time in headless Chromium (Debian's /usr/bin/chromium through
// playwright-core): a signed-in browser opens /formulas/<id>?pieces=N and the time is taken from
// the start of navigation (the page's own time origin) to the scaled table on screen. Each run
// uses a fresh browser context, so nothing is cached between runs.
import { existsSync } from 'node:fs';

export const CHROMIUM = '/usr/bin/chromium';
const FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** Why the render row cannot run here, or null when it can. */
export function renderUnavailable() {
  if (!existsSync(CHROMIUM)) return `${CHROMIUM} is not installed (apt-get install chromium)`;
  return null;
}

/**
 * @param {{ baseUrl: string, cookie: { name: string, value: string }, path: string, selector: string, runs: number, onCleanup: (fn: () => Promise<void>) => void }} o
 * @returns {Promise<{ times: number[] }>}
 */
export async function measureRender({ baseUrl, cookie, path, selector, runs, onCleanup }) {
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
  try {
    for (let i = 0; i < runs; i++) {
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      await context.addCookies([{ name: cookie.name, value: cookie.value, url: baseUrl }]);
      const page = await context.newPage();
      await page.goto(`${baseUrl}${path}`, { waitUntil: 'commit' });
      // Resolves in the page as soon as the table is laid out and visible; returns the page's clock,
      // whose origin is the start of this navigation.
      const handle = await page.waitForFunction(
        (sel) => {
          const el = document.querySelector(sel);
          if (!el) return false;
          const box = el.getBoundingClientRect();
          return box.width > 0 && box.height > 0 ? performance.now() : false;
        },
        selector,
        { polling: 'raf', timeout: 30_000 },
      );
      times.push(Number(await handle.jsonValue()));
      await context.close();
    }
  } finally {
    await close();
  }
  return { times };
}
