// Trade checks of one formula that has passed the schema: the arithmetic must add up, every
// ingredient must be known, pre-ferments and soakers must fit inside the overall formula.
// Errors stop a formula from being scaled; warnings flag values outside the trade's usual
// ranges (practice.ts). Pure: the caller passes the parsed formula, its source map and the catalog.
import type { Finding, SourceMap } from '../parse.ts';
import { lookupIngredient, type Catalog, type CatalogItem, type Formula, type Line } from '../model.ts';
import type { FormulaFile } from '../schema/shapes.ts';
import { sum } from '../scale.ts';
import { outside, PRACTICE, YEAST_FACTORS } from './practice.ts';
import { finite, FindingList, grams, pct, pointer, quote } from './report.ts';
import { didYouMean } from './suggest.ts';

export interface FormulaCheckInput {
  file: string;
  formula: Formula;
  /** The file's data as parsed (it passed the schema). */
  raw: FormulaFile;
  source: SourceMap;
  /** The file's name without its extension: the id must equal it. */
  expectedId: string;
  /** The ingredient catalog, or null when none was found (names and kinds are then not checked). */
  catalog: Catalog | null;
  /** Why there is no catalog, when `catalog` is null (default: none was found). */
  noCatalog?: string;
}

const EPS = 1e-9;
const ENRICHING_KINDS = new Set(['sugar', 'fat', 'dairy', 'egg']);

/** What each part of the check needs: the formula, where findings go, the catalog, and what the first pass found. */
interface FormulaContext {
  out: FindingList;
  f: Formula;
  raw: FormulaFile;
  catalog: Catalog | null;
  known: (name: string) => CatalogItem | undefined;
  item: (name: string) => CatalogItem;
  catalogNames: string[];
  /** Pointers of lines whose amount is not a number of percent (checked once, skipped after). */
  badAmount: Set<string>;
  /** Names not in the catalog (their error says enough; totals by kind are skipped). */
  unknownName: Set<string>;
  amountsOk: boolean;
}

export function checkFormula(input: FormulaCheckInput): Finding[] {
  const { formula: f, raw, catalog, expectedId } = input;
  const out = new FindingList(input.file, input.source);
  // Own keys only: a name such as "constructor" must not find the object's prototype.
  const known = (name: string): CatalogItem | undefined => (catalog && Object.hasOwn(catalog, name) ? catalog[name] : undefined);
  const item = (name: string): CatalogItem => known(name) ?? lookupIngredient({}, name);
  const catalogNames = catalog ? Object.keys(catalog) : [];

  // ---- identity -----------------------------------------------------------------------------
  if (f.id !== expectedId) out.error('/id', `id ${quote(f.id)} must equal the file name ${quote(expectedId)}`);

  const { badAmount, unknownName } = checkAmountsAndNames(out, f, catalog, known, input.noCatalog);
  const ctx: FormulaContext = { out, f, raw, catalog, known, item, catalogNames, badAmount, unknownName, amountsOk: badAmount.size === 0 };
  const flourSum = checkFlours(ctx);
  checkLossAndFinishes(ctx);
  checkBuilds(ctx);
  checkUsualRanges(ctx, flourSum);
  checkProcess(out, f, raw);
  return out.findings;
}

/** Every amount a finite, non-negative number; every name in the catalog. */
function checkAmountsAndNames(
  out: FindingList,
  f: Formula,
  catalog: Catalog | null,
  known: (name: string) => CatalogItem | undefined,
  noCatalog: string | undefined,
): { badAmount: Set<string>; unknownName: Set<string> } {
  const catalogNames = catalog ? Object.keys(catalog) : [];
  const tables: { at: string[]; lines: Line[]; what: string }[] = [
    { at: ['flour'], lines: f.flour, what: 'flour' },
    { at: ['ingredients'], lines: f.ingredients, what: 'ingredients' },
    ...f.preferments.map((p, i) => ({ at: ['preferments', String(i), 'ingredients'], lines: p.ingredients, what: `pre-ferment ${quote(p.name)}` })),
    ...f.soakers.map((s, i) => ({ at: ['soakers', String(i), 'ingredients'], lines: s.ingredients, what: `soaker ${quote(s.name)}` })),
  ];
  const badAmount = new Set<string>();
  const unknownName = new Set<string>();
  for (const t of tables) {
    for (const l of t.lines) {
      const at = pointer(...t.at, l.ingredient);
      if (!finite(l.percent)) {
        out.error(at, `${quote(l.ingredient)} in ${t.what} must be a number of percent; got ${String(l.percent)}`);
        badAmount.add(at);
      } else if (l.percent < 0) {
        out.error(at, `${quote(l.ingredient)} in ${t.what} is ${pct(l.percent)}; an amount cannot be negative`);
        badAmount.add(at);
      }
      if (catalog && !known(l.ingredient)) {
        out.error(at, `unknown ingredient ${quote(l.ingredient)} in ${t.what}: not in the catalog${didYouMean(l.ingredient, catalogNames)}`, 'key');
        unknownName.add(l.ingredient);
      }
    }
  }
  if (!catalog) {
    out.warning('', `${noCatalog ?? 'no ingredient catalog (ingredients.yaml beside the formula or in its parent folder, or --catalog)'}; ingredient names and kinds were not checked`);
  }
  return { badAmount, unknownName };
}

