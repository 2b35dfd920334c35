// What changed between two versions of a formula, in baker's terms: ingredient lines added,
// removed or re-percented; pre-ferments and soakers; process steps; yield, loss, bake loss, finishes, dough temperature,
// title and status; and the figures of each version's reference batch side by side. Pure.
import type { Catalog, Formula, Line, Preferment, Soaker, Step } from './model.ts';
import { referenceFigures, type FormulaFigures } from './figures.ts';
import type { NumberRange } from './units.ts';

export type ChangeKind = 'added' | 'removed' | 'changed';

/** One ingredient line: baker's percent before and after (null where the line does not exist). */
export interface LineChange {
  ingredient: string;
  change: ChangeKind;
  before: number | null;
  after: number | null;
  /** after − before in percentage points (a missing side counts 0). */
  delta: number;
}

/** A plain field, shown as text before and after (null where it is not set). */
export interface FieldChange {
  field: string;
  label: string;
  before: string | null;
  after: string | null;
}

/** A pre-ferment or a soaker. */
export interface PartChange {
  name: string;
  change: ChangeKind;
  /** Pre-ferment kind (poolish, levain ...), when it changed or the part was added or removed. */
  kind?: { before: string | null; after: string | null };
  /** Pre-ferment share of the total flour in percent, when it changed or the part was added or removed. */
  share?: { before: number | null; after: number | null };
  /** The part's own ingredient lines that differ (all of them for an added or removed part). */
  lines: LineChange[];
  /** Ripening, soaking, temperature and note changes. */
  fields: FieldChange[];
}

export interface StepChange {
  change: ChangeKind;
  step: string;
  /** 1-based position in the old and in the new process. */
  beforeIndex: number | null;
  afterIndex: number | null;
  before: string | null;
  after: string | null;
  /** Which of the step's settings differ (minutes, temperature, folds, vessel, covered, steam, note). */
  fields: string[];
}

export type FigureKey = 'totalPercent' | 'hydration' | 'effectiveHydration' | 'prefermentedFlour' | 'finalDoughHydration' | 'flour' | 'mixedDough' | 'dividedDough';

export interface FigureRow {
  key: FigureKey;
  label: string;
  unit: '%' | 'g';
  before: number | null;
  after: number | null;
  /** after − before; null when a side is missing. */
  delta: number | null;
  changed: boolean;
}

export interface FormulaDiff {
  /** The formula's id (the new one; the old one when it was removed). */
  id: string;
  title: string;
  change: ChangeKind | 'unchanged';
  /** id, title, status, category, description, tags, yield, loss, bake loss, dough temperature, finishes, may contain, notes. */
  fields: FieldChange[];
  flour: LineChange[];
  ingredients: LineChange[];
  preferments: PartChange[];
  soakers: PartChange[];
  process: StepChange[];
  /** Figures of each version's own reference batch (its yield), before and after. */
  figures: {
    before: FormulaFigures | null;
    after: FormulaFigures | null;
    /** Reference batch as text, e.g. "10 × 320 g". */
    batchBefore: string | null;
    batchAfter: string | null;
    rows: FigureRow[];
  };
  /** Why the figures of a side could not be computed. */
  problems: string[];
}

/** Differences below this are rounding noise, not a change (percent points or grams). */
const EPS = 1e-9;

export const FIGURE_ROWS: { key: FigureKey; label: string; unit: '%' | 'g' }[] = [
  { key: 'totalPercent', label: 'total %', unit: '%' },
  { key: 'hydration', label: 'hydration', unit: '%' },
  { key: 'effectiveHydration', label: 'effective hydration', unit: '%' },
  { key: 'prefermentedFlour', label: 'pre-fermented flour', unit: '%' },
  { key: 'finalDoughHydration', label: 'final dough hydration', unit: '%' },
  { key: 'flour', label: 'total flour', unit: 'g' },
  { key: 'mixedDough', label: 'dough weight (mixed)', unit: 'g' },
  { key: 'dividedDough', label: 'dough divided', unit: 'g' },
];

