// The sheet as the bench reads it: presentSheet (rounded, shared by text, HTML and PDF), the
// chart model and the HTML page.
import { describe, expect, it } from 'vitest';
import { buildSheet } from '#shared/sheet/build';
import { chartModel, productionRange } from '#shared/sheet/chart';
import { escapeHtml, renderSheetHtml } from '#shared/sheet/html';
import { longDate, presentSheet, span } from '#shared/sheet/present';
import { localDateTime, minuteOf, shortTime } from '#shared/sheet/time';
import { formatGrams } from '#shared/units';
import { stepWord } from '#shared/step-words';
import { FIXTURE_PLANS, sheetInput } from './sheet-fixtures.ts';

const sheet = buildSheet(sheetInput(FIXTURE_PLANS[0]));

describe('local times', () => {
  it.each([
    [0, '2030-07-10T00:00'],
    [250, '2030-07-10T04:10'],
    [-120, '2030-07-09T22:00'],
    [1440 + 61, '2030-07-11T01:01'],
  ])('minute %i of 2030-07-10 is %s, and back', (minute, iso) => {
    expect(localDateTime('2030-07-10', minute)).toBe(iso);
    expect(minuteOf(iso, '2030-07-10')).toBe(minute);
  });

  it('crosses month and year ends on the calendar', () => {
    expect(localDateTime('2031-01-01', -30)).toBe('2030-12-31T23:30');
    expect(localDateTime('2028-03-01', -60)).toBe('2028-02-29T23:00'); // 2028 is a leap year
  });

  it('shows the day only off the plan date', () => {
    expect(shortTime('2030-07-10T04:10', '2030-07-10')).toBe('04:10');
    expect(shortTime('2030-07-09T22:00', '2030-07-10')).toBe('9 Jul 22:00');
  });

  it.each([
    ['2026-12-03', 'Thursday 3 December 2026'],
    ['2030-07-10', 'Wednesday 10 July 2030'],
  ])('names %s as %s', (date, text) => {
    expect(longDate(date)).toBe(text);
  });
});

describe('presentSheet', () => {
  const p = presentSheet(sheet);

  it('has the sections in bench order', () => {
    // The fixture plan lists no ovens or bench, so the sheet ends with the defaults it assumed.
    expect(p.sections.map((s) => s.key)).toEqual(['cultures', 'preferments', 'soakers', 'mixes', 'totals', 'formulas', 'cautions', 'warnings']);
  });

  it('rounds every weight for display and puts a tick box beside it', () => {
    const mixes = p.sections.find((s) => s.key === 'mixes')!;
    for (const [i, m] of sheet.mixes.entries()) {
      const t = mixes.blocks[i].table!;
      const rows = t.rows.filter((r) => !r[0].startsWith('  as '));
      expect(rows.map((r) => r[1])).toEqual(m.ingredients.map((l) => formatGrams(l.grams)));
      expect(t.tick.every(Boolean)).toBe(true);
      expect(t.footer).toEqual(['dough', formatGrams(m.dough)]);
    }
  });

  it('splits the water line into ice and tap water when ice is needed', () => {
    const mixes = p.sections.find((s) => s.key === 'mixes')!;
    const i = sheet.mixes.findIndex((m) => m.ice > 0);
    const rows = mixes.blocks[i].table!.rows;
    const w = rows.findIndex((r) => r[0] === 'water');
    expect(rows[w + 1]).toEqual(['  as ice', formatGrams(sheet.mixes[i].ice)]);
    expect(rows[w + 2]).toEqual(['  as tap water (20.0 °C)', formatGrams(sheet.mixes[i].tapWater)]);
  });

  it('shows the water temperature with its working', () => {
    const mixes = p.sections.find((s) => s.key === 'mixes')!;
    const i = sheet.mixes.findIndex((m) => m.formula === 'straight-rolls');
    expect(mixes.blocks[i].lines).toContain('water at 6.0 °C for dough at 24.0 °C (3 × 24.0 °C − room 27.0 °C − flour 25.0 °C − friction 14.0 °C (3 × rise 4.7 °C))');
    expect(mixes.blocks[i].big![0]).toBe('water 6.0 °C');
    expect(mixes.blocks[i].steps!.rows.find((r) => r[1] === 'divide')![2]).toMatch(/^300 × 90\.0 g/);
  });

  it('gives each mix a card: its own steps with clock times, in the timeline order, and blanks to write in', () => {
    const mixes = p.sections.find((s) => s.key === 'mixes')!;
    for (const [i, m] of sheet.mixes.entries()) {
      const own = sheet.timeline.filter((e) => !e.window && e.order === m.order && e.mixNumber === m.mixNumber);
      const steps = mixes.blocks[i].steps!;
      expect(steps.rows.map((r) => r[1])).toEqual(own.map((e) => stepWord(e.step)));
      expect(steps.rows[0][0]).toBe(span(own[0].start, own[0].end, sheet.date));
      expect(mixes.blocks[i].blanks).toContain('mixed by (initials) ______');
      expect(mixes.blocks[i].blanks![0]).toMatch(/^dough off the mixer ______ °C/);
    }
  });

  it('prints a bake with its oven, deck, temperature, vessel, lid minutes and steam, and folds with their times', () => {
    const rows = p.sections.find((s) => s.key === 'mixes')!.blocks.flatMap((b) => b.steps!.rows);
    const bake = sheet.timeline.find((e) => e.step === 'bake')!;
    const row = rows.find((r) => r[1] === 'bake')!;
    expect(row[2]).toContain(`${bake.resource!.slice('oven:'.length)} deck ${bake.unit}`);
    expect(row[2]).toMatch(/°C/);
    expect(row[2]).toMatch(/steam/);
    const folded = sheet.timeline.find((e) => e.folds && e.folds.length > 0);
    if (folded) expect(rows.some((r) => r[2].includes(`fold at ${folded.folds!.map((f) => shortTime(f, sheet.date)).join(', ')}`))).toBe(true);
  });

  it('states the friction convention and each mixer\'s rise once, at the top', () => {
    expect(p.subtitle).toContain("water temperatures by the multiplier method, friction = n × the mixer's rise; each pre-ferment at its own ripening temperature");
    expect(p.subtitle.join(' ')).toMatch(/big spiral .* rise 4\.7 °C \(straight-dough friction 14\.0 °C ÷ 3\)/);
  });
});

