// The shipped JetBrains Mono faces for printing, read from @fontsource/jetbrains-mono (installed
// with Panform, so nothing is downloaded at run time).
//
// The package ships WOFF and WOFF2 only. pdfkit draws WOFF2 glyphs invisible and trips over
// ligature sequences in WOFF, so the WOFF is unpacked here into a plain TrueType font in memory
// (WOFF 1.0: the same tables, each zlib-compressed; W3C "WOFF File Format 1.0", sections 3–5),
// and the PDF renderer turns ligatures off. The HTML page embeds the WOFF2 as it is.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { inflateSync } from 'node:zlib';

export type FontWeight = 400 | 700;

const require = createRequire(import.meta.url);

function fontFile(weight: FontWeight, ext: 'woff' | 'woff2'): string {
  return require.resolve(`@fontsource/jetbrains-mono/files/jetbrains-mono-latin-${weight}-normal.${ext}`);
}

const ttfCache = new Map<FontWeight, Buffer>();

/** JetBrains Mono (Latin) as TrueType bytes, for pdfkit's registerFont. */
export function readJetBrainsMonoTtf(weight: FontWeight): Buffer {
  let ttf = ttfCache.get(weight);
  if (!ttf) {
    ttf = woffToSfnt(readFileSync(fontFile(weight, 'woff')));
    ttfCache.set(weight, ttf);
  }
  return ttf;
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

/** Thrown for bytes that are not a WOFF 1.0 font. */
export class FontError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FontError';
  }
}

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'
const WOFF_HEADER = 44;
const WOFF_ENTRY = 20;
const SFNT_HEADER = 12;
const SFNT_ENTRY = 16;

/** WOFF 1.0 → the sfnt (TrueType/OpenType) font it wraps. */
export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.length < WOFF_HEADER || woff.readUInt32BE(0) !== WOFF_SIGNATURE) throw new FontError('not a WOFF 1.0 font (no wOFF signature)');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables: { tag: number; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const at = WOFF_HEADER + i * WOFF_ENTRY;
    const tag = woff.readUInt32BE(at);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    if (offset + compLength > woff.length) throw new FontError('WOFF table runs past the end of the file');
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : Buffer.from(raw);
    if (data.length !== origLength) throw new FontError('WOFF table does not inflate to its stated length');
    tables.push({ tag, checksum, data });
  }
  // Tables in the sfnt directory are sorted by tag; data follows the directory, 4-byte aligned.
  tables.sort((a, b) => a.tag - b.tag);
  const pad = (n: number) => (n + 3) & ~3;
  let size = SFNT_HEADER + numTables * SFNT_ENTRY;
  for (const t of tables) size += pad(t.data.length);
  const out = Buffer.alloc(size);
  let pow = 1;
  let log = 0;
  while (pow * 2 <= numTables) {
    pow *= 2;
    log++;
  }
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(pow * 16, 6);
  out.writeUInt16BE(log, 8);
  out.writeUInt16BE(numTables * 16 - pow * 16, 10);
  let offset = SFNT_HEADER + numTables * SFNT_ENTRY;
  tables.forEach((t, i) => {
    const at = SFNT_HEADER + i * SFNT_ENTRY;
    out.writeUInt32BE(t.tag, at);
    out.writeUInt32BE(t.checksum, at + 4);
    out.writeUInt32BE(offset, at + 8);
    out.writeUInt32BE(t.data.length, at + 12);
    t.data.copy(out, offset);
    offset += pad(t.data.length);
  });
  return out;
}
