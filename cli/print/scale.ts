// Printing a scaled formula: one terminal table per section, or CSV rows. Display rounding only.
import type { Caution } from '#shared/cautions';
import type { MixWater } from '#shared/dough-water';
import type { Formula } from '#shared/model';
import type { ScaleResult, ScaleTarget } from '#shared/scale';
import type { Resolution, TemperatureUnit, UnitSystem } from '#shared/units';
import { renderCsv } from './csv.ts';
import { percent, temperature, temperatureDelta, weight, type PrintUnits } from './format.ts';
import { renderFacts, renderTable } from './table.ts';
import { FRICTION_CONVENTION } from '#shared/dough-water';
import { formatTemperatureRange } from '#shared/units';

// What `panform scale` collects (cli/commands/scale.ts) and prints here.
export interface Conditions {
  /** All °C; the rise in °C-degrees. */
  ddt?: number;
  room: number;
  flour: number;
  /** The mixer's rise: --rise, or --friction (a straight-dough friction factor) ÷ 3. */
  rise: number;
  tap?: number;
  /** Measured tonight. */
  preferments: number[];
}

export interface ScaleOptions {
  target: ScaleTarget | null;
  units: UnitSystem;
  output: 'table' | 'json' | 'csv';
  catalog?: string;
  resolution: Resolution;
  temperatureUnit: TemperatureUnit;
  conditions: Conditions | null;
}

export interface WaterSection extends MixWater {
  tap: number | null;
}

export interface ScaleData {
  result: ScaleResult;
  formula: Formula;
  water: WaterSection | null;
  /** The usual cautions for the work (shared/cautions.ts); ice only when the water takes some. */
  cautions: Caution[];
}

function describeTarget(data: ScaleData, u: PrintUnits): string {
  const r = data.result;
  if (r.target.by === 'pieces') {
    const loss = r.loss > 0 ? `, loss ${percent(r.loss)}` : '';
    return `${r.pieces} × ${weight(r.pieceGrams ?? 0, u)}${loss}: divided dough ${weight(r.dividedDough, u)}, mixed dough ${weight(r.mixedDough, u)}`;
  }
  if (r.target.by === 'mix') return `mixed dough ${weight(r.mixedDough, u)} (no loss applied)`;
  return `flour ${weight(r.flour, u)}: mixed dough ${weight(r.mixedDough, u)} (no loss applied)`;
}

function hours(h: { min: number; max: number }): string {
  return h.min === h.max ? `${h.min} h` : `${h.min}–${h.max} h`;
}

