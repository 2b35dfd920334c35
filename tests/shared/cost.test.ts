import { describe, expect, it } from 'vitest';
import { computeCost, formatMoney } from '#shared/cost';
import { scaleFormula } from '#shared/scale';
import { fixtureCatalog, makeFormula } from '../fixtures/labels/catalog.ts';

// Prices in tests/fixtures/labels/ingredients.yaml are invented: bread flour 0.80 per kg,
// water 0, fine salt 0.40, instant yeast 8.00, fresh yeast no price.
const catalog = fixtureCatalog();

// the culinary-school handout "Baker's Percentage Worksheet" ("Baker's Math", example 1): flour 100, water 67, salt 2,
// yeast 1 = 170 %; 73 baguettes × 390 g = 28 470 g of dough; flour 16 747.06 g.
const worksheet = makeFormula({ 'bread flour': 100 }, { water: 67, 'fine salt': 2, 'instant yeast': 1 }, {
  yield: { pieces: 73, piece: '390 g' },
});

describe('computeCost', () => {
  it('costs the worksheet batch line by line, as worked by hand', () => {
    const r = computeCost(scaleFormula(worksheet, catalog, { by: 'pieces', pieces: 73 }), catalog);
    const byName = Object.fromEntries(r.lines.map((l) => [l.ingredient, l]));
    // Hand-worked from that worksheet's example with the invented prices:
    // flour 16.747 0588 kg × 0.80 = 13.397 6471
    expect(byName['bread flour'].cost).toBeCloseTo(13.3976471, 6);
    // water 11.220 5294 kg × 0 = 0 (priced at zero on purpose, not missing)
    expect(byName.water.cost).toBe(0);
    // salt 0.334 9412 kg × 0.40 = 0.133 9765
    expect(byName['fine salt'].cost).toBeCloseTo(0.1339765, 6);
    // yeast 0.167 4706 kg × 8.00 = 1.339 7647
    expect(byName['instant yeast'].cost).toBeCloseTo(1.3397647, 6);
    // total = 16.747 0588 kg × (0.80 + 0.02 × 0.40 + 0.01 × 8.00) = 16.747 0588 × 0.888 = 14.871 3882
    expect(r.total).toBeCloseTo(14.8713882, 6);
    // per piece = 14.871 3882 / 73 = 0.203 7176
    expect(r.perPiece).toBeCloseTo(0.2037176, 6);
    // per kg of dough = 0.888 / 1.70 = 0.522 3529
    expect(r.perKgDough).toBeCloseTo(0.5223529, 6);
    expect(r.complete).toBe(true);
    expect(r.missing).toEqual([]);
  });

  it('charges the loss allowance to the pieces', () => {
    const withLoss = makeFormula({ 'bread flour': 100 }, { water: 67, 'fine salt': 2, 'instant yeast': 1 }, {
      yield: { pieces: 73, piece: '390 g' },
      loss: '2 %',
    });
    const r = computeCost(scaleFormula(withLoss, catalog, { by: 'pieces', pieces: 73 }), catalog);
    // mixed dough = 28 470 / 0.98 = 29 051.0204 g; flour = 29 051.0204 / 1.70 = 17 088.8355 g
    // total = 17.088 8355 × 0.888 = 15.174 8860; per piece = 15.174 8860 / 73 = 0.207 8751 (hand-worked)
    expect(r.mixedDough).toBeCloseTo(29051.0204, 3);
    expect(r.total).toBeCloseTo(15.174886, 5);
    expect(r.perPiece).toBeCloseTo(0.2078751, 6);
    // the kilo of mixed dough costs the same as without loss: 0.888 / 1.70
    expect(r.perKgDough).toBeCloseTo(0.5223529, 6);
  });

  it('lists a missing price by name and marks the totals incomplete instead of counting zero', () => {
    // common practice lean dough, hand-worked from the baker's percent definition (Gisslen, Professional Baking, Wiley): 100 / 65 / 2 / 1 = 168 %; 1680 g of dough is 1000 / 650 / 20 / 10 g.
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'fine salt': 2, 'fresh yeast': 1 });
    const r = computeCost(scaleFormula(f, catalog, { by: 'mix', grams: 1680 }), catalog);
    const yeast = r.lines.find((l) => l.ingredient === 'fresh yeast');
    expect(yeast).toMatchObject({ grams: 10, costPerKg: null, cost: null, share: null });
    expect(r.complete).toBe(false);
    expect(r.missing).toEqual(['fresh yeast']);
    // priced lines only: 1.000 kg × 0.80 + 0.650 × 0 + 0.020 × 0.40 = 0.808 (hand-worked)
    expect(r.total).toBeCloseTo(0.808, 9);
    // 0.808 / 1.68 kg = 0.480 952 (hand-worked)
    expect(r.perKgDough).toBeCloseTo(0.480952, 6);
  });

  it('gives no cost per piece for a batch scaled by mixed dough weight', () => {
    const r = computeCost(scaleFormula(worksheet, catalog, { by: 'mix', grams: 1700 }), catalog);
    expect(r.pieces).toBeNull();
    expect(r.perPiece).toBeNull();
    // 1700 g at 170 % is 1000 g of flour: 0.888 for the batch (hand-worked)
    expect(r.total).toBeCloseTo(0.888, 9);
  });

  it('reports the oldest and newest price dates and the undated prices', () => {
    const r = computeCost(scaleFormula(worksheet, catalog, { by: 'pieces', pieces: 1 }), catalog);
    expect(r.pricesFrom).toBe('2026-09-30');
    expect(r.pricesTo).toBe('2026-11-02');
    expect(r.undated).toEqual(['water']);
  });

  it('gives each priced line its share of the total', () => {
    const r = computeCost(scaleFormula(worksheet, catalog, { by: 'flour', grams: 1000 }), catalog, { currency: 'EUR' });
    // flour 0.80 of 0.888 = 90.09 % (hand-worked)
    expect(r.lines[0].share).toBeCloseTo(90.0901, 3);
    expect(r.currency).toBe('EUR');
  });

  it('costs an ingredient the catalog does not list as missing, not free', () => {
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'sea lettuce': 2 });
    const r = computeCost(scaleFormula(f, catalog, { by: 'flour', grams: 1000 }), catalog);
    expect(r.missing).toEqual(['sea lettuce']);
    expect(r.complete).toBe(false);
  });
});

describe('formatMoney', () => {
  it.each([
    [14.8713882, '', '14.87'],
    [14.8713882, '€', '€14.87'],
    [14.8713882, '$', '$14.87'],
    [14.8713882, 'EUR', '14.87 EUR'],
    [0.2037, '£', '£0.20'],
    [-0.001, '', '0.00'],
    [1234.5, '', '1234.50'],
  ])('formats %s with currency %j as %j', (amount, currency, expected) => {
    expect(formatMoney(amount, currency)).toBe(expected);
  });
});