/** The flours sum to 100 %, only flours are under flour, nothing is listed twice. Returns their sum. */
function checkFlours(ctx: FormulaContext): number {
  const { out, f, catalog, known, amountsOk } = ctx;
  const flourSum = sum(f.flour.map((l) => l.percent));
  if (amountsOk && Math.abs(flourSum - 100) > 1e-6) {
    out.error('/flour', `the flours sum to ${pct(flourSum)}; in baker's percent they must sum to 100 %`, 'key');
  }
  for (const l of f.flour) {
    if (l.percent === 0) out.warning(pointer('flour', l.ingredient), `flour ${quote(l.ingredient)} is 0 %; remove the line or give it an amount`);
    const k = known(l.ingredient);
    if (k && k.kind !== 'flour') {
      out.error(pointer('flour', l.ingredient), `${quote(l.ingredient)} is listed under flour but the catalog's kind is ${k.kind}; only flours go under flour`, 'key');
    }
  }
  const flourNames = new Set(f.flour.map((l) => l.ingredient));
  for (const l of f.ingredients) {
    const at = pointer('ingredients', l.ingredient);
    if (flourNames.has(l.ingredient)) {
      out.error(at, `${quote(l.ingredient)} is listed under both flour and ingredients; list it once`, 'key');
      continue;
    }
    const k = known(l.ingredient);
    if (k?.kind === 'flour') {
      out.error(at, `${quote(l.ingredient)} is a flour (catalog kind flour); list it under flour so the flours sum to 100 %`, 'key');
    } else if (k?.kind === 'culture') {
      out.warning(at, `${quote(l.ingredient)} is a seed culture; write it in a levain build under preferments so its flour and water count in the formula`, 'key');
    }
    if (l.percent === 0) out.warning(at, `${quote(l.ingredient)} is 0 %; remove the line or give it an amount`);
  }
  return flourSum;
}

/** The loss before dividing, the loss in the oven, and the finishes on each piece. */
function checkLossAndFinishes(ctx: FormulaContext): void {
  const { out, f, raw, catalog, catalogNames } = ctx;
  if (raw.loss !== undefined) {
    if (f.loss < 0) out.error('/loss', `loss is ${pct(f.loss)}; it cannot be negative`);
    else if (f.loss >= 100) out.error('/loss', `loss is ${pct(f.loss)}; it must be below 100 % (it is the share of mixed dough lost before dividing)`);
    else if (f.loss > PRACTICE.lossMax) out.warning('/loss', `loss is ${pct(f.loss)}; a loss allowance is usually 1-3 % (common practice)`);
  }

  // ---- bake loss and finishes --------------------------------------------------------------
  if (f.bakeLoss !== undefined) {
    if (!finite(f.bakeLoss) || f.bakeLoss < 0 || f.bakeLoss >= 100) {
      out.error('/bake_loss', `bake_loss is ${pct(f.bakeLoss)}; it must be from 0 % to below 100 % (the share of the dough's weight lost in the oven)`);
    } else if (outside(f.bakeLoss, PRACTICE.bakeLoss)) {
      out.warning('/bake_loss', `bake_loss is ${pct(f.bakeLoss)}; bread usually loses about 8-25 % of its dough weight in the oven (common practice)`);
    }
  }
  checkFinishes(out, f, catalog, catalogNames);
}

