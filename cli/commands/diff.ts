// `panform diff OLD NEW`, `panform diff --rev REV [paths..]` and `panform diff --textconv FILE`:
// what changed in a formula, in baker's terms (shared/diff.ts); the old side of --rev is read
// from git. --textconv is git's diff driver (see `panform git-setup`): the figures, then the YAML.
import { execFile } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { promisify } from 'node:util';
import { Command } from 'commander';
import type { FormulaFigures } from '#shared/api';
import { diffFormulas, FIGURE_ROWS, formatNumber, type FieldChange, type FigureRow, type FormulaDiff, type LineChange, type PartChange } from '#shared/diff';
import type { Catalog, Formula } from '#shared/model';
import { parseCatalogText, parseFormulaText, type Finding } from '#shared/parse';
import { InputError, UsageError } from '../errors.ts';
import { fitText } from '../print/width.ts';
import { CATALOG_FILE, defaultFormulasFolder, findCatalogPath, readText } from '../files.ts';

const run = promisify(execFile);

export interface DiffOptions {
  /** Two files (OLD NEW), or with `rev` any number of files and folders. */
  paths: string[];
  rev?: string;
  textconv?: string;
  catalog?: string;
  json: boolean;
}

export interface DiffEntry {
  /** The file (the new side's path; for OLD NEW both are given). */
  path: string;
  oldPath: string | null;
  diff: FormulaDiff;
}

export interface DiffReport {
  rev: string | null;
  diffs: DiffEntry[];
}

function parseFormulaOrThrow(text: string, file: string): Formula {
  const parsed = parseFormulaText(text, file);
  if (!parsed.ok) throw new InputError(`${file} cannot be read as a formula; fix it first (\`panform check ${file}\`)`, parsed.findings);
  return parsed.value;
}

function parseCatalogOrThrow(text: string, file: string): Catalog {
  const parsed = parseCatalogText(text, file);
  if (!parsed.ok) throw new InputError(`the ingredient catalog ${file} has errors; run \`panform check ${file}\``, parsed.findings);
  return parsed.value;
}

function readCatalogAt(path: string): Catalog {
  return parseCatalogOrThrow(readText(path), path);
}

/**
 * Each side's catalog: --catalog, else the one beside that file (or in its parent folder), else
 * the other file's; a file copied out of the project is still read against the project's catalog.
 * With none anywhere the figures could not be worked out, so that is an error.
 */
function catalogsFor(oldPath: string, newPath: string, explicit?: string): { before: Catalog; after: Catalog } {
  if (explicit) {
    const c = readCatalogAt(explicit);
    return { before: c, after: c };
  }
  const nearOld = findCatalogPath(oldPath);
  const nearNew = findCatalogPath(newPath);
  const oldCatalog = nearOld ?? nearNew;
  const newCatalog = nearNew ?? nearOld;
  if (!oldCatalog || !newCatalog) {
    throw new InputError(
      `no ingredient catalog (${CATALOG_FILE}) beside ${oldPath} or ${newPath}, nor in their parent folders`,
      [],
      'give one with --catalog FILE, e.g. --catalog formulas/ingredients.yaml',
    );
  }
  const after = readCatalogAt(newCatalog);
  return { before: oldCatalog === newCatalog ? after : readCatalogAt(oldCatalog), after };
}

/** `git show REV:./name` run in the file's folder; null when the file is not in that revision. */
async function gitShow(rev: string, absPath: string): Promise<string | null> {
  try {
    const r = await run('git', ['show', `${rev}:./${basename(absPath)}`], { cwd: dirname(absPath), maxBuffer: 16 * 1024 * 1024 });
    return r.stdout;
  } catch (e) {
    const stderr = String((e as { stderr?: string }).stderr ?? '');
    if (/does not exist|exists on disk, but not in/.test(stderr)) return null;
    if (/not a git repository/i.test(stderr)) throw new UsageError(`${absPath} is not inside a git repository; --rev needs one`);
    if (/invalid object name|unknown revision|bad revision|ambiguous argument/i.test(stderr)) throw new UsageError(`unknown revision "${rev}"`, 'give a commit, branch or tag, e.g. HEAD~1 or main');
    throw new InputError(`git show ${rev}:${basename(absPath)} failed: ${stderr.trim() || (e as Error).message}`);
  }
}

