// The sheet's one layout: an ordered list of items (the cautions and warnings boxes, the timeline
// chart, then each section of cards and tables) built once from the sheet. The HTML page, the PDF
// and the viewer's bake-day page all walk this list in order and draw each item their own way,
// so the printed and the on-screen sheets carry the same lines in the same order
// (tests/shared/sheet-layout.test.ts checks the three against each other). A new section added to
// presentSheet (present.ts) takes its place here by itself, after the ones before it.
// Pure; no I/O.
import { chartModel, productionRange, type ChartModel } from './chart.ts';
import { presentSheet, type PresentOptions, type SectionKey, type SheetBlock, type SheetTable } from './present.ts';
import type { Sheet } from './types.ts';

/** A boxed list at the top: the cautions (solid) and what to check before starting (dashed). */
export interface NoticeItem {
  kind: 'notice';
  key: 'cautions' | 'warnings';
  title: string;
  lines: string[];
}

/** The timeline chart: the whole night, and a close-up of the production morning when the night is long. */
export interface ChartItem {
  kind: 'chart';
  key: 'timeline';
  title: string;
  whole: ChartModel;
  closeUp: { title: string; model: ChartModel } | null;
  /** How to read the chart (under it). */
  caption: string;
}

/** A headed section of blocks: build cards, mix cards, the pick list, the products. */
export interface SectionItem {
  kind: 'section';
  key: SectionKey;
  title: string;
  blocks: SheetBlock[];
}

export type LayoutItem = NoticeItem | ChartItem | SectionItem;

export interface SheetLayout {
  title: string;
  /** The night's facts under the title: first bake out, conditions, mixers. */
  subtitle: string[];
  items: LayoutItem[];
}

export type LayoutOptions = PresentOptions;

const BOXES: NoticeItem['key'][] = ['cautions', 'warnings'];

/** The chart's key in words (the legend names every colour). */
export const CHART_CAPTION = 'Each bar is a step; dashed bars are windows to make a build in; ▼ marks a fold; the dashed line is the first bake out.';

export function layoutSheet(sheet: Sheet, options: LayoutOptions = {}): SheetLayout {
  const p = presentSheet(sheet, options);
  const items: LayoutItem[] = [];
  for (const key of BOXES) {
    const s = p.sections.find((x) => x.key === key);
    if (s) items.push({ kind: 'notice', key, title: s.title, lines: s.blocks.flatMap((b) => b.lines) });
  }
  if (sheet.timeline.length > 0) {
    const whole = chartModel(sheet);
    const morning = productionRange(sheet);
    items.push({
      kind: 'chart',
      key: 'timeline',
      title: 'Timeline',
      whole,
      closeUp: morning ? { title: 'The production morning, closer', model: chartModel(sheet, morning) } : null,
      caption: `${CHART_CAPTION}${whole.clipped ? ' Cooling after the last bake runs past the right edge.' : ''}`,
    });
  }
  for (const s of p.sections) {
    if ((BOXES as string[]).includes(s.key)) continue;
    items.push({ kind: 'section', key: s.key, title: s.title, blocks: s.blocks });
  }
  return { title: p.title, subtitle: p.subtitle, items };
}

function tableTexts(t: SheetTable): string[] {
  return [...t.head, ...t.rows.flat(), ...(t.footer ?? [])].filter((c) => c.trim() !== '');
}

/** A block's texts in reading order: title, facts, large type, weights, steps, blanks. */
export function blockTexts(b: SheetBlock): string[] {
  return [
    ...(b.title ? [b.title] : []),
    ...b.lines,
    ...(b.big ?? []),
    ...(b.table ? tableTexts(b.table) : []),
    ...(b.steps ? tableTexts(b.steps) : []),
    ...(b.blanks ?? []),
  ];
}

/**
 * Every text of the layout in reading order, cell by cell. The chart's own words (lanes, hours,
 * the close-up's heading) are left out: each surface draws the chart its own way, from the same
 * chart models (the viewer as two views of one chart). What the surfaces are compared on.
 */
export function layoutTexts(l: SheetLayout): string[] {
  const out = [l.title, ...l.subtitle];
  for (const item of l.items) {
    out.push(item.title);
    if (item.kind === 'notice') out.push(...item.lines);
    else if (item.kind === 'section') for (const b of item.blocks) out.push(...blockTexts(b));
  }
  return out;
}
