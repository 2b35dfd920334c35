// The batch sheet as one print-ready HTML page (a string): A4 or Letter through @page, large
// type, a tick box beside every weight, the timeline drawn as an inline SVG chart and the
// cautions in a box at the top. Self-contained: no script, no external file; the caller may pass
// @font-face rules that embed Panform's faces (server/print/fonts.ts), else the page names them
// and falls back to the system's. Pure; no I/O.
import { colourOf, legendOf, type ChartModel } from './chart.ts';
import { layoutSheet, type ChartItem, type NoticeItem, type SectionItem } from './layout.ts';
import type { SheetBlock, SheetTable } from './present.ts';
import { stepWord } from '../step-words.ts';
import type { Sheet } from './types.ts';

export type Paper = 'a4' | 'letter';

export interface HtmlOptions {
  paper?: Paper;
  /** @font-face CSS for the faces in FONTS (e.g. with data: URLs). */
  fontFaceCss?: string;
}

/** Panform's faces, as in the viewer: text, headings and figures (weights, times, temperatures). */
export const FONTS = {
  text: "'Atkinson Hyperlegible Next', 'Atkinson Hyperlegible Next Variable', ui-sans-serif, system-ui, sans-serif",
  heading: "'Fraunces', 'Fraunces Variable', ui-serif, Georgia, serif",
  figures: "'JetBrains Mono', ui-monospace, 'DejaVu Sans Mono', monospace",
} as const;

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

const PAGE_SIZE: Record<Paper, string> = { a4: 'A4 portrait', letter: 'letter portrait' };

function css(paper: Paper, fontFaceCss: string): string {
  return `${fontFaceCss}
@page { size: ${PAGE_SIZE[paper]}; margin: 12mm 11mm 14mm; }
:root { --ink: #2b1e15; --muted: #6a5442; --rule: #d9c6a8; }
* { box-sizing: border-box; }
html { font-family: ${FONTS.text}; color: var(--ink); }
h1, h2, h3 { font-family: ${FONTS.heading}; font-weight: 600; }
td.r, th.r, td.time, .fig { font-family: ${FONTS.figures}; font-variant-ligatures: none; font-variant-numeric: tabular-nums; }
body { margin: 0 auto; max-width: 190mm; padding: 6mm 0; font-size: 10.5pt; line-height: 1.3; }
h1 { font-size: 18pt; margin: 0 0 1.5mm; }
h2 { font-size: 13pt; margin: 4mm 0 1.5mm; padding-bottom: 0.8mm; border-bottom: 0.6mm solid var(--ink); break-after: avoid; }
h3 { font-size: 12pt; margin: 0 0 0.5mm; }
ul.sub { list-style: none; margin: 0 0 2mm; padding: 0; color: var(--muted); font-size: 9pt; }
.block { break-inside: avoid; margin: 0 0 3mm; }
.block p { margin: 0; font-size: 8pt; color: var(--muted); }
table { border-collapse: collapse; margin-top: 1.5mm; }
.grid { display: grid; grid-template-columns: 1fr 1fr 1fr; column-gap: 5mm; }
table.weigh { width: 100%; }
section.totals .grid, section.formulas .grid { display: block; }
section.totals table.weigh { width: auto; min-width: 120mm; }
th, td { padding: 0.6mm 1.8mm; border-bottom: 0.2mm solid var(--rule); vertical-align: top; text-align: left; }
th { font-size: 8pt; color: var(--muted); font-weight: 400; border-bottom: 0.4mm solid var(--ink); }
td.r, th.r { text-align: right; }
table.weigh td.r { font-size: 11pt; font-weight: 700; white-space: nowrap; }
tfoot td { border-top: 0.4mm solid var(--ink); border-bottom: none; font-weight: 700; }
td.tick { width: 7mm; padding-left: 1mm; }
.tick span { display: inline-block; width: 4.2mm; height: 4.2mm; border: 0.45mm solid var(--ink); border-radius: 0.6mm; vertical-align: middle; }
table.steps { font-size: 9.5pt; width: 100%; margin-top: 2mm; }
table.steps td { padding: 0.6mm 1.5mm; }
table.steps td.time { white-space: nowrap; }
section.mixes .block { border: 0.5mm solid var(--ink); border-radius: 2mm; padding: 2mm 3mm; display: grid; grid-template-columns: 62mm 1fr auto; column-gap: 4mm; align-items: start; }
section.mixes .block > :not(table) { grid-column: 1 / -1; }
section.mixes .block > h3 { grid-column: 1 / 3; grid-row: 1; }
section.mixes .block > .big { grid-column: 3; grid-row: 1; justify-self: end; margin: 0; }
section.mixes .block > table.weigh { grid-column: 1; }
section.mixes .block > table.steps { grid-column: 2 / -1; }
section.mixes .grid { display: block; }
section.mixes table.weigh td { padding: 0.4mm 1.2mm; }
section.mixes table.weigh td.r { font-size: 10.5pt; }
section.mixes table.steps { font-size: 7.5pt; margin-top: 1.5mm; }
section.mixes table.steps td { padding: 0.3mm 1.2mm; }
.block p { line-height: 1.25; }
.big { font-size: 14pt; font-weight: 700; margin: 0.5mm 0; }
.big span { margin-right: 8mm; }
.blanks { display: flex; gap: 10mm; margin-top: 2mm; font-size: 9.5pt; }
.box { border: 0.7mm solid var(--ink); border-radius: 2mm; padding: 2mm 3.5mm; margin: 2mm 0; break-inside: avoid; }
.box h2 { margin-top: 0; border: none; font-size: 12pt; }
.box ul { margin: 0; padding-left: 5mm; font-size: 8.5pt; }
.box.warnings { border-style: dashed; }
figure.chart { margin: 2mm 0 4mm; break-inside: avoid; }
.closeup { break-inside: avoid; }
figure.chart svg { width: 100%; height: auto; display: block; }
figure.chart figcaption { font-size: 9pt; color: var(--muted); }
@media screen { body { padding: 8mm; } }
@media print { h2 { break-after: avoid; } }`;
}

