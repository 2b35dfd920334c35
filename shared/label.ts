// The ingredient statement of a formula, under EU or US rules, as plain text and HTML. Pure; no I/O.
//
// Order. Ingredients are listed in descending order of weight as used in one piece: the dough's
// ingredients and the finishes on and under it (product.ts). Lines with the same name on the
// statement (two flours both labelled "wheat flour", seeds in the dough and on top) are one entry.
// Names are the catalog's `labels.eu` / `labels.us` for the market, else its `label`.
//
// Water. EU: Regulation (EU) No 1169/2011 Annex VII Part A point 1 ranks added water by its weight
// in the finished product, and added water of no more than 5 % of the finished product need not be
// listed. The bake loss (the formula's `bake_loss`, else the category's default, product.ts) is
// taken as water: water is ranked by what remains, and every share is taken of the baked piece.
// US (21 CFR 101.4(a)(1)): water is ranked by the weight added, like any ingredient.
//
// QUID (EU, Article 22 and Annex VIII). An ingredient named in the product's title or in one of its
// tags gets its quantity in percent (the words of its name, less words such as "flour" or
// "whole", matched to the title's words: "milk" in "milk buns", "seed" and "rye" in "seeded rye").
// Annex VIII point 3: the quantity at the time of use; point 4(a): for a product that loses
// moisture in baking, related to the finished product (grams used per 100 g of baked product), and
// above 100 % given as grams used per 100 g of product.
//
// The 2 % rules. US, 21 CFR 101.4(a)(2): ingredients at 2 percent or less by weight may follow,
// in any order, after a quantifying phrase such as "Contains 2% or less of:"; the threshold may
// instead be 1.5, 1 or 0.5 percent, and no ingredient under the phrase may exceed it. EU,
// Art. 18 and Annex VII Part A: ingredients making up less than 2 % (strictly) may follow the
// others in a different order. Panform keeps weight order inside the group too, which both rules
// allow; `minor` lists the entries the rule lets go. Shares are compared with a tolerance of 1e-9
// percentage points, so a share that is 2 % on paper counts as exactly 2 %.
//
// Allergens. Each ingredient carries its catalog codes and those of its components (allergens.ts).
// The word naming the allergen is emphasised where the name has it ("WHEAT flour"); otherwise
// the allergen follows in brackets ("butter (MILK)"). EU: the 14 groups of Annex II; the cereal
// and nut are named. US: the 9 major food allergens (spelt and khorasan are wheat), with a
// "Contains:" statement naming them after the list. Text emphasises in UPPER CASE, HTML with <strong>.
//
// This supports, and does not replace, the bakery's own labelling review under local law.
import type { AllergenCode } from './schema/shapes.ts';
import { lookupIngredient, type Catalog, type Formula } from './model.ts';
import { productPiece, ProductError, type BakeLoss } from './product.ts';
import { sum } from './scale.ts';
import {
  allergenSummary, groupOf, ingredientAllergens, sortCodes, type AllergenSummary, type Jurisdiction,
} from './allergens.ts';

export type UsThreshold = 2 | 1.5 | 1 | 0.5;
export const US_THRESHOLDS: readonly UsThreshold[] = [2, 1.5, 1, 0.5];
/** EU: "less than 2 %" of the finished product. */
export const EU_MINOR_BELOW = 2;
/** EU Annex VII Part A: added water of no more than 5 % of the finished product need not be listed. */
export const EU_WATER_MAY_OMIT_AT_MOST = 5;
const TOLERANCE = 1e-9;

export const LABEL_CAUTION =
  'This ingredient statement supports, and does not replace, the bakery\'s own labelling review under local law. ' +
  'Check names, allergens and cross-contact against the suppliers\' specifications and your own bakehouse before printing a label. ' +
  'Toppings, washes, tray oil and dusting flour count only when they are written in the formula\'s finishes.';

export interface LabelOptions {
  rules: Jurisdiction;
  /** US only: the threshold of the quantifying phrase; default 2. */
  threshold?: UsThreshold;
  /** Group the small ingredients as the rules allow (US phrase; EU end group); default true. */
  groupMinor?: boolean;
  /** EU only: leave out added water of no more than 5 % of the finished product; default true. */
  omitMinorWater?: boolean;
  /** Percent of the dough's weight lost in baking (taken as water); default: the formula's, else its category's (product.ts). */
  bakeLoss?: number;
}

