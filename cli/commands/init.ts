// `panform init`: a new formula file by questions (@inquirer/prompts), or from `--answers FILE`
// for scripts. The file is written with the schema line for editors, checked exactly as
// `panform check` checks it (and scaled once, so a pre-ferment that takes more than the formula
// holds is caught), and never written over an existing file.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Command } from 'commander';
import { checkFileText } from '#shared/check/check-file';
import { formatFinding, type Finding } from '#shared/parse';
import { ScaleError, scaleFormula } from '#shared/scale';
import { ID_PATTERN, PREFERMENT_KINDS } from '#shared/schema/vocabulary';
import type { PrefermentKind } from '#shared/schema/shapes';
import { parseMassArgument, QuantityError } from '#shared/units';
import { InputError, UsageError } from '../errors.ts';
import { defaultFormulasFolder, readCatalogFor } from '../files.ts';
import { SCHEMAS_FOLDER } from '../new-repository.ts';

export interface InitLine {
  name: string;
  percent: number;
}

export interface InitPreferment {
  kind: PrefermentKind;
  name?: string;
  /** Percent of the total flour. */
  share: number;
  /** Water in percent of the pre-ferment's flour. */
  hydration: number;
  /** Yeast for a poolish, biga or sponge: a name from the formula's ingredients and its percent of the pre-ferment's flour. */
  yeast?: InitLine;
  /** A levain's mature culture, in percent of the build's flour. */
  seed?: InitLine;
}

export interface InitAnswers {
  id: string;
  title: string;
  category: string;
  status?: 'draft' | 'active';
  pieces: number;
  /** "320 g", "2 lb" or grams. */
  piece: string | number;
  /** Percent of mixed dough lost before dividing. */
  loss?: number;
  /** °C */
  doughTemperature?: number;
  flours: InitLine[];
  ingredients: InitLine[];
  preferment?: InitPreferment | null;
}

/** The prompt functions init uses; tests pass their own. */
export interface Prompts {
  input(q: { message: string; default?: string; validate?: (v: string) => true | string }): Promise<string>;
  /** `step` defaults to 1 (whole numbers only); 'any' takes decimals. */
  number(q: { message: string; default?: number; min?: number; max?: number; step?: number | 'any'; required?: boolean }): Promise<number | undefined>;
  select<T extends string>(q: { message: string; choices: { name: string; value: T }[]; default?: T }): Promise<T>;
  confirm(q: { message: string; default?: boolean }): Promise<boolean>;
}

const KIND_WORDS = /[^a-z0-9]+/g;
const kebab = (s: string) => s.trim().toLowerCase().replace(KIND_WORDS, '-').replace(/^-+|-+$/g, '');
const ID_RE = new RegExp(ID_PATTERN);

// ---- rendering ---------------------------------------------------------------------------

