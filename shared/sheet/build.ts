// Tomorrow's batch sheet from a plan: builds to mix tonight, mixes split by mixer capacity with
// water temperature and ice, the timeline, the pick list and the cautions. Pure; no I/O, no clock.
//
// Conventions (docs/batch-sheet.md):
// - An order's mixed dough is the formula scaled to its pieces with its loss (scale.ts). It is split
//   into the fewest EQUAL mixes that fit the mixer: the order's mixer, else the first mixer that
//   takes the whole order (capacity and minimum), else the biggest. Pieces per mix are whole: when
//   they do not divide evenly the first mixes divide one piece more.
// - A mix's water, bassinage and ice: planMixWater (dough-water.ts), with the mixer's rise and the
//   plan's `conditions.preferment` only as the default for a pre-ferment that gives no temperature.
// - A build's water temperature: planBuildWater (dough-water.ts), T its `temperature`, else its
//   ripening temperature; the seed culture counted at the plan's pre-ferment default, else the room.
// - Builds whose kind, ingredient percentages, ripening hours and temperatures are identical are
//   made together, across formulas. A build must have ripened at least its minimum hours and at most
//   its maximum at every final mix that takes it: mixUntil = first use − min hours, mixFrom = last
//   use − max hours. When uses are too far apart for one build, it is made in several batches.
//   Soakers follow the same rule with their soaking hours.
import { lookupIngredient, type Catalog, type Formula, type Mixer, type Order } from '../model.ts';
import { resolveTarget, scaleFormula, ScaleError, sum, type ScaledBuild, type ScaleResult } from '../scale.ts';
import type { AllergenCode, IngredientKind } from '../schema/shapes.ts';
import { AllergenError, allergenSummary } from '../allergens.ts';
import { cautionFacts, cautionsFor, type CautionSet } from '../cautions.ts';
import { planBuildWater, planMixWater, type MixWater } from '../dough-water.ts';
import { computeIce, HOT_WATER_CELSIUS, WARM_WATER_ADVICE, WARM_WATER_CELSIUS } from '../temperature.ts';
import { formatTemperature } from '../units.ts';
import { bookBuilds, finishBookings, scheduleNight, type NightMix } from '../schedule/night.ts';
import { clockMinutes, localDateTime, minuteOf } from './time.ts';
import {
  SheetError,
  type BuildUse,
  type FormulaSummary,
  type PickLine,
  type Sheet,
  type SheetBuild,
  type SheetInput,
  type SheetLine,
  type SheetMix,
  type TimelineEntry,
} from './types.ts';
import { compareCodeUnits, textRanks } from '../text.ts';
import { mixFinishes, pickLines, sheetFinishes } from './pick.ts';
import { checkWeights } from './scales.ts';
import { equipmentNeeds } from './equipment.ts';
import { cultureFeeds } from './cultures.ts';

const EPSILON = 1e-9;

/** A mix of the plan as the scheduler sees it (NightMix), with its order and its scaled batch. */
interface PlannedMix extends Omit<NightMix, 'label' | 'allergens'> {
  o: Order;
  scaled: ScaleResult;
  mixStart: number;
  mixEnd: number;
}