/** Formula file names in a folder at REV (to find formulas deleted since). */
async function gitListFolder(rev: string, absDir: string): Promise<string[]> {
  try {
    const r = await run('git', ['ls-tree', '--name-only', `${rev}`, './'], { cwd: absDir, maxBuffer: 16 * 1024 * 1024 });
    return r.stdout.split('\n').filter((n) => n && !n.includes('/') && isFormulaName(n));
  } catch (e) {
    const stderr = String((e as { stderr?: string }).stderr ?? '');
    if (/not a git repository/i.test(stderr)) throw new UsageError(`${absDir} is not inside a git repository; --rev needs one`);
    if (/not a valid object|unknown revision|bad revision|ambiguous argument/i.test(stderr)) throw new UsageError(`unknown revision "${rev}"`, 'give a commit, branch or tag, e.g. HEAD~1 or main');
    return [];
  }
}

const isFormulaName = (n: string) => /\.ya?ml$/i.test(n) && n !== CATALOG_FILE;

async function collectRev(rev: string, given: string[], explicitCatalog?: string): Promise<DiffEntry[]> {
  const paths = given.length > 0 ? given : [defaultFormulasFolder()];
  const files: string[] = [];
  for (const p of paths) {
    const abs = resolve(p);
    const st = statSync(abs, { throwIfNoEntry: false });
    if (st?.isDirectory()) {
      const now = readdirSync(abs).filter(isFormulaName);
      const then = await gitListFolder(rev, abs);
      for (const n of [...new Set([...now, ...then])].sort()) files.push(join(abs, n));
    } else if (st?.isFile() || !st) {
      if (!st && !(await gitShow(rev, abs))) throw new UsageError(`no such file, now or in ${rev}: ${p}`);
      files.push(abs);
    }
  }
  const catalogs = new Map<string, { now: Catalog; then: Catalog }>();
  const catalogsFor = async (file: string) => {
    const key = dirname(file);
    let c = catalogs.get(key);
    if (!c) {
      const nowPath = explicitCatalog ? resolve(explicitCatalog) : findCatalogPath(file);
      const now = nowPath && existsSync(nowPath) ? parseCatalogOrThrow(readText(nowPath), nowPath) : {};
      const thenText = nowPath ? await gitShow(rev, nowPath) : null;
      const then = thenText === null ? now : parseCatalogOrThrow(thenText, `${rev}:${relative(process.cwd(), nowPath!)}`);
      c = { now, then };
      catalogs.set(key, c);
    }
    return c;
  };
  const out: DiffEntry[] = [];
  for (const file of files) {
    const shown = relative(process.cwd(), file) || file;
    const oldText = await gitShow(rev, file);
    const newText = existsSync(file) ? readText(file) : null;
    if (oldText === newText) continue;
    const { now, then } = await catalogsFor(file);
    const before = oldText === null ? null : parseFormulaOrThrow(oldText, `${rev}:${shown}`);
    const after = newText === null ? null : parseFormulaOrThrow(newText, shown);
    out.push({ path: shown, oldPath: oldText === null ? null : `${rev}:${shown}`, diff: diffFormulas(before, after, now, then) });
  }
  return out;
}

export async function collectDiff(options: DiffOptions): Promise<DiffReport> {
  if (options.rev !== undefined) {
    return { rev: options.rev, diffs: await collectRev(options.rev, options.paths, options.catalog) };
  }
  if (options.paths.length !== 2) throw new UsageError('give two formula files (OLD NEW), or --rev REV [paths..]', 'e.g. panform diff old/harbour-ciabatta.yaml formulas/harbour-ciabatta.yaml');
  const [oldPath, newPath] = options.paths;
  const before = parseFormulaOrThrow(readText(oldPath), oldPath);
  const after = parseFormulaOrThrow(readText(newPath), newPath);
  const catalogs = catalogsFor(oldPath, newPath, options.catalog);
  const diff = diffFormulas(before, after, catalogs.after, catalogs.before);
  return { rev: null, diffs: [{ path: newPath, oldPath, diff }] };
}

// ---- printing ----------------------------------------------------------------------------------

const MINUS = '-';
const mark = (c: 'added' | 'removed' | 'changed') => (c === 'added' ? '+' : c === 'removed' ? MINUS : '~');
const signed = (n: number, decimals: number) => `${n > 0 ? '+' : n < 0 ? MINUS : '±'}${Math.abs(n).toFixed(decimals)}`;
const pctText = (p: number | null) => (p === null ? '' : `${formatNumber(p)} %`);

