// `panform convert`: conversions, JSON and refusals through the command's own functions
// in-process; the built CLI for a catalog found in the working folder, exit codes and --help.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectConvert, command as convertCommand, convertText, toConvertOptions } from '../../cli/commands/convert.ts';
import { buildCli, type BuiltCli } from './arithmetic-cli.ts';
import { parseFlags, refusal } from './flags.ts';

let cli: BuiltCli;
let empty: string;
beforeAll(async () => {
  cli = await buildCli();
  empty = mkdtempSync(join(tmpdir(), 'panform-convert-'));
});
afterAll(() => {
  cli?.dispose();
  if (empty) rmSync(empty, { recursive: true, force: true });
});

const run = (args: string[], cwd = empty) => cli.run(['convert', ...args], { cwd });

/** What `panform convert <args>` collects, in-process (yeast factors from the demo catalog, which sets none of its own). */
async function collect(args: string[]) {
  const { operands, options } = parseFlags<Parameters<typeof toConvertOptions>[2]>(convertCommand, args);
  return collectConvert(toConvertOptions(operands[0], operands.slice(1), options));
}

describe('panform convert', () => {
  it.each([
    [['2', 'lb', 'g'], '2 lb ≈ 907 g'], // NIST SP 811 App. B.8: 1 lb = 453.592 37 g exactly; 907.18474 g to the gram
    [['1', 'oz', 'g'], '1 oz ≈ 28.3 g'], // NIST SP 811 App. B.8: 28.349 523 125 g; 0.1 g below 100 g
    [['1000', 'g', 'lb'], '1000 g ≈ 2.205 lb'], // NIST SP 811 App. B.8: 1000 / 453.592 37 = 2.204 62 lb
    [['78', 'F', 'C'], '78 °F ≈ 25.6 °C'], // NIST SP 811 App. B.8: t/°C = (t/°F − 32)/1.8 = 25.555…
    [['26', 'C', 'F'], '26 °C = 78.8 °F'], // t/°F = 1.8·t/°C + 32 (NIST SP 811 App. B.8/B.9)
    [['-40', 'C', 'F'], '-40 °C = -40 °F'], // the scales meet at −40 (same relation)
    [['10', 'g', 'fresh', 'instant'], '10 g fresh yeast = 3.3 g instant yeast (× 0.33)'], // Hamelman, Bread (Wiley 2004): × 0.33
    [['10', 'g', 'fresh', 'active-dry'], '10 g fresh yeast = 4 g active dry yeast (× 0.4)'], // Hamelman, Bread (Wiley 2004): × 0.4
    [['4', 'g', 'active-dry', 'instant'], '4 g active dry yeast = 3.3 g instant yeast (× 0.825)'], // Hamelman's factors: 0.33 / 0.4
  ])('converts %j', async (args, line) => {
    expect(convertText(await collect(args)).split('\n')[0]).toBe(line);
  });

  it('prints the first line through the built CLI, exit 0', async () => {
    const r = await run(['2', 'lb', 'g']);
    expect(r.code).toBe(0);
    expect(r.stdout.split('\n')[0]).toBe('2 lb ≈ 907 g'); // NIST SP 811 App. B.8: 1 lb = 453.592 37 g exactly
  });

  it('collects the unrounded result for --json', async () => {
    expect(await collect(['2', 'lb', 'g', '--json'])).toMatchObject({ kind: 'mass', value: 2, from: 'lb', to: 'g', result: 907.18474 }); // NIST SP 811 App. B.8
    expect((await collect(['78', 'F', 'C', '--json'])).result).toBeCloseTo(25.5555555556, 9); // NIST SP 811 App. B.8: (78 − 32)/1.8
  });

  it('rounds the temperature difference line too', async () => {
    expect(convertText(await collect(['78', 'F', 'C'])).replace(/\n\s+/g, ' ')).toContain('78 °F-degrees ≈ 43.3 °C-degrees'); // NIST SP 811 App. B.8: a difference converts by 5/9 alone
  });

  it('takes the yeast factor from the catalog when it sets one', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'panform-convert-'));
    try {
      writeFileSync(join(dir, 'ingredients.yaml'), 'dry yeast: { kind: yeast, yeast: active-dry, yeast_factor: 0.5 }\n');
      const r = await cli.run(['convert', '10', 'g', 'fresh', 'active-dry', '--json'], { cwd: dir });
      expect(r.code).toBe(0);
      expect(JSON.parse(r.stdout)).toMatchObject({ result: 5, factors: { fresh: 1, 'active-dry': 0.5, instant: 0.33 } });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it.each([
    [['3', 'stone', 'g'], 'panform: unknown unit "stone"'],
    [['3', 'g', 'F'], 'panform: cannot convert a weight (g) to a temperature (F)'],
    [['three', 'lb', 'g'], 'panform: not a number: "three"'],
    [['3', 'lb'], 'panform: give a value and two units (three for yeast); got 1 unit(s)'],
  ])('refuses %j with exit 2 and one clear line', async (args, message) => {
    expect(await refusal(() => collect(args))).toEqual({ code: 2, line: message });
  });

  it('prints a refusal as one line on stderr, exit 2', async () => {
    const r = await run(['3', 'stone', 'g']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.split('\n')[0]).toBe('panform: unknown unit "stone"');
  });

  it('shows an example in --help', async () => {
    const r = await run(['--help']);
    expect(r.stdout).toMatch(/\$ panform convert 10 g fresh instant/);
  });
});