export function buildSheet(input: SheetInput): Sheet {
  const { plan, formulas, catalog } = input;
  const warnings: string[] = [];
  const date = plan.date;
  const at = (minute: number) => localDateTime(date, minute);
  const readyBy = clockMinutes(plan.readyBy);

  // ---- orders → equal mixes -------------------------------------------------------------
  const warnedFolds = new Set<string>();
  const planned: PlannedMix[] = [];
  plan.orders.forEach((o, order) => {
    const formula = formulas[o.formula];
    if (!formula) {
      throw new SheetError(`order ${order + 1} names formula "${o.formula}", which was not found; known formulas: ${Object.keys(formulas).sort().join(', ') || 'none'}`);
    }
    if (formula.status !== 'active') warnings.push(`${formula.id} is ${formula.status}, not active`);
    // The order's dough alone decides the mixer and the number of mixes; each mix is scaled below.
    const whole = scaleOrThrow(formula, order, () => resolveTarget(formula, { by: 'pieces', pieces: o.pieces, pieceGrams: o.pieceGrams }));
    const pieceGrams = whole.pieceGrams ?? formula.yield.pieceGrams;
    const mixer = chooseMixer(plan.mixers, o, whole.mixedDough, order);
    const pieceMixed = pieceGrams / (1 - whole.loss / 100);
    if (pieceMixed > mixer.capacityGrams * (1 + EPSILON)) {
      throw new SheetError(
        `order ${order + 1} (${formula.id}): one piece needs ${grams(pieceMixed)} of mixed dough, more than mixer "${mixer.name}" holds (${grams(mixer.capacityGrams)})`,
      );
    }
    const of = Math.max(1, Math.ceil(whole.mixedDough / mixer.capacityGrams - EPSILON));
    const dough = whole.mixedDough / of;
    if (mixer.minimumGrams !== undefined && dough < mixer.minimumGrams * (1 - EPSILON)) {
      throw new SheetError(
        `order ${order + 1} (${formula.id}): ${of === 1 ? 'the mix' : `each of ${of} mixes`} holds ${grams(dough)}, below mixer "${mixer.name}"'s minimum of ${grams(mixer.minimumGrams)}`,
      );
    }
    const perMix = scaleOrThrow(formula, order, () => scaleFormula(formula, catalog, { by: 'mix', grams: dough }));
    const base = Math.floor(o.pieces / of);
    const extra = o.pieces % of;
    if (extra > 0 && (base + 1) * pieceMixed > dough * (1 + EPSILON)) {
      warnings.push(
        `order ${order + 1} (${formula.id}): ${o.pieces} pieces do not divide evenly into ${of} mixes; mixes 1–${extra} divide ${base + 1} pieces and need the dough left over from the others`,
      );
    }
    for (let i = 0; i < of; i++) {
      planned.push({
        order, o, formula, mixer, mixNumber: i + 1, of, pieces: base + (i < extra ? 1 : 0), pieceGrams,
        scaled: perMix, mixStart: 0, mixEnd: 0,
      });
    }
  });

  // ---- timeline: the night scheduled on the mixers, the bench and the ovens ------------------
  const ordersOf = new Map<string, number>();
  for (const o of plan.orders) ordersOf.set(o.formula, (ordersOf.get(o.formula) ?? 0) + 1);
  const allergensOf = new Map<string, AllergenCode[]>();
  for (const p of planned) if (!allergensOf.has(p.formula.id)) allergensOf.set(p.formula.id, allergenCodes(p.formula, catalog));
  const night = scheduleNight(
    plan,
    planned.map((p) => ({
      order: p.order, formula: p.formula, mixer: p.mixer, mixNumber: p.mixNumber, of: p.of, pieces: p.pieces, pieceGrams: p.pieceGrams,
      // A formula ordered more than once gets the order's number, so its rows can be told apart.
      label: `${p.formula.title}${ordersOf.get(p.formula.id)! > 1 ? ` (order ${p.order + 1})` : ''} ${p.mixNumber}/${p.of}`,
      allergens: allergensOf.get(p.formula.id)!,
    })),
  );
  const timeline: TimelineEntry[] = [];
  planned.forEach((p, i) => {
    const s = night.mixes[i];
    p.mixStart = s.mixStart;
    p.mixEnd = s.mixEnd;
    for (const e of s.entries) {
      const step = p.formula.process.find((x) => x.step === e.step && x.folds);
      if (step?.folds && p.mixNumber === 1 && !warnedFolds.has(p.formula.id) && step.folds.count * step.folds.every > e.minutes + EPSILON) {
        warnedFolds.add(p.formula.id);
        warnings.push(`${p.formula.id}: ${step.folds.count} folds every ${step.folds.every} min run past the end of its ${e.step} (${e.minutes} min)`);
      }
      timeline.push(e);
    }
  });

  // ---- builds: pre-ferments and soakers -----------------------------------------------------
  const { room, flour: flourT, tapWater } = plan.conditions;
  const preferments = makeBuilds('preferment', planned, catalog, plan.conditions, at, warnings);
  const soakers = makeBuilds('soaker', planned, catalog, plan.conditions, at, warnings);
  const booked = bookBuilds(
    night,
    plan,
    preferments.map((b) => ({
      name: b.batches > 1 ? `${b.name} (${b.batch}/${b.batches})` : b.name,
      formula: b.formula,
      grams: b.grams,
      allergens: [...new Set(b.ingredients.flatMap((l) => lookupIngredient(catalog, l.ingredient).allergens))],
      from: b.mixFrom ? minuteOf(b.mixFrom, date) : minuteOf(b.mixUntil, date) - 12 * 60,
      until: minuteOf(b.mixUntil, date),
    })),
    at,
  );
  preferments.forEach((b, i) => {
    const x = booked[i];
    b.booked = x ? { mixer: x.mixer, start: at(x.start), end: at(x.end) } : null;
  });
  for (const b of [...preferments, ...soakers]) {
    const from = b.mixFrom ? minuteOf(b.mixFrom, date) : minuteOf(b.mixUntil, date);
    const to = minuteOf(b.mixUntil, date);
    timeline.push({
      formula: b.formula, label: b.batches > 1 ? `${b.name} (${b.batch}/${b.batches})` : b.name,
      step: b.kind === 'soaker' ? 'soak' : 'build', order: null, mixNumber: null,
      start: b.mixFrom ?? b.mixUntil, end: b.mixUntil, startMinute: from, endMinute: to, minutes: to - from, window: true,
      ...(b.holdTemperature !== null ? { temperature: b.holdTemperature } : {}),
    });
  }
  // Labels ranked once: thousands of entries share start and end times on a big night.
  const labelRank = textRanks(timeline.map((e) => e.label));
  timeline.sort((a, b) => a.startMinute - b.startMinute || a.endMinute - b.endMinute || labelRank.get(a.label)! - labelRank.get(b.label)!);

  // ---- mixes ---------------------------------------------------------------------------------
  const mixes: SheetMix[] = planned.map((p) => {
    const f = p.formula;
    const kindOf = (name: string): IngredientKind => lookupIngredient(catalog, name).kind;
    const ingredients: SheetLine[] = p.scaled.finalDough.map((l) => ({
      ingredient: l.ingredient,
      grams: l.grams,
      kind: l.source === 'ingredient' ? kindOf(l.ingredient) : l.source,
    }));
    const water = sum(ingredients.filter((l) => l.kind === 'water').map((l) => l.grams));
    let waterTemperature: number | null = null;
    let factors: SheetMix['factors'] = null;
    let liquid: string | null = null;
    let bassinage: SheetMix['bassinage'] = null;
    let ice = 0;
    let w: MixWater | null = null;
    if (f.doughTemperature !== undefined) {
      w = planMixWater(f, p.scaled, catalog, { room, flour: flourT, tap: tapWater, rise: p.mixer.rise, prefermentDefault: plan.conditions.preferment });
      factors = { room, flour: flourT, rise: w.rise, friction: w.frictionFactor, preferments: w.preferments, n: w.factors };
      waterTemperature = w.main?.temperature ?? null;
      liquid = w.liquid ? w.liquid.names.join(' and ') : null;
      bassinage = w.bassinage && { grams: w.bassinage.grams, temperature: w.bassinage.temperature };
      ice = w.main?.ice ?? 0;
      if (p.mixNumber === 1) for (const x of w.warnings) warnings.push(`${f.id} mix ${p.mixNumber}/${p.of}: ${x}`);
    } else if (p.mixNumber === 1) {
      warnings.push(`${f.id} has no dough_temperature; its mixes get no water temperature`);
    }
    return {
      formula: f.id, title: f.title, order: p.order, ...(p.o.customer ? { customer: p.o.customer } : {}),
      mixer: p.mixer.name, mixNumber: p.mixNumber, of: p.of, dough: p.scaled.mixedDough, flour: p.scaled.flour,
      ingredients, doughTemperature: f.doughTemperature ?? null, doughTemperatureRange: w?.doughTemperatureRange ?? null, factors, waterTemperature,
      liquid, water, ice, tapWater: water - ice - (bassinage?.grams ?? 0), bassinage, pieces: p.pieces, pieceGrams: p.pieceGrams,
      finishes: mixFinishes(f, p.pieces, catalog), start: at(p.mixStart), end: at(p.mixEnd),
    };
  });
  const mixOrder = mixes.map((m, i) => ({ m, start: planned[i].mixStart, i }));
  mixOrder.sort((a, b) => a.start - b.start || a.i - b.i);

  // ---- the pick list and the per-formula summary -----------------------------------------------
  const pick = new PickList(catalog);
  const perFormula = new Map<string, PickList>();
  const formulaPick = (id: string) => {
    let l = perFormula.get(id);
    if (!l) perFormula.set(id, (l = new PickList(catalog)));
    return l;
  };
  for (const p of planned) formulaPick(p.formula.id);
  for (const b of [...preferments, ...soakers]) for (const l of b.ingredients) pick.add(l.ingredient, l.grams);
  for (const p of planned) {
    for (const list of p.scaled.preferments.concat(p.scaled.soakers)) {
      for (const l of list.ingredients) formulaPick(p.formula.id).add(l.ingredient, l.weigh);
    }
  }
  for (const m of mixes) {
    for (const l of m.ingredients) {
      if (l.kind === 'preferment' || l.kind === 'soaker') continue;
      pick.add(l.ingredient, l.grams);
      formulaPick(m.formula).add(l.ingredient, l.grams);
    }
  }

  const summaries: FormulaSummary[] = [];
  for (const [id, list] of perFormula) {
    const ps = planned.filter((p) => p.formula.id === id);
    const orders = new Set(ps.map((p) => p.order));
    const ingredients = list.lines();
    summaries.push({
      formula: id,
      title: ps[0].formula.title,
      orders: orders.size,
      pieces: sum(ps.map((p) => p.pieces)),
      dividedDough: sum(ps.map((p) => p.pieces * p.pieceGrams)),
      mixedDough: sum(ps.map((p) => p.scaled.mixedDough)),
      mixes: ps.length,
      mixers: [...new Set(ps.map((p) => p.mixer.name))],
      weighed: sum(ingredients.map((l) => l.grams)),
      ingredients,
    });
  }

  // ---- cautions --------------------------------------------------------------------------------
  const used = new Map<string, Formula>();
  for (const p of planned) used.set(p.formula.id, p.formula);
  const { allergens, mayContain, cautions } = makeCautions([...used.values()], catalog, mixes, [...preferments, ...soakers]);

  // ---- what the night holds its pieces in, its scales and its cultures ------------------------
  const sortedMixes = mixOrder.map((x) => x.m);
  const equipment = equipmentNeeds(sortedMixes, timeline, formulas, plan.equipment, at);
  const weights = checkWeights(
    [
      ...[...preferments, ...soakers].map((b) => ({ where: 'build' as const, label: b.batches > 1 ? `${b.name} (${b.batch}/${b.batches})` : b.name, formula: b.formula, lines: b.ingredients })),
      ...sortedMixes.map((m) => ({ where: 'mix' as const, label: `${m.title} ${m.mixNumber}/${m.of}`, formula: m.formula, lines: m.ingredients })),
    ],
    plan.scales,
  );
  if (weights.smallWeights.length > 0) {
    warnings.push(
      `${weights.smallWeights.length === 1 ? '1 weight is' : `${weights.smallWeights.length} weights are`} too small for the scale that weighs it (fewer than 20 divisions): ${weights.smallWeights
        .map((w) => `${w.ingredient} ${grams(w.grams)} in ${w.label}`)
        .join('; ')}; see "Small weights"`,
    );
  }
  const cultures = cultureFeeds(preferments, catalog, (t) => minuteOf(t, date), at);

  return {
    date,
    readyBy: at(readyBy),
    conditions: plan.conditions,
    mixers: plan.mixers,
    ovens: night.ovens,
    bench: night.bench,
    ranges: plan.ranges,
    ...(plan.notes ? { notes: plan.notes } : {}),
    preferments,
    soakers,
    mixes: sortedMixes,
    timeline,
    bookings: finishBookings(night, at),
    orders: night.orders,
    totals: pick.lines(),
    finishes: sheetFinishes(sortedMixes),
    equipment: equipment.needs,
    scales: weights.scales,
    smallWeights: weights.smallWeights,
    cultures: cultures.feeds,
    formulas: summaries,
    allergens,
    mayContain,
    cautions,
    warnings: [...night.warnings, ...warnings, ...equipment.warnings, ...weights.warnings, ...cultures.warnings],
  };
}