function table(t: SheetTable, cls: string): string {
  const tick = t.tick.some(Boolean);
  const alignCls = (i: number) => (t.align[i] === 'right' ? ' class="r"' : '');
  const head = `<thead><tr>${t.head.map((h, i) => `<th${alignCls(i)}>${escapeHtml(h)}</th>`).join('')}${tick ? '<th class="r">✓</th>' : ''}</tr></thead>`;
  const body = t.rows
    .map(
      (r, ri) =>
        `<tr>${r.map((c, i) => `<td${cls === 'steps' && i === 0 ? ' class="time"' : alignCls(i)}>${escapeHtml(c)}</td>`).join('')}${
          tick ? `<td class="tick">${t.tick[ri] ? '<span aria-label="tick box"></span>' : ''}</td>` : ''
        }</tr>`,
    )
    .join('');
  const foot = t.footer ? `<tfoot><tr>${t.footer.map((c, i) => `<td${alignCls(i)}>${escapeHtml(c)}</td>`).join('')}${tick ? '<td></td>' : ''}</tr></tfoot>` : '';
  return `<table class="${cls}">${head}<tbody>${body}</tbody>${foot}</table>`;
}

function block(b: SheetBlock, cls: string): string {
  return `<div class="block">${b.title ? `<h3>${escapeHtml(b.title)}</h3>` : ''}${b.lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('')}${
    b.big && b.big.length > 0 ? `<div class="big">${b.big.map((l) => `<span>${escapeHtml(l)}</span>`).join('')}</div>` : ''
  }${b.table ? table(b.table, cls) : ''}${b.steps ? table(b.steps, 'steps') : ''}${
    b.blanks ? `<div class="blanks">${b.blanks.map((l) => `<span>${escapeHtml(l)}</span>`).join('')}</div>` : ''
  }</div>`;
}

function section(s: SectionItem): string {
  const cls = s.key === 'formulas' ? 'summary' : 'weigh';
  const blocks = s.blocks.map((b) => block(b, cls)).join('');
  return `<section class="${s.key}"><h2>${escapeHtml(s.title)}</h2>${cls === 'weigh' ? `<div class="grid">${blocks}</div>` : blocks}</section>`;
}

function box(n: NoticeItem): string {
  return `<section class="box ${n.key}"><h2>${escapeHtml(n.title)}</h2><ul>${n.lines.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}</ul></section>`;
}

function chart(c: ChartItem): string {
  return `<section class="chart"><h2>${escapeHtml(c.title)}</h2><figure class="chart">${timelineSvg(c.whole)}<figcaption>${escapeHtml(c.caption)}</figcaption></figure>${
    c.closeUp ? `<div class="closeup"><h3>${escapeHtml(c.closeUp.title)}</h3><figure class="chart">${timelineSvg(c.closeUp.model)}</figure></div>` : ''
  }</section>`;
}

