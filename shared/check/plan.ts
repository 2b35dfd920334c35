// Trade checks of a production plan once it has passed the schema: its orders name formulas
// and mixers that exist, its mixers make sense, its date is the file's. Pure.
import type { Finding, SourceMap } from '../parse.ts';
import type { Plan } from '../model.ts';
import type { FormulaStatus } from '../schema/shapes.ts';
import { isCalendarDate } from './catalog.ts';
import { FindingList, grams, pointer, quote } from './report.ts';
import { didYouMean } from './suggest.ts';

export interface KnownFormula {
  /** The status written in the file, when it could be read. */
  status?: FormulaStatus | string;
}

export interface PlanCheckInput {
  file: string;
  plan: Plan;
  source: SourceMap;
  /** The file's name without its extension; when it looks like a date, the plan's date must equal it. */
  fileStem: string;
  /** Formulas by id, from the folder that holds plans/. */
  formulas: ReadonlyMap<string, KnownFormula>;
  /** Where those formulas were looked for, for messages. */
  formulasDir: string;
}

export function checkPlan(input: PlanCheckInput): Finding[] {
  const { plan, formulas } = input;
  const out = new FindingList(input.file, input.source);

  if (!isCalendarDate(plan.date)) out.error('/date', `date ${quote(plan.date)} is not a date in the calendar (YYYY-MM-DD)`);
  else if (/^\d{4}-\d{2}-\d{2}$/.test(input.fileStem) && input.fileStem !== plan.date) {
    out.error('/date', `date ${quote(plan.date)} must equal the file name ${quote(input.fileStem)}`);
  }

  const mixerNames = new Set<string>();
  plan.mixers.forEach((m, i) => {
    const at = (k?: string) => pointer('mixers', String(i), ...(k ? [k] : []));
    if (mixerNames.has(m.name)) out.error(at('name'), `mixer ${quote(m.name)} is listed twice; give each mixer its own name`);
    mixerNames.add(m.name);
    if (!(m.capacityGrams > 0)) out.error(at('capacity'), `the capacity of mixer ${quote(m.name)} is ${grams(m.capacityGrams)}; it must be above 0 g`);
    if (m.minimumGrams !== undefined && m.minimumGrams > m.capacityGrams) {
      out.error(at('minimum'), `the minimum of mixer ${quote(m.name)} (${grams(m.minimumGrams)}) is above its capacity (${grams(m.capacityGrams)})`);
    }
    if (Number.isNaN(m.rise)) {
      out.error(at(), `mixer ${quote(m.name)} gives no friction; give its rise (e.g. rise: 4 °C, how much warmer dough comes off it than its ingredients' average) or the friction factor found on a straight dough (friction: 13 °C)`);
    } else if (m.rise < 0) {
      out.warning(at(m.riseFrom === 'friction' ? 'friction' : 'rise'), `mixer ${quote(m.name)} has a negative ${m.riseFrom === 'friction' ? 'friction' : 'rise'}; mixing warms dough, it does not cool it`);
    }
  });

  const ovenNames = new Set<string>();
  (plan.ovens ?? []).forEach((o, i) => {
    if (ovenNames.has(o.name)) out.error(pointer('ovens', String(i), 'name'), `oven ${quote(o.name)} is listed twice; give each oven its own name`);
    ovenNames.add(o.name);
  });
  const shiftNames = new Set<string>();
  (plan.bench ?? []).forEach((b, i) => {
    if (b.name !== undefined) {
      if (shiftNames.has(b.name)) out.error(pointer('bench', String(i), 'name'), `shift ${quote(b.name)} is named twice; give each shift its own name (panform sheet --shift picks it by name)`);
      shiftNames.add(b.name);
    }
    if (!isCalendarDate(b.date)) out.error(pointer('bench', String(i), 'date'), `date ${quote(b.date)} is not a date in the calendar (YYYY-MM-DD)`);
    if (b.from === b.to) out.error(pointer('bench', String(i), 'to'), `the shift from ${b.from} to ${b.to} has no length; a shift over midnight ends the next day (e.g. from "22:00" to "06:00")`);
  });

  const scaleNames = new Set<string>();
  (plan.scales ?? []).forEach((s, i) => {
    const at = (k: string) => pointer('scales', String(i), k);
    if (scaleNames.has(s.name)) out.error(at('name'), `scale ${quote(s.name)} is listed twice; give each scale its own name`);
    scaleNames.add(s.name);
    if (!(s.maxGrams > 0)) out.error(at('max'), `scale ${quote(s.name)} weighs at most ${grams(s.maxGrams)}; it must be above 0 g`);
    if (!(s.resolutionGrams > 0)) out.error(at('resolution'), `scale ${quote(s.name)} reads in steps of ${grams(s.resolutionGrams)}; the step must be above 0 g`);
    else if (s.resolutionGrams >= s.maxGrams) out.error(at('resolution'), `scale ${quote(s.name)} reads in steps of ${grams(s.resolutionGrams)}, not below its maximum ${grams(s.maxGrams)}; swap max and resolution?`);
  });

  const ids = [...formulas.keys()];
  plan.orders.forEach((o, i) => {
    const at = (k: string) => pointer('orders', String(i), k);
    const known = formulas.get(o.formula);
    if (!known) {
      out.error(at('formula'), `order ${i + 1} names formula ${quote(o.formula)}, which is not in ${input.formulasDir}${didYouMean(o.formula, ids)}`);
    } else if (known.status === 'retired') {
      out.warning(at('formula'), `order ${i + 1} names ${quote(o.formula)}, which is retired`);
    } else if (known.status === 'draft') {
      out.warning(at('formula'), `order ${i + 1} names ${quote(o.formula)}, which is still a draft`);
    }
    if (o.mixer !== undefined && !mixerNames.has(o.mixer)) {
      out.error(at('mixer'), `order ${i + 1} names mixer ${quote(o.mixer)}, which is not among this plan's mixers${didYouMean(o.mixer, mixerNames)}`);
    }
    if (o.oven !== undefined && plan.ovens && !ovenNames.has(o.oven)) {
      out.error(at('oven'), `order ${i + 1} names oven ${quote(o.oven)}, which is not among this plan's ovens${didYouMean(o.oven, ovenNames)}`);
    } else if (o.oven !== undefined && !plan.ovens) {
      out.error(at('oven'), `order ${i + 1} names oven ${quote(o.oven)}, but the plan lists no ovens; add them under ovens:`);
    }
    if (o.pieceGrams !== undefined && !(o.pieceGrams > 0)) {
      out.error(at('piece'), `order ${i + 1} has a piece weight of ${grams(o.pieceGrams)}; it must be above 0 g`);
    }
  });
  return out.findings;
}