function allergenCodes(f: Formula, catalog: Catalog): AllergenCode[] {
  try {
    return allergenSummary(f, catalog).codes;
  } catch (e) {
    if (e instanceof AllergenError) throw new SheetError(`${f.id}: ${e.message}`);
    throw e;
  }
}

function scaleOrThrow<T>(f: Formula, order: number, scale: () => T): T {
  try {
    return scale();
  } catch (e) {
    if (e instanceof ScaleError) throw new SheetError(`order ${order + 1} (${f.id}): ${e.message}`);
    throw e;
  }
}

function chooseMixer(mixers: Mixer[], o: Order, dough: number, order: number): Mixer {
  if (o.mixer !== undefined) {
    const m = mixers.find((x) => x.name === o.mixer);
    if (!m) {
      throw new SheetError(`order ${order + 1} (${o.formula}) asks for mixer "${o.mixer}", which the plan does not list; mixers: ${mixers.map((x) => x.name).join(', ')}`);
    }
    return m;
  }
  const fits = mixers.find((m) => dough <= m.capacityGrams * (1 + EPSILON) && (m.minimumGrams === undefined || dough >= m.minimumGrams * (1 - EPSILON)));
  if (fits) return fits;
  return mixers.reduce((big, m) => (m.capacityGrams > big.capacityGrams ? m : big), mixers[0]);
}

