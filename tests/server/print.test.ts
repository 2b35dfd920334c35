// The shipped font for printing (WOFF → TrueType in memory) and the PDF renderer.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { FontError, jetBrainsMonoFontFaceCss, readJetBrainsMonoTtf, woffToSfnt } from '#server/print/fonts';
import { renderSheetPdf } from '#server/print/pdf';
import { buildSheet } from '#shared/sheet/build';
import { FIXTURE_PLANS, sheetInput } from '../shared/sheet-fixtures.ts';

const require = createRequire(import.meta.url);

describe('woffToSfnt', () => {
  it('unpacks the shipped WOFF into a TrueType font with the same tables', () => {
    const woff = readFileSync(require.resolve('@fontsource/jetbrains-mono/files/jetbrains-mono-latin-400-normal.woff'));
    const ttf = woffToSfnt(woff);
    // sfnt version 0x00010000 (TrueType outlines) and the table count carried over (WOFF 1.0 §3)
    expect(ttf.readUInt32BE(0)).toBe(woff.readUInt32BE(4));
    const numTables = woff.readUInt16BE(12);
    expect(ttf.readUInt16BE(4)).toBe(numTables);
    // WOFF header: totalSfntSize is the size of the uncompressed font
    expect(ttf.length).toBe(woff.readUInt32BE(16));
    const tags = Array.from({ length: numTables }, (_, i) => ttf.toString('latin1', 12 + i * 16, 16 + i * 16));
    expect(tags).toEqual([...tags].sort());
    for (const t of ['cmap', 'glyf', 'head', 'hmtx', 'loca', 'name']) expect(tags).toContain(t);
  });

  it('refuses bytes that are not WOFF', () => {
    expect(() => woffToSfnt(Buffer.from('not a font at all, just some text for the header'))).toThrow(FontError);
  });

  it('reads both weights and builds the @font-face rules for HTML', () => {
    expect(readJetBrainsMonoTtf(700).length).toBeGreaterThan(10_000);
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
    const pdf = await renderSheetPdf(sheet, { paper: 'letter', fonts: { regular: readJetBrainsMonoTtf(400), bold: readJetBrainsMonoTtf(400) } });
    expect(pdf.toString('latin1')).toMatch(/\/MediaBox \[0 0 612 792\]/);
  });
});
