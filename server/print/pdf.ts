// The batch sheet as a PDF, drawn with pdfkit in Panform's own faces (no browser): the
// sheet's one layout (shared/sheet/layout.ts), item by item in its order, as the HTML page and
// the viewer draw it; tick boxes
// beside every weight, the timeline chart drawn with vector shapes, the cautions in a box.
//
//   const pdf = await renderSheetPdf(sheet, { paper: 'a4' });   // Buffer
//
// Panform's faces (server/print/fonts.ts) are read from the installed packages unless passed in.
import PDFDocument from 'pdfkit';
import { colourOf, legendOf, type ChartModel } from '#shared/sheet/chart';
import { layoutSheet, type ChartItem, type NoticeItem, type SectionItem } from '#shared/sheet/layout';
import type { SheetBlock, SheetTable } from '#shared/sheet/present';
import type { Sheet } from '#shared/sheet/types';
import type { UnitSystem } from '#shared/units';
import { PRINT_FACES, readPrintFonts, type PrintFace } from './fonts.ts';

export type Paper = 'a4' | 'letter';

/** Font bytes pdfkit reads for each face: TrueType, OpenType or WOFF (not WOFF2: see fonts.ts). */
export type PdfFonts = Record<PrintFace, Uint8Array>;

export interface PdfOptions {
  paper?: Paper;
  fonts?: PdfFonts;
  /** Metric unless the reader chose US customary units (the viewer's setting). */
  units?: UnitSystem;
}

type Doc = InstanceType<typeof PDFDocument>;

const MARGIN = { top: 36, bottom: 42, left: 34, right: 34 };
// Ligatures off: JetBrains Mono joins "->", "<=" and the like, which a weighing sheet must not do.
const FEATURES = { liga: false, calt: false, clig: false, dlig: false } as unknown as never;
const INK = '#2b1e15';
const MUTED = '#6a5442';

/**
 * The latin subset has no narrow no-break space (formatGrams' thousands separator): use a no-break
 * space. A figure and its unit stay on one line ("4 978 g", "20 min", "230 °C").
 */
function clean(s: string): string {
  return s.replace(/\u202f/g, '\u00a0').replace(/(\d) (g|kg|oz|lb|°C|°F|min|h)(?![\p{L}])/gu, '$1\u00a0$2');
}

class Writer {
  y: number;
  left = MARGIN.left;
  width: number;
  readonly bottom: number;

  constructor(readonly doc: Doc) {
    this.y = MARGIN.top;
    this.width = doc.page.width - MARGIN.left - MARGIN.right;
    this.bottom = doc.page.height - MARGIN.bottom;
  }

  font(size: number, face: PrintFace = 'text'): this {
    this.doc.font(face).fontSize(size);
    return this;
  }

  private readonly widths = new Map<string, number>();

  /** Width at 1 pt, measured once per string and face: layouts with features set are not cached by pdfkit. */
  widthOf(s: string, size: number, face: PrintFace = 'text'): number {
    const key = `${face}\u0000${s}`;
    let unit = this.widths.get(key);
    if (unit === undefined) {
      this.font(1000, face);
      unit = this.doc.widthOfString(clean(s), { features: FEATURES }) / 1000;
      this.widths.set(key, unit);
    }
    return unit * size;
  }

  heightOf(s: string, size: number, width: number, face: PrintFace = 'text'): number {
    this.font(size, face);
    return this.doc.heightOfString(clean(s), { width, features: FEATURES, lineGap: 1 });
  }

  text(s: string, x: number, y: number, o: { size: number; bold?: boolean; face?: PrintFace; width?: number; align?: 'left' | 'right' | 'center'; colour?: string }): void {
    this.font(o.size, o.face ?? (o.bold ? 'text-bold' : 'text'));
    this.doc.fillColor(o.colour ?? INK).text(clean(s), x, y, {
      width: o.width,
      align: o.align ?? 'left',
      lineBreak: o.width !== undefined,
      lineGap: 1,
      features: FEATURES,
    });
  }

  /** Starts a new page when `h` points do not fit on this one. */
  ensure(h: number): void {
    if (this.y + h > this.bottom && this.y > MARGIN.top + 1) this.newPage();
  }

  newPage(): void {
    this.doc.addPage();
    this.y = MARGIN.top;
  }

