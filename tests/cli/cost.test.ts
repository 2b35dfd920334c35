import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { toCostOptions } from '#cli/commands/cost';
import { runPanform } from '../fixtures/labels/run-cli.ts';

const fixture = (name: string) => fileURLToPath(new URL(`../fixtures/labels/${name}.yaml`, import.meta.url));
const worksheet = fixture('worksheet-baguette');

describe('toCostOptions', () => {
  it.each([
    [{}, null],
    [{ pieces: '60' }, { by: 'pieces', pieces: 60, pieceGrams: undefined }],
    [{ pieces: '18', piece: '0.9 kg' }, { by: 'pieces', pieces: 18, pieceGrams: 900 }],
    [{ mix: '20kg' }, { by: 'mix', grams: 20000 }],
    [{ mix: '1500' }, { by: 'mix', grams: 1500 }],
  ])('turns %j into the target %j', (raw, target) => {
    expect(toCostOptions(raw).target).toEqual(target);
  });

  it.each([
    [{ piece: '900g' }, /--piece needs --pieces/],
    [{ pieces: '6', mix: '10kg' }, /cannot be used together/],
    [{ pieces: 'six' }, /whole number/],
    [{ pieces: '0' }, /whole number/],
    [{ mix: 'lots' }, /--mix/],
  ])('refuses %j', (raw, message) => {
    expect(() => toCostOptions(raw)).toThrow(message);
  });
});

describe('panform cost', () => {
  it('prints the worksheet batch with its totals, as worked by hand', async () => {
    const r = await runPanform('cost', worksheet, '--json');
    expect(r.code).toBe(0);
    const data = JSON.parse(r.stdout);
    // "Baker's Percentage Worksheet" handout, example 1, with the fixture's invented prices: 16.747 0588 kg flour × 0.888 = 14.871 3882
    expect(data.total).toBeCloseTo(14.8713882, 6);
    expect(data.perPiece).toBeCloseTo(0.2037176, 6); // 14.871 3882 / 73
    expect(data.complete).toBe(true);
    expect(data.pieces).toBe(73);
  });

  it('prints a table with the currency, the totals and the price dates', async () => {
    const r = await runPanform('cost', worksheet, '--currency', '€');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^total\s+€14\.87$/m);
    expect(r.stdout).toMatch(/^per piece \(73\)\s+€0\.20$/m);
    expect(r.stdout).toMatch(/^per kg of dough\s+€0\.52$/m); // 0.888 / 1.70 = 0.522
    expect(r.stdout).toContain('Prices dated 2026-09-30 to 2026-11-02.');
    expect(r.stdout).not.toContain('incomplete');
  });

  it('lists the missing prices by name and marks the totals incomplete', async () => {
    const r = await runPanform('cost', fixture('dulse-roll'), '--pieces', '10');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^fresh yeast .* no price .*—$/m);
    expect(r.stdout).toContain('No price for: fresh yeast, dulse flakes.');
    expect(r.stdout).toMatch(/^total\s+\d+\.\d\d {2}\(incomplete: prices missing\)$/m);
  });

  it.each([
    [['--piece', '500g'], 2],
    [['--pieces', '3', '--mix', '2kg'], 2],
    [['--pieces', 'many'], 2],
  ])('exits 2 on misuse %j', async (args, code) => {
    const r = await runPanform('cost', worksheet, ...args);
    expect(r.code).toBe(code);
    expect(r.stderr).toMatch(/^panform: /m);
    expect(r.stderr).not.toMatch(/at .*\.ts:\d+/);
  });

  it('exits 1 for a formula that does not exist', async () => {
    const r = await runPanform('cost', 'no-such-formula');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('unknown formula: no-such-formula');
  });

  it('shows an example in its help', async () => {
    const r = await runPanform('cost', '--help');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('$ panform cost harbour-ciabatta --pieces 60');
  });
});