/** Pre-ferments and soakers: shares, their own flours, seeds, names, and what they take out of the overall formula. */
function checkBuilds(ctx: FormulaContext): void {
  const { out, f, catalog, known, item, badAmount, unknownName, amountsOk } = ctx;
  // Reference batch: the formula's own yield, for amounts in grams in messages.
  const total = sum([...f.flour, ...f.ingredients].map((l) => l.percent));
  const lossOk = f.loss >= 0 && f.loss < 100;
  const refFlour = amountsOk && lossOk && total > 0 ? (f.yield.pieces * f.yield.pieceGrams) / (1 - f.loss / 100) / (total / 100) : undefined;
  const inBatch = (percentOfFlour: number, batch: boolean) =>
    refFlour === undefined ? '' : ` (${grams((refFlour * percentOfFlour) / 100)}${batch ? ` in the reference batch of ${f.yield.pieces} × ${grams(f.yield.pieceGrams)}` : ''})`;
  if (!(f.yield.pieceGrams > 0)) out.error('/yield/piece', `the piece weight is ${grams(f.yield.pieceGrams)}; it must be above 0 g`);

  const overall = new Map<string, number>();
  for (const l of [...f.flour, ...f.ingredients]) overall.set(l.ingredient, (overall.get(l.ingredient) ?? 0) + l.percent);

  interface Take {
    ingredient: string;
    /** Percent of the formula's total flour. */
    percent: number;
    at: string;
    from: string;
  }
  const takes: Take[] = [];
  f.preferments.forEach((p, i) => {
    const base = ['preferments', String(i)];
    const from = `pre-ferment ${quote(p.name)}`;
    if (!finite(p.share) || p.share <= 0) {
      out.error(pointer(...base, 'share'), `the share of ${from} is ${pct(p.share)}; it must be above 0 %`);
      return;
    }
    if (p.share > 100 + EPS) out.error(pointer(...base, 'share'), `the share of ${from} is ${pct(p.share)}; a pre-ferment cannot hold more than all of the formula's flour`);
    const buildFlour = p.ingredients.filter((l) => item(l.ingredient).kind === 'flour');
    const seeds = p.ingredients.filter((l) => known(l.ingredient)?.kind === 'culture');
    const buildFlourSum = sum(buildFlour.map((l) => l.percent));
    if (amountsOk && Math.abs(buildFlourSum - 100) > 1e-6) {
      out.error(
        pointer(...base, 'ingredients'),
        `the flours of ${from} sum to ${pct(buildFlourSum)}; its ingredients are baker's percent of its own flour, so its flours must sum to 100 % (a seed culture's flour is counted inside them)`,
        'key',
      );
    }
    for (const l of p.ingredients) {
      const at = pointer(...base, 'ingredients', l.ingredient);
      if (unknownName.has(l.ingredient) || badAmount.has(at)) continue;
      if (known(l.ingredient)?.kind === 'culture') continue;
      takes.push({ ingredient: l.ingredient, percent: (p.share * l.percent) / 100, at, from });
    }
    for (const seed of seeds) checkSeed(out, base, from, p.ingredients, seed, known(seed.ingredient)!, item);
    if (seeds.length > 1) out.warning(pointer(...base, 'ingredients'), `${from} has ${seeds.length} seed cultures; a build usually has one`, 'key');

    const water = sum(p.ingredients.filter((l) => item(l.ingredient).kind === 'water').map((l) => l.percent));
    const hydrationAt = pointer(...base, 'ingredients');
    if (catalog && amountsOk) {
      if (p.kind === 'poolish' && outside(water, PRACTICE.poolishHydration)) {
        out.warning(hydrationAt, `${from} is at ${pct(water)} hydration; a poolish is usually about 100 % (equal weights of flour and water; common practice)`, 'key');
      } else if (p.kind === 'biga' && outside(water, PRACTICE.bigaStiffHydration) && outside(water, PRACTICE.bigaLiquidHydration)) {
        out.warning(hydrationAt, `${from} is at ${pct(water)} hydration; a biga is usually stiff at 50-60 %, or liquid at about 100 % (common practice)`, 'key');
      } else if (p.kind === 'levain' && outside(water, PRACTICE.levainHydration)) {
        out.warning(hydrationAt, `${from} is at ${pct(water)} hydration; a levain is usually stiff at 50-60 % or liquid at 100-125 % (common practice)`, 'key');
      }
    }
  });
  f.soakers.forEach((s, i) => {
    const from = `soaker ${quote(s.name)}`;
    for (const l of s.ingredients) {
      const at = pointer('soakers', String(i), 'ingredients', l.ingredient);
      if (unknownName.has(l.ingredient) || badAmount.has(at)) continue;
      takes.push({ ingredient: l.ingredient, percent: l.percent, at, from });
    }
  });

  // Each build is one line of the final dough, by its name: two with one name cannot be told apart.
  const buildNames = new Map<string, string>();
  const builds = [
    ...f.preferments.map((p, i) => ({ name: p.name, at: pointer('preferments', String(i), 'name') })),
    ...f.soakers.map((s, i) => ({ name: s.name, at: pointer('soakers', String(i), 'name') })),
  ];
  for (const b of builds) {
    if (buildNames.has(b.name)) out.error(b.at, `two pre-ferments or soakers are named ${quote(b.name)}; give each its own name (each is one line of the final dough)`);
    else if (overall.has(b.name)) out.error(b.at, `the build ${quote(b.name)} has the name of an ingredient of the formula; give it its own name (it is one line of the final dough)`);
    buildNames.set(b.name, b.at);
  }

  const takenSoFar = new Map<string, { percent: number; from: Set<string> }>();
  const reported = new Set<string>();
  for (const t of takes) {
    const have = overall.get(t.ingredient);
    if (have === undefined) {
      // Without a catalog a pre-ferment line may be a seed culture, which is not in the overall formula.
      if (!catalog && t.from.startsWith('pre-ferment')) continue;
      out.error(
        t.at,
        `${quote(t.ingredient)} is in ${t.from} but not in the overall formula; pre-ferments and soakers are taken out of the overall formula, so add it under ${item(t.ingredient).kind === 'flour' ? 'flour' : 'ingredients'}`,
        'key',
      );
      continue;
    }
    const acc = takenSoFar.get(t.ingredient) ?? { percent: 0, from: new Set<string>() };
    acc.percent += t.percent;
    acc.from.add(t.from);
    takenSoFar.set(t.ingredient, acc);
    if (!reported.has(t.ingredient) && acc.percent > have * (1 + 1e-9) + EPS) {
      reported.add(t.ingredient);
      const who = acc.from.size === 1 ? `${t.from} takes` : `the pre-ferments and soakers take`;
      out.error(
        t.at,
        `${who} ${pct(acc.percent)} of ${quote(t.ingredient)}${inBatch(acc.percent, true)}, but the overall formula has only ${pct(have)}${inBatch(have, false)}; raise it in the overall formula or take less`,
      );
    }
  }
}

