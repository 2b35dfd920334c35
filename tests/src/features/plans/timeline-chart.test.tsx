// The timeline's lanes and times have one home (shared/sheet/chart.ts): the viewer's chart draws
// the same lanes, in the same order, over the same hours as the printed sheet (HTML and PDF).
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { buildSheet } from '#shared/sheet/build';
import { chartModel } from '#shared/sheet/chart';
import { clockOf, localDateTime } from '#shared/sheet/time';
import { renderSheetHtml } from '#shared/sheet/html';
import { TimelineChart } from '../../../../src/features/plans/components/timeline-chart.tsx';
import { DEMO_PLANS, sheetInput } from '../../../shared/sheet-fixtures.ts';

describe('TimelineChart', () => {
  it.each(DEMO_PLANS)('draws the lanes and hours of the printed sheet for %s', (plan) => {
    const sheet = buildSheet(sheetInput(plan));
    const model = chartModel(sheet);
    const html = renderToStaticMarkup(<TimelineChart sheet={sheet} />);
    const lanes = [...html.matchAll(/data-lane="([^"]*)"/g)].map((m) => m[1].replace(/&amp;/g, '&').replace(/&quot;/g, '"').replace(/&#x27;/g, "'"));
    // Twice: the screen chart's lane names and the print chart's.
    const rows = model.rows.map((r) => r.label);
    expect(lanes).toEqual([...rows, ...rows]);
    const clock = (m: number) => clockOf(localDateTime(sheet.date, m));
    expect(html).toContain(`${model.rows.length} builds and mixes`);
    expect(html).toMatch(new RegExp(`${clock(model.from)} to \\w{3} \\d+ \\w{3} ${clock(model.to)}`));
    // The printed sheet's chart lists the same lanes (shortened to 30 characters there).
    const printed = renderSheetHtml(sheet);
    for (const r of rows) expect(printed).toContain(r.length > 30 ? r.slice(0, 29) : r);
  });
});