function grams(g: number): string {
  return g >= 1000 ? `${(g / 1000).toFixed(2)} kg` : `${g.toFixed(1)} g`;
}

function iceFor(water: number, tap: number, target: number, what: string, warnings: string[]): number {
  if (target > HOT_WATER_CELSIUS) {
    warnings.push(`${what}: the water would have to be ${formatTemperature(target)}, hot enough to scald and to harm the yeast; check the conditions, or warm the flour or the room instead`);
  } else if (target > WARM_WATER_CELSIUS) {
    warnings.push(`${what}: the water will be ${formatTemperature(target)}, ${WARM_WATER_ADVICE}`);
  }
  if (water <= 0 || target >= tap) return 0;
  if (target < 0) {
    warnings.push(`${what}: the water would have to be ${formatTemperature(target)}, colder than ice can make it; cool the flour or the room, or lower the friction (shorter mix)`);
  }
  return computeIce(water, tap, Math.max(0, target)).ice;
}

class PickList {
  private readonly all: { ingredient: string; grams: number; kind: IngredientKind }[] = [];
  constructor(private readonly catalog: Catalog) {}
  add(ingredient: string, g: number): void {
    this.all.push({ ingredient, grams: g, kind: lookupIngredient(this.catalog, ingredient).kind });
  }
  lines(): PickLine[] {
    return pickLines(this.all);
  }
}