/** The timeline chart as SVG: rows of bars, hour ticks, a line at the first bake out. */
export function timelineSvg(m: ChartModel): string {
  const W = 760;
  const labelW = 190;
  const rowH = 15;
  const top = 32;
  const span = Math.max(1, m.to - m.from);
  const x = (minute: number) => labelW + ((Math.min(Math.max(minute, m.from), m.to) - m.from) / span) * (W - labelW - 6);
  const out: string[] = [];
  const svgAt = out.length;
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} __H__" role="img" aria-label="Timeline chart" font-family="${escapeHtml(FONTS.text)}">`);
  for (const t of m.ticks) {
    const tx = x(t.minute).toFixed(1);
    out.push(`<line x1="${tx}" y1="${top - 4}" x2="${tx}" y2="${top + m.rows.length * rowH}" stroke="#d9c6a8" stroke-width="0.6"/>`);
    out.push(`<text x="${tx}" y="${top - 7}" font-size="9" text-anchor="middle" fill="#6a5442">${escapeHtml(t.label)}</text>`);
    if (t.day) out.push(`<text x="${tx}" y="${top - 18}" font-size="9" font-weight="700" text-anchor="middle" fill="#2b1e15">${escapeHtml(t.day)}</text>`);
  }
  m.rows.forEach((row, i) => {
    const y = top + i * rowH;
    if (i % 2 === 1) out.push(`<rect x="0" y="${y}" width="${W}" height="${rowH}" fill="#f5eddf"/>`);
    out.push(`<text x="4" y="${y + rowH - 4}" font-size="9.5" fill="#2b1e15">${escapeHtml(truncate(row.label, 30))}</text>`);
    for (const b of row.bars) {
      if (b.to < m.from || b.from > m.to) continue;
      const x1 = x(b.from);
      const w = Math.max(b.to > b.from ? 1.5 : 0, x(b.to) - x1);
      if (w === 0) {
        out.push(`<line x1="${x1.toFixed(1)}" y1="${y + 2}" x2="${x1.toFixed(1)}" y2="${y + rowH - 2}" stroke="${colourOf(b.step)}" stroke-width="1.4"/>`);
        continue;
      }
      const dash = b.window ? ' stroke-dasharray="3 2"' : '';
      out.push(
        `<rect x="${x1.toFixed(1)}" y="${y + 2.5}" width="${w.toFixed(1)}" height="${rowH - 5}" fill="${colourOf(b.step)}" stroke="#2b1e15" stroke-width="0.5"${dash}><title>${escapeHtml(stepWord(b.step))}</title></rect>`,
      );
      for (const f of b.folds) {
        const fx = x(f).toFixed(1);
        out.push(`<path d="M${fx} ${y + 1} l-2.5 -0 l2.5 4 l2.5 -4 z" fill="#2b1e15"/>`);
      }
    }
  });
  if (m.readyBy >= m.from && m.readyBy <= m.to) {
    const rx = x(m.readyBy).toFixed(1);
    out.push(`<line x1="${rx}" y1="${top - 4}" x2="${rx}" y2="${top + m.rows.length * rowH}" stroke="#2b1e15" stroke-width="1.4" stroke-dasharray="4 2"/>`);
  }
  // The legend wraps onto as many lines as it needs: every colour drawn is named.
  let ly = top + m.rows.length * rowH + 8;
  let lx = 4;
  const item = (w: number) => {
    if (lx + w > W) {
      lx = 4;
      ly += 14;
    }
  };
  for (const p of legendOf(m)) {
    item(20 + p.label.length * 5.6);
    out.push(`<rect x="${lx}" y="${ly}" width="12" height="9" fill="${p.colour}" stroke="#2b1e15" stroke-width="0.5"${p.group === 'build' ? ' stroke-dasharray="3 2"' : ''}/>`);
    out.push(`<text x="${lx + 15}" y="${ly + 8}" font-size="9" fill="#2b1e15">${escapeHtml(p.label)}</text>`);
    lx += 22 + p.label.length * 5.6;
  }
  item(50);
  out.push(`<path d="M${lx + 6} ${ly} l-3 0 l3 5 l3 -5 z" fill="#2b1e15"/><text x="${lx + 13}" y="${ly + 8}" font-size="9" fill="#2b1e15">fold</text>`);
  lx += 50;
  item(110);
  out.push(`<line x1="${lx}" y1="${ly - 1}" x2="${lx}" y2="${ly + 10}" stroke="#2b1e15" stroke-width="1.4" stroke-dasharray="4 2"/><text x="${lx + 5}" y="${ly + 8}" font-size="9" fill="#2b1e15">first bake out</text>`);
  out[svgAt] = out[svgAt].replace('__H__', String(ly + 16));
  out.push('</svg>');
  return out.join('');
}

function truncate(s: string, n: number): string {
  return s.length <= n ? s : `${s.slice(0, n - 1)}…`;
}

export function renderSheetHtml(sheet: Sheet, options: HtmlOptions = {}): string {
  const layout = layoutSheet(sheet);
  const paper = options.paper ?? 'a4';
  const body: string[] = [];
  body.push(`<header><h1>${escapeHtml(layout.title)}</h1><ul class="sub">${layout.subtitle.map((s) => `<li>${escapeHtml(s)}</li>`).join('')}</ul></header>`);
  for (const item of layout.items) body.push(item.kind === 'notice' ? box(item) : item.kind === 'chart' ? chart(item) : section(item));
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(layout.title)}</title>
<style>
${css(paper, options.fontFaceCss ?? '')}
</style>
</head>
<body>
${body.join('\n')}
</body>
</html>
`;
}