/** A run of text, emphasised when it names an allergen. */
export interface Segment {
  text: string;
  strong?: boolean;
}

export interface StatementComponent {
  ingredient: string;
  label: string;
  /** Allergen codes carried under these rules (own and components'). */
  allergens: AllergenCode[];
  inCatalog: boolean;
  components: StatementComponent[];
}

export interface StatementEntry extends StatementComponent {
  /** The formula's ingredient names merged into this entry. */
  ingredients: string[];
  /** Weight that ranks the entry, in grams per 100 g of the basis (mixed dough, or baked weight with bakeLoss). */
  share: number;
  water: boolean;
  /** EU: the quantity declared (Article 22), in percent of the finished product; null when not required. */
  quid: number | null;
  segments: Segment[];
}

export interface IngredientStatement {
  formula: string;
  title: string;
  rules: Jurisdiction;
  /** What the shares are percent of. */
  basis: 'mixed dough' | 'baked weight';
  bakeLoss: number;
  /** Where the bake loss comes from: given, the formula's bake_loss, or the category's default. */
  bakeLossSource: BakeLoss['source'];
  /** US: the threshold in use; EU: 2 (strictly less than). */
  threshold: number;
  /** In weight order, above the threshold. */
  main: StatementEntry[];
  /** The small ingredients the rule lets follow in any order (weight order kept). */
  minor: StatementEntry[];
  /** US: "Contains 2% or less of:"; EU: null (no phrase is needed). */
  minorPhrase: string | null;
  /** Listed nowhere, with the reason (EU added water ≤ 5 %). */
  omitted: { ingredient: string; share: number; reason: string }[];
  /** US "Contains:" names in the order of the 9; null under EU rules. */
  contains: string[] | null;
  /** "May contain" names under these rules. */
  mayContain: string[];
  allergens: AllergenSummary;
  /** Ingredients and components the catalog does not list: their allergens are unknown. */
  unlisted: string[];
  notes: string[];
  caution: string;
  text: string;
  html: string;
}

export class LabelError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'LabelError';
  }
}

// Words that name an allergen in an ingredient's name, matched as whole words, case-insensitive.
const WORDS: Record<AllergenCode, string[]> = {
  wheat: ['wheat'],
  rye: ['rye'],
  barley: ['barley'],
  oats: ['oats', 'oat'],
  spelt: ['spelt'],
  khorasan: ['khorasan'],
  crustaceans: ['crustaceans', 'crustacean', 'shrimps', 'shrimp', 'prawns', 'prawn', 'crabs', 'crab', 'lobster', 'crayfish'],
  eggs: ['eggs', 'egg'],
  fish: ['fish', 'anchovies', 'anchovy', 'salmon', 'tuna', 'cod'],
  peanuts: ['peanuts', 'peanut'],
  soybeans: ['soybeans', 'soybean', 'soya', 'soy'],
  milk: ['milk', 'lactose'],
  almonds: ['almonds', 'almond'],
  hazelnuts: ['hazelnuts', 'hazelnut'],
  walnuts: ['walnuts', 'walnut'],
  cashews: ['cashews', 'cashew'],
  pecans: ['pecans', 'pecan'],
  'brazil-nuts': ['brazil nuts', 'brazil nut'],
  pistachios: ['pistachios', 'pistachio'],
  macadamia: ['macadamia'],
  celery: ['celery', 'celeriac'],
  mustard: ['mustard'],
  sesame: ['sesame'],
  sulphites: ['sulphites', 'sulphite', 'sulfites', 'sulfite', 'sulphur dioxide', 'sulfur dioxide'],
  lupin: ['lupin', 'lupine'],
  molluscs: ['molluscs', 'mollusc', 'mussels', 'mussel', 'oysters', 'oyster', 'clams', 'clam', 'squid', 'scallops', 'scallop'],
};

// US: spelt and khorasan are declared as wheat.
const US_WORDS: Partial<Record<AllergenCode, string[]>> = { spelt: ['wheat'], khorasan: ['wheat'], crustaceans: ['shellfish', ...WORDS.crustaceans] };

