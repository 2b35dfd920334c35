// The timeline's lanes and times have one home (shared/sheet/chart.ts): the viewer's chart draws
// the same lanes, in the same order, over the same hours as the printed sheet (HTML and PDF); it
// opens on the close-up when now falls in the production morning, and draws a line for now.
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { buildSheet } from '#shared/sheet/build';
import { layoutSheet, type ChartItem } from '#shared/sheet/layout';
import { renderSheetHtml } from '#shared/sheet/html';
import { openingView, TimelineChart } from '../../../../src/features/plans/components/timeline-chart.tsx';
import { DEMO_PLANS, sheetInput } from '../../../shared/sheet-fixtures.ts';

const chartOf = (plan: string) => {
  const sheet = buildSheet(sheetInput(plan));
  return { sheet, item: layoutSheet(sheet).items.find((i): i is ChartItem => i.kind === 'chart')! };
};

describe('TimelineChart', () => {
  it.each(DEMO_PLANS)('draws the lanes of the printed sheet for %s', (plan) => {
    const { sheet, item } = chartOf(plan);
    const html = renderToStaticMarkup(<TimelineChart item={item} sheet={sheet} now={null} />);
    const lanes = [...html.matchAll(/data-lane="([^"]*)"/g)].map((m) => m[1].replace(/&amp;/g, '&').replace(/&quot;/g, '"').replace(/&#x27;/g, "'"));
    // Twice: the screen chart's lane names and the print chart's.
    const rows = item.whole.rows.map((r) => r.label);
    expect(lanes).toEqual([...rows, ...rows]);
    expect(html).toContain(`${item.whole.rows.length} builds and mixes`);
    // Each bar is a button that says its lane, step and times.
    expect(html).toMatch(/role="button" aria-label="[^"]+: mix \d\d:\d\d–\d\d:\d\d"/);
    // The printed sheet's chart lists the same lanes (shortened to 30 characters there).
    const printed = renderSheetHtml(sheet);
    for (const r of rows) expect(printed).toContain(r.length > 30 ? r.slice(0, 29) : r);
  });

  it('opens on the close-up when now is in the production morning, else on the whole night', () => {
    const { sheet, item } = chartOf(DEMO_PLANS[0]);
    expect(item.closeUp).not.toBeNull();
    const inMorning = item.closeUp!.model.from + 30;
    expect(openingView(item, inMorning)).toBe('close');
    expect(openingView(item, null)).toBe('whole');
    expect(openingView(item, -600)).toBe('whole');
    const html = renderToStaticMarkup(<TimelineChart item={item} sheet={sheet} now={inMorning} />);
    expect(html).toContain('data-view="close"');
    expect(html).toContain('data-testid="now-line"');
    expect(html).toMatch(/Now \d\d:\d\d/);
    // A week away: no line, no words about now.
    const far = renderToStaticMarkup(<TimelineChart item={item} sheet={sheet} now={7 * 1440} />);
    expect(far).not.toContain('now-line');
    expect(far).not.toContain('data-testid="now"');
  });
});