function lineRows(lines: LineChange[], indent: string): string[] {
  const w = Math.max(12, ...lines.map((l) => l.ingredient.length));
  return lines.map((l) => {
    const head = `${indent}${mark(l.change)} ${l.ingredient.padEnd(w)}`;
    if (l.change === 'added') return `${head}  ${pctText(l.after).padStart(9)}`;
    if (l.change === 'removed') return `${head}  ${pctText(l.before).padStart(9)}`;
    return `${head}  ${pctText(l.before).padStart(9)} → ${pctText(l.after)}  (${signed(l.delta, Number.isInteger(l.delta) ? 0 : 2)})`;
  });
}

function fieldRows(fields: FieldChange[], indent: string): string[] {
  const w = Math.max(12, ...fields.map((f) => f.label.length));
  return fields.map((f) => {
    const c = f.before === null ? 'added' : f.after === null ? 'removed' : 'changed';
    const text = c === 'added' ? f.after : c === 'removed' ? f.before : `${f.before} → ${f.after}`;
    return `${indent}${mark(c)} ${f.label.padEnd(w)}  ${text}`;
  });
}

function partRows(kind: string, p: PartChange): string[] {
  const out = [`${kind} "${p.name}"${p.change === 'changed' ? '' : ` (${p.change})`}`];
  const extra: FieldChange[] = [];
  if (p.kind) extra.push({ field: 'kind', label: 'kind', before: p.kind.before, after: p.kind.after });
  if (p.share) extra.push({ field: 'share', label: 'share of flour', before: p.share.before === null ? null : pctText(p.share.before), after: p.share.after === null ? null : pctText(p.share.after) });
  out.push(...fieldRows([...extra, ...p.fields], '  '), ...lineRows(p.lines, '  '));
  return out;
}

function figureValue(r: FigureRow, v: number | null): string {
  if (v === null) return '—';
  return r.unit === 'g' ? `${Math.round(v)} g` : `${v.toFixed(r.key === 'totalPercent' ? 2 : 1)} %`;
}

function figureRows(d: FormulaDiff): string[] {
  const { rows, batchBefore, batchAfter } = d.figures;
  const batch = batchBefore === batchAfter ? batchAfter : `${batchBefore ?? '—'} → ${batchAfter ?? '—'}`;
  const out = [`Figures of the reference batch (${batch})`];
  const w = Math.max(...rows.map((r) => r.label.length));
  out.push(`    ${''.padEnd(w)}  ${'before'.padStart(10)}  ${'after'.padStart(10)}  ${'change'.padStart(8)}`);
  for (const r of rows) {
    const delta = r.delta === null ? '' : r.unit === 'g' ? signed(Math.round(r.delta), 0) : signed(r.delta, r.key === 'totalPercent' ? 2 : 1);
    out.push(`  ${r.changed ? '~' : ' '} ${r.label.padEnd(w)}  ${figureValue(r, r.before).padStart(10)}  ${figureValue(r, r.after).padStart(10)}  ${(r.changed ? delta : '').padStart(8)}`.trimEnd());
  }
  return out;
}

export function printDiffEntry(e: DiffEntry): string {
  const d = e.diff;
  const out: string[] = [];
  const head = d.change === 'added' ? 'new formula' : d.change === 'removed' ? 'formula removed' : d.change === 'unchanged' ? 'no change in baker\'s terms (layout or comments only)' : 'changed';
  out.push(`${d.id}: ${d.title} (${head})`);
  out.push(`  ${e.oldPath ?? '(none)'} → ${d.change === 'removed' ? '(none)' : e.path}`);
  if (d.change === 'unchanged') return `${out.join('\n')}\n`;
  if (d.fields.length) out.push(...fieldRows(d.fields, '  '));
  if (d.flour.length) out.push('Flour', ...lineRows(d.flour, '  '));
  if (d.ingredients.length) out.push('Ingredients', ...lineRows(d.ingredients, '  '));
  for (const p of d.preferments) out.push(...partRows('Pre-ferment', p));
  for (const s of d.soakers) out.push(...partRows('Soaker', s));
  if (d.process.length) {
    out.push('Process');
    for (const s of d.process) {
      const at = s.afterIndex ?? s.beforeIndex;
      if (s.change === 'changed') out.push(`  ~ ${String(at).padStart(2)}. ${s.before}`, `        → ${s.after}`);
      else out.push(`  ${mark(s.change)} ${String(at).padStart(2)}. ${s.after ?? s.before}`);
    }
  }
  out.push(...figureRows(d));
  for (const p of d.problems) out.push(`  ! ${p}`);
  return `${out.join('\n')}\n`;
}

