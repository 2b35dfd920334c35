// The sheet as the bench reads it: sections of headed tables with rounded weights, shared by
// the text, HTML and PDF renderers so that every format shows the same figures. Rounding happens
// here (units.ts formatMass, formatTemperature) and nowhere earlier; metric unless the reader
// chose US customary units. Pure; no I/O.
import { sum } from '../scale.ts';
import { FRICTION_CONVENTION } from '../dough-water.ts';
import { dayRange, FRICTION_MINIMUM, type FrictionProposal } from '../friction.ts';
import { celsiusDeltaToFahrenheit, formatMass, formatTemperature, formatTemperatureRange, temperatureUnitOf, type UnitSystem } from '../units.ts';
import { shortTime } from './time.ts';
import { stepWord } from '../step-words.ts';
import type { Sheet, SheetBuild, SheetLine, SheetMix, TimelineEntry } from './types.ts';
import { FINISH_USE_WORDS } from '../finishes.ts';
import { culturesSection, equipmentSection, finishesBlock, scalesSection } from './present-parts.ts';
import { inWindow } from '../schedule/window.ts';

export type Align = 'left' | 'right';

export interface SheetTable {
  head: string[];
  rows: string[][];
  align: Align[];
  /** Rows with a weight to weigh: the renderers put a tick box beside them. */
  tick: boolean[];
  footer?: string[];
}

export interface SheetBlock {
  title: string;
  /** Short facts under the title: times, temperatures, what to divide. */
  lines: string[];
  /** Printed in large type: the water temperature and the ice of a mix. */
  big?: string[];
  table?: SheetTable;
  /** A mix's own steps with clock times (the card's second half). */
  steps?: SheetTable;
  /** Blanks to write in by hand, e.g. "dough off the mixer ____ °C". */
  blanks?: string[];
  /** The mix a card is for (the viewer hangs its own parts on a mix's card by this). */
  mix?: { order: number; mixNumber: number };
  /** The build a card is for: its place in `sheet.preferments` or `sheet.soakers`. */
  build?: { list: 'preferments' | 'soakers'; index: number };
}

export type SectionKey = 'cultures' | 'preferments' | 'soakers' | 'mixes' | 'totals' | 'equipment' | 'scales' | 'formulas' | 'friction' | 'cautions' | 'warnings';

export interface SheetSection {
  key: SectionKey;
  title: string;
  blocks: SheetBlock[];
}

export interface PresentedSheet {
  title: string;
  subtitle: string[];
  sections: SheetSection[];
}

const WEEKDAYS = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** "Thursday 3 December 2026". */
export function longDate(date: string): string {
  const [y, m, d] = date.split('-').map(Number);
  const weekday = new Date(Date.UTC(y, m - 1, d)).getUTCDay();
  return `${WEEKDAYS[weekday]} ${d} ${MONTHS[m - 1]} ${y}`;
}

/** How figures are written: grams and °C by default, or US customary units (the viewer's choice). */
export interface Figures {
  /** "1 234 g" or "2 lb 11.53 oz". */
  g: (grams: number) => string;
  /** "24.0 °C" or "75.2 °F". */
  t: (celsius: number) => string;
  /** "24.0–26.0 °C". */
  range: (r: { min: number; max: number }) => string;
  /** A temperature difference (friction, a mixer's rise): ×1.8 for °F, no offset. */
  dt: (celsiusDegrees: number) => string;
  /** "°C" or "°F", for the blanks. */
  degree: string;
}

export function figuresFor(units: UnitSystem = 'metric'): Figures {
  const unit = temperatureUnitOf(units);
  return {
    g: (grams) => formatMass(grams, units),
    t: (celsius) => formatTemperature(celsius, unit),
    range: (r) => formatTemperatureRange(r, unit),
    dt: (d) => formatTemperature(unit === 'C' ? d : celsiusDeltaToFahrenheit(d), 'C').replace('°C', `°${unit}`),
    degree: `°${unit}`,
  };
}

export interface PresentOptions {
  /** Metric unless the reader chose US customary units. */
  units?: UnitSystem;
}

/** "03:32–03:42", or "2 Dec 11:47–11:55" off the plan's date. */
export function span(from: string, to: string, planDate: string): string {
  const a = shortTime(from, planDate);
  return from.slice(0, 10) === to.slice(0, 10) ? `${a}–${to.slice(11, 16)}` : `${a}–${shortTime(to, planDate)}`;
}

