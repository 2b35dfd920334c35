// The sheet's sections for finishes, cultures, equipment and scales, as the bench reads them:
// headed tables with rounded weights, used by present.ts for the text, HTML and PDF formats.
// Rounding happens here (units.ts formatGrams). Pure; no I/O.
import { FINISH_USE_WORDS } from '../finishes.ts';
import { shortTime } from './time.ts';
import { MIN_DIVISIONS } from './scales.ts';
import type { Figures, SheetBlock, SheetSection } from './present.ts';
import type { CultureFeed, EquipmentNeed, Sheet } from './types.ts';

const ratioText = (r: [number, number, number]) => r.map((x) => Number(x.toFixed(2))).join(' : ');

/** The pick list's second block: what goes on or under the pieces. */
export function finishesBlock(sheet: Sheet, { g }: Figures): SheetBlock | null {
  if (sheet.finishes.length === 0) return null;
  const rows = sheet.finishes.map((f) => [`${f.ingredient} (${f.use})`, f.title, `${f.pieces} × ${g(f.perPiece)}`, g(f.grams)]);
  return {
    title: 'Finishes: on or under the pieces',
    lines: [
      `${[...new Set(sheet.finishes.map((f) => f.use))].map((u) => `${u}: ${FINISH_USE_WORDS[u]}`).join('; ')}`,
      "from each formula's finishes; counted in its ingredient statement and allergens, as on the label",
    ],
    table: { head: ['ingredient (use)', 'for', 'pieces', 'total'], rows, align: ['left', 'left', 'right', 'right'], tick: rows.map(() => true) },
  };
}

function feedBlock(c: CultureFeed, sheet: Sheet, { g, t: temp, range }: Figures): SheetBlock {
  const when = (x: string) => shortTime(x, sheet.date);
  const t = c.temperatureRange.min === c.temperatureRange.max ? temp(c.temperature) : range(c.temperatureRange);
  const hours = c.hours.min === c.hours.max ? `${c.hours.min} h` : `${c.hours.min}–${c.hours.max} h`;
  return {
    title: `${c.culture}${c.feeds > 1 ? ` · feed ${c.feed} of ${c.feeds}` : ''} · ${g(c.grams)}`,
    lines: [
      `feed at ${when(c.at)} (any time ${when(c.from)}–${when(c.until)}); ripe ${when(c.ripeFrom)}–${when(c.ripeUntil)}`,
      `ripens ${hours} at ${t} (${c.timingSource}); ratio ${ratioText(c.ratio)} culture : flour : water (${c.ratioSource})`,
      `for ${c.uses.map((u) => `${u.build} at ${when(u.at)} (${g(u.grams)})`).join('; ')}; keep back ${g(c.keep)} (${c.keepSource})`,
    ],
    table: {
      head: ['ingredient', 'weigh'],
      rows: [[`${c.culture} (ripe, from the last feed)`, g(c.seed)], [c.flour.ingredient, g(c.flour.grams)], ['water', g(c.water)]],
      align: ['left', 'right'],
      tick: [true, true, true],
      footer: ['feed', g(c.grams)],
    },
  };
}

export function culturesSection(sheet: Sheet, f: Figures): SheetSection | null {
  if (sheet.cultures.length === 0) return null;
  return { key: 'cultures', title: 'Cultures to feed', blocks: sheet.cultures.map((c) => feedBlock(c, sheet, f)) };
}

const KIT_WORDS: Record<EquipmentNeed['kind'], string> = { tray: 'trays', tin: 'tins', pot: 'pots', banneton: 'bannetons', couche: 'couches' };

export function equipmentSection(sheet: Sheet): SheetSection | null {
  if (sheet.equipment.length === 0) return null;
  const when = (x: string) => shortTime(x, sheet.date);
  const rows = sheet.equipment.map((e) => [
    KIT_WORDS[e.kind],
    String(e.peak),
    e.have === null ? '?' : String(e.have),
    `${e.short > 0 ? `SHORT ${e.short}` : e.have === null ? 'not counted' : 'enough'} · busiest ${when(e.at)}`,
  ]);
  const lines = ['the most in use at one moment, from the proof and bake steps: a banneton, tin or pot per piece, a tray or couche per oven slot'];
  if (!sheet.equipment.some((e) => e.have !== null)) lines.push("the plan's equipment does not say what the bakery has: add `equipment:` to check it");
  for (const e of sheet.equipment) lines.push(`${KIT_WORDS[e.kind]}: ${e.uses.map((u) => `${u.label} ${u.count}`).join(', ')}`);
  return {
    key: 'equipment',
    title: 'Equipment',
    blocks: [{ title: '', lines, table: { head: ['kit', 'need', 'have', ''], rows, align: ['left', 'right', 'right', 'left'], tick: rows.map(() => false) } }],
  };
}

export function scalesSection(sheet: Sheet, { g }: Figures): SheetSection | null {
  if (sheet.scales.length === 0) return null;
  const kg = g;
  const blocks: SheetBlock[] = [
    {
      title: '',
      lines: [
        `each weight goes on the finest scale that holds it; a weight needs at least ${MIN_DIVISIONS} divisions of its scale (then it is at most 2.5 % off): OIML R 76-1 minimum capacity, class III`,
        ...sheet.scales.map((s) => `${s.name}: up to ${kg(s.max)}, reads ${kg(s.resolution)}, least weight ${kg(s.least)}; ${s.weights} weight${s.weights === 1 ? '' : 's'} on this sheet`),
      ],
    },
  ];
  if (sheet.smallWeights.length === 0) blocks[0].lines.push('no weight on this sheet is too small for its scale');
  for (const w of sheet.smallWeights) {
    const lines = [`${w.where === 'build' ? 'build' : 'mix'} ${w.label}: ${g(w.grams)} is ${w.divisions < 1 ? 'below one division' : `${Number(w.divisions.toFixed(1))} divisions`} of the ${w.scale} (${kg(w.resolution)}); ${w.advice}`];
    const p = w.premix;
    const block: SheetBlock = { title: `${w.ingredient} · ${g(w.grams)} · ${w.label}`, lines };
    if (p) {
      lines.push(`premix 1 in ${p.factor}: weigh ${g(p.dissolve)} of ${w.ingredient} into ${g(p.water)} of the water, stir until dissolved, take ${g(p.take)} of the solution; weigh ${g(p.lessWater)} less water for the ${w.where}`);
      block.table = {
        head: ['premix', 'weigh'],
        rows: [[w.ingredient, g(p.dissolve)], [`water (from the ${w.where}'s water)`, g(p.water)], ['take of the solution', g(p.take)], ['less water on the water line', g(p.lessWater)]],
        align: ['left', 'right'],
        tick: [true, true, true, false],
      };
    }
    blocks.push(block);
  }
  return { key: 'scales', title: 'Scales and small weights', blocks };
}