  paragraph(s: string, size: number, o: { bold?: boolean; face?: PrintFace; colour?: string; indent?: number; gap?: number } = {}): void {
    const x = this.left + (o.indent ?? 0);
    const w = this.width - (o.indent ?? 0);
    const face = o.face ?? (o.bold ? 'text-bold' : 'text');
    const h = this.heightOf(s, size, w, face);
    this.ensure(h);
    this.text(s, x, this.y, { size, face, width: w, colour: o.colour });
    this.y += h + (o.gap ?? 1);
  }
}

function sectionTitle(w: Writer, title: string, keepWith = 150): void {
  w.ensure(28 + keepWith);
  w.y += 6;
  w.text(title, w.left, w.y, { size: 13, face: 'heading' });
  w.y += 16;
  w.doc.moveTo(w.left, w.y).lineTo(w.left + w.width, w.y).lineWidth(1.2).strokeColor(INK).stroke();
  w.y += 5;
}

interface TableStyle {
  size: number;
  weightSize: number;
  pad: number;
  /** Column that may wrap when the table is too wide (the last left-aligned one). */
  wrapColumn?: number;
  maxWidth?: number;
  /** Smallest width per column, so that the weights and tick boxes of one section line up. */
  minWidths?: number[];
}

const TICK_W = 22;

function drawTable(w: Writer, t: SheetTable, s: TableStyle): void {
  const tick = t.tick.some(Boolean);
  const cols = t.head.length;
  const bold = (i: number) => t.align[i] === 'right' && s.weightSize > s.size;
  const sizeOf = (i: number) => (bold(i) ? s.weightSize : s.size);
  // Figures (weights, counts) in the figures face, words in the text face.
  const faceOf = (i: number, strong = false): PrintFace =>
    t.align[i] === 'right' ? (bold(i) || strong ? 'figures-bold' : 'figures') : strong ? 'text-bold' : 'text';
  const widths = Array.from({ length: cols }, (_, i) => {
    const cells = [t.head[i], ...t.rows.map((r) => r[i]), ...(t.footer ? [t.footer[i]] : [])];
    const widest = Math.max(...cells.map((c) => w.widthOf(c ?? '', sizeOf(i), faceOf(i, t.footer !== undefined && c === t.footer[i])))) + 2 * s.pad;
    return Math.max(widest, s.minWidths?.[i] ?? 0);
  });
  const avail = Math.min(s.maxWidth ?? w.width, w.width) - (tick ? TICK_W : 0);
  let total = widths.reduce((a, b) => a + b, 0);
  if (total > avail && s.wrapColumn !== undefined) {
    widths[s.wrapColumn] = Math.max(60, widths[s.wrapColumn] - (total - avail));
    total = widths.reduce((a, b) => a + b, 0);
  }
  const xs: number[] = [];
  let x = w.left;
  for (const cw of widths) {
    xs.push(x);
    x += cw;
  }
  const tickX = x;
  const tableW = total + (tick ? TICK_W : 0);
  const rowHeight = (r: string[]) =>
    Math.max(...r.map((c, i) => (i === s.wrapColumn ? w.heightOf(c, sizeOf(i), widths[i] - 2 * s.pad) : sizeOf(i) * 1.2))) + 2 * s.pad;

  const drawHead = () => {
    const h = s.size * 1.2 + 2 * s.pad;
    t.head.forEach((c, i) =>
      w.text(c, xs[i] + s.pad, w.y + s.pad, { size: s.size - 1, width: widths[i] - 2 * s.pad, align: t.align[i], colour: MUTED }),
    );
    w.y += h;
    w.doc.moveTo(w.left, w.y).lineTo(w.left + tableW, w.y).lineWidth(0.8).strokeColor(INK).stroke();
  };

  w.ensure(s.size * 1.2 * 3 + 6 * s.pad);
  drawHead();
  t.rows.forEach((r, ri) => {
    const h = rowHeight(r);
    if (w.y + h > w.bottom) {
      w.newPage();
      drawHead();
    }
    r.forEach((c, i) =>
      w.text(c, xs[i] + s.pad, w.y + s.pad, { size: sizeOf(i), face: faceOf(i), width: widths[i] - 2 * s.pad, align: t.align[i] }),
    );
    if (tick && t.tick[ri]) {
      const box = Math.min(12, h - 4);
      w.doc.rect(tickX + 6, w.y + (h - box) / 2, box, box).lineWidth(1).strokeColor(INK).stroke();
    }
    w.y += h;
    w.doc.moveTo(w.left, w.y).lineTo(w.left + tableW, w.y).lineWidth(0.3).strokeColor('#d9c6a8').stroke();
  });
  if (t.footer) {
    const h = s.size * 1.2 + 2 * s.pad;
    if (w.y + h > w.bottom) w.newPage();
    w.doc.moveTo(w.left, w.y).lineTo(w.left + tableW, w.y).lineWidth(0.8).strokeColor(INK).stroke();
    const fh = Math.max(...t.footer.map((_, i) => sizeOf(i))) * 1.2 + 2 * s.pad;
    t.footer.forEach((c, i) => w.text(c, xs[i] + s.pad, w.y + s.pad, { size: sizeOf(i), face: faceOf(i, true), width: widths[i] - 2 * s.pad, align: t.align[i] }));
    w.y += Math.max(h, fh);
  }
}