function hoursText(h: { min: number; max: number }): string {
  return h.min === h.max ? `${h.min} h` : `${h.min}–${h.max} h`;
}

function buildBlock(b: SheetBuild, sheet: Sheet, f: Figures, ref: NonNullable<SheetBlock['build']>): SheetBlock {
  const { g, t } = f;
  const when = (x: string) => shortTime(x, sheet.date);
  const lines: string[] = [];
  const forWhom = b.formulas.length > 1 ? `combined for ${b.formulas.join(' + ')}` : `for ${b.formula}`;
  lines.push(`${forWhom}${b.batches > 1 ? `, batch ${b.batch} of ${b.batches}` : ''}`);
  lines.push(b.mixFrom ? `mix between ${when(b.mixFrom)} and ${when(b.mixUntil)}` : `mix before ${when(b.mixUntil)}`);
  const hold = [b.hours ? hoursText(b.hours) : null, b.holdTemperature !== null ? `at ${t(b.holdTemperature)}` : null].filter(Boolean).join(' ');
  if (hold) lines.push(`${b.kind === 'soaker' ? 'soak' : 'ripen'} ${hold}`);
  if (b.waterTemperature !== null) {
    const seed = b.seedTemperature !== null ? ` (seed counted at ${t(b.seedTemperature)})` : '';
    lines.push(`water at ${t(b.waterTemperature)}${b.targetTemperature !== null ? ` for a build at ${t(b.targetTemperature)}` : ''}${seed}`);
  }
  if (b.hot) lines.push('made with boiling water: pour with care');
  lines.push(`used at ${b.uses.map((u) => `${when(u.at)} (${u.formula} ${u.mixNumber}, ${g(u.grams)})`).join('; ')}`);
  if (b.note) lines.push(b.note);
  const onScales = scalesLine(b.ingredients);
  if (onScales) lines.push(onScales);
  const rows: string[][] = [];
  const tick: boolean[] = [];
  for (const l of b.ingredients) {
    rows.push([`${l.seed ? `${l.ingredient} (seed)` : l.ingredient}${smallMark(l, sheet)}`, g(l.grams)]);
    tick.push(true);
    if (l.kind === 'water' && b.ice > 0) addIceRows(rows, tick, b.ice, b.tapWater, sheet.conditions.tapWater, f);
  }
  return {
    title: `${b.name} · ${g(b.grams)}`,
    build: ref,
    lines,
    table: { head: ['ingredient', 'weigh'], rows, align: ['left', 'right'], tick, footer: ['build', g(b.grams)] },
  };
}

/** Which scale weighs which line (the plan's scales): "scales: platform scale for bread flour, water; bench scale for the rest". */
function scalesLine(lines: SheetLine[]): string | null {
  const by = new Map<string, string[]>();
  for (const l of lines) if (l.scale) by.set(l.scale, [...(by.get(l.scale) ?? []), l.ingredient]);
  if (by.size === 0) return null;
  if (by.size === 1) return `scale: all on the ${[...by.keys()][0]}`;
  const groups = [...by].sort((a, b) => a[1].length - b[1].length);
  const last = groups.pop()!;
  return `scales: ${groups.map(([s, names]) => `${s} for ${names.join(', ')}`).join('; ')}; ${last[0]} for the rest`;
}

/** " (premix)" or " (too small)" beside a line the scale check flagged. */
function smallMark(l: SheetLine, sheet: Sheet): string {
  const w = sheet.smallWeights.find((x) => x.ingredient === l.ingredient && x.grams === l.grams);
  if (!w) return '';
  return w.premix ? ' (premix)' : ' (too small)';
}

function addIceRows(rows: string[][], tick: boolean[], ice: number, tapWater: number, tapT: number, { g, t }: Figures): void {
  rows.push(['  as ice', g(ice)]);
  tick.push(true);
  rows.push([`  as tap water (${t(tapT)})`, g(tapWater)]);
  tick.push(true);
}