/** The trade's usual ranges (warnings, common practice): pre-fermented flour, dough temperature, salt, hydration, yeast. */
function checkUsualRanges(ctx: FormulaContext, flourSum: number): void {
  const { out, f, catalog, item, unknownName, amountsOk } = ctx;
  const prefermented = sum(f.preferments.map((p) => (finite(p.share) ? p.share : 0)));
  if (prefermented > PRACTICE.prefermentedFlourMax + EPS && prefermented <= 100) {
    out.warning(
      f.preferments.length === 1 ? pointer('preferments', '0', 'share') : '/preferments',
      `${pct(prefermented)} of the flour is pre-fermented; above about 60 % the dough tends to be slack and sour (common practice)`,
      f.preferments.length === 1 ? 'value' : 'key',
    );
  }
  if (f.bassinage) {
    // Held back from the water line, so it must fit in the water the final dough itself weighs.
    const water = sum(f.ingredients.filter((l) => item(l.ingredient).kind === 'water').map((l) => l.percent));
    const isWater = (l: Line) => item(l.ingredient).kind === 'water';
    const builds =
      sum(f.preferments.flatMap((p) => p.ingredients.filter(isWater).map((l) => (l.percent * p.share) / 100))) +
      sum(f.soakers.flatMap((s) => s.ingredients.filter(isWater).map((l) => l.percent)));
    if (f.bassinage.percent >= water - builds - EPS) {
      out.error(pointer('bassinage', 'percent'), `the bassinage holds back ${pct(f.bassinage.percent)} of water, but the final dough weighs only ${pct(Math.max(0, water - builds))} of water; hold back less`);
    }
  }
  if (f.doughTemperature !== undefined && outside(f.doughTemperature, PRACTICE.doughTemperature)) {
    out.warning('/dough_temperature', `dough temperature ${Number(f.doughTemperature.toFixed(1))} °C is outside the usual 20-30 °C (common practice)`);
  }
  // Kind-based totals (salt, yeast, water) mean nothing while a name is unknown: its error says enough.
  const overallKnown = [...f.flour, ...f.ingredients].every((l) => !unknownName.has(l.ingredient));
  if (catalog && amountsOk && flourSum > 0 && overallKnown) {
    const overallLines = [...f.flour, ...f.ingredients];
    const ofKind = (kind: string) => overallLines.filter((l) => item(l.ingredient).kind === kind);
    const salt = sum(ofKind('salt').map((l) => l.percent));
    if (outside(salt, PRACTICE.salt)) {
      out.warning(ofKind('salt').length === 1 ? pointer('ingredients', ofKind('salt')[0].ingredient) : '/ingredients', `salt is ${pct(salt)} of the flour; bread usually has 1.5-3 % (common practice)`, ofKind('salt').length === 1 ? 'value' : 'key');
    }
    const water = sum(ofKind('water').map((l) => l.percent));
    const effective = sum(overallLines.map((l) => (l.percent * item(l.ingredient).water) / 100));
    if (outside(effective, PRACTICE.hydration)) {
      const what = Math.abs(effective - water) > 1e-6 ? `effective hydration (counting the water in ${overallLines.filter((l) => item(l.ingredient).kind !== 'water' && item(l.ingredient).water > 0).map((l) => l.ingredient).join(', ')}) is ${pct(effective)}` : `hydration is ${pct(water)}`;
      out.warning('/ingredients', `${what}; bread doughs are usually 50-100 % (common practice)`, 'key');
    }
    const enrichment = sum(overallLines.filter((l) => ENRICHING_KINDS.has(item(l.ingredient).kind)).map((l) => l.percent));
    if (enrichment <= PRACTICE.leanEnrichmentMax) {
      const yeasts = ofKind('yeast');
      const fresh = sum(yeasts.map((l) => l.percent / yeastFactor(item(l.ingredient))));
      if (fresh > PRACTICE.leanYeastFreshMax + EPS) {
        out.warning(
          yeasts.length === 1 ? pointer('ingredients', yeasts[0].ingredient) : '/ingredients',
          `yeast is ${pct(sum(yeasts.map((l) => l.percent)))} (${pct(fresh)} as fresh yeast) in a lean dough; lean doughs rarely need more than about 4 % fresh yeast (common practice)`,
          yeasts.length === 1 ? 'value' : 'key',
        );
      }
    }
  }
}