describe('chartModel', () => {
  const m = chartModel(sheet);

  it('has a row per build and per mix, and hour ticks that cover the bars', () => {
    expect(m.rows).toHaveLength(sheet.preferments.length + sheet.soakers.length + sheet.mixes.length);
    expect(Math.abs(m.from % 60)).toBe(0);
    expect(m.ticks[0].minute).toBeGreaterThanOrEqual(m.from);
    expect(m.ticks[m.ticks.length - 1].minute).toBeLessThanOrEqual(m.to);
    expect(m.ticks[0].day).toBe('9 Jul');
    expect(m.ticks.filter((t) => t.day).map((t) => t.day)).toEqual(['9 Jul', '10 Jul']);
    expect(m.readyBy).toBe(5 * 60);
  });
});

describe('productionRange', () => {
  it('zooms on the plan day from its first mix to the last bake out when the whole timeline is long', () => {
    const whole = chartModel(sheet);
    expect(whole.to - whole.from).toBeGreaterThan(14 * 60);
    const r = productionRange(sheet)!;
    // the first mix on 10 July; the last bake out + 15 min
    expect(r.from).toBe(Math.min(...sheet.timeline.filter((e) => e.step === 'mix' && e.startMinute >= 0).map((e) => e.startMinute)));
    const lastBake = Math.max(...sheet.timeline.filter((e) => e.step === 'bake').map((e) => e.endMinute));
    expect(r.to).toBe(lastBake + 15);
    const zoom = chartModel(sheet, r);
    expect(zoom.rows.length).toBeLessThan(whole.rows.length);
    for (const row of zoom.rows) expect(row.bars.some((b) => b.to > zoom.from && b.from < zoom.to)).toBe(true);
  });
});

describe('renderSheetHtml', () => {
  const html = renderSheetHtml(sheet);

  it('sets the paper through @page', () => {
    expect(html).toContain('@page { size: A4 portrait;');
    expect(renderSheetHtml(sheet, { paper: 'letter' })).toContain('@page { size: letter portrait;');
  });

  it('has a tick box beside every weight and every weight the presented sheet has', () => {
    const p = presentSheet(sheet);
    const weighed = p.sections.flatMap((s) => s.blocks.flatMap((b) => [...(b.table?.tick ?? []), ...(b.steps?.tick ?? [])].filter(Boolean)));
    expect((html.match(/aria-label="tick box"/g) ?? []).length).toBe(weighed.length);
    for (const l of sheet.totals) expect(html).toContain(escapeHtml(formatGrams(l.grams)));
  });

  it('draws the timeline as inline SVG and boxes the cautions', () => {
    expect(html.match(/<svg[^>]*viewBox="0 0 760 \d+"/g)).toHaveLength(2);
    expect(html).toContain('The production morning, closer');
    expect((html.match(/<rect /g) ?? []).length).toBeGreaterThan(sheet.timeline.filter((e) => e.minutes > 0).length / 2);
    expect(html).toMatch(/<section class="box cautions"><h2>Cautions<\/h2><ul><li>Allergens: /);
  });

  it('escapes text from the files', () => {
    const tricky = { ...sheet, notes: '<script>alert(1)</script> & "quotes"' };
    const out = renderSheetHtml(tricky);
    expect(out).not.toContain('<script>');
    expect(out).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;quotes&quot;');
  });

  it('embeds the font rules it is given and asks for no ligatures', () => {
    const out = renderSheetHtml(sheet, { fontFaceCss: "@font-face{font-family:'JetBrains Mono';src:url(data:font/woff2;base64,AAAA)}" });
    expect(out).toContain("@font-face{font-family:'JetBrains Mono'");
    expect(out).toContain('font-variant-ligatures: none');
  });
});

describe('a formula ordered twice', () => {
  it('tells the orders apart on the mixes and the timeline', () => {
    const input = sheetInput(FIXTURE_PLANS[0]);
    input.plan = { ...input.plan, orders: [...input.plan.orders, { formula: 'straight-rolls', pieces: 20, customer: 'school kitchen' }] };
    const twice = buildSheet(input);
    const titles = presentSheet(twice).sections.find((s) => s.key === 'mixes')!.blocks.map((b) => b.title);
    expect(titles.filter((t) => t.startsWith('Straight rolls'))).toEqual(['Straight rolls (order 1) · mix 1 of 1 · 27\u202f551 g', 'Straight rolls (order 5) · mix 1 of 1 · 1\u202f837 g']);
    expect(new Set(twice.timeline.filter((e) => e.formula === 'straight-rolls').map((e) => e.label))).toEqual(new Set(['Straight rolls (order 1) 1/1', 'Straight rolls (order 5) 1/1']));
    expect(chartModel(twice).rows.filter((r) => r.label.startsWith('Straight rolls'))).toHaveLength(2);
  });
});