/** A YAML scalar: plain when that is safe, else a double-quoted (JSON) string. */
function scalar(s: string): string {
  return /^[A-Za-z][A-Za-z0-9 '’()-]*$/.test(s) && !/^(true|false|yes|no|on|off|null|y|n)$/i.test(s) && !/\s$/.test(s) ? s : JSON.stringify(s);
}

function num(n: number): string {
  return String(Number(n.toPrecision(12)));
}

function pieceText(piece: string | number): string {
  if (typeof piece === 'number') return `${num(piece)} g`;
  const t = piece.trim();
  return /^[0-9]+(\.[0-9]+)?$/.test(t) ? `${t} g` : t.replace(/^([0-9.]+)\s*(g|kg|oz|lb)$/i, (_, n: string, u: string) => `${n} ${u.toLowerCase()}`);
}

export function renderFormulaYaml(a: InitAnswers, schemaRef: string): string {
  const out: string[] = [
    `# yaml-language-server: $schema=${schemaRef}`,
    `id: ${a.id}`,
    `title: ${scalar(a.title)}`,
    `status: ${a.status ?? 'draft'}`,
    `category: ${a.category}`,
    `yield: { pieces: ${a.pieces}, piece: ${pieceText(a.piece)} }`,
  ];
  if (a.loss !== undefined && a.loss > 0) out.push(`loss: ${num(a.loss)} %`);
  if (a.doughTemperature !== undefined) out.push(`dough_temperature: ${num(a.doughTemperature)} °C`);
  out.push('flour:', ...a.flours.map((l) => `  ${scalar(l.name)}: ${num(l.percent)}`));
  out.push('ingredients:', ...a.ingredients.map((l) => `  ${scalar(l.name)}: ${num(l.percent)}`));
  const p = a.preferment;
  if (p) {
    const flour = a.flours[0].name;
    out.push(
      'preferments:',
      `  - name: ${scalar(p.name ?? p.kind)}`,
      `    kind: ${p.kind}`,
      `    share: ${num(p.share)} %`,
      '    ingredients:',
      `      ${scalar(flour)}: 100`,
      `      water: ${num(p.hydration)}`,
    );
    if (p.yeast) out.push(`      ${scalar(p.yeast.name)}: ${num(p.yeast.percent)}`);
    if (p.seed) out.push(`      ${scalar(p.seed.name)}: ${num(p.seed.percent)}`);
  }
  return `${out.join('\n')}\n`;
}

// ---- checking answers before anything is written -------------------------------------------

function problem(message: string): never {
  throw new InputError(message);
}

export function validateAnswers(a: InitAnswers): InitAnswers {
  if (typeof a !== 'object' || a === null) problem('the answers must be a JSON object');
  if (typeof a.id !== 'string' || !ID_RE.test(a.id)) problem(`id must be kebab-case (e.g. "harbour-rolls"); got ${JSON.stringify(a.id)}`);
  if (typeof a.title !== 'string' || a.title.trim() === '') problem('title must not be empty');
  if (typeof a.category !== 'string' || !ID_RE.test(a.category)) problem(`category must be kebab-case (e.g. "lean"); got ${JSON.stringify(a.category)}`);
  if (!Number.isInteger(a.pieces) || a.pieces < 1) problem(`pieces must be a whole number of at least 1; got ${JSON.stringify(a.pieces)}`);
  let grams: number;
  try {
    grams = typeof a.piece === 'number' ? a.piece : parseMassArgument(String(a.piece));
  } catch (e) {
    if (e instanceof QuantityError) problem(`piece: ${e.message}; expected ${e.expected}`);
    throw e;
  }
  if (!(grams > 0)) problem(`piece weight must be above 0; got ${JSON.stringify(a.piece)}`);
  if (a.loss !== undefined && !(a.loss >= 0 && a.loss < 100)) problem(`loss must be from 0 to below 100 %; got ${a.loss}`);
  if (!Array.isArray(a.flours) || a.flours.length === 0) problem('give at least one flour');
  if (!Array.isArray(a.ingredients)) problem('ingredients must be a list of { name, percent }');
  const names = new Set<string>();
  for (const l of [...a.flours, ...a.ingredients]) {
    if (typeof l?.name !== 'string' || l.name.trim() === '') problem('every flour and ingredient needs a name');
    if (!Number.isFinite(l.percent) || l.percent < 0) problem(`"${l.name}" needs a percentage of 0 or more; got ${JSON.stringify(l.percent)}`);
    if (names.has(l.name)) problem(`"${l.name}" is listed twice`);
    names.add(l.name);
  }
  const flourSum = a.flours.reduce((s, l) => s + l.percent, 0);
  if (Math.abs(flourSum - 100) > 1e-9) problem(`the flours must add up to 100 %; they add up to ${num(flourSum)} %`);
  const p = a.preferment;
  if (p) {
    if (!PREFERMENT_KINDS.includes(p.kind)) problem(`pre-ferment kind must be one of ${PREFERMENT_KINDS.join(', ')}; got ${JSON.stringify(p.kind)}`);
    if (!(p.share > 0 && p.share <= 100)) problem(`the pre-ferment's share of the flour must be above 0 and at most 100 %; got ${p.share}`);
    if (!(p.hydration >= 0)) problem(`the pre-ferment's hydration must be 0 % or more; got ${p.hydration}`);
    if (!a.ingredients.some((l) => l.name === 'water')) problem('a pre-ferment takes its water from the formula: add "water" to the ingredients');
    if (p.yeast && !names.has(p.yeast.name)) problem(`the pre-ferment's yeast "${p.yeast.name}" must also be in the formula's ingredients`);
  }
  return a;
}

// ---- asking --------------------------------------------------------------------------------

async function askLines(prompts: Prompts, what: 'flour' | 'ingredient', suggestions: string[]): Promise<InitLine[]> {
  const lines: InitLine[] = [];
  for (let i = 0; ; i++) {
    const sum = lines.reduce((s, l) => s + l.percent, 0);
    if (what === 'flour' && Math.abs(sum - 100) < 1e-9) return lines;
    const name = (
      await prompts.input({
        message: what === 'flour' ? `Flour ${i + 1} name (flours add up to 100 %)` : `Ingredient ${i + 1} name (empty to finish)`,
        default: suggestions[i],
        validate: (v) => (what === 'flour' && v.trim() === '' ? 'a flour needs a name' : lines.some((l) => l.name === v.trim()) ? 'already listed' : true),
      })
    ).trim();
    if (name === '') return lines;
    const percent = await prompts.number({
      message: `${name}: baker's %`,
      step: 'any',
      default: what === 'flour' ? 100 - sum : undefined,
      min: 0,
      max: what === 'flour' ? 100 - sum : undefined,
      required: true,
    });
    lines.push({ name, percent: percent ?? 0 });
  }
}

export async function askAnswers(prompts: Prompts, exists: (id: string) => boolean): Promise<InitAnswers> {
  const id = await prompts.input({
    message: 'Formula id (kebab-case, also the file name)',
    validate: (v) => (!ID_RE.test(v) ? 'lower-case words joined by "-", e.g. harbour-rolls' : exists(v) ? 'a formula with this id exists already' : true),
  });
  const title = await prompts.input({ message: 'Title', default: id.split('-').map((w, i) => (i === 0 ? w[0].toUpperCase() + w.slice(1) : w)).join(' ') });
  const category = kebab(await prompts.input({ message: 'Category (e.g. lean, sourdough, rye, enriched, oil, rolls)', default: 'lean', validate: (v) => (kebab(v) === '' ? 'give a category' : true) }));
  const pieces = (await prompts.number({ message: 'Pieces in one batch', default: 10, min: 1, required: true })) ?? 1;
  const piece = await prompts.input({
    message: 'Piece weight (e.g. 320 g, 2 lb)',
    default: '500 g',
    validate: (v) => {
      try {
        return parseMassArgument(v) > 0 ? true : 'above 0, please';
      } catch {
        return 'a weight such as "320 g" or "2 lb"';
      }
    },
  });
  const loss = await prompts.number({ message: 'Loss in the bowl and on the bench, %', default: 2, min: 0, max: 99, step: 'any' });
  const ddtText = await prompts.input({ message: 'Desired dough temperature, °C (empty for none)', default: '25', validate: (v) => (v.trim() === '' || Number.isFinite(Number(v)) ? true : 'a number of °C') });
  const flours = await askLines(prompts, 'flour', ['bread flour']);
  const ingredients = await askLines(prompts, 'ingredient', ['water', 'fine salt', 'instant yeast']);
  const kind = await prompts.select<'none' | PrefermentKind>({
    message: 'Pre-ferment',
    choices: [
      { name: 'none (straight dough)', value: 'none' },
      { name: 'poolish', value: 'poolish' },
      { name: 'biga', value: 'biga' },
      { name: 'sponge', value: 'sponge' },
      { name: 'levain (seeded with a mature culture)', value: 'levain' },
    ],
    default: 'none',
  });
  let preferment: InitPreferment | null = null;
  if (kind !== 'none') {
    const share = (await prompts.number({ message: `${kind}: share of the total flour, %`, default: kind === 'levain' ? 20 : 30, min: 0.1, max: 100, step: 'any', required: true })) ?? 0;
    const hydration = (await prompts.number({ message: `${kind}: water, % of its flour`, default: kind === 'biga' ? 60 : 100, min: 0, step: 'any', required: true })) ?? 0;
    if (kind === 'levain') {
      const name = await prompts.input({ message: 'Seed culture (a catalog entry of kind culture)', default: 'mature levain' });
      const percent = (await prompts.number({ message: `${name}: % of the levain's flour`, default: 20, min: 0, step: 'any', required: true })) ?? 0;
      preferment = { kind, name: 'levain', share, hydration, seed: { name, percent } };
    } else {
      const yeasts = ingredients.filter((l) => /yeast/i.test(l.name)).map((l) => l.name);
      let yeast: InitLine | undefined;
      if (yeasts.length > 0) {
        const name = yeasts.length === 1 ? yeasts[0] : await prompts.select({ message: `${kind}: which yeast`, choices: yeasts.map((y) => ({ name: y, value: y })) });
        const percent = (await prompts.number({ message: `${name} in the ${kind}: % of its flour`, default: 0.1, min: 0, step: 'any', required: true })) ?? 0;
        yeast = { name, percent };
      }
      preferment = { kind, name: kind, share, hydration, yeast };
    }
  }
  return {
    id,
    title,
    category,
    status: 'draft',
    pieces,
    piece,
    loss: loss ?? 0,
    doughTemperature: ddtText.trim() === '' ? undefined : Number(ddtText),
    flours,
    ingredients,
    preferment,
  };
}

// ---- the command -------------------------------------------------------------------------------

/** The first `rel` (a schema file) found in `start` or a folder above it. */
function findUpwards(start: string, rel: string): string | undefined {
  for (let d = resolve(start); ; d = dirname(d)) {
    const candidate = join(d, rel);
    if (existsSync(candidate)) return candidate;
    if (dirname(d) === d) return undefined;
  }
}

const PROJECT_SCHEMA = join('shared', 'schema', 'formula.schema.json');
const REPOSITORY_SCHEMA = join(SCHEMAS_FOLDER, 'formula.schema.json');

/**
 * The formula schema for the new file's schema line, relative to the folder it goes into, so it
 * works from any folder and, inside a repository, for everyone who clones it: Panform's own
 * project copy (the demo in formulas/), else the copy a `panform new` repository keeps in
 * schemas/, else this installation's (shipped in the package; the path then holds on this
 * computer only).
 */
export function schemaReference(dir: string, installedAt = dirname(fileURLToPath(import.meta.url))): string {
  const schema = findUpwards(dir, PROJECT_SCHEMA) ?? findUpwards(dir, REPOSITORY_SCHEMA) ?? findUpwards(installedAt, PROJECT_SCHEMA);
  if (!schema) return 'https://panform.example/schema/formula.schema.json';
  return relative(resolve(dir), schema).split(sep).join('/');
}

export interface InitResult {
  path: string;
  findings: Finding[];
}

export interface InitOptions {
  dir: string;
  answers?: string;
}

/** Checks the answers, renders, checks the text as `panform check` would, then writes; refuses to overwrite. */
export function writeFormula(answers: InitAnswers, dir: string): InitResult {
  const a = validateAnswers(answers);
  const path = join(dir, `${a.id}.yaml`);
  if (existsSync(path)) throw new InputError(`${path} exists already; Panform does not write over a formula`, [], 'choose another id, or edit the file');
  const text = renderFormulaYaml(a, schemaReference(dir));
  const { catalog, path: catalogPath } = readCatalogFor(resolve(dir, 'x.yaml'));
  const checked = checkFileText({
    kind: 'formula',
    file: path,
    text,
    catalog: catalogPath ? catalog : null,
    noCatalog: catalogPath ? undefined : `no ${'ingredients.yaml'} in ${dir} or its parent folder`,
  });
  const errors = checked.findings.filter((f) => f.severity === 'error');
  if (errors.length > 0) throw new InputError(`the formula has errors, so ${path} was not written`, errors);
  if (checked.kind === 'formula' && checked.value) {
    const formula = checked.value;
    try {
      scaleFormula(formula, catalog, { by: 'pieces', pieces: formula.yield.pieces });
    } catch (e) {
      if (e instanceof ScaleError) throw new InputError(`${e.message}; ${path} was not written`);
      throw e;
    }
  }
  mkdirSync(dir, { recursive: true });
  try {
    writeFileSync(path, text, { flag: 'wx' });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'EEXIST') throw new InputError(`${path} exists already; Panform does not write over a formula`);
    throw e;
  }
  return { path, findings: checked.findings };
}

