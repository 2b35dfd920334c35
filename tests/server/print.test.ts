// The shipped font for printing and the PDF renderer.
import { describe, expect, it } from 'vitest';
import { jetBrainsMonoFontFaceCss, readJetBrainsMonoWoff } from '#server/print/fonts';
import { renderSheetPdf } from '#server/print/pdf';
import { buildSheet } from '#shared/sheet/build';
import { FIXTURE_PLANS, sheetInput } from '../shared/sheet-fixtures.ts';

describe('the shipped font', () => {
  it('reads both weights and builds the @font-face rules for HTML', () => {
    expect(readJetBrainsMonoWoff(700).length).toBeGreaterThan(10_000);
    const css = jetBrainsMonoFontFaceCss();
    expect(css.match(/@font-face/g)).toHaveLength(2);
    expect(css).toContain('font-weight:700');
  });
});

describe('renderSheetPdf', () => {
  const sheet = buildSheet(sheetInput(FIXTURE_PLANS[0]));

  it('draws a PDF with the shipped font embedded', async () => {
    const pdf = await renderSheetPdf(sheet);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pdf.toString('latin1')).toMatch(/\/BaseFont \/[A-Z]{6}\+JetBrainsMono/);
    expect(pdf.toString('latin1')).toMatch(/\/MediaBox \[0 0 595\.28 841\.89\]/);
  });

  it('takes the font bytes and the paper as arguments', async () => {
    const pdf = await renderSheetPdf(sheet, { paper: 'letter', fonts: { regular: readJetBrainsMonoWoff(400), bold: readJetBrainsMonoWoff(400) } });
    expect(pdf.toString('latin1')).toMatch(/\/MediaBox \[0 0 612 792\]/);
  });
});
