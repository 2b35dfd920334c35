// The shipped JetBrains Mono faces for printing, read from @fontsource/jetbrains-mono (installed
// with Panform, so nothing is downloaded at run time).
//
// The package ships WOFF and WOFF2. pdfkit's font reader (fontkit) takes the WOFF as it is (it
// draws WOFF2 glyphs invisible), and the PDF renderer turns ligatures off; the HTML page embeds
// the WOFF2.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

export type FontWeight = 400 | 700;

const require = createRequire(import.meta.url);

function fontFile(weight: FontWeight, ext: 'woff' | 'woff2'): string {
  return require.resolve(`@fontsource/jetbrains-mono/files/jetbrains-mono-latin-${weight}-normal.${ext}`);
}

/** JetBrains Mono (Latin) WOFF bytes, for pdfkit's registerFont. */
export function readJetBrainsMonoWoff(weight: FontWeight): Buffer {
  return readFileSync(fontFile(weight, 'woff'));
}

/** JetBrains Mono (Latin) WOFF2 bytes, for an @font-face in a self-contained HTML page. */
export function readJetBrainsMonoWoff2(weight: FontWeight): Buffer {
  return readFileSync(fontFile(weight, 'woff2'));
}

/** @font-face rules with the faces embedded as data: URLs (the page then prints the same anywhere). */
export function jetBrainsMonoFontFaceCss(): string {
  return ([400, 700] as const)
    .map(
      (w) =>
        `@font-face{font-family:'JetBrains Mono';font-style:normal;font-weight:${w};font-display:block;` +
        `src:url(data:font/woff2;base64,${readJetBrainsMonoWoff2(w).toString('base64')}) format('woff2')}`,
    )
    .join('\n');
}