function readAnswers(file: string): InitAnswers {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    throw new InputError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  try {
    return JSON.parse(text) as InitAnswers;
  } catch (e) {
    throw new InputError(`${file} is not valid JSON: ${(e as Error).message}`);
  }
}

export async function runInit(opts: InitOptions, prompts?: Prompts): Promise<InitResult> {
  let answers: InitAnswers;
  if (opts.answers !== undefined) answers = readAnswers(opts.answers);
  else {
    if (!prompts) {
      if (!process.stdin.isTTY) throw new UsageError('panform init asks questions and needs a terminal', 'give the answers with --answers FILE.json');
      prompts = (await import('@inquirer/prompts')) as unknown as Prompts;
    }
    answers = await askAnswers(prompts, (id) => existsSync(join(opts.dir, `${id}.yaml`)));
  }
  return writeFormula(answers, opts.dir);
}

export const command = new Command('init')
  .description('Write a new formula file by answering questions, then check it.')
  .option('--dir <folder>', 'folder for the new file (default: formulas, or . when it holds ingredients.yaml)')
  .option('--answers <file.json>', 'take the answers from a JSON file instead of asking (for scripts)')
  .addHelpText(
    'after',
    `
Examples:
  $ panform init
  $ panform init --dir formulas --answers new-rolls.json

The answers file holds { id, title, category, pieces, piece, loss?, doughTemperature?,
flours: [{ name, percent }], ingredients: [{ name, percent }], preferment?: { kind, share,
hydration, yeast?: { name, percent }, seed?: { name, percent } } }. An existing file is never
written over.`,
  )
  .action(async (raw: { dir?: string; answers?: string }) => {
    let result: InitResult;
    try {
      result = await runInit({ dir: raw.dir ?? defaultFormulasFolder(), answers: raw.answers });
    } catch (e) {
      // Ctrl-C in a prompt: stop quietly, nothing was written.
      if ((e as Error)?.name === 'ExitPromptError') throw new UsageError('stopped; nothing was written');
      throw e;
    }
    for (const f of result.findings) process.stdout.write(`${formatFinding(f)}\n`);
    process.stdout.write(`wrote ${result.path}; check it with \`panform check ${result.path}\` and scale it with \`panform scale ${result.path}\`\n`);
  });