function mixBlock(m: SheetMix, sheet: Sheet, repeated: boolean, f: Figures): SheetBlock {
  const { g, t } = f;
  const lines: string[] = [];
  lines.push(`${m.mixer} · mix at ${span(m.start, m.end, sheet.date)}${m.customer ? ` · for ${m.customer}` : ''}`);
  if (m.waterTemperature !== null && m.doughTemperature !== null) {
    const fa = m.factors!;
    const pre = fa.preferments.map((x) => ` − ${x.name} ${t(x.temperature)} (${x.source})`).join('');
    const aim = m.doughTemperatureRange ? `${f.range(m.doughTemperatureRange)}, aim ${t(m.doughTemperature)}` : t(m.doughTemperature);
    const liquid = m.liquid === null || m.liquid === 'water' ? (m.bassinage ? 'main water' : 'water') : m.liquid;
    const sum = `${fa.n} × ${t(m.doughTemperature)} − room ${t(fa.room)} − flour ${t(fa.flour)}${pre} − friction ${f.dt(fa.friction)} (${fa.n} × rise ${f.dt(fa.rise)})`;
    lines.push(`${liquid} at ${t(m.waterTemperature)} for dough at ${aim} (${sum}${m.bassinage ? '; with the bassinage' : ''})`);
  }
  for (const x of m.finishes) lines.push(`finish: ${x.ingredient} ${FINISH_USE_WORDS[x.use]}, ${m.pieces} × ${g(x.perPiece)} = ${g(x.grams)}${x.note ? ` (${x.note})` : ''}`);
  const onScales = scalesLine(m.ingredients);
  if (onScales) lines.push(onScales);
  if (m.bassinage) lines.push(`bassinage: hold back ${g(m.bassinage.grams)} of the water at ${t(m.bassinage.temperature)}; add it late in the mix`);
  const big: string[] = [];
  if (m.waterTemperature !== null) big.push(`water ${t(m.waterTemperature)}`);
  if (m.ice > 0) big.push(`ice ${g(m.ice)} + tap water ${g(m.tapWater)}${m.bassinage ? ` + bassinage ${g(m.bassinage.grams)}` : ''}`);
  const rows: string[][] = [];
  const tick: boolean[] = [];
  for (const l of m.ingredients) {
    const name = l.kind === 'preferment' ? `${l.ingredient} (pre-ferment)` : l.kind === 'soaker' ? `${l.ingredient} (soaker)` : l.ingredient;
    rows.push([`${name}${smallMark(l, sheet)}`, g(l.grams)]);
    tick.push(true);
    if (l.kind === 'water' && m.ice > 0) addIceRows(rows, tick, m.ice, m.tapWater, sheet.conditions.tapWater, f);
    if (l.kind === 'water' && m.bassinage) {
      rows.push([`  held back: bassinage (${t(m.bassinage.temperature)}), add late`, g(m.bassinage.grams)]);
      tick.push(true);
    }
  }
  // Cut to a window that does not hold the mix itself: its weights are shown for reference, not to weigh again.
  const w = sheet.window;
  if (w && !inWindow(m.start, m.end, w.from, w.to)) {
    lines.unshift(`mixed before this window (${span(m.start, m.end, sheet.date)}): weights for reference only; its steps in this window below`);
    return {
      title: `${m.title}${repeated ? ` (order ${m.order + 1})` : ''} · mix ${m.mixNumber} of ${m.of} · ${g(m.dough)}`,
      lines,
      table: { head: ['ingredient', 'weighed'], rows, align: ['left', 'right'], tick: tick.map(() => false), footer: ['dough', g(m.dough)] },
      steps: mixSteps(m, sheet, f),
      mix: { order: m.order, mixNumber: m.mixNumber },
    };
  }
  return {
    title: `${m.title}${repeated ? ` (order ${m.order + 1})` : ''} · mix ${m.mixNumber} of ${m.of} · ${g(m.dough)}`,
    lines,
    big,
    table: { head: ['ingredient', 'weigh'], rows, align: ['left', 'right'], tick, footer: ['dough', g(m.dough)] },
    steps: mixSteps(m, sheet, f),
    mix: { order: m.order, mixNumber: m.mixNumber },
    blanks: [
      m.doughTemperature !== null ? `dough off the mixer ______ ${f.degree} (aim ${t(m.doughTemperature)})` : `dough off the mixer ______ ${f.degree}`,
      'mixed by (initials) ______',
    ],
  };
}

const VESSEL: Record<NonNullable<TimelineEntry['vessel']>, string> = {
  deck: 'on the deck', tray: 'on trays', pot: 'in pots', tin: 'in tins', stone: 'on the stone', banneton: 'in bannetons', couche: 'on couches',
};