function box(w: Writer, notice: NoticeItem): void {
  const dashed = notice.key === 'warnings';
  const lines = notice.lines;
  const inner = w.width - 24;
  const heights = lines.map((l) => w.heightOf(`• ${l}`, 8.5, inner));
  const h = 24 + heights.reduce((a, b) => a + b + 2, 0) + 6;
  w.ensure(h);
  const top = w.y;
  w.doc.roundedRect(w.left, top, w.width, h, 5).lineWidth(1.6);
  if (dashed) w.doc.dash(4, { space: 3 });
  w.doc.strokeColor(INK).stroke();
  w.doc.undash();
  w.text(notice.title, w.left + 12, top + 8, { size: 12, face: 'heading' });
  let y = top + 26;
  lines.forEach((l, i) => {
    w.text(`• ${l}`, w.left + 12, y, { size: 8.5, width: inner });
    y += heights[i] + 2;
  });
  w.y = top + h + 8;
}

/** A chart lane's height, pt. */
const CHART_ROW = 8;

function chart(w: Writer, m: ChartModel): void {
  const rowH = CHART_ROW;
  const labelW = 150;
  const top = 24;
  const h = top + m.rows.length * rowH + 26;
  w.ensure(h);
  const y0 = w.y + top;
  const span = Math.max(1, m.to - m.from);
  const x = (minute: number) => w.left + labelW + ((Math.min(Math.max(minute, m.from), m.to) - m.from) / span) * (w.width - labelW - 4);
  const doc = w.doc;
  m.rows.forEach((_, i) => {
    if (i % 2 === 1) doc.rect(w.left, y0 + i * rowH, w.width, rowH).fillColor('#f5eddf').fill();
  });
  for (const t of m.ticks) {
    const tx = x(t.minute);
    doc.moveTo(tx, y0 - 3).lineTo(tx, y0 + m.rows.length * rowH).lineWidth(0.4).strokeColor('#d9c6a8').stroke();
    w.text(t.label, tx - 40, y0 - 11, { size: 6.5, face: 'figures', width: 80, align: 'center', colour: MUTED });
    if (t.day) w.text(t.day, tx - 40, y0 - 20, { size: 6.5, bold: true, width: 80, align: 'center' });
  }
  m.rows.forEach((row, i) => {
    const y = y0 + i * rowH;
    const label = row.label.length > 30 ? `${row.label.slice(0, 29)}…` : row.label;
    w.text(label, w.left + 2, y + 2, { size: 7 });
    for (const b of row.bars) {
      if (b.to < m.from || b.from > m.to) continue;
      const x1 = x(b.from);
      const bw = x(b.to) - x1;
      if (bw <= 0) {
        doc.moveTo(x1, y + 1.5).lineTo(x1, y + rowH - 1.5).lineWidth(1).strokeColor(colourOf(b.step)).stroke();
        continue;
      }
      doc.rect(x1, y + 2, Math.max(1, bw), rowH - 4).fillColor(colourOf(b.step)).fill();
      doc.rect(x1, y + 2, Math.max(1, bw), rowH - 4).lineWidth(0.4);
      if (b.window) doc.dash(2, { space: 1.5 });
      doc.strokeColor(INK).stroke();
      doc.undash();
      for (const f of b.folds) {
        const fx = x(f);
        doc.polygon([fx - 2, y + 0.5], [fx + 2, y + 0.5], [fx, y + 4]).fillColor(INK).fill();
      }
    }
  });
  if (m.readyBy >= m.from && m.readyBy <= m.to) {
    const rx = x(m.readyBy);
    doc.moveTo(rx, y0 - 3).lineTo(rx, y0 + m.rows.length * rowH).lineWidth(1).dash(3, { space: 2 }).strokeColor(INK).stroke();
    doc.undash();
  }
  let lx = w.left;
  let ly = y0 + m.rows.length * rowH + 7;
  // The legend wraps onto as many lines as it needs: every colour drawn is named.
  const item = (width: number) => {
    if (lx + width > w.left + w.width) {
      lx = w.left;
      ly += 11;
    }
  };
  for (const p of legendOf(m)) {
    item(18 + w.widthOf(p.label, 6.5));
    doc.rect(lx, ly, 9, 7).fillColor(p.colour).fill();
    doc.rect(lx, ly, 9, 7).lineWidth(0.4);
    if (p.group === 'build') doc.dash(2, { space: 1.5 });
    doc.strokeColor(INK).stroke();
    doc.undash();
    w.text(p.label, lx + 12, ly, { size: 6.5 });
    lx += 18 + w.widthOf(p.label, 6.5);
  }
  item(36);
  doc.polygon([lx + 1, ly], [lx + 7, ly], [lx + 4, ly + 5]).fillColor(INK).fill();
  w.text('fold', lx + 10, ly, { size: 6.5 });
  lx += 36;
  item(70);
  doc.moveTo(lx, ly - 1).lineTo(lx, ly + 8).lineWidth(1).dash(3, { space: 2 }).strokeColor(INK).stroke();
  doc.undash();
  w.text('first bake out', lx + 4, ly, { size: 6.5 });
  w.y = ly + 12;
}

