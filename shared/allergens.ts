// Allergens of a formula, rolled up from the catalog and read under EU and US rules. Pure; no I/O.
//
// - Each catalog ingredient declares allergen codes (shared/schema/shapes.ts ALLERGEN_CODES).
// - A compound ingredient (catalog `components`) carries its own codes and all of its
//   components' codes, recursively; a component that leads back to itself is an error.
// - A levain's seed culture brings the codes of the flour it is fed with (`fed_with`).
// - EU: Regulation (EU) No 1169/2011 Annex II, 14 groups in Annex order; the cereal and the nut
//   are named. US: the 9 major food allergens (FALCPA 2004 + FASTER Act 2021); tree nuts are
//   named; rye, barley and oats are not major allergens, nor are molluscs, celery, mustard,
//   lupin or sulphites. Spelt and khorasan are wheat species (genus Triticum) and count as wheat.
// - An ingredient that the catalog does not list has unknown allergens: it is reported in
//   `unlisted`, never taken as allergen-free.
// This supports, and does not replace, the bakery's own labelling review under local law.
import { ALLERGEN_CODES } from './schema/vocabulary.ts';
import type { AllergenCode } from './schema/shapes.ts';
import type { Catalog, Formula } from './model.ts';

export const ALLERGEN_CAUTION =
  'This supports, and does not replace, the bakery\'s own allergen and labelling review under local law: ' +
  'check every ingredient against its supplier\'s specification and the cross-contact in your own bakehouse.';

export type Jurisdiction = 'eu' | 'us';

export interface AllergenGroupRule {
  /** Position in the list: Annex II number (EU) or the order of the 9 (US). */
  number: number;
  group: string;
  codes: readonly AllergenCode[];
  /** True when the declaration must name which item of the group (the cereal, the nut). */
  namesItems: boolean;
}

/** Regulation (EU) No 1169/2011, Annex II, in Annex order. */
export const EU_GROUPS: readonly AllergenGroupRule[] = [
  { number: 1, group: 'cereals containing gluten', codes: ['wheat', 'spelt', 'khorasan', 'rye', 'barley', 'oats'], namesItems: true },
  { number: 2, group: 'crustaceans', codes: ['crustaceans'], namesItems: false },
  { number: 3, group: 'eggs', codes: ['eggs'], namesItems: false },
  { number: 4, group: 'fish', codes: ['fish'], namesItems: false },
  { number: 5, group: 'peanuts', codes: ['peanuts'], namesItems: false },
  { number: 6, group: 'soybeans', codes: ['soybeans'], namesItems: false },
  { number: 7, group: 'milk', codes: ['milk'], namesItems: false },
  {
    number: 8,
    group: 'nuts',
    codes: ['almonds', 'hazelnuts', 'walnuts', 'cashews', 'pecans', 'brazil-nuts', 'pistachios', 'macadamia'],
    namesItems: true,
  },
  { number: 9, group: 'celery', codes: ['celery'], namesItems: false },
  { number: 10, group: 'mustard', codes: ['mustard'], namesItems: false },
  { number: 11, group: 'sesame seeds', codes: ['sesame'], namesItems: false },
  { number: 12, group: 'sulphur dioxide and sulphites', codes: ['sulphites'], namesItems: false },
  { number: 13, group: 'lupin', codes: ['lupin'], namesItems: false },
  { number: 14, group: 'molluscs', codes: ['molluscs'], namesItems: false },
];

/** The 9 major food allergens of the US (FALCPA 2004; sesame added by the FASTER Act 2021). */
export const US_GROUPS: readonly AllergenGroupRule[] = [
  { number: 1, group: 'milk', codes: ['milk'], namesItems: false },
  { number: 2, group: 'eggs', codes: ['eggs'], namesItems: false },
  { number: 3, group: 'fish', codes: ['fish'], namesItems: false },
  { number: 4, group: 'Crustacean shellfish', codes: ['crustaceans'], namesItems: false },
  {
    number: 5,
    group: 'tree nuts',
    codes: ['almonds', 'hazelnuts', 'walnuts', 'cashews', 'pecans', 'brazil-nuts', 'pistachios', 'macadamia'],
    namesItems: true,
  },
  { number: 6, group: 'peanuts', codes: ['peanuts'], namesItems: false },
  { number: 7, group: 'wheat', codes: ['wheat', 'spelt', 'khorasan'], namesItems: false },
  { number: 8, group: 'soybeans', codes: ['soybeans'], namesItems: false },
  { number: 9, group: 'sesame', codes: ['sesame'], namesItems: false },
];