/** A number as written in a formula: up to 3 decimals, no trailing zeros. */
export function formatNumber(n: number): string {
  return String(Number(n.toFixed(3)));
}

function formatRange(r: NumberRange | undefined, unit: string): string | null {
  if (!r) return null;
  return r.min === r.max ? `${formatNumber(r.min)} ${unit}` : `${formatNumber(r.min)}–${formatNumber(r.max)} ${unit}`;
}

function formatMinutes(r: NumberRange | undefined): string | null {
  if (!r) return null;
  if (r.min >= 120 && r.min % 30 === 0 && r.max % 30 === 0) return formatRange({ min: r.min / 60, max: r.max / 60 }, 'h');
  return formatRange(r, 'min');
}

const temp = (c: number | undefined) => (c === undefined ? null : `${formatNumber(c)} °C`);

const VESSEL_TEXT: Record<string, string> = { deck: 'on the deck', tray: 'on trays', pot: 'in pots', tin: 'in tins', stone: 'on the stone', banneton: 'in bannetons', couche: 'on couches' };

/** A step in a line, e.g. "bake 45 min at 230 °C, in pots, covered 20 min (note)". */
export function describeStep(s: Step): string {
  const head: string[] = [s.step];
  const m = formatMinutes(s.minutes);
  if (m) head.push(m);
  if (s.temperature !== undefined) head.push(`at ${temp(s.temperature)}`);
  const parts: string[] = [head.join(' ')];
  if (s.folds) parts.push(`${s.folds.count} fold${s.folds.count === 1 ? '' : 's'} every ${formatNumber(s.folds.every)} min`);
  if (s.vessel) parts.push(VESSEL_TEXT[s.vessel] ?? s.vessel);
  if (s.covered !== undefined) parts.push(`covered ${formatNumber(s.covered)} min`);
  if (s.steam !== undefined) parts.push(s.steam ? 'with steam' : 'no steam');
  let text = parts.join(', ');
  if (s.note) text += ` (${s.note})`;
  return text;
}

function diffLines(before: Line[], after: Line[]): LineChange[] {
  const sumBy = (ls: Line[]) => {
    const m = new Map<string, number>();
    for (const l of ls) m.set(l.ingredient, (m.get(l.ingredient) ?? 0) + l.percent);
    return m;
  };
  const a = sumBy(before);
  const b = sumBy(after);
  const out: LineChange[] = [];
  for (const [ingredient, p] of a) {
    const q = b.get(ingredient);
    if (q === undefined) out.push({ ingredient, change: 'removed', before: p, after: null, delta: -p });
    else if (Math.abs(q - p) > EPS) out.push({ ingredient, change: 'changed', before: p, after: q, delta: q - p });
  }
  for (const [ingredient, q] of b) if (!a.has(ingredient)) out.push({ ingredient, change: 'added', before: null, after: q, delta: q });
  return out;
}

function field(out: FieldChange[], fieldName: string, label: string, before: string | null, after: string | null): void {
  if (before !== after) out.push({ field: fieldName, label, before, after });
}

function prefermentFields(p: Preferment | undefined): Record<string, string | null> {
  return {
    ripen: p ? [formatRange(p.ripenHours, 'h'), p.ripenTemperature !== undefined ? `at ${temp(p.ripenTemperature)}` : null].filter(Boolean).join(' ') || null : null,
    temperature: p ? temp(p.temperature) : null,
    note: p?.note ?? null,
  };
}

function soakerFields(s: Soaker | undefined): Record<string, string | null> {
  return {
    soak: s
      ? [formatRange(s.soakHours, 'h'), s.soakTemperature !== undefined ? `at ${temp(s.soakTemperature)}` : null, s.hot ? 'hot' : null].filter(Boolean).join(' ') || null
      : null,
    note: s?.note ?? null,
  };
}

const PART_LABELS: Record<string, string> = { ripen: 'ripening', temperature: 'build temperature', soak: 'soaking', note: 'note' };

