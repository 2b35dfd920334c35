import { describe, expect, it } from 'vitest';
import {
  AllergenError, allergenSummary, declareGroups, EU_GROUPS, groupOf, ingredientAllergens, rollup, US_GROUPS,
} from '#shared/allergens';
import type { Catalog } from '#shared/model';
import { ALLERGEN_CODES, type AllergenCode } from '#shared/schema/shapes';
import { fixtureCatalog, makeFormula } from '../fixtures/labels/catalog.ts';

const catalog = fixtureCatalog();

describe('EU_GROUPS and US_GROUPS', () => {
  it('lists the 14 groups of Annex II in Annex order', () => {
    // Regulation (EU) No 1169/2011 Annex II, the 14 groups in Annex order
    expect(EU_GROUPS.map((g) => g.group)).toEqual([
      'cereals containing gluten', 'crustaceans', 'eggs', 'fish', 'peanuts', 'soybeans', 'milk', 'nuts',
      'celery', 'mustard', 'sesame seeds', 'sulphur dioxide and sulphites', 'lupin', 'molluscs',
    ]);
    expect(EU_GROUPS.map((g) => g.number)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14]);
  });

  it('lists the 9 major food allergens of the US', () => {
    // FALCPA 2004 (8) + sesame, FASTER Act 2021 (effective 1 January 2023)
    expect(US_GROUPS.map((g) => g.group)).toEqual([
      'milk', 'eggs', 'fish', 'Crustacean shellfish', 'tree nuts', 'peanuts', 'wheat', 'soybeans', 'sesame',
    ]);
  });

  it('places every allergen code in an EU group', () => {
    for (const code of ALLERGEN_CODES) expect(groupOf(code, 'eu'), code).toBeDefined();
  });
});

describe('groupOf', () => {
  it.each<[AllergenCode, number, string | undefined]>([
    ['wheat', 1, 'wheat'], // EU Annex II item 1 and FALCPA
    ['rye', 1, undefined], // EU Annex II item 1 (cereals containing gluten); not among FALCPA's major allergens
    ['barley', 1, undefined], // same note: barley, oats count in the EU only
    ['oats', 1, undefined], // same note
    ['spelt', 1, 'wheat'], // EU Annex II "wheat (such as spelt and khorasan wheat)"; US: spelt is a wheat (Triticum), from memory (FDA allergen guidance)
    ['khorasan', 1, 'wheat'], // same
    ['crustaceans', 2, 'Crustacean shellfish'], // EU Annex II item 2; FALCPA 'Crustacean shellfish'
    ['molluscs', 14, undefined], // EU Annex II item 14; FALCPA names Crustacean shellfish only
    ['sesame', 11, 'sesame'], // EU Annex II item 11; US since 1 January 2023 (FASTER Act 2021)
    ['milk', 7, 'milk'], // EU Annex II item 7; FALCPA
    ['eggs', 3, 'eggs'],
    ['fish', 4, 'fish'],
    ['peanuts', 5, 'peanuts'],
    ['soybeans', 6, 'soybeans'],
    ['hazelnuts', 8, 'tree nuts'], // EU Annex II item 8 names hazelnuts; FALCPA 'tree nuts'
    ['celery', 9, undefined], // EU Annex II item 9; celery, mustard, lupin, molluscs and sulphites are not FALCPA major allergens
    ['mustard', 10, undefined],
    ['sulphites', 12, undefined],
    ['lupin', 13, undefined],
  ])('puts %s in EU group %i and US group %j', (code, euNumber, usGroup) => {
    expect(groupOf(code, 'eu')?.number).toBe(euNumber);
    expect(groupOf(code, 'us')?.group).toBe(usGroup);
  });
});

describe('declareGroups', () => {
  it('names the cereals and the nuts, in catalog-code order', () => {
    const codes: AllergenCode[] = ['walnuts', 'rye', 'wheat', 'hazelnuts'];
    expect(declareGroups(codes, 'eu')).toEqual([
      { number: 1, group: 'cereals containing gluten', items: ['wheat', 'rye'], codes: ['wheat', 'rye'] },
      { number: 8, group: 'nuts', items: ['hazelnuts', 'walnuts'], codes: ['hazelnuts', 'walnuts'] },
    ]);
    expect(declareGroups(codes, 'us')).toEqual([
      { number: 5, group: 'tree nuts', items: ['hazelnuts', 'walnuts'], codes: ['hazelnuts', 'walnuts'] },
      { number: 7, group: 'wheat', items: [], codes: ['wheat'] },
    ]);
  });

  it('declares rye flour under EU rules and no major allergen under US rules', () => {
    // Rye: cereals containing gluten under Regulation (EU) No 1169/2011 Annex II item 1; not a major allergen under FALCPA
    const r = rollup(['rye']);
    expect(r.eu.map((g) => g.group)).toEqual(['cereals containing gluten']);
    expect(r.eu[0].items).toEqual(['rye']);
    expect(r.us).toEqual([]);
  });
});