// ---- builds ----------------------------------------------------------------------------------

interface Consumer {
  p: PlannedMix;
  build: ScaledBuild;
  index: number;
}

function makeBuilds(
  what: 'preferment' | 'soaker',
  planned: PlannedMix[],
  catalog: Catalog,
  conditions: SheetInput['plan']['conditions'],
  at: (minute: number) => string,
  warnings: string[],
): SheetBuild[] {
  const groups = new Map<string, Consumer[]>();
  for (const p of planned) {
    const builds = what === 'preferment' ? p.scaled.preferments : p.scaled.soakers;
    builds.forEach((build, index) => {
      const key = buildKey(p.formula, what, index);
      const list = groups.get(key) ?? [];
      list.push({ p, build, index });
      groups.set(key, list);
    });
  }
  const out: SheetBuild[] = [];
  const noHours = new Set<string>();
  for (const consumers of groups.values()) {
    consumers.sort((a, b) => a.p.mixStart - b.p.mixStart);
    const first = consumers[0];
    const spec = specOf(first.p.formula, what, first.index);
    // Greedy batches: a batch takes uses while the spread of their times fits max − min hours.
    const batches: Consumer[][] = [];
    const spread = spec.hours ? (spec.hours.max - spec.hours.min) * 60 : Infinity;
    for (const c of consumers) {
      const cur = batches[batches.length - 1];
      if (cur && c.p.mixStart - cur[0].p.mixStart <= spread + EPSILON) cur.push(c);
      else batches.push([c]);
    }
    if (!spec.hours && !noHours.has(first.p.formula.id + spec.name)) {
      noHours.add(first.p.formula.id + spec.name);
      warnings.push(`${first.p.formula.id}: ${what === 'preferment' ? 'pre-ferment' : 'soaker'} "${spec.name}" gives no ${what === 'preferment' ? 'ripening' : 'soaking'} hours; mix it before its first use`);
    }
    batches.forEach((batch, bi) => {
      const lines = new Map<string, { grams: number[]; seed: boolean }>();
      for (const c of batch) {
        for (const l of c.build.ingredients) {
          const e = lines.get(l.ingredient) ?? { grams: [], seed: false };
          e.grams.push(l.weigh);
          e.seed ||= Boolean(l.seed);
          lines.set(l.ingredient, e);
        }
      }
      const ingredients: SheetLine[] = [...lines].map(([ingredient, e]) => ({
        ingredient,
        grams: sum(e.grams),
        kind: lookupIngredient(catalog, ingredient).kind,
        ...(e.seed ? { seed: true } : {}),
      }));
      const water = sum(ingredients.filter((l) => l.kind === 'water').map((l) => l.grams));
      const target = what === 'preferment' ? (spec.temperature ?? spec.holdTemperature) : null;
      const seedTemperature = ingredients.some((l) => l.seed) ? (conditions.preferment ?? conditions.room) : null;
      let waterTemperature =
        target === null ? null : planBuildWater(target, { room: conditions.room, flour: conditions.flour, seed: seedTemperature ?? undefined }).waterTemperature;
      if (waterTemperature !== null && waterTemperature < 0) {
        // A build that ripens cold (old dough in the cold room, say) cannot come off the mixer that cold.
        warnings.push(
          spec.temperature === null
            ? `${spec.name} (${batch[0].p.formula.id}) ripens at ${formatTemperature(target!)}, colder than water can bring it to; mix it with the coldest tap water and chill it at once`
            : `${spec.name} (${batch[0].p.formula.id}): the water would have to be ${formatTemperature(waterTemperature)} to reach ${formatTemperature(target!)}, colder than ice can make it; cool the flour or the room`,
        );
        waterTemperature = null;
      }
      const ice = waterTemperature === null ? 0 : iceFor(water, conditions.tapWater, waterTemperature, `${spec.name} build`, warnings);
      const firstUse = batch[0].p.mixStart;
      const lastUse = batch[batch.length - 1].p.mixStart;
      const uses: BuildUse[] = batch.map((c) => ({ formula: c.p.formula.id, order: c.p.order, mixNumber: c.p.mixNumber, grams: c.build.grams, at: at(c.p.mixStart) }));
      out.push({
        formula: batch[0].p.formula.id,
        formulas: [...new Set(batch.map((c) => c.p.formula.id))],
        name: spec.name,
        kind: what === 'soaker' ? 'soaker' : spec.kind,
        batch: bi + 1,
        batches: batches.length,
        grams: sum(batch.map((c) => c.build.grams)),
        flour: sum(batch.map((c) => c.build.flour)),
        ingredients,
        uses,
        targetTemperature: target,
        waterTemperature,
        seedTemperature: target === null ? null : seedTemperature,
        water,
        ice,
        tapWater: water - ice,
        hours: spec.hours ?? null,
        holdTemperature: spec.holdTemperature,
        mixFrom: spec.hours ? at(lastUse - spec.hours.max * 60) : null,
        mixUntil: at(firstUse - (spec.hours ? spec.hours.min * 60 : 0)),
        hot: spec.hot,
        booked: null,
        ...(spec.note ? { note: spec.note } : {}),
      });
    });
  }
  const key = (b: SheetBuild) => b.mixFrom ?? b.mixUntil;
  return out.sort((a, b) => compareCodeUnits(key(a), key(b)) || compareCodeUnits(a.mixUntil, b.mixUntil));
}

