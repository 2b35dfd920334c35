// `panform check [paths..]`: schema and trade checks of formulas, the catalog and plans, one
// line per finding. Reading files happens here; the checks themselves are in shared/check/.
import { Command } from 'commander';
import { statSync } from 'node:fs';
import { listYamlFiles, LoadPathError, readFileText } from '#server/load/read';
import { fileKindOf, orderableFormula, orderFiles } from '#shared/files';
import { join, relative, resolve } from 'node:path';
import { checkFileText, fileStem } from '#shared/check/check-file';
import type { KnownFormula } from '#shared/check/plan';
import type { Catalog } from '#shared/model';
import { formatFinding, parseYamlText, sortFindings, type Finding } from '#shared/parse';
import { ExitError, UsageError } from '../errors.ts';
import { defaultFormulasFolder, findCatalogPath, formulasDirForPlan } from '../files.ts';

export interface CheckOptions {
  paths: string[];
  /** Use this catalog for every formula instead of the one found beside it. */
  catalog?: string;
  json: boolean;
}

export interface CheckReport {
  /** How many files were checked. */
  files: number;
  /** Their paths, as shown in findings. */
  checked: string[];
  findings: Finding[];
  errors: number;
  warnings: number;
}


/** The .yaml/.yml files under a folder, as a load finds them (server/load/read.ts). */
function walk(dir: string, out: string[]): void {
  try {
    out.push(...listYamlFiles(dir));
  } catch (e) {
    if (e instanceof LoadPathError) throw new UsageError(e.message);
    throw e;
  }
}

/** The files named on the command line: files as given, folders searched for .yaml/.yml. */
export function listFiles(paths: string[]): string[] {
  const out: string[] = [];
  const seen = new Set<string>();
  for (const p of paths) {
    const st = statSync(p, { throwIfNoEntry: false });
    if (!st) throw new UsageError(`no such file or folder: ${p}`, p === 'formulas' ? 'run panform check in the project folder, or give the files or folders to check' : undefined);
    const found: string[] = [];
    if (st.isDirectory()) {
      walk(p, found);
      if (found.length === 0) throw new UsageError(`found no .yaml or .yml files in ${p}`);
    } else found.push(p);
    for (const f of found) {
      const key = resolve(f);
      if (!seen.has(key)) {
        seen.add(key);
        out.push(f);
      }
    }
  }
  return out;
}

/** The file's text, or a finding when it cannot be read or is too large to be a formula file. */
function readForCheck(path: string): { text: string } | { finding: Finding } {
  const r = readFileText(path);
  return 'text' in r ? r : { finding: { file: path, line: 1, col: 1, severity: 'error', message: r.problem } };
}

