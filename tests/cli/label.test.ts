import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { toLabelOptions } from '#cli/commands/label';
import { runPanform } from '../fixtures/labels/run-cli.ts';

const fixture = (name: string) => fileURLToPath(new URL(`../fixtures/labels/${name}.yaml`, import.meta.url));
const bun = fixture('milk-bun');

describe('toLabelOptions', () => {
  it.each([
    [{ rules: 'eu' }, { rules: 'eu', threshold: undefined, bakeLoss: undefined, nutrition: false, keepWater: false, output: 'text' }],
    [{ rules: 'US', threshold: '1.5' }, { rules: 'us', threshold: 1.5, bakeLoss: undefined, nutrition: false, keepWater: false, output: 'text' }],
    [{ rules: 'eu', bakeLoss: '12 %', html: true }, { rules: 'eu', threshold: undefined, bakeLoss: 12, keepWater: false, output: 'html' }],
    [{ rules: 'eu', keepWater: true, json: true }, { rules: 'eu', threshold: undefined, bakeLoss: undefined, nutrition: false, keepWater: true, output: 'json' }],
  ])('turns %j into %j', (raw, expected) => {
    expect(toLabelOptions(raw)).toMatchObject(expected);
  });

  it.each([
    [{ rules: 'fr' }, /--rules must be eu or us/],
    [{ rules: 'eu', threshold: '2' }, /US rules only/],
    [{ rules: 'us', threshold: '3' }, /one of 2, 1.5, 1, 0.5/], // 21 CFR 101.4(a)(2)
    [{ rules: 'eu', bakeLoss: '100' }, /--bake-loss/],
    [{ rules: 'eu', html: true, json: true }, /cannot be used together/],
  ])('refuses %j', (raw, message) => {
    expect(() => toLabelOptions(raw)).toThrow(message);
  });
});

describe('panform label', () => {
  it('prints the EU statement, its allergens, the notes and the caution', async () => {
    const r = await runPanform('label', bun, '--bake-loss', '0');
    expect(r.code).toBe(0);
    // Milk named in the title: its quantity, 30 / 200.5 = 15 % (Reg. (EU) No 1169/2011 Art. 22(1)(a); hand-worked)
    expect(r.stdout).toContain('Ingredients: WHEAT flour, whole MILK (15 %), butter (MILK), pasteurised whole EGG, sugar, salt, yeast.\n');
    expect(r.stdout).toContain('May contain: SESAME SEEDS.');
    expect(r.stdout).toContain('Allergens (Regulation (EU) No 1169/2011 Annex II): cereals containing gluten (wheat), eggs, milk');
    // water 10 / 200.5 = 4.99 % of the mixed dough: may be left out under Annex VII Part A (hand-worked)
    expect(r.stdout).toMatch(/note: water \(5\.0 %\) is not listed/);
    expect(r.stdout).toContain('supports, and does not replace, the bakery\'s own labelling review under local law');
  });

  it('prints the US statement with the quantifying phrase and the "Contains:" statement', async () => {
    const r = await runPanform('label', bun, '--rules', 'us');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain(
      'Ingredients: WHEAT flour, whole MILK, butter (MILK), pasteurised whole EGG, sugar, water. Contains 2% or less of: salt, yeast.\nContains: MILK, EGG, WHEAT.\n',
    );
  });

  it('prints an HTML fragment with <strong> allergens and sends the notes to stderr', async () => {
    const r = await runPanform('label', bun, '--html', '--keep-water', '--bake-loss', '0');
    expect(r.code).toBe(0);
    expect(r.stdout.startsWith('<div class="ingredient-statement" data-rules="eu">')).toBe(true);
    expect(r.stdout).toContain('<strong>wheat</strong> flour');
    expect(r.stdout).toContain('sugar, water, salt, yeast.');
    expect(r.stdout).toContain('<p class="caution">');
    expect(r.stderr).toMatch(/^note: Shares are of the mixed dough/m);
  });

  it('prints the collected data as JSON', async () => {
    const r = await runPanform('label', bun, '--rules', 'us', '--threshold', '1', '--json', '--bake-loss', '0');
    expect(r.code).toBe(0);
    const data = JSON.parse(r.stdout);
    expect(data.rules).toBe('us');
    expect(data.minorPhrase).toBe('Contains 1% or less of:');
    // salt 2 / 200.5 = 0.998 %, yeast 1.5 / 200.5 = 0.748 % (hand-worked)
    expect(data.minor.map((e: { label: string }) => e.label)).toEqual(['salt', 'yeast']);
    expect(data.allergens.us.map((g: { group: string }) => g.group)).toEqual(['milk', 'eggs', 'wheat']);
  });

  it('adds the nutrition declaration with --nutrition --json: per100g, perPiece and rounded with exactly the named keys', async () => {
    const demo = fileURLToPath(new URL('../../formulas/tidewater-milk-buns.yaml', import.meta.url));
    const r = await runPanform('label', demo, '--nutrition', '--json');
    expect(r.code).toBe(0);
    const n = JSON.parse(r.stdout).nutrition;
    const keys = ['energyKj', 'energyKcal', 'fat', 'saturates', 'carbohydrate', 'sugars', 'fibre', 'protein', 'salt'];
    for (const part of ['per100g', 'perPiece', 'rounded']) expect(Object.keys(n[part]), part).toEqual(keys);
    // EU guidance: energy in whole kJ and kcal
    expect(Number.isInteger(n.rounded.energyKj) && Number.isInteger(n.rounded.energyKcal)).toBe(true);
    const text = await runPanform('label', demo, '--nutrition', '--rules', 'us');
    expect(text.stdout).toMatch(/Nutrition Facts +per serving: 1 piece \(75 g\)/);
  });

  it('prints the statement but no nutrition, naming what is missing, and exits 1', async () => {
    const loaf = fileURLToPath(new URL('../../formulas/malted-grain-loaf.yaml', import.meta.url));
    const r = await runPanform('label', loaf, '--nutrition');
    expect(r.code).toBe(1);
    expect(r.stdout).toContain('Ingredients:');
    expect(r.stdout).not.toContain('Nutrition declaration');
    expect(r.stderr).toMatch(/no nutrients for "malted grain blend"/);
  });

  it('prints no statement and exits 1 when an ingredient is not in the catalog (its allergens are unknown)', async () => {
    const r = await runPanform('label', fixture('sea-lettuce-roll'));
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/sea-lettuce-roll\.yaml:\d+:\d+ error .*sea lettuce/);
  });

  it('exits 2 on misuse', async () => {
    const r = await runPanform('label', bun, '--rules', 'uk');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--rules must be eu or us');
  });

  it('shows an example in its help', async () => {
    const r = await runPanform('label', '--help');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('$ panform label');
  });
});
