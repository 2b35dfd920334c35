// One layout for every print: the HTML page, the PDF (read back with poppler's pdftotext) and
// the viewer's bake-day page (React's server renderer) carry the layout's texts in the same order
// for the demo day.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildSheet } from '#shared/sheet/build';
import { renderSheetHtml } from '#shared/sheet/html';
import { layoutSheet, layoutTexts } from '#shared/sheet/layout';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { renderSheetPdf } from '../../server/print/pdf.ts';
import { BakeDay } from '../../src/features/plans/components/bake-day.tsx';
import { DEMO_PLANS, sheetInput } from './sheet-fixtures.ts';

const sheet = buildSheet(sheetInput(DEMO_PLANS[0]));
const layout = layoutSheet(sheet);
const texts = layoutTexts(layout);

/** Whitespace (and the no-break spaces of thousands) does not count: wrapping differs by surface. */
const squeeze = (s: string) => s.replace(/[\s\u00a0\u202f]+/g, '');

/** The first text not found after the one before it, or null when all are there in order. */
export function firstOutOfOrder(haystack: string, needles: string[]): string | null {
  const text = squeeze(haystack);
  let at = 0;
  for (const n of needles) {
    const i = text.indexOf(squeeze(n), at);
    if (i < 0) return n;
    at = i + squeeze(n).length;
  }
  return null;
}

/** An HTML page's text without its markup, styles and chart drawings. */
export function htmlText(html: string): string {
  return html
    .replace(/<style[\s\S]*?<\/style>/g, ' ')
    .replace(/<svg[\s\S]*?<\/svg>/g, ' ')
    .replace(/<[^>]+>/g, ' ')
    .replace(/&(amp|lt|gt|quot|#39|#x27|nbsp);/g, (_, e: string) => ({ amp: '&', lt: '<', gt: '>', quot: '"', '#39': "'", '#x27': "'", nbsp: ' ' })[e]!);
}

const dir = mkdtempSync(join(tmpdir(), 'panform-layout-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('the layout of the demo day', () => {
  it('puts the boxes first, then the chart, then the sections of cards and tables', () => {
    expect(layout.items.map((i) => i.key)).toEqual(['cautions', 'warnings', 'timeline', 'cultures', 'preferments', 'soakers', 'mixes', 'totals', 'equipment', 'scales', 'formulas'].filter((k) => k !== 'warnings' || sheet.warnings.length > 0));
    const mixes = layout.items.find((i) => i.key === 'mixes');
    expect(mixes?.kind === 'section' && mixes.blocks.map((b) => b.mix)).toEqual(sheet.mixes.map((m) => ({ order: m.order, mixNumber: m.mixNumber })));
    expect(texts.length).toBeGreaterThan(500);
  });

  it('writes US customary units when asked, the same texts otherwise', () => {
    const usLayout = layoutSheet(sheet, { units: 'us' });
    const us = layoutTexts(usLayout);
    expect(us.length).toBe(texts.length);
    expect(us.join('\n')).toContain('°F');
    const mixes = usLayout.items.find((i) => i.key === 'mixes');
    const weights = mixes?.kind === 'section' ? mixes.blocks.flatMap((b) => b.table!.rows.map((r) => r[1])) : [];
    expect(weights.length).toBeGreaterThan(40);
    for (const w of weights) expect(w).toMatch(/ oz$/);
  });

  it('the HTML page carries every text in order', () => {
    expect(firstOutOfOrder(htmlText(renderSheetHtml(sheet)), texts)).toBeNull();
  });

  it('the PDF carries every text in order (pdftotext, in drawing order)', async () => {
    const pdf = join(dir, 'sheet.pdf');
    writeFileSync(pdf, await renderSheetPdf(sheet));
    const text = execFileSync('/usr/bin/pdftotext', ['-raw', pdf, '-'], { encoding: 'utf8' });
    expect(firstOutOfOrder(text, texts)).toBeNull();
  });

  it('the viewer\'s bake-day page carries every text in order (React\'s server renderer)', () => {
    const html = renderToStaticMarkup(createElement(BakeDay, { sheet, now: null }));
    // The page's own chart labels and step list are drawings of the chart: left out as in the HTML.
    const page = html.replace(/<figure[\s\S]*?<\/figure>/g, ' ');
    expect(firstOutOfOrder(htmlText(page), texts)).toBeNull();
    // And nothing of the sheet's text is left out of the page: each mix is a card with its steps.
    expect(html.match(/data-testid="sheet-mix"/g)).toHaveLength(sheet.mixes.length);
  });

  it('a text out of place is caught', () => {
    expect(firstOutOfOrder('a b c', ['a', 'c', 'b'])).toBe('b');
  });
});