/** The name in brackets after an ingredient whose own name does not say the allergen. */
const EU_BRACKET: Record<AllergenCode, string> = {
  wheat: 'wheat', rye: 'rye', barley: 'barley', oats: 'oats', spelt: 'spelt', khorasan: 'khorasan wheat',
  crustaceans: 'crustaceans', eggs: 'egg', fish: 'fish', peanuts: 'peanuts', soybeans: 'soya', milk: 'milk',
  almonds: 'almonds', hazelnuts: 'hazelnuts', walnuts: 'walnuts', cashews: 'cashews', pecans: 'pecan nuts',
  'brazil-nuts': 'Brazil nuts', pistachios: 'pistachio nuts', macadamia: 'macadamia nuts', celery: 'celery',
  mustard: 'mustard', sesame: 'sesame', sulphites: 'sulphites', lupin: 'lupin', molluscs: 'molluscs',
};
const US_BRACKET: Partial<Record<AllergenCode, string>> = {
  wheat: 'wheat', spelt: 'wheat', khorasan: 'wheat', crustaceans: 'crustacean shellfish', eggs: 'egg', fish: 'fish',
  peanuts: 'peanuts', soybeans: 'soy', milk: 'milk', almonds: 'almonds', hazelnuts: 'hazelnuts', walnuts: 'walnuts',
  cashews: 'cashews', pecans: 'pecans', 'brazil-nuts': 'Brazil nuts', pistachios: 'pistachios', macadamia: 'macadamia nuts',
  sesame: 'sesame',
};

function relevant(codes: readonly AllergenCode[], rules: Jurisdiction): AllergenCode[] {
  return codes.filter((c) => groupOf(c, rules) !== undefined);
}

function bracketName(code: AllergenCode, rules: Jurisdiction): string {
  return (rules === 'eu' ? EU_BRACKET[code] : US_BRACKET[code]) ?? EU_BRACKET[code];
}

function wordsFor(code: AllergenCode, rules: Jurisdiction): string[] {
  return (rules === 'us' ? US_WORDS[code] : undefined) ?? WORDS[code];
}

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** Emphasises the words that name any of `codes` in `text`; returns the segments and the codes found. */
export function emphasise(text: string, codes: readonly AllergenCode[], rules: Jurisdiction): { segments: Segment[]; found: Set<AllergenCode> } {
  const ranges: { start: number; end: number; code: AllergenCode }[] = [];
  for (const code of codes) {
    for (const w of wordsFor(code, rules)) {
      const re = new RegExp(`(?<![\\p{L}\\p{N}])${escapeRegExp(w)}(?![\\p{L}\\p{N}])`, 'giu');
      for (const m of text.matchAll(re)) ranges.push({ start: m.index, end: m.index + m[0].length, code });
    }
  }
  ranges.sort((a, b) => a.start - b.start || b.end - a.end);
  const found = new Set<AllergenCode>();
  const segments: Segment[] = [];
  let at = 0;
  for (const r of ranges) {
    if (r.start < at) {
      // Overlaps a longer match already taken ("soybean" inside "soybeans"): same words.
      if (r.end <= at) found.add(r.code);
      continue;
    }
    if (r.start > at) segments.push({ text: text.slice(at, r.start) });
    segments.push({ text: text.slice(r.start, r.end), strong: true });
    found.add(r.code);
    at = r.end;
  }
  if (at < text.length) segments.push({ text: text.slice(at) });
  return { segments, found };
}

/** The name on the statement: the market's own name, else the catalog's label, else the catalog name. */
export function labelOf(catalog: Catalog, name: string, rules: Jurisdiction): string {
  const item = catalog[name];
  const own = item?.labels?.[rules];
  if (own) return own;
  if (item?.label) return item.label;
  if (item?.kind === 'water') return 'water';
  return name;
}

interface Rendered {
  segments: Segment[];
  covered: Set<AllergenCode>;
}

/**
 * A statement node: its name with allergen words emphasised, then any allergen not named in it
 * or in its components in brackets, then its components in brackets. A component the catalog
 * does not list has no codes of its own; the words of its parent's codes are emphasised in its
 * name (`inherited`), and the parent adds brackets for what no name says.
 */