describe('ingredientAllergens', () => {
  it('rolls a compound ingredient up from its components', () => {
    // seed mix: sunflower, sesame, linseed; milk chocolate: ... whole milk powder, soya lecithin
    expect(ingredientAllergens(catalog, 'seed mix').codes).toEqual(['sesame']);
    expect(ingredientAllergens(catalog, 'milk chocolate chips').codes).toEqual(['soybeans', 'milk']);
    expect(ingredientAllergens(catalog, 'dark chocolate chips').codes).toEqual(['soybeans']);
  });

  it('rolls up through compounds inside compounds', () => {
    const c: Catalog = {
      ...catalog,
      'praline filling': { name: 'praline filling', kind: 'inclusion', water: 0, allergens: [], components: ['sugar', 'hazelnuts', 'milk chocolate chips'] },
      'praline twist': { name: 'praline twist', kind: 'inclusion', water: 0, allergens: [], components: ['praline filling', 'butter'] },
    };
    expect(ingredientAllergens(c, 'praline twist').codes).toEqual(['soybeans', 'milk', 'hazelnuts']);
  });

  it('refuses a compound ingredient that contains itself', () => {
    const c: Catalog = {
      ...catalog,
      'crumb topping': { name: 'crumb topping', kind: 'inclusion', water: 0, allergens: [], components: ['streusel'] },
      streusel: { name: 'streusel', kind: 'inclusion', water: 0, allergens: [], components: ['butter', 'crumb topping'] },
    };
    expect(() => ingredientAllergens(c, 'crumb topping')).toThrow(AllergenError);
    expect(() => ingredientAllergens(c, 'crumb topping')).toThrow(/crumb topping → streusel → crumb topping/);
  });

  it('brings in the flour a seed culture is fed with', () => {
    expect(ingredientAllergens(catalog, 'rye culture').codes).toEqual(['rye']);
  });

  it('reports a component the catalog does not list', () => {
    const c: Catalog = { ...catalog, 'spice mix': { name: 'spice mix', kind: 'other', water: 0, allergens: [], components: ['caraway', 'fennel'] } };
    expect(ingredientAllergens(c, 'spice mix').unlisted).toEqual(['caraway', 'fennel']);
  });
});

describe('allergenSummary', () => {
  it('rolls up a formula with rye, compounds and a may-contain note', () => {
    const f = makeFormula(
      { 'bread flour': 80, 'rye flour': 20 },
      { water: 70, 'fine salt': 2, 'instant yeast': 1, butter: 5, 'seed mix': 4 },
      { may_contain: ['hazelnuts', 'sesame'] },
    );
    const s = allergenSummary(f, catalog);
    expect(s.codes).toEqual(['wheat', 'rye', 'milk', 'sesame']);
    expect(s.eu.map((g) => [g.number, g.group, g.items])).toEqual([
      [1, 'cereals containing gluten', ['wheat', 'rye']],
      [7, 'milk', []],
      [11, 'sesame seeds', []],
    ]);
    expect(s.us.map((g) => g.group)).toEqual(['milk', 'wheat', 'sesame']);
    expect(s.sources).toContainEqual({ code: 'sesame', ingredients: ['seed mix'] });
    // sesame is contained, so only hazelnuts remain a "may contain"
    expect(s.mayContain.codes).toEqual(['hazelnuts']);
    expect(s.mayContain.eu).toEqual([{ number: 8, group: 'nuts', items: ['hazelnuts'], codes: ['hazelnuts'] }]);
    expect(s.mayContain.us[0].group).toBe('tree nuts');
    expect(s.mayContainAlreadyContained).toEqual(['sesame']);
    expect(s.caution).toMatch(/does not replace/);
  });

  it('declares mussels in the EU only and crustaceans in both', () => {
    // A mussel: molluscs, Regulation (EU) No 1169/2011 Annex II item 14; FALCPA lists Crustacean shellfish only
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'fine salt': 2, 'smoked mussels': 10, 'shrimp paste': 3 });
    const s = allergenSummary(f, catalog);
    expect(s.eu.map((g) => g.group)).toEqual(['cereals containing gluten', 'crustaceans', 'molluscs']);
    expect(s.us.map((g) => g.group)).toEqual(['Crustacean shellfish', 'wheat']);
    expect(s.notes.some((n) => n.startsWith('US: the species'))).toBe(true);
  });

  it('counts the seed culture of a levain build', () => {
    const f = makeFormula({ 'bread flour': 100 }, { water: 70, 'fine salt': 2 }, {
      preferments: [{ name: 'levain', kind: 'levain', share: '20 %', ingredients: { 'bread flour': 100, water: 100, 'rye culture': 20 } }],
    });
    const s = allergenSummary(f, catalog);
    expect(s.eu[0].items).toEqual(['wheat', 'rye']);
    expect(s.sources).toContainEqual({ code: 'rye', ingredients: ['rye culture'] });
  });

  it('reports an ingredient the catalog does not list instead of taking it as allergen-free', () => {
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'sea lettuce': 2 });
    const s = allergenSummary(f, catalog);
    expect(s.unlisted).toEqual(['sea lettuce']);
    expect(s.notes).toContain('"sea lettuce" is not in the catalog: its allergens are unknown.');
  });

  it('adds the sulphite threshold to check', () => {
    const c: Catalog = { ...catalog, 'dried apricots': { name: 'dried apricots', kind: 'inclusion', water: 30, allergens: ['sulphites'] } };
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'dried apricots': 10 });
    const s = allergenSummary(f, c);
    expect(s.eu.map((g) => g.number)).toEqual([1, 12]);
    // Annex II item 12: declared above 10 mg/kg or 10 mg/litre as total SO2 (Regulation (EU) No 1169/2011 Annex II item 12)
    expect(s.notes[0]).toMatch(/above 10 mg\/kg/);
  });
});