export function printDiff(r: DiffReport): string {
  if (r.diffs.length === 0) return r.rev ? `No formula changed since ${r.rev}.\n` : 'No differences.\n';
  return r.diffs.map(printDiffEntry).join('\n');
}

// ---- git's diff driver ---------------------------------------------------------------------------

/** The figures block printed above the YAML for `git diff` (one figure per line, so git shows which moved). */
export function textconvFigures(figures: FormulaFigures | null, batch: string | null, problem?: string): string {
  if (!figures) return `# panform: figures not available: ${problem ?? 'unknown'}\n`;
  const out = [`# panform figures of the reference batch (${batch})`];
  const w = Math.max(...FIGURE_ROWS.map((r) => r.label.length));
  for (const r of FIGURE_ROWS) {
    const row: FigureRow = { ...r, before: null, after: figures[r.key], delta: null, changed: false };
    out.push(`#   ${r.label.padEnd(w)}  ${figureValue(row, figures[r.key])}`);
  }
  return `${out.join('\n')}\n`;
}

function textconvCatalog(file: string): Catalog {
  const candidates = [findCatalogPath(file), join(process.cwd(), 'formulas', CATALOG_FILE), join(process.cwd(), CATALOG_FILE)];
  for (const c of candidates) {
    if (!c || !existsSync(c)) continue;
    const parsed = parseCatalogText(readText(c), c);
    if (parsed.ok) return parsed.value;
  }
  return {};
}

/** Never fails on a bad file: git calls this for every version in a diff or log. */
export function textconv(file: string): string {
  const text = readText(file);
  if (basename(file) === CATALOG_FILE) return text;
  const parsed = parseFormulaText(text, file);
  let head: string;
  if (!parsed.ok) {
    const first: Finding | undefined = parsed.findings[0];
    head = textconvFigures(null, null, first ? `line ${first.line}: ${first.message}` : 'the file cannot be read as a formula');
  } else {
    const d = diffFormulas(null, parsed.value, textconvCatalog(file));
    head = textconvFigures(d.figures.after, d.figures.batchAfter, d.problems[0]);
  }
  return `${head}${text.endsWith('\n') || text === '' ? text : `${text}\n`}`;
}

export const command = new Command('diff')
  .description("what changed in a formula, in baker's terms: lines, pre-ferments, soakers, process and the figures")
  .argument('[paths...]', 'OLD NEW formula files, or with --rev the files and folders to compare (default: formulas/, or . when it holds ingredients.yaml)')
  .option('--rev <rev>', 'compare with this git revision (commit, branch or tag)')
  .option('--catalog <file>', 'use this ingredient catalog for both sides')
  .option('--textconv <file>', "print a formula's figures and its YAML (git's diff driver; see `panform git-setup`)")
  .option('--json', 'print the differences as JSON', false)
  .addHelpText(
    'after',
    `
Lines marked + were added, - removed, ~ changed. Figures are each version's own
reference batch (its yield), before and after.

Examples:
  $ panform diff old/harbour-ciabatta.yaml formulas/harbour-ciabatta.yaml
  $ panform diff --rev HEAD~1      # every formula changed since the last commit
  $ panform diff --rev main formulas/country-levain.yaml --json
`,
  )
  .action(async (paths: string[], flags: { rev?: string; catalog?: string; textconv?: string; json?: boolean }) => {
    const options: DiffOptions = { paths: paths ?? [], rev: flags.rev, textconv: flags.textconv, catalog: flags.catalog, json: flags.json === true };
    if (options.textconv !== undefined) {
      if (options.paths.length > 0 || options.rev !== undefined) throw new UsageError('--textconv takes one file and no other arguments');
      process.stdout.write(textconv(options.textconv));
      return;
    }
    const report = await collectDiff(options);
    process.stdout.write(options.json ? `${JSON.stringify(report, null, 2)}\n` : fitText(printDiff(report)));
  });