function renderNode(label: string, codes: AllergenCode[], components: StatementComponent[], rules: Jurisdiction, inherited = false): Rendered {
  const own = emphasise(label, codes, rules);
  const covered = new Set<AllergenCode>(own.found);
  const children = components.map((c) => {
    const r = c.inCatalog ? renderNode(c.label, c.allergens, c.components, rules) : renderNode(c.label, codes, c.components, rules, true);
    for (const k of r.covered) covered.add(k);
    return r;
  });
  const segments: Segment[] = [...own.segments];
  const missing = inherited ? [] : [...new Set(codes.filter((c) => !covered.has(c)).map((c) => bracketName(c, rules)))];
  if (missing.length > 0) {
    segments.push({ text: ' (' });
    missing.forEach((m, i) => {
      if (i > 0) segments.push({ text: ', ' });
      segments.push({ text: m, strong: true });
    });
    segments.push({ text: ')' });
    for (const c of codes) covered.add(c);
  }
  if (children.length > 0) {
    segments.push({ text: ' (' });
    children.forEach((r, i) => {
      if (i > 0) segments.push({ text: ', ' });
      segments.push(...r.segments);
    });
    segments.push({ text: ')' });
  }
  return { segments, covered };
}

function componentTree(catalog: Catalog, name: string, rules: Jurisdiction, path: string[]): StatementComponent {
  if (path.includes(name)) {
    throw new LabelError(`compound ingredient "${name}" contains itself: ${[...path, name].join(' → ')}; fix its components in the catalog`);
  }
  const item = catalog[name];
  return {
    ingredient: name,
    label: labelOf(catalog, name, rules),
    allergens: item ? relevant(ingredientAllergens(catalog, name).codes, rules) : [],
    inCatalog: item !== undefined,
    components: (item?.components ?? []).map((c) => componentTree(catalog, c, rules, [...path, name])),
  };
}

