// Text output fits an 80-column terminal: help, the scale header, the batch sheet.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COMMANDS } from '../../cli/command-table.ts';
import { fitText, outputWidth, reflowParagraphs, wrapLine } from '../../cli/print/width.ts';
import { buildCli, type BuiltCli } from './arithmetic-cli.ts';

const longest = (text: string) => Math.max(...text.split('\n').map((l) => [...l].length));

let cli: BuiltCli;
beforeAll(async () => {
  cli = await buildCli();
});
afterAll(() => cli?.dispose());

describe('output width', () => {
  it.each(['', ...Object.keys(COMMANDS)])('keeps `panform %s --help` within 80 columns', async (command) => {
    const r = await cli.run([...(command ? [command] : []), '--help']);
    expect(r.code).toBe(0);
    expect(longest(r.stdout)).toBeLessThanOrEqual(80);
  });

  it.each([
    [['scale', 'formulas/country-levain.yaml']],
    [['scale', 'formulas/harbour-ciabatta.yaml', '--fahrenheit']],
    [['sheet', 'formulas/plans/2026-12-03.yaml']],
    [['temp', '--ddt', '26', '--room', '28', '--flour', '27', '--friction', '13', '--preferment', '24', '--tap', '22', '--water', '6.5kg']],
  ])('keeps `panform %j` within 80 columns', async (args) => {
    const r = await cli.run(args);
    expect(r.stderr).toBe('');
    expect(longest(r.stdout)).toBeLessThanOrEqual(80);
  });

  it('puts the scale header on two lines: the formula, then the batch', async () => {
    const r = await cli.run(['scale', 'formulas/country-levain.yaml']);
    expect(r.stdout.split('\n').slice(0, 2)).toEqual(['Country levain (country-levain)', '  12 × 900 g, loss 2 %: divided dough 10\u202f800 g, mixed dough 11\u202f020 g']);
  });
});

describe('fitText', () => {
  it('wraps a long line at spaces under its indent plus two', () => {
    expect(wrapLine('  one two three four', 12)).toEqual(['  one two', '    three', '    four']);
  });
  it('leaves table lines and short lines alone', () => {
    const table = `│ ${'x'.repeat(90)} │`;
    expect(fitText(`${table}\nshort`, 80)).toBe(`${table}\nshort`);
  });
  it('rejoins a paragraph broken in the source before wrapping, but not a list under a heading', () => {
    expect(reflowParagraphs('Examples:\n  $ a\n\nOne line\ngoes on.')).toBe('Examples:\n  $ a\n\nOne line goes on.');
  });
  it('follows the terminal when there is one, else 80 columns', () => {
    expect(outputWidth({ isTTY: true, columns: 120 })).toBe(120);
    expect(outputWidth({ isTTY: false, columns: 120 })).toBe(80);
    expect(outputWidth({})).toBe(80);
  });
});
