// Printing `panform temp`: the inputs and the result as one small table, cautions below it.
import type { TemperatureUnit } from '#shared/units';
import { renderFacts } from './table.ts';
import { formatGrams } from '#shared/units';

/** What `panform temp` collects (cli/commands/temp.ts) and prints here. */
export interface TempData {
  /** The scale the temperatures below are in. */
  unit: TemperatureUnit;
  mode: 'water' | 'friction';
  factors: number;
  desiredDoughTemperature: number | null;
  room: number;
  flour: number;
  preferments: number[];
  /** The mixer's rise, a difference in the unit's degrees. */
  rise: number;
  /** n × rise: the friction factor of this sum, in the unit's degrees. */
  friction: number;
  /** 3 × rise: the same mixer's friction factor on a straight dough. */
  straightDoughFriction: number;
  waterTemperature: number;
  measured: number | null;
  tap: number | null;
  /** g */
  water: number | null;
  /** g */
  ice: number | null;
  /** g */
  tapWater: number | null;
  iceShare: number | null;
  warnings: string[];
}

export function tempText(d: TempData): string {
  const t = (v: number) => `${v.toFixed(1)} °${d.unit}`;
  const facts: [string, string][] = [];
  if (d.mode === 'water') facts.push(['desired dough temperature', t(d.desiredDoughTemperature ?? 0)]);
  else facts.push(['measured dough temperature', t(d.measured ?? 0)]);
  facts.push(['room', t(d.room)], ['flour', t(d.flour)]);
  d.preferments.forEach((p, i) => facts.push([d.preferments.length > 1 ? `pre-ferment ${i + 1}` : 'pre-ferment', t(p)]));
  if (d.mode === 'water') {
    facts.push(['mixer rise', t(d.rise)], ['friction', `${t(d.friction)} (${d.factors} × rise)`], ['factors', String(d.factors)], ['water temperature', t(d.waterTemperature)]);
    if (d.tap !== null) facts.push(['tap water temperature', t(d.tap)]);
    if (d.water !== null) facts.push(['water in all', formatGrams(d.water)]);
    if (d.ice !== null && d.tapWater !== null) facts.push(['ice (at 0 °C)', formatGrams(d.ice)], ['tap water', formatGrams(d.tapWater)]);
    else if (d.iceShare !== null) facts.push(['ice per kg of water', formatGrams(d.iceShare * 1000)]);
  } else {
    facts.push(
      ['water temperature', t(d.waterTemperature)], ['factors', String(d.factors)], ['mixer rise (keep this)', t(d.rise)],
      ['friction in this sum', `${t(d.friction)} (${d.factors} × rise)`], ['friction on a straight dough', `${t(d.straightDoughFriction)} (3 × rise)`],
    );
  }
  const title = d.mode === 'water' ? 'Water for the dough' : "The mixer's friction";
  const lines = [renderFacts(title, facts), ...d.warnings.map((w) => `  caution: ${w}`)];
  return `${lines.join('\n')}\n`;
}