/** The name of each code in a declaration (EU wording; the US names its groups by US_GROUPS). */
export const ALLERGEN_NAMES: Record<AllergenCode, string> = {
  wheat: 'wheat',
  rye: 'rye',
  barley: 'barley',
  oats: 'oats',
  spelt: 'spelt',
  khorasan: 'khorasan wheat',
  crustaceans: 'crustaceans',
  eggs: 'eggs',
  fish: 'fish',
  peanuts: 'peanuts',
  soybeans: 'soybeans',
  milk: 'milk',
  almonds: 'almonds',
  hazelnuts: 'hazelnuts',
  walnuts: 'walnuts',
  cashews: 'cashews',
  pecans: 'pecan nuts',
  'brazil-nuts': 'Brazil nuts',
  pistachios: 'pistachio nuts',
  macadamia: 'macadamia nuts',
  celery: 'celery',
  mustard: 'mustard',
  sesame: 'sesame',
  sulphites: 'sulphites',
  lupin: 'lupin',
  molluscs: 'molluscs',
};

export function groupsFor(rules: Jurisdiction): readonly AllergenGroupRule[] {
  return rules === 'eu' ? EU_GROUPS : US_GROUPS;
}

/** The group a code falls in under the rules, or undefined when it is no allergen there (rye in the US). */
export function groupOf(code: AllergenCode, rules: Jurisdiction): AllergenGroupRule | undefined {
  return groupsFor(rules).find((g) => g.codes.includes(code));
}

export interface DeclaredGroup {
  number: number;
  group: string;
  /** The named items (cereals, nuts) in catalog-code order; empty for a group that names none. */
  items: string[];
  codes: AllergenCode[];
}

export interface AllergenSource {
  code: AllergenCode;
  /** The formula's ingredients that bring this code (through their components too). */
  ingredients: string[];
}

export interface AllergenRollup {
  /** Codes present, in ALLERGEN_CODES order. */
  codes: AllergenCode[];
  eu: DeclaredGroup[];
  us: DeclaredGroup[];
}

export interface AllergenSummary extends AllergenRollup {
  formula: string;
  sources: AllergenSource[];
  /** "May contain" from the formula's `may_contain`, less what it surely contains. */
  mayContain: AllergenRollup;
  /** `may_contain` codes that the formula contains anyway (left out of mayContain). */
  mayContainAlreadyContained: AllergenCode[];
  /** Ingredients and components the catalog does not list: their allergens are unknown. */
  unlisted: string[];
  /** Points the bakery must check by hand. */
  notes: string[];
  caution: string;
}

/** A compound ingredient that contains itself, directly or through other components. */
export class AllergenError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AllergenError';
  }
}

export function sortCodes(codes: Iterable<AllergenCode>): AllergenCode[] {
  const set = new Set(codes);
  return ALLERGEN_CODES.filter((c) => set.has(c));
}

/** EU and US groups for a set of codes, each list in its own order. */
export function declareGroups(codes: Iterable<AllergenCode>, rules: Jurisdiction): DeclaredGroup[] {
  const set = new Set(codes);
  const out: DeclaredGroup[] = [];
  for (const g of groupsFor(rules)) {
    const present = g.codes.filter((c) => set.has(c));
    if (present.length === 0) continue;
    out.push({
      number: g.number,
      group: g.group,
      items: g.namesItems ? present.map((c) => ALLERGEN_NAMES[c]) : [],
      codes: present,
    });
  }
  return out;
}