/** What one step of a mix asks for, beside its clock time. */
function stepDetail(e: TimelineEntry, m: SheetMix, sheet: Sheet, { g, t }: Figures): string {
  const when = (x: string) => shortTime(x, sheet.date);
  const what: string[] = [];
  if (e.step === 'mix' && e.resource?.startsWith('mixer:')) what.push(e.resource.slice('mixer:'.length));
  if (e.step === 'divide') what.push(`${m.pieces} × ${g(m.pieceGrams)}`);
  if (e.step === 'bake') {
    const oven = e.resource?.startsWith('oven:') ? e.resource.slice('oven:'.length) : null;
    if (oven) what.push(`${oven}${e.unit !== undefined ? ` deck ${e.unit}` : ''}`);
    if (e.temperature !== undefined) what.push(t(e.temperature));
    if (e.slots !== undefined) what.push(`${e.slots} slot${e.slots === 1 ? '' : 's'}`);
    if (e.vessel) what.push(VESSEL[e.vessel]);
    if (e.covered !== undefined && e.covered > 0) what.push(`lid on ${e.covered} min, then off`);
    what.push(e.steam ? 'steam' : 'no steam');
  } else {
    if (e.temperature !== undefined) what.push(`at ${t(e.temperature)}`);
    if (e.vessel) what.push(VESSEL[e.vessel]);
  }
  if (e.step !== 'divide' && e.step !== 'mix' && e.resource === 'bench' && e.unit !== undefined) what.push(`person ${e.unit}`);
  if (e.folds && e.folds.length > 0) what.push(`fold at ${e.folds.map(when).join(', ')}`);
  if (e.note) what.push(e.note);
  return what.join('; ');
}

/** The mix's own steps, each with its clock times. */
function mixSteps(m: SheetMix, sheet: Sheet, f: Figures): SheetTable {
  const rows = sheet.timeline
    .filter((e) => !e.window && e.order === m.order && e.mixNumber === m.mixNumber)
    .map((e) => [span(e.start, e.end, sheet.date), stepWord(e.step), stepDetail(e, m, sheet, f)]);
  return { head: ['time', 'step', 'what'], rows, align: ['left', 'left', 'left'], tick: rows.map(() => true) };
}

/** What the bench's records say about one mixer's friction for one product; the file decides. */
function frictionBlock(p: FrictionProposal, f: Figures): SheetBlock {
  const lines: string[] = [];
  if (p.current) {
    lines.push(`the plan says rise ${f.dt(p.current.rise)}${p.current.riseFrom === 'friction' ? ` (straight-dough friction ${f.dt(p.current.rise * 3)} ÷ 3)` : ''}`);
  }
  if (p.rise !== null && p.friction !== null) lines.push(`the mixes recorded say rise ${f.dt(p.rise)} (straight-dough friction ${f.dt(p.friction)}), median ${p.basis}`);
  else lines.push(`${p.basis}: at least ${FRICTION_MINIMUM} are needed before a value is proposed`);
  if (p.outliers.length > 0) lines.push(`left out as far from the others: ${p.outliers.map((o) => `${shortDay(o.date)} rise ${f.dt(o.rise)}`).join(', ')}`);
  if (p.status === 'agrees') lines.push('the plan agrees with the records (within half a degree); nothing to change');
  if (p.status === 'propose' && p.change) lines.push(`to use it: ${p.change}; until then the sheet keeps the plan's value`);
  return { title: `${p.mixer} · ${p.title}`, lines };
}

const shortDay = (date: string) => dayRange(date, date);