function diffParts<T extends Preferment | Soaker>(before: T[], after: T[], fieldsOf: (p: T | undefined) => Record<string, string | null>): PartChange[] {
  const out: PartChange[] = [];
  const byName = (ps: T[]) => new Map(ps.map((p) => [p.name, p]));
  const a = byName(before);
  const b = byName(after);
  const isPreferment = (p: T | undefined): p is T & Preferment => p !== undefined && 'share' in p;
  const names = [...new Set([...before.map((p) => p.name), ...after.map((p) => p.name)])];
  for (const name of names) {
    const p = a.get(name);
    const q = b.get(name);
    const change: ChangeKind = !p ? 'added' : !q ? 'removed' : 'changed';
    const part: PartChange = { name, change, lines: diffLines(p?.ingredients ?? [], q?.ingredients ?? []), fields: [] };
    if (isPreferment(p) || isPreferment(q)) {
      const pk = isPreferment(p) ? p.kind : null;
      const qk = isPreferment(q) ? q.kind : null;
      if (pk !== qk) part.kind = { before: pk, after: qk };
      const ps = isPreferment(p) ? p.share : null;
      const qs = isPreferment(q) ? q.share : null;
      if (ps === null || qs === null || Math.abs(ps - qs) > EPS) part.share = { before: ps, after: qs };
    }
    const fp = fieldsOf(p);
    const fq = fieldsOf(q);
    for (const key of Object.keys(fp)) field(part.fields, key, PART_LABELS[key] ?? key, fp[key], fq[key]);
    if (change !== 'changed' || part.kind || part.share || part.lines.length > 0 || part.fields.length > 0) out.push(part);
  }
  return out;
}

const STEP_FIELDS: (keyof Step)[] = ['minutes', 'temperature', 'folds', 'vessel', 'covered', 'steam', 'note'];

/** Steps matched in order by kind (longest common subsequence), then compared setting by setting. */
function diffSteps(before: Step[], after: Step[]): StepChange[] {
  const n = before.length;
  const m = after.length;
  const L: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  for (let i = n - 1; i >= 0; i--) {
    for (let j = m - 1; j >= 0; j--) {
      L[i][j] = before[i].step === after[j].step ? L[i + 1][j + 1] + 1 : Math.max(L[i + 1][j], L[i][j + 1]);
    }
  }
  const out: StepChange[] = [];
  let i = 0;
  let j = 0;
  const removed = (k: number): StepChange => ({ change: 'removed', step: before[k].step, beforeIndex: k + 1, afterIndex: null, before: describeStep(before[k]), after: null, fields: [] });
  const added = (k: number): StepChange => ({ change: 'added', step: after[k].step, beforeIndex: null, afterIndex: k + 1, before: null, after: describeStep(after[k]), fields: [] });
  while (i < n && j < m) {
    if (before[i].step === after[j].step) {
      const fields = STEP_FIELDS.filter((f) => JSON.stringify(before[i][f] ?? null) !== JSON.stringify(after[j][f] ?? null));
      if (fields.length > 0) {
        out.push({ change: 'changed', step: after[j].step, beforeIndex: i + 1, afterIndex: j + 1, before: describeStep(before[i]), after: describeStep(after[j]), fields });
      }
      i++;
      j++;
    } else if (L[i + 1][j] >= L[i][j + 1]) out.push(removed(i++));
    else out.push(added(j++));
  }
  while (i < n) out.push(removed(i++));
  while (j < m) out.push(added(j++));
  return out;
}

function figuresOf(f: Formula | null, catalog: Catalog, problems: string[], side: string): FormulaFigures | null {
  if (!f) return null;
  try {
    return referenceFigures(f, catalog);
  } catch (e) {
    problems.push(`${side}: the reference batch cannot be computed: ${(e as Error).message}`);
    return null;
  }
}