const WEIGH_STYLE: TableStyle = { size: 9.5, weightSize: 10.5, pad: 1.7, minWidths: [110, 62] };
const STEP_STYLE: TableStyle = { size: 7.5, weightSize: 7.5, pad: 1.2, wrapColumn: 2, minWidths: [0, 40] };
const WEIGH_W = 190;
/** Size of a card's facts under its title. */
const CARD_LINE = 8;
const GAP = 12;

/** How tall a mix's card draws, pt (its title, facts, weights beside steps, blanks). */
function cardHeight(w: Writer, b: SheetBlock): number {
  const big = b.big && b.big.length > 0 ? b.big.join('     ') : '';
  const beside = big !== '' && b.title !== '' && w.widthOf(b.title, 12, 'heading') + w.widthOf(big, 14, 'text-bold') + 24 <= w.width;
  const head = 18 + b.lines.reduce((a, l) => a + w.heightOf(l, CARD_LINE, w.width - 8) + 1, 0) + (big && !beside ? 18 : 0);
  const weighH = ((b.table?.rows.length ?? 0) + 2) * (WEIGH_STYLE.weightSize * 1.2 + 2 * WEIGH_STYLE.pad);
  const stepsW = w.width - WEIGH_W - GAP;
  const stepsH = (b.steps?.rows ?? []).reduce(
    (a, r) => a + Math.max(STEP_STYLE.size * 1.2, w.heightOf(r[2], STEP_STYLE.size, stepsW - 140)) + 2 * STEP_STYLE.pad,
    STEP_STYLE.size * 1.2 + 2 * STEP_STYLE.pad,
  );
  return head + Math.max(weighH, stepsH) + 26;
}