/** Reads and checks every file; returns the findings, sorted. Throws UsageError for a bad path. */
export function collectCheck(options: Pick<CheckOptions, 'paths' | 'catalog'>): CheckReport {
  const paths = options.paths.length > 0 ? options.paths : [defaultFormulasFolder()];
  if (options.catalog !== undefined && !statSync(options.catalog, { throwIfNoEntry: false })?.isFile()) {
    throw new UsageError(`--catalog ${options.catalog}: no such file`, 'give the path of an ingredient catalog, e.g. --catalog formulas/ingredients.yaml');
  }
  const files = listFiles(paths);
  if (options.catalog !== undefined && !files.some((f) => resolve(f) === resolve(options.catalog!))) files.push(options.catalog);

  const findings: Finding[] = [];
  const checkedSet = new Set(files.map((f) => resolve(f)));

  // Catalogs first: formulas need them. Each is read and checked once.
  const catalogs = new Map<string, { catalog: Catalog | null; findings: Finding[] }>();
  const loadCatalog = (path: string) => {
    const key = resolve(path);
    let c = catalogs.get(key);
    if (!c) {
      const r = readForCheck(path);
      if ('finding' in r) c = { catalog: null, findings: [r.finding] };
      else {
        const res = checkFileText({ kind: 'catalog', file: path, text: r.text });
        c = { catalog: res.kind === 'catalog' && res.value && !res.findings.some((f) => f.severity === 'error') ? res.value : null, findings: res.findings };
      }
      catalogs.set(key, c);
    }
    return c;
  };

  // Statuses of the formulas checked in this run, so plans need not read them again.
  const statusOf = new Map<string, { status?: string }>();
  const formulaDirs = new Map<string, Map<string, KnownFormula>>();
  const formulasIn = (dir: string) => {
    let m = formulaDirs.get(dir);
    if (!m) {
      m = new Map();
      let names: string[] = [];
      try {
        names = listYamlFiles(dir)
          .filter((p) => fileKindOf(p) === 'formula' && orderableFormula(relative(dir, p)))
          .map((p) => relative(dir, p));
      } catch {
        // An unreadable folder holds no formulas we can name; each order then says so.
      }
      for (const name of names) {
        const checked = statusOf.get(resolve(join(dir, name)));
        if (checked) {
          m.set(fileStem(name), { status: checked.status });
          continue;
        }
        const r = readForCheck(join(dir, name));
        let status: string | undefined;
        if ('text' in r) {
          const y = parseYamlText(r.text, name);
          if (y.ok && y.data && typeof y.data === 'object' && typeof (y.data as { status?: unknown }).status === 'string') {
            status = (y.data as { status: string }).status;
          }
        }
        m.set(fileStem(name), { status });
      }
      formulaDirs.set(dir, m);
    }
    return m;
  };

  // The catalog, formulas, plans (shared/files.ts); paths compared resolved, shown as given.
  const shown = new Map(files.map((f) => [resolve(f), f]));
  const byKind = orderFiles([...shown.keys()], options.catalog === undefined ? undefined : resolve(options.catalog));
  for (const { path, kind } of byKind) {
    const file = shown.get(path)!;
    if (kind === 'catalog') {
      findings.push(...loadCatalog(file).findings);
      continue;
    }
    const r = readForCheck(file);
    if ('finding' in r) {
      findings.push(r.finding);
      continue;
    }
    if (kind === 'formula') {
      const catalogPath = options.catalog ?? findCatalogPath(file);
      let catalog: Catalog | null = null;
      let noCatalog: string | undefined;
      if (catalogPath !== undefined) {
        const c = loadCatalog(catalogPath);
        catalog = c.catalog;
        if (!catalog) {
          noCatalog = `the catalog ${catalogPath} has errors`;
          if (!checkedSet.has(resolve(catalogPath))) noCatalog += ` (run \`panform check ${catalogPath}\`)`;
        }
      }
      const res = checkFileText({ kind: 'formula', file, text: r.text, catalog, noCatalog });
      findings.push(...res.findings);
      if (res.kind === 'formula' && res.value) statusOf.set(resolve(file), { status: res.value.status });
    } else {
      const dir = formulasDirForPlan(file);
      const shown = relative(process.cwd(), dir) || '.';
      findings.push(...checkFileText({ kind: 'plan', file, text: r.text, formulas: formulasIn(dir), formulasDir: `${shown}/` }).findings);
    }
  }

  const sorted = sortFindings(findings);
  return {
    files: files.length,
    checked: files,
    findings: sorted,
    errors: sorted.filter((f) => f.severity === 'error').length,
    warnings: sorted.filter((f) => f.severity === 'warning').length,
  };
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

export function summaryLine(r: CheckReport): string {
  if (r.findings.length === 0) return `${plural(r.files, 'file')} checked, no problems`;
  return `${plural(r.errors, 'error')}, ${plural(r.warnings, 'warning')} in ${plural(r.files, 'file')}`;
}

export function printCheck(r: CheckReport): string {
  return [...r.findings.map(formatFinding), summaryLine(r)].join('\n') + '\n';
}

export const command = new Command('check')
  .description('check formulas, the ingredient catalog and plans: schema, units and the baker\'s arithmetic')
  .argument('[paths...]', 'files or folders to check (default: formulas/, or . when it holds ingredients.yaml)')
  .option('--catalog <file>', 'use this ingredient catalog for every formula')
  .option('--json', 'print the findings as JSON', false)
  .addHelpText(
    'after',
    `
Each problem is printed as path:line:col severity message, sorted, then a count.
Errors (exit 1) stop a formula from being used; warnings flag values outside the
trade's usual ranges and do not change the exit code.

Examples:
  $ panform check                         # everything under formulas/
  $ panform check formulas/harbour-ciabatta.yaml
  $ panform check formulas/plans --json
`,
  )
  .action((paths: string[], flags: { catalog?: string; json?: boolean }) => {
    const options: CheckOptions = { paths: paths ?? [], catalog: flags.catalog, json: flags.json === true };
    const report = collectCheck(options);
    if (options.json) {
      const { files, findings, errors, warnings, checked } = report;
      process.stdout.write(`${JSON.stringify({ files, findings, errors, warnings, checked }, null, 2)}\n`);
    } else {
      // One line per finding, never wrapped: `file:line:col` is what editors and CI jump to.
      process.stdout.write(printCheck(report));
    }
    // Exit 1 when there is an error; the findings are already printed.
    if (report.errors > 0) throw new ExitError(1, '');
  });
