// `panform temp`: °C and °F, ice, friction and every refusal through the command's own functions
// in-process; the built CLI for the text, the exit codes and --help.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectTemp, command as tempCommand, toTempOptions } from '../../cli/commands/temp.ts';
import { buildCli, type BuiltCli } from './arithmetic-cli.ts';
import { parseFlags, refusal } from './flags.ts';

let cli: BuiltCli;
beforeAll(async () => {
  cli = await buildCli();
});
afterAll(() => cli?.dispose());

type RawFlags = Parameters<typeof toTempOptions>[0];

/** What `panform temp <args> --json` prints, collected in-process. */
async function json(args: string[]): Promise<Record<string, unknown>> {
  const { options } = parseFlags<RawFlags>(tempCommand, [...args, '--json']);
  return JSON.parse(JSON.stringify(collectTemp(toTempOptions(options)))) as Record<string, unknown>;
}

describe('panform temp --json', () => {
  it('gives example A in °F with --fahrenheit', async () => {
    const j = await json(['--fahrenheit', '--ddt', '80', '--room', '75', '--flour', '65', '--friction', '35']);
    expect(j.unit).toBe('F');
    expect(j.waterTemperature as number).toBeCloseTo(65, 9); // Pizza Today, June 2018, dough temperature example: 65 °F (from memory)
    expect(j.factors).toBe(3);
    expect(j).toHaveProperty('ice', null);
    expect(j).toHaveProperty('tapWater', null);
  });

  it('gives example C in °C, with friction converted as a difference', async () => {
    // Cook's Illustrated, "Precise Water Temperature for the Perfect Loaf": (75 × 4) − 71 − 71 − 71 − 20 = 67 °F; its
    // friction factor of 20 °F in a four-factor sum is a rise of 5 °F
    const j = await json(['--ddt', '75F', '--room', '71F', '--flour', '71F', '--preferment', '71F', '--rise', '5F']);
    expect(j.unit).toBe('C');
    expect(Math.abs((j.waterTemperature as number) - 19.444444444444443)).toBeLessThan(1e-9); // (67 − 32)/1.8
    expect(j.factors).toBe(4);
    expect(j.friction as number).toBeCloseTo(20 / 1.8, 9);
  });

  it('works out the ice and tap water in grams', async () => {
    const j = await json(['--ddt', '26', '--room', '28', '--flour', '27', '--rise', '3.25', '--preferment', '24', '--tap', '22', '--water', '6.5 kg']);
    expect(j.waterTemperature).toBe(12); // 4·26 − (28 + 27 + 24 + 4 × 3.25), by hand
    // ice = W·(tap − water)/(tap + L/c), L = 333.55 J/g (CRC Handbook, enthalpy of fusion), c = 4.186 J/(g·K) (NIST SP 811 B.8)
    expect(j.ice as number).toBeCloseTo((6500 * 10) / (22 + 333.55 / 4.186), 9);
    expect((j.ice as number) + (j.tapWater as number)).toBeCloseTo(6500, 9);
  });

  it('needs 100.32 g of ice for 1000 g from a 20 °C tap to 10 °C', async () => {
    const j = await json(['--ddt', '20', '--room', '20', '--flour', '20', '--friction', '10', '--tap', '20', '--water', '1000']);
    expect(j.waterTemperature).toBe(10);
    expect(j.ice as number).toBeCloseTo(100.32, 2); // 1000 × 10 / (20 + 333.55/4.186), by hand
  });

  it('gives ice and tap water in grams and temperatures in °F with --fahrenheit', async () => {
    const j = await json(['--fahrenheit', '--ddt', '68', '--room', '68', '--flour', '68', '--friction', '18', '--tap', '68', '--water', '1000']);
    expect(j.waterTemperature as number).toBeCloseTo(50, 9); // 3·68 − (68 + 68 + 18) = 50 °F
    expect(j.ice as number).toBeCloseTo(100.32, 2); // the same as 20 °C → 10 °C
  });

  it('works the friction back from a measured dough', async () => {
    const j = await json(['--fahrenheit', '--measured', '80', '--room', '75', '--flour', '65', '--water-temp', '65']);
    expect(j.friction as number).toBeCloseTo(35, 9); // Pizza Today, June 2018 (from memory): FF = 35 °F
    expect(j.rise as number).toBeCloseTo(35 / 3, 9);
    expect(j.straightDoughFriction as number).toBeCloseTo(35, 9);
    const c = await json(['--measured', '80F', '--room', '75F', '--flour', '65F', '--water-temp', '65F']);
    expect(c.friction as number).toBeCloseTo(35 / 1.8, 9); // the same friction as a °C difference
  });
});

describe('panform temp (text)', () => {
  it('prints the water, the ice and the caution about ice', async () => {
    const r = await cli.run(['temp', '--ddt', '26', '--room', '28', '--flour', '27', '--friction', '13', '--tap', '22', '--water', '5000']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/water temperature\s+│\s+10.0 °C/); // 3·26 − (28 + 27 + 13), by hand
    expect(r.stdout).toMatch(/ice \(at 0 °C\)/);
    expect(r.stdout).toMatch(/caution: use clean food-grade ice/);
  });
});

describe('panform temp: misuse and targets out of reach', () => {
  it.each([
    [['--ddt', '25', '--room', '22'], 2, 'panform: the water temperature needs --flour, --friction'],
    [['--ddt', '25', '--room', '22', '--flour', '20', '--friction', '13', '--water', '5000'], 2, 'panform: --water needs --tap'],
    [['--ddt', 'warm', '--room', '22', '--flour', '20', '--friction', '13'], 2, 'panform: --ddt: not a temperature: "warm"'],
    [['--ddt', '25', '--room', '22', '--flour', '20', '--friction', '13', '--tap', '14', '--water', '-5'], 2, 'panform: --water must be a weight of 0 or more; got -5'],
    [['--measured', '26', '--ddt', '25', '--room', '22', '--flour', '20', '--water-temp', '18'], 2, 'panform: --measured works the friction out; it cannot be used with --ddt'],
    [['--ddt', '22', '--room', '30', '--flour', '30', '--friction', '13'], 1, 'panform: the water would have to be -7.0 °C, below the 0 °C that ice can bring it to'],
    [['--fahrenheit', '--ddt', '72', '--room', '86', '--flour', '86', '--friction', '24'], 1, 'panform: the water would have to be 20.0 °F, below the 32 °F that ice can bring it to'],
  ])('refuses %j with exit %d and one clear line', async (args, code, message) => {
    const r = await refusal(() => collectTemp(toTempOptions(parseFlags<RawFlags>(tempCommand, args).options)));
    expect(r.code).toBe(code);
    expect(r.line).toContain(message);
  });

  it.each([
    [['--ddt', 'warm', '--room', '22', '--flour', '20', '--friction', '13'], 2, 'panform: --ddt: not a temperature: "warm"'],
    [['--ddt', '22', '--room', '30', '--flour', '30', '--friction', '13'], 1, 'panform: the water would have to be -7.0 °C'],
  ])('prints a refusal of %j as one line on stderr, exit %d, no stack trace', async (args, code, message) => {
    const r = await cli.run(['temp', ...args]);
    expect(r.code).toBe(code);
    expect(r.stdout).toBe('');
    expect(r.stderr.split('\n')[0]).toContain(message);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('shows an example in --help', async () => {
    const r = await cli.run(['temp', '--help']);
    expect(r.stdout).toMatch(/\$ panform temp --ddt 25 --room 22 --flour 20 --friction 13/);
  });
});