const batch = (f: Formula | null) => (f ? `${f.yield.pieces} × ${formatNumber(f.yield.pieceGrams)} g` : null);
const pctOrNull = (p: number | undefined) => (p === undefined ? null : `${formatNumber(p)} %`);
const finishes = (f: Formula | null) => list(f?.finishes.map((x) => `${x.ingredient} ${formatNumber(x.perPieceGrams)} g a piece (${x.use})`));
const list = (xs: string[] | undefined) => (xs && xs.length > 0 ? xs.join(', ') : null);

/**
 * The difference between two versions of a formula (null for a side that does not exist: an added
 * or removed formula). `catalog` is the ingredient catalog of the new side; `oldCatalog` that of
 * the old side (default the same).
 */
export function diffFormulas(before: Formula | null, after: Formula | null, catalog: Catalog, oldCatalog: Catalog = catalog): FormulaDiff {
  const fields: FieldChange[] = [];
  const problems: string[] = [];
  const a = before;
  const b = after;
  field(fields, 'id', 'id', a?.id ?? null, b?.id ?? null);
  field(fields, 'title', 'title', a?.title ?? null, b?.title ?? null);
  field(fields, 'status', 'status', a?.status ?? null, b?.status ?? null);
  field(fields, 'category', 'category', a?.category ?? null, b?.category ?? null);
  field(fields, 'description', 'description', a?.description ?? null, b?.description ?? null);
  field(fields, 'tags', 'tags', list(a?.tags), list(b?.tags));
  field(fields, 'yield', 'yield (reference batch)', batch(a), batch(b));
  field(fields, 'loss', 'loss', a ? `${formatNumber(a.loss)} %` : null, b ? `${formatNumber(b.loss)} %` : null);
  field(fields, 'bakeLoss', 'bake loss', pctOrNull(a?.bakeLoss), pctOrNull(b?.bakeLoss));
  field(fields, 'doughTemperature', 'dough temperature', temp(a?.doughTemperature), temp(b?.doughTemperature));
  field(fields, 'finishes', 'finishes', finishes(a), finishes(b));
  field(fields, 'mayContain', 'may contain', list(a?.mayContain), list(b?.mayContain));
  field(fields, 'notes', 'notes', a?.notes ?? null, b?.notes ?? null);

  const figBefore = figuresOf(a, oldCatalog, problems, 'before');
  const figAfter = figuresOf(b, catalog, problems, 'after');
  const rows: FigureRow[] = FIGURE_ROWS.map(({ key, label, unit }) => {
    const x = figBefore ? figBefore[key] : null;
    const y = figAfter ? figAfter[key] : null;
    const delta = x !== null && y !== null ? y - x : null;
    const changed = x === null || y === null ? x !== y : Math.abs(y - x) > (unit === 'g' ? 1e-6 : EPS);
    return { key, label, unit, before: x, after: y, delta, changed };
  });

  const diff: FormulaDiff = {
    id: b?.id ?? a?.id ?? '',
    title: b?.title ?? a?.title ?? '',
    change: !a && !b ? 'unchanged' : !a ? 'added' : !b ? 'removed' : 'changed',
    fields,
    flour: diffLines(a?.flour ?? [], b?.flour ?? []),
    ingredients: diffLines(a?.ingredients ?? [], b?.ingredients ?? []),
    preferments: diffParts(a?.preferments ?? [], b?.preferments ?? [], prefermentFields),
    soakers: diffParts(a?.soakers ?? [], b?.soakers ?? [], soakerFields),
    process: diffSteps(a?.process ?? [], b?.process ?? []),
    figures: { before: figBefore, after: figAfter, batchBefore: batch(a), batchAfter: batch(b), rows },
    problems,
  };
  if (diff.change === 'changed' && isEmpty(diff)) diff.change = 'unchanged';
  return diff;
}

/** True when nothing a baker would notice changed (comments and formatting may have). */
export function isEmpty(d: FormulaDiff): boolean {
  return (
    d.fields.length === 0 &&
    d.flour.length === 0 &&
    d.ingredients.length === 0 &&
    d.preferments.length === 0 &&
    d.soakers.length === 0 &&
    d.process.length === 0 &&
    d.figures.rows.every((r) => !r.changed)
  );
}