export function scaleText(data: ScaleData, opts: ScaleOptions): string {
  const u: PrintUnits = { system: opts.units, resolution: opts.resolution, temperature: opts.temperatureUnit };
  const r = data.result;
  const out: string[] = [];
  out.push(`${r.title} (${r.formula})`, `  ${describeTarget(data, u)}`);

  out.push(
    renderTable({
      title: '\nOverall formula',
      head: ['ingredient', "baker's %", 'weight'],
      rows: r.overall.map((l) => [l.ingredient, percent(l.percent), weight(l.grams, u)]),
      footer: ['total', percent(r.totalPercent), weight(r.mixedDough, u)],
    }),
  );

  data.formula.preferments.forEach((p, i) => {
    const b = r.preferments[i];
    const hasSeed = b.ingredients.some((l) => l.seed);
    const ripen = p.ripenHours ? `; ripen ${hours(p.ripenHours)}${p.ripenTemperature === undefined ? '' : ` at ${temperature(p.ripenTemperature, u)}`}` : '';
    const title = `\nPre-ferment "${b.name}" (${b.kind}): ${percent(b.share ?? 0)} of the flour, hydration ${percent(b.hydration, 1)}${ripen}`;
    if (hasSeed) {
      out.push(
        renderTable({
          title,
          head: ['ingredient', "% of its flour", 'in the build', 'weigh'],
          rows: b.ingredients.map((l) => [l.seed ? `${l.ingredient} (seed)` : l.ingredient, percent(l.percent), l.seed ? '' : weight(l.grams, u), weight(l.weigh, u)]),
          footer: ['total', '', weight(b.grams, u), weight(b.grams, u)],
        }),
      );
      out.push('  The seed\'s flour and water are part of the build\'s flour and water: weigh the "weigh" column.');
    } else {
      out.push(
        renderTable({
          title,
          head: ['ingredient', "% of its flour", 'weight'],
          rows: b.ingredients.map((l) => [l.ingredient, percent(l.percent), weight(l.grams, u)]),
          footer: ['total', '', weight(b.grams, u)],
        }),
      );
    }
  });

  data.formula.soakers.forEach((s, i) => {
    const b = r.soakers[i];
    const soak = s.soakHours ? `; soak ${hours(s.soakHours)}` : '';
    out.push(
      renderTable({
        title: `\nSoaker "${b.name}"${s.hot ? ' (scald: made with boiling water; take care)' : ''}${soak}`,
        head: ['ingredient', 'baker\'s %', 'weight'],
        rows: b.ingredients.map((l) => [l.ingredient, percent(l.percent), weight(l.grams, u)]),
        footer: ['total', '', weight(b.grams, u)],
      }),
    );
  });

  out.push(
    renderTable({
      title: '\nFinal dough',
      head: ['ingredient', 'weight'],
      rows: r.finalDough.map((l) => [l.source === 'ingredient' ? l.ingredient : `${l.ingredient} (${l.source === 'preferment' ? 'pre-ferment' : 'soaker'}, all of it)`, weight(l.grams, u)]),
      footer: ['total', weight(r.mixedDough, u)],
    }),
  );

  const facts: [string, string][] = [
    ['total %', percent(r.totalPercent)],
    ['hydration', percent(r.hydration, 2)],
    ['effective hydration', percent(r.effectiveHydration, 2)],
    ['pre-fermented flour', percent(r.prefermentedFlour, 2)],
    ['final-dough hydration', percent(r.finalDoughHydration, 2)],
    ['flour', weight(r.flour, u)],
    ['mixed dough', weight(r.mixedDough, u)],
    ['divided dough', weight(r.dividedDough, u)],
  ];
  if (r.pieces !== null && r.pieceGrams !== null) facts.push(['pieces', `${r.pieces} × ${weight(r.pieceGrams, u)}`]);
  out.push(renderFacts('\nDerived figures', facts));

  const w = data.water;
  if (w) {
    const aim = w.doughTemperatureRange
      ? `${formatTemperatureRange(w.doughTemperatureRange, u.temperature)}, aim ${temperature(w.desiredDoughTemperature, u)}`
      : temperature(w.desiredDoughTemperature, u);
    const liquidName = w.liquid === null || w.liquid.kind === 'water' ? 'water' : w.liquid.names.join(' and ');
    const wf: [string, string][] = [
      ['desired dough temperature', aim],
      ['room', temperature(w.room, u)],
      ['flour', temperature(w.flour, u)],
      ...w.preferments.map((p): [string, string] => [`pre-ferment "${p.name}"`, `${temperature(p.temperature, u)} (${p.source})`]),
      ['mixer rise', temperatureDelta(w.rise, u)],
      ['friction', `${temperatureDelta(w.frictionFactor, u)} (${w.factors} × rise)`],
      ['factors', String(w.factors)],
    ];
    if (w.main) {
      wf.push([`${w.bassinage ? 'main ' : ''}${liquidName} temperature`, temperature(w.main.temperature, u)]);
      wf.push([`${w.bassinage ? 'main ' : ''}${liquidName} in the final dough`, weight(w.main.grams, u)]);
    }
    if (w.bassinage) wf.push(['bassinage (held back, add late)', `${weight(w.bassinage.grams, u)} at ${temperature(w.bassinage.temperature, u)}`]);
    if (w.tap !== null) wf.push(['tap water temperature', temperature(w.tap, u)]);
    if (w.main && w.main.ice !== null && w.main.tapWater !== null) {
      wf.push(['ice (at 0 °C)', weight(w.main.ice, u)], ['tap water', weight(w.main.tapWater, u)]);
    }
    if (w.liquid?.kind === 'other') wf.push(['specific heat', w.specificHeat]);
    out.push(renderFacts(`\nWater for the final dough (${FRICTION_CONVENTION})`, wf));
    for (const m of [...w.warnings, ...w.advice]) out.push(`  caution: ${m}`);
  }
  out.push('\nTake care', ...data.cautions.map((c) => `- ${c.text}`));
  return `${out.join('\n')}\n`;
}

export function scaleCsv(data: ScaleData): string {
  const r = data.result;
  const rows: (string | number | boolean | null)[][] = [];
  for (const l of r.overall) rows.push(['overall', '', l.ingredient, l.percent, l.grams, l.grams, false]);
  for (const b of r.preferments) for (const l of b.ingredients) rows.push(['preferment', b.name, l.ingredient, l.percent, l.grams, l.weigh, l.seed === true]);
  for (const b of r.soakers) for (const l of b.ingredients) rows.push(['soaker', b.name, l.ingredient, l.percent, l.grams, l.weigh, false]);
  for (const l of r.finalDough) rows.push(['final', l.source === 'ingredient' ? '' : l.ingredient, l.ingredient, null, l.grams, l.grams, false]);
  return renderCsv(['section', 'build', 'ingredient', 'percent', 'grams', 'weigh', 'seed'], rows);
}
