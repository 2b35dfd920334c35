// Trade checks of the ingredient catalog once it has passed the schema: compound ingredients
// name known components and declare their allergens, seed cultures say how to count them,
// water contents and dates are real. Pure.
import type { Finding, SourceMap } from '../parse.ts';
import type { Catalog, Nutrients } from '../model.ts';
import { SALT_PER_SODIUM } from '../nutrition.ts';
import { finite, FindingList, pct, pointer, quote } from './report.ts';
import { didYouMean } from './suggest.ts';

export interface CatalogCheckInput {
  file: string;
  catalog: Catalog;
  source: SourceMap;
}

export function checkCatalog(input: CatalogCheckInput): Finding[] {
  const { catalog } = input;
  const out = new FindingList(input.file, input.source);
  const names = Object.keys(catalog);

  for (const [name, e] of Object.entries(catalog)) {
    const at = (...k: string[]) => pointer(name, ...k);

    if (!finite(e.water) || e.water < 0 || e.water > 100) {
      out.error(at('water'), `the water content of ${quote(name)} is ${pct(e.water)}; it must be from 0 to 100 % of its weight`);
    }
    if (e.kind === 'water' && e.water !== 100) {
      out.warning(at('water'), `${quote(name)} is of kind water but its water content is ${pct(e.water)}; hydration counts it as water all the same`);
    }

    if (e.kind === 'culture') {
      if (e.hydration === undefined) {
        out.error(at(), `the culture ${quote(name)} needs "hydration" (e.g. "hydration: 100 %"): a levain build counts its flour and water by it`, 'key');
      } else if (!finite(e.hydration) || e.hydration < 0) {
        out.error(at('hydration'), `the hydration of ${quote(name)} is ${pct(e.hydration)}; it cannot be negative`);
      }
      if (e.fedWith === undefined) {
        out.error(at(), `the culture ${quote(name)} needs "fed_with": the flour it is fed with`, 'key');
      } else if (!Object.hasOwn(catalog, e.fedWith)) {
        out.error(at('fed_with'), `${quote(name)} is fed with ${quote(e.fedWith)}, which is not in the catalog${didYouMean(e.fedWith, names)}`);
      } else if (catalog[e.fedWith].kind !== 'flour') {
        out.error(at('fed_with'), `${quote(name)} is fed with ${quote(e.fedWith)}, whose kind is ${catalog[e.fedWith].kind}; a culture is fed with a flour`);
      }
      const r = e.feeding?.ratio;
      if (r && !(r[0] > 0 && r[1] > 0)) {
        out.error(at('feeding', 'ratio'), `the feeding ratio of ${quote(name)} needs some culture and some flour (culture : flour : water, e.g. "1:2:2")`);
      } else if (r && e.hydration !== undefined && finite(e.hydration) && Math.abs((r[2] / r[1]) * 100 - e.hydration) > 1) {
        out.warning(
          at('feeding', 'ratio'),
          `${quote(name)} is fed ${r.join(':')}, water ${pct((r[2] / r[1]) * 100)} of the flour, but its hydration is ${pct(e.hydration)}; fed so, the culture drifts away from the hydration the builds count it at`,
        );
      }
    } else {
      if (e.feeding !== undefined) out.warning(at('feeding'), `"feeding" is used only for a culture; ${quote(name)} is of kind ${e.kind}`, 'key');
      if (e.hydration !== undefined) out.warning(at('hydration'), `"hydration" is used only for a culture; ${quote(name)} is of kind ${e.kind}`, 'key');
      if (e.fedWith !== undefined) out.warning(at('fed_with'), `"fed_with" is used only for a culture; ${quote(name)} is of kind ${e.kind}`, 'key');
    }

    if (e.kind === 'yeast' && e.yeast === undefined) {
      out.warning(at(), `the yeast ${quote(name)} has no "yeast" type (fresh, active-dry or instant); it is treated as fresh yeast when converting`, 'key');
    }
    if (e.kind !== 'yeast' && e.yeast !== undefined) {
      out.warning(at('yeast'), `"yeast" is used only for kind yeast; ${quote(name)} is of kind ${e.kind}`, 'key');
    }
    if (e.kind !== 'yeast' && e.yeastFactor !== undefined) {
      out.warning(at('yeast_factor'), `"yeast_factor" is used only for kind yeast; ${quote(name)} is of kind ${e.kind}`, 'key');
    }

    if (e.costDate !== undefined && !isCalendarDate(e.costDate)) {
      out.error(at('cost_date'), `cost_date ${quote(e.costDate)} is not a date in the calendar (YYYY-MM-DD)`);
    }
    if (e.costDate !== undefined && e.costPerKg === undefined) {
      out.warning(at('cost_date'), `${quote(name)} has a cost_date but no cost_per_kg`, 'key');
    }

    if (e.nutrients) checkNutrients(out, name, e.nutrients, at);
    if (e.kind === 'culture' && e.nutrients) {
      out.warning(at('nutrients'), `a culture's nutrients are not used: its flour and water count as the flour it is fed with and water`, 'key');
    }
    for (const market of ['eu', 'us'] as const) {
      if (e.labels?.[market] !== undefined && e.labels[market] === e.label) {
        out.warning(at('labels', market), `labels.${market} of ${quote(name)} is the same as label; leave it out`, 'key');
      }
    }

    if (e.components) {
      const seen = new Set<string>();
      e.components.forEach((c, i) => {
        const cat = pointer(name, 'components', String(i));
        if (seen.has(c)) out.error(cat, `${quote(c)} is listed twice in the components of ${quote(name)}`);
        seen.add(c);
        if (c === name) {
          out.error(cat, `${quote(name)} lists itself as a component`);
          return;
        }
        const comp = Object.hasOwn(catalog, c) ? catalog[c] : undefined;
        if (!comp) {
          out.error(cat, `component ${quote(c)} of ${quote(name)} is not in the catalog${didYouMean(c, names)}`);
          return;
        }
        // Labels roll a component's allergens up into the compound anyway; an entry that does
        // not say so itself misleads whoever reads the catalog, so it is flagged.
        for (const a of comp.allergens) {
          if (!e.allergens.includes(a)) {
            out.warning(
              at(...(e.allergens.length ? ['allergens'] : [])),
              `${quote(name)} does not list allergen ${quote(a)}, which its component ${quote(c)} has; add it to allergens so the catalog reads true`,
              e.allergens.length ? 'value' : 'key',
            );
          }
        }
      });
    }
  }
  for (const cycle of componentCycles(catalog)) {
    out.error(pointer(cycle[0], 'components'), `${quote(cycle[0])} contains itself through its components: ${cycle.map(quote).join(' → ')}`, 'key');
  }
  return out.findings;
}