/** The ingredient statement of a formula under EU or US rules. Throws ScaleError or LabelError for input it cannot read. */
export function ingredientStatement(formula: Formula, catalog: Catalog, options: LabelOptions): IngredientStatement {
  const rules = options.rules;
  const threshold = rules === 'us' ? (options.threshold ?? 2) : EU_MINOR_BELOW;
  if (rules === 'us' && !US_THRESHOLDS.includes(threshold as UsThreshold)) {
    throw new LabelError(`the US threshold must be one of ${US_THRESHOLDS.join(', ')} percent; got ${threshold}`);
  }
  let piece;
  try {
    piece = productPiece(formula, catalog, { bakeLoss: options.bakeLoss });
  } catch (e) {
    if (e instanceof ProductError) throw new LabelError(e.message);
    throw e;
  }
  const bakeLoss = piece.bakeLoss.percent;
  const groupMinor = options.groupMinor ?? true;
  const omitMinorWater = rules === 'eu' && (options.omitMinorWater ?? true);

  const summary = allergenSummary(formula, catalog);
  const basisWeight = piece.bakedGrams;
  const isWater = (n: string) => lookupIngredient(catalog, n).kind === 'water';
  const used = [...piece.dough, ...piece.finishes.map((f) => ({ ingredient: f.ingredient, grams: f.grams }))];
  const totalWater = sum(used.filter((l) => isWater(l.ingredient)).map((l) => l.grams));
  // EU: water ranks by what is left of it after baking; all of the bake loss is taken to be water.
  const lost = rules === 'eu' ? Math.min(totalWater, piece.lostGrams) : 0;

  // Merge lines that read the same on the statement.
  interface Acc { key: string; names: string[]; grams: number; water: boolean }
  const acc = new Map<string, Acc>();
  for (const { ingredient: name, grams: g } of used) {
    if (!(g > 0)) continue;
    const item = catalog[name];
    const key = item?.components ? `compound:${name}` : `label:${labelOf(catalog, name, rules).toLowerCase()}`;
    const a = acc.get(key) ?? { key, names: [], grams: 0, water: isWater(name) };
    if (!a.names.includes(name)) a.names.push(name);
    a.grams += g;
    a.water &&= isWater(name);
    acc.set(key, a);
  }

  const named = rules === 'eu' ? namedWords(formula) : new Set<string>();
  const entries: StatementEntry[] = [];
  for (const a of acc.values()) {
    const first = a.names[0];
    const grams = a.water && totalWater > 0 ? a.grams - (lost * a.grams) / totalWater : a.grams;
    const codes = relevant(sortCodes(a.names.flatMap((n) => ingredientAllergens(catalog, n).codes)), rules);
    const tree = componentTree(catalog, first, rules, []);
    const rendered = renderNode(tree.label, codes, tree.components, rules);
    // Annex VIII point 4(a): the quantity used, related to the finished product (water: what is left).
    const quid = !a.water && namesIngredient(named, tree.label) ? (a.grams / basisWeight) * 100 : null;
    if (quid !== null) rendered.segments.push({ text: ` (${formatQuid(quid)})` });
    entries.push({
      ...tree,
      allergens: codes,
      ingredients: a.names,
      share: basisWeight > 0 ? (grams / basisWeight) * 100 : 0,
      water: a.water,
      quid,
      segments: rendered.segments,
    });
  }
  // Descending weight; the formula's order breaks ties (Array.prototype.sort is stable).
  entries.sort((x, y) => y.share - x.share);

  const omitted: IngredientStatement['omitted'] = [];
  const listed: StatementEntry[] = [];
  for (const e of entries) {
    if (omitMinorWater && e.water && e.share <= EU_WATER_MAY_OMIT_AT_MOST + TOLERANCE) {
      omitted.push({
        ingredient: e.label,
        share: e.share,
        reason: `added water of no more than ${EU_WATER_MAY_OMIT_AT_MOST} % of the finished product need not be listed (Regulation (EU) No 1169/2011 Annex VII Part A)`,
      });
    } else listed.push(e);
  }
  const isMinor = (e: StatementEntry) =>
    groupMinor && (rules === 'us' ? e.share <= threshold + TOLERANCE : e.share < EU_MINOR_BELOW - TOLERANCE);
  const main = listed.filter((e) => !isMinor(e));
  const minor = listed.filter(isMinor);
  const minorPhrase = rules === 'us' && minor.length > 0 ? `Contains ${threshold}% or less of:` : null;

  const contains = rules === 'us' ? usNames(summary.us) : null;
  const mayContain = rules === 'us' ? usNames(summary.mayContain.us) : euNames(summary.mayContain.eu);

  const notes: string[] = [];
  notes.push(
    bakeLoss > 0
      ? `Shares are of the baked piece (${Number(basisWeight.toFixed(1))} g): ${Number(piece.doughGrams.toFixed(1))} g of dough less the ${piece.bakeLoss.note}, all taken as water${piece.finishes.length > 0 ? ', plus its finishes' : ''}.`
      : 'Shares are of the mixed dough: with no bake loss, water is ranked by its weight in the mixed dough and the small-ingredient groups are worked out before baking.',
  );
  const quids = entries.filter((e) => e.quid !== null);
  if (quids.length > 0) {
    notes.push(
      `Quantities declared (Regulation (EU) No 1169/2011 Article 22, Annex VIII point 4(a)): ${quids.map((e) => `${e.label} ${formatQuid(e.quid!)}`).join(', ')}, as used per 100 g of the baked product; the title or a tag names ${quids.length === 1 ? 'it' : 'them'}.`,
    );
  }
  for (const o of omitted) notes.push(`${o.ingredient} (${o.share.toFixed(1)} %) is not listed: ${o.reason}.`);
  if (rules === 'eu' && minor.length > 0) {
    notes.push(`Under 2 % of the finished product (may follow the others in any order): ${minor.map((e) => e.label).join(', ')}.`);
  }
  notes.push(...summary.notes.filter((n) => n.startsWith(rules === 'eu' ? 'EU' : 'US')));
  if (summary.mayContainAlreadyContained.length > 0) {
    notes.push(`"May contain" left out for what the formula contains anyway: ${summary.mayContainAlreadyContained.join(', ')}.`);
  }
  const unlisted = [...summary.unlisted];
  for (const u of unlisted) notes.push(`"${u}" is not in the catalog: its allergens are unknown, so nothing is emphasised for it.`);

  const statement: Omit<IngredientStatement, 'text' | 'html'> = {
    formula: formula.id,
    title: formula.title,
    rules,
    basis: bakeLoss > 0 ? 'baked weight' : 'mixed dough',
    bakeLoss,
    bakeLossSource: piece.bakeLoss.source,
    threshold,
    main,
    minor,
    minorPhrase,
    omitted,
    contains,
    mayContain,
    allergens: summary,
    unlisted,
    notes,
    caution: LABEL_CAUTION,
  };
  return { ...statement, text: renderText(statement), html: renderHtml(statement) };
}