export function rollup(codes: Iterable<AllergenCode>): AllergenRollup {
  const sorted = sortCodes(codes);
  return { codes: sorted, eu: declareGroups(sorted, 'eu'), us: declareGroups(sorted, 'us') };
}

export interface IngredientAllergens {
  codes: AllergenCode[];
  /** Names on the way down that the catalog does not list. */
  unlisted: string[];
}

/**
 * The codes an ingredient carries: its own, its components' (recursively) and, for a culture,
 * those of the flour it is fed with. Throws AllergenError when a compound contains itself.
 */
export function ingredientAllergens(catalog: Catalog, name: string): IngredientAllergens {
  const codes = new Set<AllergenCode>();
  const unlisted = new Set<string>();
  const done = new Set<string>();
  const visit = (n: string, path: string[]) => {
    if (path.includes(n)) {
      throw new AllergenError(`compound ingredient "${n}" contains itself: ${[...path, n].join(' → ')}; fix its components in the catalog`);
    }
    if (done.has(n)) return;
    const item = catalog[n];
    if (!item) {
      unlisted.add(n);
      done.add(n);
      return;
    }
    for (const c of item.allergens) codes.add(c);
    const next = [...(item.components ?? [])];
    if (item.kind === 'culture' && item.fedWith) next.push(item.fedWith);
    for (const child of next) visit(child, [...path, n]);
    done.add(n);
  };
  visit(name, []);
  return { codes: sortCodes(codes), unlisted: [...unlisted] };
}

/** Every ingredient name the formula uses: overall lines, pre-ferment and soaker lines (seed cultures), then finishes. */
export function formulaIngredientNames(formula: Formula): string[] {
  const names = new Set<string>();
  for (const l of [...formula.flour, ...formula.ingredients]) names.add(l.ingredient);
  for (const p of formula.preferments) for (const l of p.ingredients) names.add(l.ingredient);
  for (const s of formula.soakers) for (const l of s.ingredients) names.add(l.ingredient);
  for (const f of formula.finishes) names.add(f.ingredient);
  return [...names];
}

/** The formula's allergens under EU and US rules, where they come from, and its "may contain". */
export function allergenSummary(formula: Formula, catalog: Catalog): AllergenSummary {
  const bySource = new Map<AllergenCode, string[]>();
  const unlisted = new Set<string>();
  for (const name of formulaIngredientNames(formula)) {
    const a = ingredientAllergens(catalog, name);
    for (const u of a.unlisted) unlisted.add(u);
    for (const c of a.codes) bySource.set(c, [...(bySource.get(c) ?? []), name]);
  }
  const contained = rollup(bySource.keys());
  const containedSet = new Set(contained.codes);
  const mayContain = rollup(formula.mayContain.filter((c) => !containedSet.has(c)));

  const notes: string[] = [];
  if (containedSet.has('sulphites')) {
    notes.push('EU: sulphur dioxide and sulphites are declared only above 10 mg/kg or 10 mg/litre in total as SO2 in the product as sold; check the amount.');
  }
  if (containedSet.has('fish') || containedSet.has('crustaceans')) {
    notes.push('US: the species of fish or Crustacean shellfish must be named (e.g. "anchovy", "shrimp"); the catalog codes do not say which.');
  }
  for (const u of [...unlisted].sort()) notes.push(`"${u}" is not in the catalog: its allergens are unknown.`);

  return {
    formula: formula.id,
    ...contained,
    sources: contained.codes.map((code) => ({ code, ingredients: bySource.get(code) ?? [] })),
    mayContain,
    mayContainAlreadyContained: sortCodes(formula.mayContain.filter((c) => containedSet.has(c))),
    unlisted: [...unlisted].sort(),
    notes,
    caution: ALLERGEN_CAUTION,
  };
}

/** "cereals containing gluten (wheat, rye), milk, nuts (hazelnuts)": a one-line reading of declared groups. */
export function formatGroups(groups: readonly DeclaredGroup[]): string {
  return groups.map((g) => (g.items.length > 0 ? `${g.group} (${g.items.join(', ')})` : g.group)).join(', ');
}