function checkFinishes(out: FindingList, f: Formula, catalog: Catalog | null, catalogNames: string[]): void {
  const seen = new Map<string, number>();
  f.finishes.forEach((x, i) => {
    const at = (...k: string[]) => pointer('finishes', String(i), ...k);
    const what = `finish ${i + 1} (${x.use} of ${quote(x.ingredient)})`;
    if (catalog && !Object.hasOwn(catalog, x.ingredient)) {
      out.error(at('ingredient'), `unknown ingredient ${quote(x.ingredient)} in ${what}: not in the catalog${didYouMean(x.ingredient, catalogNames)}`);
    } else if (catalog && catalog[x.ingredient].kind === 'culture') {
      out.error(at('ingredient'), `${quote(x.ingredient)} is a seed culture; a culture goes into a levain build, not on the piece`);
    }
    if (!finite(x.perPieceGrams) || x.perPieceGrams <= 0) {
      out.error(at('per_piece'), `${what} is ${grams(x.perPieceGrams)} a piece; it must be above 0 g`);
    } else if (f.yield.pieceGrams > 0 && x.perPieceGrams > f.yield.pieceGrams * PRACTICE.finishShareMax / 100) {
      out.warning(
        at('per_piece'),
        `${what} is ${grams(x.perPieceGrams)} on a ${grams(f.yield.pieceGrams)} piece, more than ${PRACTICE.finishShareMax} % of it; a topping, wash or tray oil is usually a few percent of the piece (common practice)`,
      );
    }
    const key = `${x.use}\u0000${x.ingredient}`;
    const first = seen.get(key);
    if (first !== undefined) out.error(at('ingredient'), `${what} repeats finish ${first + 1}; give each ingredient once per use, with the whole amount`);
    else seen.set(key, i);
  });
}

function yeastFactor(i: CatalogItem): number {
  if (i.yeastFactor !== undefined && i.yeastFactor > 0) return i.yeastFactor;
  return YEAST_FACTORS[i.yeast ?? 'fresh'];
}

