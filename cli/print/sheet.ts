// The batch sheet as terminal text: the presented sections (shared/sheet/present.ts) as plain
// box tables in the look of table.ts, a "[ ]" beside every weight to tick off; and as CSV.
import type { Align, PresentedSheet } from '#shared/sheet/present';
import type { Sheet } from '#shared/sheet/types';
import { roundGrams } from '#shared/units';
import { renderCsv } from './csv.ts';
import { DEFAULT_WIDTH, fitText } from './width.ts';

/** The sheet within `width` columns: long lines wrap, and a table's widest column wraps its cells. */
export function renderSheetText(p: PresentedSheet, width: number = DEFAULT_WIDTH): string {
  const out: string[] = [p.title, ...p.subtitle.map((s) => `  ${s}`), ''];
  for (const section of p.sections) {
    out.push(section.title.toUpperCase(), '');
    for (const b of section.blocks) {
      if (b.title) out.push(b.title);
      for (const l of b.lines) out.push(section.key === 'cautions' || section.key === 'warnings' ? `- ${l}` : `  ${l}`);
      for (const l of b.big ?? []) out.push(`  >> ${l.toUpperCase()}`);
      for (const t of [b.table, b.steps]) {
        if (!t) continue;
        const tk = t.tick.some(Boolean);
        out.push(
          boxTable(
            tk ? [...t.head, ''] : t.head,
            t.rows.map((r, i) => (tk ? [...r, t.tick[i] ? '[ ]' : ''] : r).map((cell) => wrap(cell, WRAP))),
            tk ? [...t.align, 'left'] : t.align,
            t.footer ? (tk ? [...t.footer, ''] : t.footer) : undefined,
            width,
          ),
        );
      }
      if (b.blanks) out.push(`  ${b.blanks.join('   ')}`);
      out.push('');
    }
  }
  return fitText(out.join('\n'), width);
}

/**
 * A table drawn like renderTable (table.ts) draws it, without cli-table3: a 40-order plan has a
 * timeline of several hundred rows, and cli-table3's per-cell ANSI handling made printing it the
 * slowest part of `panform sheet`. The sheet's cells hold no colour codes and no wide characters.
 */
export function boxTable(head: string[], rows: string[][], align: Align[], footer?: string[], maxWidth = Infinity): string {
  let all = [head, ...rows, ...(footer ? [footer] : [])];
  const measure = () => head.map((_, i) => Math.max(...all.map((r) => Math.max(...(r[i] ?? '').split('\n').map((l) => l.length)))));
  let widths = measure();
  // Too wide: the widest column (a step's notes) wraps its cells at spaces, then the next widest,
  // none narrower than 14 characters.
  const total = () => widths.reduce((s, w) => s + w + 3, 1);
  for (let pass = 0; pass < widths.length && total() > maxWidth; pass++) {
    const widest = widths.indexOf(Math.max(...widths));
    const room = Math.max(14, widths[widest] - (total() - maxWidth));
    if (room >= widths[widest]) break;
    all = all.map((r) => r.map((c, i) => (i === widest ? wrap((c ?? '').replace(/\n/g, ' '), room) : c)));
    widths = measure();
  }
  head = all[0];
  rows = all.slice(1, footer ? -1 : undefined);
  if (footer) footer = all[all.length - 1];
  const rule = (l: string, m: string, r: string) => `${l}${widths.map((w) => '─'.repeat(w + 2)).join(m)}${r}`;
  const line = (cells: string[]) => {
    const split = cells.map((c) => (c ?? '').split('\n'));
    const height = Math.max(...split.map((c) => c.length));
    const lines: string[] = [];
    for (let k = 0; k < height; k++) {
      lines.push(`│${split.map((c, i) => ` ${align[i] === 'right' ? (c[k] ?? '').padStart(widths[i]) : (c[k] ?? '').padEnd(widths[i])} `).join('│')}│`);
    }
    return lines.join('\n');
  };
  const out = [rule('┌', '┬', '┐'), line(head), rule('├', '┼', '┤'), ...rows.map(line)];
  if (footer) out.push(rule('├', '┼', '┤'), line(footer));
  out.push(rule('└', '┴', '┘'));
  return out.join('\n');
}

/**
 * The sheet for spreadsheets: one row per weighed line, with its section (preferment, soaker,
 * mix, total). Grams are rounded as printed (1 g, 0.1 g below 100 g); ice and tap water sit on
 * the water line they split, so a column sum counts the water once.
 */
export function renderSheetCsv(sheet: Sheet): string {
  const rows: (string | number | null)[][] = [];
  for (const b of [...sheet.preferments, ...sheet.soakers]) {
    for (const l of b.ingredients) {
      const ice = l.kind === 'water' && b.ice > 0;
      rows.push([
        b.kind === 'soaker' ? 'soaker' : 'preferment', b.formulas.join('+'), b.batches > 1 ? `${b.name} (${b.batch}/${b.batches})` : b.name, '', '',
        l.ingredient, l.seed ? 'culture (seed)' : l.kind, roundGrams(l.grams), ice ? roundGrams(b.ice) : null, ice ? roundGrams(b.tapWater) : null,
        b.waterTemperature === null || l.kind !== 'water' ? null : round1(b.waterTemperature), b.mixFrom ?? '', b.mixUntil,
      ]);
    }
  }
  for (const m of sheet.mixes) {
    for (const l of m.ingredients) {
      const water = l.kind === 'water';
      rows.push([
        'mix', m.formula, m.title, `${m.mixNumber}/${m.of}`, m.mixer, l.ingredient, l.kind, roundGrams(l.grams),
        water && m.ice > 0 ? roundGrams(m.ice) : null, water && m.ice > 0 ? roundGrams(m.tapWater) : null,
        water && m.waterTemperature !== null ? round1(m.waterTemperature) : null, m.start, m.end,
      ]);
    }
  }
  for (const l of sheet.totals) rows.push(['total', '', '', '', '', l.ingredient, l.kind, roundGrams(l.grams), null, null, null, '', '']);
  return renderCsv(
    ['section', 'formula', 'name', 'mix', 'mixer', 'ingredient', 'kind', 'grams', 'ice_grams', 'tap_water_grams', 'water_celsius', 'from', 'until'],
    rows,
  );
}

const WRAP = 56;

/** Long cells (step notes) wrapped onto several lines of a table cell. */
function wrap(text: string, width: number): string {
  if (text.length <= width) return text;
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines.join('\n');
}

const round1 = (x: number) => Math.round(x * 10) / 10;