/** A mix's card: its facts, the water in large type, the weights beside its own steps, the blanks. */
function card(w: Writer, b: SheetBlock): void {
  // The water in large type on the title's line, at the right, when both fit; else under the facts.
  const big = b.big && b.big.length > 0 ? b.big.join('     ') : '';
  const beside = big !== '' && b.title !== '' && w.widthOf(b.title, 12, 'heading') + w.widthOf(big, 14, 'text-bold') + 24 <= w.width;
  const weighH = ((b.table?.rows.length ?? 0) + 2) * (WEIGH_STYLE.weightSize * 1.2 + 2 * WEIGH_STYLE.pad);
  const stepsW = w.width - WEIGH_W - GAP;
  const stepsH = (b.steps?.rows ?? []).reduce(
    (a, r) => a + Math.max(STEP_STYLE.size * 1.2, w.heightOf(r[2], STEP_STYLE.size, stepsW - 140)) + 2 * STEP_STYLE.pad,
    STEP_STYLE.size * 1.2 + 2 * STEP_STYLE.pad,
  );
  const height = cardHeight(w, b);
  w.ensure(height);
  const top = w.y;
  const page = w.doc.bufferedPageRange().count;
  const titleY = w.y;
  if (b.title) {
    w.paragraph(b.title, 12, { face: 'heading', gap: 0.5 });
    if (beside) w.y = Math.max(w.y, titleY + 17);
  }
  for (const l of b.lines) w.paragraph(l, CARD_LINE, { indent: 8, colour: MUTED, gap: 0.5 });
  // Drawn after the facts, as the layout reads (title, facts, large type), though set on the title's line.
  if (beside) w.text(big, w.left, titleY - 1, { size: 14, face: 'text-bold', width: w.width, align: 'right' });
  if (big && !beside) {
    w.text(big, w.left + 8, w.y + 1, { size: 14, face: 'text-bold', width: w.width - 8 });
    w.y += 18;
  }
  const fits = w.y + Math.max(weighH, stepsH) + 22 <= w.bottom;
  const start = w.y;
  if (fits && b.steps) {
    // Side by side: weights on the left, the steps on the right.
    const [left, width] = [w.left, w.width];
    w.width = WEIGH_W;
    if (b.table) drawTable(w, b.table, WEIGH_STYLE);
    const weighEnd = w.y;
    w.y = start;
    w.left = left + WEIGH_W + GAP;
    w.width = stepsW;
    drawTable(w, b.steps, STEP_STYLE);
    w.left = left;
    w.width = width;
    w.y = Math.max(w.y, weighEnd);
  } else {
    if (b.table) drawTable(w, b.table, { ...WEIGH_STYLE, maxWidth: 380 });
    w.y += 4;
    if (b.steps) drawTable(w, b.steps, STEP_STYLE);
  }
  if (b.blanks) {
    w.ensure(18);
    w.y += 7;
    w.text(b.blanks.join('        '), w.left + 8, w.y, { size: 9.5, width: w.width - 8 });
    w.y += 12;
  }
  // The card's frame, when it stayed on one page.
  if (w.doc.bufferedPageRange().count === page) w.doc.roundedRect(w.left - 6, top - 4, w.width + 12, w.y - top + 3, 4).lineWidth(0.8).strokeColor(INK).stroke();
  w.y += 9;
}

const BUILD_STYLE: TableStyle = { size: 8.5, weightSize: 10, pad: 1.5, wrapColumn: 0, minWidths: [80, 52] };

function buildHeight(w: Writer, b: SheetBlock, width: number): number {
  const lines = b.lines.reduce((a, l) => a + w.heightOf(l, CARD_LINE, width - 6) + 0.5, 0);
  return 16 + lines + ((b.table?.rows.length ?? 0) + 2) * (BUILD_STYLE.weightSize * 1.2 + 2 * BUILD_STYLE.pad) + 6;
}

const BUILD_COLUMNS = 3;

/** Up to three blocks (builds) side by side, each in a third of the width. */
function columns(w: Writer, blocks: SheetBlock[]): void {
  const half = (w.width - GAP * (BUILD_COLUMNS - 1)) / BUILD_COLUMNS;
  w.ensure(Math.max(...blocks.map((b) => buildHeight(w, b, half))));
  const [left, width, start] = [w.left, w.width, w.y];
  let end = start;
  blocks.forEach((b, i) => {
    w.left = left + i * (half + GAP);
    w.width = half;
    w.y = start;
    if (b.title) w.paragraph(b.title, 11.5, { face: 'heading', gap: 0.5 });
    for (const l of b.lines) w.paragraph(l, CARD_LINE, { indent: 6, colour: MUTED, gap: 0.5 });
    if (b.table) drawTable(w, b.table, BUILD_STYLE);
    end = Math.max(end, w.y);
  });
  w.left = left;
  w.width = width;
  w.y = end + 9;
}

function timeline(w: Writer, c: ChartItem): void {
  sectionTitle(w, c.title, 24 + c.whole.rows.length * CHART_ROW + 42);
  chart(w, c.whole);
  w.paragraph(c.caption, 7, { colour: MUTED });
  if (c.closeUp) {
    const zoom = c.closeUp.model;
    w.ensure(40 + zoom.rows.length * CHART_ROW + 42);
    w.y += 6;
    w.paragraph(c.closeUp.title, 12, { face: 'heading', gap: 2 });
    chart(w, zoom);
  }
}