/** A levain seeded with a mature culture: the seed's flour and water must fit inside the build's lines. */
function checkSeed(
  out: FindingList,
  base: string[],
  from: string,
  lines: Line[],
  seed: Line,
  culture: CatalogItem,
  item: (name: string) => CatalogItem,
): void {
  const at = pointer(...base, 'ingredients', seed.ingredient);
  if (culture.hydration === undefined || !finite(culture.hydration) || culture.hydration < 0) {
    out.error(at, `the seed culture ${quote(seed.ingredient)} needs a hydration in the catalog (e.g. "hydration: 100 %") so its flour and water can be counted`, 'key');
    return;
  }
  const flours = lines.filter((l) => l !== seed && item(l.ingredient).kind === 'flour');
  const water = lines.find((l) => item(l.ingredient).kind === 'water');
  let flourLine: Line | undefined;
  if (culture.fedWith === undefined) {
    out.error(at, `the seed culture ${quote(seed.ingredient)} needs "fed_with" in the catalog: the flour it is fed with`, 'key');
    return;
  }
  flourLine = flours.find((l) => l.ingredient === culture.fedWith);
  if (!flourLine) {
    out.error(
      at,
      `the seed ${quote(seed.ingredient)} is fed with ${quote(culture.fedWith)}, which is not among the flours of ${from}${flours.length ? ` (${flours.map((l) => l.ingredient).join(', ')})` : ''}; its flour counts as that flour, so add it to the build`,
      'key',
    );
    return;
  }
  if (!water) {
    out.error(at, `${from} has a seed culture but no water line for the seed's water to count in`, 'key');
    return;
  }
  const h = culture.hydration;
  const seedFlour = (seed.percent * 100) / (100 + h);
  const seedWater = (seed.percent * h) / (100 + h);
  if (seedFlour > flourLine.percent + EPS) {
    out.error(at, `the seed ${quote(seed.ingredient)} at ${pct(seed.percent)} brings ${pct(seedFlour)} of ${quote(flourLine.ingredient)}, more than the build's ${pct(flourLine.percent)}`);
  }
  if (seedWater > water.percent + EPS) {
    out.error(at, `the seed ${quote(seed.ingredient)} at ${pct(seed.percent)} brings ${pct(seedWater)} water, more than the build's ${pct(water.percent)}`);
  }
}

function checkProcess(out: FindingList, f: Formula, raw: FormulaFile): void {
  f.process.forEach((s, i) => {
    const at = (...k: string[]) => pointer('process', String(i), ...k);
    const r = raw.process?.[i];
    if (r && r.minutes !== undefined && r.hours !== undefined) {
      out.error(at('hours'), `step ${i + 1} (${s.step}) gives both minutes and hours; give one`, 'key');
    }
    const longest = s.minutes?.max;
    if (s.covered !== undefined) {
      if (s.step !== 'bake') out.warning(at('covered'), `"covered" is for bake steps; step ${i + 1} is ${s.step}`, 'key');
      else if (longest !== undefined && s.covered > longest + EPS) {
        out.error(at('covered'), `the bake is covered for ${s.covered} min but lasts only ${longest} min`);
      }
    }
    if (s.vessel !== undefined && s.step !== 'bake' && s.step !== 'proof' && s.step !== 'retard') {
      out.warning(at('vessel'), `"vessel" is for bake, proof and retard steps; step ${i + 1} is ${s.step}`, 'key');
    } else if (s.step === 'bake' && (s.vessel === 'banneton' || s.vessel === 'couche')) {
      out.error(at('vessel'), `a ${s.vessel} is for the proof, not the oven; step ${i + 1} bakes: say deck, stone, tray, tin or pot`);
    }
    if (s.folds && longest !== undefined && s.folds.count * s.folds.every > longest + EPS) {
      out.warning(at('folds'), `${s.folds.count} folds every ${s.folds.every} min take ${s.folds.count * s.folds.every} min, longer than the step (${longest} min)`, 'key');
    }
    const t = s.temperature;
    if (t !== undefined) {
      if (s.step === 'retard' && t > PRACTICE.retardTemperatureMax) {
        out.warning(at('temperature'), `a retard (cold hold) at ${Number(t.toFixed(1))} °C is warm; cold holds usually run at about 2-6 °C (common practice; follow your food-safety plan)`);
      }
      if (s.step === 'bake' && outside(t, PRACTICE.bakeTemperature)) {
        out.warning(at('temperature'), `a bake at ${Number(t.toFixed(1))} °C is outside the usual 150-300 °C (common practice)`);
      }
    }
  });
}
