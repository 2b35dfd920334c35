// Panform's faces for printing, as in the viewer: Atkinson Hyperlegible Next for text, Fraunces
// for headings, JetBrains Mono for figures (weights, times, temperatures). Read from the
// @fontsource packages installed with Panform, so nothing is downloaded at run time.
//
// The packages ship WOFF and WOFF2. pdfkit's font reader (fontkit) takes the WOFF as it is (it
// draws WOFF2 glyphs invisible), and the PDF renderer turns ligatures off; the HTML page embeds
// the WOFF2.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

/** A face the sheet prints in. */
export type PrintFace = 'text' | 'text-bold' | 'heading' | 'figures' | 'figures-bold';

const require = createRequire(import.meta.url);

const FACES: Record<PrintFace, { pkg: string; family: string; weight: number }> = {
  text: { pkg: 'atkinson-hyperlegible-next', family: 'Atkinson Hyperlegible Next', weight: 400 },
  'text-bold': { pkg: 'atkinson-hyperlegible-next', family: 'Atkinson Hyperlegible Next', weight: 700 },
  heading: { pkg: 'fraunces', family: 'Fraunces', weight: 600 },
  figures: { pkg: 'jetbrains-mono', family: 'JetBrains Mono', weight: 400 },
  'figures-bold': { pkg: 'jetbrains-mono', family: 'JetBrains Mono', weight: 700 },
};

export const PRINT_FACES = Object.keys(FACES) as PrintFace[];

function fontFile(face: PrintFace, ext: 'woff' | 'woff2'): string {
  const f = FACES[face];
  return require.resolve(`@fontsource/${f.pkg}/files/${f.pkg}-latin-${f.weight}-normal.${ext}`);
}

/** A face's WOFF bytes (Latin), for pdfkit's registerFont. */
export function readPrintFontWoff(face: PrintFace): Buffer {
  return readFileSync(fontFile(face, 'woff'));
}

/** Every face as WOFF bytes, for renderSheetPdf. */
export function readPrintFonts(): Record<PrintFace, Buffer> {
  return Object.fromEntries(PRINT_FACES.map((f) => [f, readPrintFontWoff(f)])) as Record<PrintFace, Buffer>;
}

/** @font-face rules with every face embedded as a data: URL (the page then prints the same anywhere). */
export function printFontFaceCss(): string {
  return PRINT_FACES.map((face) => {
    const f = FACES[face];
    const woff2 = readFileSync(fontFile(face, 'woff2')).toString('base64');
    return `@font-face{font-family:'${f.family}';font-style:normal;font-weight:${f.weight};font-display:block;src:url(data:font/woff2;base64,${woff2}) format('woff2')}`;
  }).join('\n');
}
