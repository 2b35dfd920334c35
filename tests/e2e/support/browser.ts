// Headless Chromium from Debian, driven by playwright-core (which cannot download a browser here).
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContextOptions, type Page } from 'playwright-core';
import { CHROMIUM, CHROMIUM_FLAGS as FLAGS } from '../../../bench/lib/chromium.mjs';

export { CHROMIUM };
export type { Browser };
export const SCREENSHOTS = 'test-results/screenshots';

export function hasChromium(): boolean {
  return existsSync(CHROMIUM);
}

/** What every test's browser context starts with: a bench tablet in landscape, light, British English. */
export const CONTEXT_OPTIONS = {
  viewport: { width: 1280, height: 800 },
  colorScheme: 'light',
  locale: 'en-GB',
} as const satisfies BrowserContextOptions;

/** One headless Chromium for a test file; each test opens its own context in it (no shared cookies or cache). */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM, headless: true, args: FLAGS });
}

export interface ShotOptions {
  width?: number;
  height?: number;
  scheme?: 'light' | 'dark';
  fullPage?: boolean;
}

/** Saves a screenshot to test-results/screenshots/<name>.png, in the size and colour scheme asked. */
export async function screenshot(page: Page, name: string, o: ShotOptions = {}): Promise<string> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  const before = page.viewportSize();
  if (o.width && o.height) await page.setViewportSize({ width: o.width, height: o.height });
  await page.emulateMedia({ colorScheme: o.scheme ?? 'light', media: 'screen' });
  // Let layout and fonts settle after a size or scheme change.
  await page.evaluate(() => document.fonts.ready.then(() => new Promise((r) => requestAnimationFrame(() => r(null)))));
  const path = join(SCREENSHOTS, `${name}.png`);
  await page.screenshot({ path, fullPage: o.fullPage ?? true });
  if (before && o.width && o.height) await page.setViewportSize(before);
  await page.emulateMedia({ colorScheme: 'light' });
  return path;
}

/** The print stylesheet's result: an A4 PDF, and its first page as a PNG when poppler is there. Returns the page count when known. */
export async function printPreview(page: Page, name: string): Promise<{ pdf: string; pages: number | null }> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  const pdf = join(SCREENSHOTS, `${name}.pdf`);
  await page.emulateMedia({ media: 'print', colorScheme: 'light' });
  await page.pdf({ path: pdf, format: 'A4', printBackground: true, preferCSSPageSize: true });
  await page.emulateMedia({ media: 'screen' });
  let pages: number | null = null;
  try {
    const info = execFileSync('pdfinfo', [pdf], { encoding: 'utf8' });
    pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1] ?? NaN);
    execFileSync('pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '2', pdf, join(SCREENSHOTS, `${name}-print`)]);
  } catch {
    // poppler-utils missing: the PDF alone is kept.
  }
  return { pdf, pages };
}
