// The CLI's shared table and CSV helpers.
import { describe, expect, it } from 'vitest';
import { renderCsv } from '../../../cli/print/csv.ts';
import { renderFacts, renderTable } from '../../../cli/print/table.ts';

describe('renderTable', () => {
  it('draws a heading, the rows, and a rule above the footer, without colour', () => {
    const text = renderTable({ title: 'Overall', head: ['ingredient', '%', 'weight'], rows: [['flour', '100 %', '1 000 g'], ['water', '65 %', '650 g']], footer: ['total', '165 %', '1 650 g'] });
    expect(text.split('\n')).toEqual([
      'Overall',
      '┌────────────┬───────┬─────────┐',
      '│ ingredient │     % │  weight │',
      '├────────────┼───────┼─────────┤',
      '│ flour      │ 100 % │ 1 000 g │',
      '│ water      │  65 % │   650 g │',
      '├────────────┼───────┼─────────┤',
      '│ total      │ 165 % │ 1 650 g │',
      '└────────────┴───────┴─────────┘',
    ]);
    expect(text).not.toMatch(/\u001b\[/);
  });

  it('prints facts as label and value', () => {
    expect(renderFacts('Derived', [['hydration', '65 %']]).split('\n')).toEqual(['Derived', '┌───────────┬──────┐', '│ hydration │ 65 % │', '└───────────┴──────┘']);
  });
});

describe('renderCsv', () => {
  it('quotes cells with commas, quotes or line breaks', () => {
    expect(renderCsv(['a', 'b'], [['x, y', 'say "hi"'], [1.5, null]])).toBe('a,b\n"x, y","say ""hi"""\n1.5,\n');
  });
});