interface BuildSpec {
  name: string;
  kind: Exclude<SheetBuild['kind'], 'soaker'>;
  hours?: { min: number; max: number };
  holdTemperature: number | null;
  temperature: number | null;
  hot: boolean;
  note?: string;
}

function specOf(f: Formula, what: 'preferment' | 'soaker', index: number): BuildSpec {
  if (what === 'preferment') {
    const p = f.preferments[index];
    return { name: p.name, kind: p.kind, hours: p.ripenHours, holdTemperature: p.ripenTemperature ?? null, temperature: p.temperature ?? null, hot: false, note: p.note };
  }
  const s = f.soakers[index];
  return { name: s.name, kind: 'other', hours: s.soakHours, holdTemperature: s.soakTemperature ?? null, temperature: null, hot: Boolean(s.hot), note: s.note };
}

/** Identical builds share a key: kind, ingredient percentages, hours and temperatures. */
function buildKey(f: Formula, what: 'preferment' | 'soaker', index: number): string {
  const spec = specOf(f, what, index);
  const src = what === 'preferment' ? f.preferments[index].ingredients : f.soakers[index].ingredients;
  // Any fixed order makes the key.
  const lines = [...src].sort((a, b) => compareCodeUnits(a.ingredient, b.ingredient)).map((l) => [l.ingredient, l.percent]);
  // Soakers are percent of the formula's total flour, so identical percentages are the same soaker per gram of flour.
  return JSON.stringify([what, spec.kind, lines, spec.hours ?? null, spec.holdTemperature, spec.temperature, spec.hot]);
}

// ---- cautions --------------------------------------------------------------------------------

function makeCautions(used: Formula[], catalog: Catalog, mixes: SheetMix[], builds: SheetBuild[]): CautionSet {
  const facts = used.map((f) => {
    try {
      return cautionFacts(f, catalog);
    } catch (e) {
      if (e instanceof AllergenError) throw new SheetError(`${f.id}: ${e.message}`);
      throw e;
    }
  });
  return cautionsFor(facts, { ice: mixes.some((m) => m.ice > 0) || builds.some((b) => b.ice > 0) });
}