// Words that say what an ingredient is like, not what it is: they do not name it in a title.
const PLAIN_WORDS = new Set([
  'flour', 'whole', 'wholemeal', 'wholegrain', 'grain', 'white', 'fine', 'fresh', 'dried', 'free', 'range', 'unsalted', 'salted',
  'extra', 'virgin', 'mix', 'blend', 'pieces', 'flakes', 'and', 'of', 'with', 'the', 'house',
]);
const stem = (w: string) => (w.length > 4 && w.endsWith('ed') ? w.slice(0, -2) : w.length > 3 && w.endsWith('s') ? w.slice(0, -1) : w);
const wordsOf = (text: string) => text.toLowerCase().replace(/\([^)]*\)/g, ' ').split(/[^\p{L}\p{N}]+/u).filter(Boolean).map(stem);

/** The stemmed words of the title and tags: what the product's name and labelling stress. */
function namedWords(formula: Formula): Set<string> {
  return new Set([...wordsOf(formula.title), ...formula.tags.flatMap(wordsOf)]);
}

/** Whether a word of the ingredient's statement name (less plain words) is in the title or a tag. */
function namesIngredient(named: Set<string>, label: string): boolean {
  return wordsOf(label).some((w) => !PLAIN_WORDS.has(w) && named.has(w));
}

/** "41 %", "3.5 %"; above 100 % as grams per 100 g (Annex VIII point 4(a)). */
export function formatQuid(percent: number): string {
  if (percent > 100) return `${Math.round(percent)} g per 100 g of product`;
  return percent >= 10 ? `${Math.round(percent)} %` : `${Number(percent.toFixed(1))} %`;
}

function usNames(groups: AllergenSummary['us']): string[] {
  return groups.flatMap((g) => (g.items.length > 0 ? g.items.map((i) => US_NUT_NAMES[i] ?? i) : [US_GROUP_NAMES[g.group] ?? g.group]));
}
const US_GROUP_NAMES: Record<string, string> = { eggs: 'egg', 'Crustacean shellfish': 'crustacean shellfish', soybeans: 'soy' };
const US_NUT_NAMES: Record<string, string> = { 'pecan nuts': 'pecans', 'pistachio nuts': 'pistachios' };

function euNames(groups: AllergenSummary['eu']): string[] {
  return groups.flatMap((g) => (g.items.length > 0 ? g.items : [g.group]));
}

function lines(s: Omit<IngredientStatement, 'text' | 'html'>): { heading: string; body: Segment[] }[] {
  const list = (es: StatementEntry[]): Segment[] =>
    es.flatMap((e, i) => (i === 0 ? e.segments : [{ text: ', ' }, ...e.segments]));
  const body: Segment[] = [...list(s.main)];
  if (s.minor.length > 0) {
    if (s.minorPhrase) {
      if (s.main.length > 0) body.push({ text: '. ' });
      body.push({ text: `${s.minorPhrase} ` }, ...list(s.minor));
    } else {
      if (s.main.length > 0) body.push({ text: ', ' });
      body.push(...list(s.minor));
    }
  }
  body.push({ text: '.' });
  const out = [{ heading: 'Ingredients:', body }];
  const named = (names: string[]): Segment[] => [
    ...names.flatMap((n, i) => (i === 0 ? [{ text: n, strong: true }] : [{ text: ', ' }, { text: n, strong: true }])),
    { text: '.' },
  ];
  if (s.contains && s.contains.length > 0) out.push({ heading: 'Contains:', body: named(s.contains) });
  if (s.mayContain.length > 0) out.push({ heading: 'May contain:', body: named(s.mayContain) });
  return out;
}

function renderText(s: Omit<IngredientStatement, 'text' | 'html'>): string {
  const body = lines(s).map((l) => `${l.heading} ${l.body.map((g) => (g.strong ? g.text.toUpperCase() : g.text)).join('')}`);
  return `${body.join('\n')}\n`;
}

const escapeHtml = (t: string) =>
  t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');

function renderHtml(s: Omit<IngredientStatement, 'text' | 'html'>): string {
  const cls: Record<string, string> = { 'Ingredients:': 'ingredients', 'Contains:': 'contains', 'May contain:': 'may-contain' };
  const ps = lines(s).map(
    (l) =>
      `<p class="${cls[l.heading]}"><span class="heading">${escapeHtml(l.heading)}</span> ${l.body
        .map((g) => (g.strong ? `<strong>${escapeHtml(g.text)}</strong>` : escapeHtml(g.text)))
        .join('')}</p>`,
  );
  return `<div class="ingredient-statement" data-rules="${s.rules}">\n${ps.join('\n')}\n<p class="caution">${escapeHtml(s.caution)}</p>\n</div>\n`;
}

