// Weights, temperatures and yeast, against exact definitions and the yeast factors' source.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  convert, ConvertError, convertYeast, HAMELMAN_YEAST_FACTORS, parseUnit, yeastFactorsFrom, yeastRatio,
} from '#shared/convert';
import type { Catalog } from '#shared/model';
import type { YeastType } from '#shared/schema/shapes';

const RUNS = Number(process.env.PANFORM_FUZZ_RUNS ?? 300);

describe('convert: weights', () => {
  it.each([
    [1, 'lb', 'g', 453.59237], // International yard and pound agreement (1959): exact
    [1, 'oz', 'g', 28.349523125], // 453.592 37 / 16, exact (1 lb = 16 oz avoirdupois, same agreement)
    [2, 'lb', 'g', 907.18474], // 2 × 453.592 37
    [1, 'lb', 'oz', 16], // 1 lb = 16 oz avoirdupois by definition
    [1, 'kg', 'g', 1000],
    [28.47, 'kg', 'g', 28470], // the "Baker's Percentage Worksheet" handout's dough weight
  ])('converts %d %s to %s exactly', (value, from, to, result) => {
    const c = convert({ value, units: [from, to] });
    expect(c.kind).toBe('mass');
    expect(Math.abs(c.result - result)).toBeLessThanOrEqual(1e-12 * result);
  });

  it('gives 2.204 622 621 8 lb per kg (not exact)', () => {
    expect(convert({ value: 1, units: ['kg', 'lb'] }).result).toBeCloseTo(2.2046226218, 10); // 1 / 0.453 592 37 (International yard and pound agreement, 1959)
  });

  it('gives 0.035 273 961 95 oz per g', () => {
    expect(convert({ value: 1, units: ['g', 'oz'] }).result).toBeCloseTo(0.03527396195, 11); // 16 / 453.592 37
  });

  it('returns to the same grams after g → lb → g', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e7, noNaN: true }), (g) => {
        const lb = convert({ value: g, units: ['g', 'lb'] }).result;
        expect(Math.abs(convert({ value: lb, units: ['lb', 'g'] }).result - g)).toBeLessThanOrEqual(1e-12 * Math.max(1, g));
      }),
      { numRuns: RUNS },
    );
  });
});

describe('convert: temperatures', () => {
  // Temperature fixed points (t/°F = 1.8·t/°C + 32, from NIST SP 811 App. B.8/B.9).
  it.each([
    [-40, -40],
    [0, 32],
    [20, 68],
    [24, 75.2],
    [26, 78.8],
    [37, 98.6],
    [100, 212],
  ])('converts %d °C to %d °F and back', (c, f) => {
    expect(convert({ value: c, units: ['C', 'F'] }).result).toBeCloseTo(f, 12);
    expect(convert({ value: f, units: ['F', 'C'] }).result).toBeCloseTo(c, 12);
  });

  it('accepts °C, celsius and lower case', () => {
    expect(convert({ value: 26, units: ['°C', 'fahrenheit'] }).result).toBeCloseTo(78.8, 12);
    expect(convert({ value: 26, units: ['c', 'f'] }).result).toBeCloseTo(78.8, 12);
  });
});

describe('convert: yeast', () => {
  it('uses Hamelman\'s factors against fresh yeast', () => {
    expect(HAMELMAN_YEAST_FACTORS).toEqual({ fresh: 1, 'active-dry': 0.4, instant: 0.33 }); // Hamelman, Bread (Wiley 2004), "Yeast conversions: fresh to dry"
    expect(convertYeast(10, 'fresh', 'active-dry')).toBe(4); // Hamelman: fresh → active dry × 0.4
    expect(convertYeast(10, 'fresh', 'instant')).toBeCloseTo(3.3, 12); // Hamelman: fresh → instant × 0.33
  });

  it('derives active dry → instant as 0.33 / 0.4 = 0.825', () => {
    expect(yeastRatio('active-dry', 'instant')).toBeCloseTo(0.825, 12); // Hamelman's factors: 0.33 / 0.4
  });

  it('converts 10 g of fresh yeast to instant through the command words', () => {
    const c = convert({ value: 10, units: ['g', 'fresh', 'instant'] });
    expect(c).toMatchObject({ kind: 'yeast', unit: 'g', from: 'fresh', to: 'instant' });
    expect(c.result).toBeCloseTo(3.3, 12);
  });

  it('returns to the start after fresh → active dry → instant → fresh', () => {
    const types: YeastType[] = ['fresh', 'active-dry', 'instant'];
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e5, noNaN: true }), fc.constantFrom(...types), fc.constantFrom(...types), fc.constantFrom(...types), (g, a, b, c) => {
        const back = convertYeast(convertYeast(convertYeast(g, a, b), b, c), c, a);
        expect(Math.abs(back - g)).toBeLessThanOrEqual(1e-12 * Math.max(1, g)); // one factor per type against fresh yeast, so each round trip is the identity
      }),
      { numRuns: RUNS },
    );
  });

  it('takes a factor from the catalog when one is set', () => {
    const catalog: Catalog = {
      'dry yeast': { name: 'dry yeast', kind: 'yeast', water: 0, allergens: [], yeast: 'active-dry', yeastFactor: 0.5 }, // Rouxbe "Yeast Substitutions": fresh → active dry × 0.5
    };
    const { factors, fromCatalog } = yeastFactorsFrom(catalog);
    expect(factors).toEqual({ fresh: 1, 'active-dry': 0.5, instant: 0.33 });
    expect(fromCatalog).toEqual(['active-dry']);
    expect(convertYeast(10, 'fresh', 'active-dry', factors)).toBe(5);
  });

  it('refuses two catalog factors for one yeast type', () => {
    const catalog: Catalog = {
      'instant a': { name: 'instant a', kind: 'yeast', water: 0, allergens: [], yeast: 'instant', yeastFactor: 0.33 },
      'instant b': { name: 'instant b', kind: 'yeast', water: 0, allergens: [], yeast: 'instant', yeastFactor: 0.4 },
    };
    expect(() => yeastFactorsFrom(catalog)).toThrow(/two factors for instant yeast: 0.33 \("instant a"\) and 0.4 \("instant b"\)/);
  });
});

describe('convert: what it refuses', () => {
  it.each([
    [['stone', 'g'], /unknown unit "stone"/],
    [['g', 'F'], /cannot convert a weight \(g\) to a temperature \(F\)/],
    [['g'], /two units/],
    [['lb', 'fresh', 'instant', 'g'], /two units/],
    [['C', 'fresh', 'instant'], /three units mean a yeast conversion/],
    [['fresh', 'g'], /cannot convert yeast/],
  ])('refuses the units %o', (units, message) => {
    expect(() => convert({ value: 1, units })).toThrow(ConvertError);
    expect(() => convert({ value: 1, units })).toThrow(message);
  });

  it('refuses a negative weight', () => {
    expect(() => convert({ value: -1, units: ['lb', 'g'] })).toThrow(/cannot be negative/);
  });

  it('lists the valid units with an unknown one', () => {
    try {
      parseUnit('cups');
      expect.unreachable();
    } catch (e) {
      expect((e as ConvertError).expected).toMatch(/weights g, kg, oz, lb; temperatures C, F; yeast fresh, active-dry, instant/);
    }
  });
});