export function presentSheet(sheet: Sheet, options: PresentOptions = {}): PresentedSheet {
  const f = figuresFor(options.units);
  const { g, t } = f;
  const when = (x: string) => shortTime(x, sheet.date);
  const c = sheet.conditions;
  const subtitle = [
    `first bake out of the oven at ${when(sheet.readyBy)}`,
    `room ${t(c.room)} · flour ${t(c.flour)} · tap water ${t(c.tapWater)}${c.preferment !== undefined ? ` · pre-ferments without a temperature of their own ${t(c.preferment)}` : ''}`,
    `mixers: ${sheet.mixers.map((m) => `${m.name} ${m.kind === 'hand' ? `by hand, ${g(m.capacityGrams)} a person` : g(m.capacityGrams)}${m.minimumGrams !== undefined ? ` (min ${g(m.minimumGrams)})` : ''}, rise ${f.dt(m.rise)}${m.riseFrom === 'friction' ? ` (straight-dough friction ${f.dt(m.rise * 3)} ÷ 3)` : m.riseFrom === 'hand default' ? ' (hand mixing, common practice)' : ''}`).join(' · ')}`,
    `water temperatures by the ${FRICTION_CONVENTION}; each pre-ferment at its own ripening temperature`,
  ];
  if (sheet.ranges !== 'mid') subtitle.push(`step ranges: ${sheet.ranges} end`);
  if (sheet.notes) subtitle.push(sheet.notes);

  const sections: SheetSection[] = [];
  const cultures = culturesSection(sheet, f);
  if (cultures) sections.push(cultures);
  if (sheet.preferments.length > 0) {
    sections.push({ key: 'preferments', title: 'Pre-ferments to build', blocks: sheet.preferments.map((b, index) => buildBlock(b, sheet, f, { list: 'preferments', index })) });
  }
  if (sheet.soakers.length > 0) {
    sections.push({ key: 'soakers', title: 'Soakers', blocks: sheet.soakers.map((b, index) => buildBlock(b, sheet, f, { list: 'soakers', index })) });
  }
  const orders = new Map<string, Set<number>>();
  for (const m of sheet.mixes) orders.set(m.formula, (orders.get(m.formula) ?? new Set()).add(m.order));
  sections.push({ key: 'mixes', title: 'Mix cards', blocks: sheet.mixes.map((m) => mixBlock(m, sheet, orders.get(m.formula)!.size > 1, f)) });

  const totalRows = sheet.totals.map((l) => [l.ingredient, l.kind, g(l.grams)]);
  sections.push({
    key: 'totals',
    title: 'Pick list',
    blocks: [
      {
        title: '',
        lines: [sheet.window ? 'everything weighed in this window: its builds and mixes, seed cultures included' : 'everything weighed today: builds and mixes, seed cultures included'],
        table: { head: ['ingredient', 'kind', 'total'], rows: totalRows, align: ['left', 'left', 'right'], tick: totalRows.map(() => true), footer: ['all', '', g(sum(sheet.totals.map((l) => l.grams)))] },
      },
      ...[finishesBlock(sheet, f)].filter((b) => b !== null),
    ],
  });
  for (const s of [equipmentSection(sheet), scalesSection(sheet, f)]) if (s) sections.push(s);

  const formulaRows = sheet.formulas.map((f) => [f.title, String(f.pieces), String(f.mixes), f.mixers.join(', '), g(f.dividedDough), g(f.mixedDough)]);
  sections.push({
    key: 'formulas',
    title: 'Per product',
    blocks: [
      {
        title: '',
        lines: [],
        table: {
          head: ['product', 'pieces', 'mixes', 'mixer', 'divided', 'mixed'],
          rows: formulaRows,
          align: ['left', 'right', 'right', 'left', 'right', 'right'],
          tick: formulaRows.map(() => false),
          footer: ['all', String(sum(sheet.formulas.map((f) => f.pieces))), String(sheet.mixes.length), '', g(sum(sheet.formulas.map((f) => f.dividedDough))), g(sum(sheet.formulas.map((f) => f.mixedDough)))],
        },
      },
    ],
  });
  if (sheet.frictionProposals && sheet.frictionProposals.length > 0) {
    sections.push({ key: 'friction', title: 'Friction from the bench records', blocks: sheet.frictionProposals.map((p) => frictionBlock(p, f)) });
  }
  sections.push({ key: 'cautions', title: 'Cautions', blocks: [{ title: '', lines: sheet.cautions.map((x) => x.text) }] });
  if (sheet.warnings.length > 0) sections.push({ key: 'warnings', title: 'Check before you start', blocks: [{ title: '', lines: sheet.warnings }] });

  const w = sheet.window;
  if (w) subtitle.unshift(`this window only (${w.name ? `${w.name}, ` : ''}${span(w.from, w.to, sheet.date)}): the feeds, builds and mix cards with work in it, each card with its steps in it, and the pick list of what is weighed in it; equipment is the whole night's`);
  return { title: `Batch sheet · ${longDate(sheet.date)}${w ? ` · ${w.name ? `${w.name} ` : ''}${span(w.from, w.to, sheet.date)}` : ''}`, subtitle, sections };
}