function section(w: Writer, s: SectionItem): void {
  const builds = s.key === 'cultures' || s.key === 'preferments' || s.key === 'soakers';
  const colW = (w.width - GAP * (BUILD_COLUMNS - 1)) / BUILD_COLUMNS;
  // A section's title stays with its first card or row of builds.
  const keep = s.key === 'mixes' ? (s.blocks[0] ? cardHeight(w, s.blocks[0]) : 0) : s.key === 'equipment' ? 240 : s.key === 'totals' ? 200 : builds ? Math.max(0, ...s.blocks.slice(0, BUILD_COLUMNS).map((b) => buildHeight(w, b, colW))) : 120;
  sectionTitle(w, s.title, keep);
  if (builds) {
    // Builds three by three, side by side.
    for (let i = 0; i < s.blocks.length; i += BUILD_COLUMNS) columns(w, s.blocks.slice(i, i + BUILD_COLUMNS));
    return;
  }
  for (const b of s.blocks) {
    if (s.key === 'mixes') {
      card(w, b);
      continue;
    }
    const style: TableStyle =
      s.key === 'formulas'
        ? { size: 8.5, weightSize: 8.5, pad: 2.2 }
        : { size: 9.5, weightSize: 10.5, pad: 1.8, maxWidth: 380, minWidths: s.key === 'totals' ? [110, 50, 70] : [200, 90] };
    const rowH = style.weightSize * 1.2 + 2 * style.pad;
    // A long list of weights goes in two columns, its rows in order down the left, then the right.
    const halves = b.table && b.table.rows.length > 12 && b.table.tick.some(Boolean) ? split(b.table) : null;
    const rows = b.table ? (halves ? halves[0].rows.length : b.table.rows.length) + 2 : 0;
    // Keep a block's title and lines with its table; a table of up to 24 rows stays on one page.
    const head = (b.title ? 16 : 0) + b.lines.reduce((a, l) => a + w.heightOf(l, 9, w.width - 8) + 1, 0);
    w.ensure(head + Math.min(rows, 26) * rowH + 8);
    if (b.title) w.paragraph(b.title, 12.5, { face: 'heading', gap: 2 });
    for (const l of b.lines) w.paragraph(l, 9, { indent: 8 });
    if (halves) {
      const [left, width, start] = [w.left, w.width, w.y];
      const half = (width - GAP * 2) / 2;
      w.width = half;
      drawTable(w, halves[0], style);
      w.y = start;
      w.left = left + half + GAP * 2;
      drawTable(w, halves[1], style);
      w.left = left;
      w.width = width;
    } else if (b.table) drawTable(w, b.table, style);
    w.y += 10;
  }
}

/** A table cut in two: the first half of its rows, then the rest with the footer. */
function split(t: SheetTable): [SheetTable, SheetTable] {
  const n = Math.ceil(t.rows.length / 2);
  return [
    { ...t, rows: t.rows.slice(0, n), tick: t.tick.slice(0, n), footer: undefined },
    { ...t, rows: t.rows.slice(n), tick: t.tick.slice(n) },
  ];
}

export async function renderSheetPdf(sheet: Sheet, options: PdfOptions = {}): Promise<Buffer> {
  const fonts = options.fonts ?? readPrintFonts();
  const p = layoutSheet(sheet, { units: options.units });
  const doc = new PDFDocument({
    size: options.paper === 'letter' ? 'LETTER' : 'A4',
    margins: MARGIN,
    bufferPages: true,
    autoFirstPage: true,
    info: { Title: p.title, Author: 'Panform', Subject: `Batch sheet for ${sheet.date}` },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve, reject) => {
    doc.on('end', () => resolve());
    doc.on('error', reject);
  });
  for (const face of PRINT_FACES) doc.registerFont(face, Buffer.from(fonts[face]));

  const w = new Writer(doc);
  w.paragraph(p.title, 18, { face: 'heading', gap: 4 });
  for (const s of p.subtitle) w.paragraph(s, 9, { colour: MUTED });
  w.y += 6;
  for (const item of p.items) {
    if (item.kind === 'notice') box(w, item);
    else if (item.kind === 'chart') timeline(w, item);
    else section(w, item);
  }

  const range = doc.bufferedPageRange();
  for (let i = 0; i < range.count; i++) {
    doc.switchToPage(range.start + i);
    // Drawing in the bottom margin must not add a page: write with the margin lifted.
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    w.text(`${p.title} · page ${i + 1} of ${range.count}`, MARGIN.left, doc.page.height - 28, { size: 7, width: w.width, align: 'center', colour: MUTED });
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  await done;
  return Buffer.concat(chunks);
}
