// The shipped font for printing and the PDF renderer.
import { describe, expect, it } from 'vitest';
import { printFontFaceCss, readPrintFonts, readPrintFontWoff } from '#server/print/fonts';
import { renderSheetPdf } from '#server/print/pdf';
import { buildSheet } from '#shared/sheet/build';
import { FIXTURE_PLANS, sheetInput } from '../shared/sheet-fixtures.ts';

describe('the shipped faces', () => {
  it('reads the text, heading and figures faces and builds the @font-face rules for HTML', () => {
    expect(readPrintFontWoff('figures-bold').length).toBeGreaterThan(10_000);
    const css = printFontFaceCss();
    expect(css.match(/@font-face/g)).toHaveLength(5);
    for (const family of ['Atkinson Hyperlegible Next', 'Fraunces', 'JetBrains Mono']) expect(css).toContain(`font-family:'${family}'`);
    expect(css).toContain('font-weight:700');
  });
});

describe('renderSheetPdf', () => {
  const sheet = buildSheet(sheetInput(FIXTURE_PLANS[0]));

  it('draws a PDF with the text, heading and figures faces embedded', async () => {
    const pdf = await renderSheetPdf(sheet);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pdf.toString('latin1')).toMatch(/\/BaseFont \/[A-Z]{6}\+JetBrainsMono/);
    expect(pdf.toString('latin1')).toMatch(/\/BaseFont \/[A-Z]{6}\+AtkinsonHyperlegibleNext/);
    expect(pdf.toString('latin1')).toMatch(/\/BaseFont \/[A-Z]{6}\+Fraunces/);
    expect(pdf.toString('latin1')).toMatch(/\/MediaBox \[0 0 595\.28 841\.89\]/);
  });

  it('takes the font bytes and the paper as arguments', async () => {
    const pdf = await renderSheetPdf(sheet, { paper: 'letter', fonts: readPrintFonts() });
    expect(pdf.toString('latin1')).toMatch(/\/MediaBox \[0 0 612 792\]/);
  });
});