/** Values per 100 g that cannot all be true at once: parts larger than their whole, more than 100 g in 100 g. */
function checkNutrients(out: FindingList, name: string, n: Nutrients, at: (...k: string[]) => string): void {
  const g = (x: number) => `${Number(x.toFixed(3))} g`;
  // Food tables give carbohydrate by difference and sugars by analysis: they may disagree a little
  // (whole milk: 5.05 g sugars in 4.80 g carbohydrate, USDA SR Legacy 01077).
  const slack = 0.5;
  if (n.saturates > n.fat + slack) out.error(at('nutrients', 'saturates'), `${quote(name)} has ${g(n.saturates)} saturates in ${g(n.fat)} fat; saturates are part of the fat`);
  if (n.sugars > n.carbohydrate + slack) out.error(at('nutrients', 'sugars'), `${quote(name)} has ${g(n.sugars)} sugars in ${g(n.carbohydrate)} carbohydrate; sugars are part of the carbohydrate`);
  if (n.fibre > n.carbohydrate + slack) {
    out.warning(at('nutrients', 'fibre'), `${quote(name)} has more fibre (${g(n.fibre)}) than carbohydrate (${g(n.carbohydrate)}); carbohydrate is total carbohydrate, fibre included (as food tables give it by difference)`);
  }
  const total = n.fat + n.carbohydrate + n.protein + (n.sodiumMg * SALT_PER_SODIUM) / 1000;
  if (total > 100 + 0.5) {
    out.error(at('nutrients'), `the nutrients of ${quote(name)} add up to ${g(total)} per 100 g (fat, carbohydrate, protein and the salt its sodium makes); no food holds more than 100 g in 100 g`, 'key');
  }
}

/** Compounds that contain themselves through other compounds (A → B → A); each cycle once. */
function componentCycles(catalog: Catalog): string[][] {
  const cycles: string[][] = [];
  const reported = new Set<string>();
  const state = new Map<string, 'open' | 'done'>();
  const path: string[] = [];
  const visit = (name: string) => {
    state.set(name, 'open');
    path.push(name);
    for (const c of Object.hasOwn(catalog, name) ? (catalog[name].components ?? []) : []) {
      if (c === name || !Object.hasOwn(catalog, c)) continue; // reported above
      if (state.get(c) === 'open') {
        const cycle = [...path.slice(path.indexOf(c)), c];
        const key = [...cycle.slice(0, -1)].sort().join('\u0000');
        if (!reported.has(key)) {
          reported.add(key);
          cycles.push(cycle);
        }
      } else if (!state.has(c)) visit(c);
    }
    path.pop();
    state.set(name, 'done');
  };
  for (const name of Object.keys(catalog)) if (!state.has(name)) visit(name);
  return cycles;
}

export function isCalendarDate(s: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(s);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (mo < 1 || mo > 12 || d < 1) return false;
  const days = [31, y % 4 === 0 && (y % 100 !== 0 || y % 400 === 0) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
  return d <= days[mo - 1];
}
