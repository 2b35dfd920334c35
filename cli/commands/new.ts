// `panform new <dir>`: starts a bakery's own formulas repository: a starter catalog, one sample
// formula, a sample plan, copies of the schemas for editors, a README, and (when git is there) a
// git repository with Panform's diff driver and a pre-commit hook that runs `panform check`.
// Everything is written into a hidden folder beside <dir> first and moved into place at the end,
// so a refused or failed run leaves nothing behind.
import { execFile } from 'node:child_process';
import { chmodSync, copyFileSync, existsSync, mkdirSync, readdirSync, renameSync, rmSync, rmdirSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { promisify } from 'node:util';
import { Command } from 'commander';
import { checkFileText } from '#shared/check/check-file';
import type { Catalog } from '#shared/model';
import { InputError, UsageError } from '../errors.ts';
import {
  bakeryReadme,
  CATALOG_YAML,
  CI_SCRIPT,
  GITIGNORE,
  PRE_COMMIT_HOOK,
  SAMPLE_FORMULA,
  SAMPLE_FORMULA_YAML,
  samplePlanYaml,
  SCHEMA_FILES,
  SCHEMAS_FOLDER,
  vscodeSettings,
} from '../new-repository.ts';
import { schemaFolder } from '../../server/install-paths.ts';

const run = promisify(execFile);

export interface NewOptions {
  dir: string;
  /** Set up git (when git is installed); --no-git leaves it out. */
  git: boolean;
  json: boolean;
  /** The sample plan's date, YYYY-MM-DD (default: tomorrow by this computer's clock). */
  planDate?: string;
}

export interface NewReport {
  folder: string;
  /** The files written, relative to the folder. */
  files: string[];
  planFile: string;
  /** What git setup did; null with --no-git or without git (then `gitMissing`). */
  git: { textconv: string; command: string; hooksPath: string | null; attributes: string } | null;
  gitMissing: boolean;
}

/** The local date after `now`, YYYY-MM-DD. */
export function tomorrow(now = new Date()): string {
  const d = new Date(now.getFullYear(), now.getMonth(), now.getDate() + 1);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

/** A title for the README from the folder's name: "tidewater-bakehouse" → "Tidewater bakehouse formulas". */
function titleOf(dir: string): string {
  const words = basename(resolve(dir)).replace(/[-_.]+/g, ' ').trim();
  if (!words) return 'Formulas';
  return `${words[0].toUpperCase()}${words.slice(1)} formulas`;
}

/** The texts of the new repository, each checked as `panform check` would; throws on an error (a bug). */
export function repositoryFiles(dir: string, planDate: string): Map<string, string> {
  const planFile = `plans/${planDate}.yaml`;
  const files = new Map<string, string>([
    ['README.md', bakeryReadme({ title: titleOf(dir), planFile })],
    ['ingredients.yaml', CATALOG_YAML],
    [`${SAMPLE_FORMULA}.yaml`, SAMPLE_FORMULA_YAML],
    [planFile, samplePlanYaml(planDate)],
    ['.gitignore', GITIGNORE],
    ['.githooks/pre-commit', PRE_COMMIT_HOOK],
    ['ci/check.sh', CI_SCRIPT],
    ['.vscode/settings.json', vscodeSettings()],
  ]);
  const catalog = checkFileText({ kind: 'catalog', file: 'ingredients.yaml', text: CATALOG_YAML });
  const formula = checkFileText({ kind: 'formula', file: `${SAMPLE_FORMULA}.yaml`, text: SAMPLE_FORMULA_YAML, catalog: (catalog.value ?? null) as Catalog | null });
  const plan = checkFileText({
    kind: 'plan',
    file: planFile,
    text: samplePlanYaml(planDate),
    formulas: new Map([[SAMPLE_FORMULA, { status: 'active' }]]),
    formulasDir: './',
  });
  const errors = [...catalog.findings, ...formula.findings, ...plan.findings].filter((f) => f.severity === 'error');
  if (errors.length > 0) throw new InputError('the starter files do not pass `panform check` (a bug in Panform)', errors);
  return files;
}

function isEmptyFolder(path: string): boolean {
  return readdirSync(path).length === 0;
}

async function gitAvailable(): Promise<boolean> {
  try {
    await run('git', ['--version']);
    return true;
  } catch {
    return false;
  }
}

export async function collectNew(options: NewOptions): Promise<NewReport> {
  const target = resolve(options.dir);
  const st = statSync(target, { throwIfNoEntry: false });
  if (st && !st.isDirectory()) throw new UsageError(`${options.dir} is a file; give a new or empty folder`);
  if (st && !isEmptyFolder(target)) {
    throw new UsageError(`${options.dir} is not empty; panform new starts a repository only in a new or empty folder`, 'give another folder name, e.g. panform new tidewater-formulas');
  }
  const parent = dirname(target);
  if (!existsSync(parent)) throw new UsageError(`the folder ${relative(process.cwd(), parent) || parent} does not exist; create it first`);
  const planDate = options.planDate ?? tomorrow();
  const files = repositoryFiles(target, planDate);
  const schemaDir = schemaFolder();
  if (!schemaDir) throw new InputError("cannot find Panform's schemas (shared/schema/) next to this installation; reinstall Panform");

  // Write everything beside the target, then move it into place in one rename.
  const staging = join(parent, `.${basename(target)}.panform-new-${process.pid}`);
  rmSync(staging, { recursive: true, force: true });
  try {
    mkdirSync(staging);
    for (const [name, text] of files) {
      mkdirSync(dirname(join(staging, name)), { recursive: true });
      writeFileSync(join(staging, name), text);
    }
    chmodSync(join(staging, '.githooks', 'pre-commit'), 0o755);
    chmodSync(join(staging, 'ci', 'check.sh'), 0o755);
    mkdirSync(join(staging, SCHEMAS_FOLDER));
    for (const name of SCHEMA_FILES) copyFileSync(join(schemaDir, name), join(staging, SCHEMAS_FOLDER, name));
    if (st) rmdirSync(target);
    renameSync(staging, target);
  } catch (e) {
    rmSync(staging, { recursive: true, force: true });
    throw new InputError(`could not write ${options.dir}: ${(e as Error).message}; nothing was written`);
  }
  const written = [...files.keys(), ...SCHEMA_FILES.map((n) => `${SCHEMAS_FOLDER}/${n}`)].sort();

  let git: NewReport['git'] = null;
  let gitMissing = false;
  if (options.git) {
    if (!(await gitAvailable())) gitMissing = true;
    else {
      try {
        await run('git', ['init', '-q'], { cwd: target });
        const { collectGitSetup } = await import('./git-setup.ts');
        const r = await collectGitSetup({ folder: '.', json: false, cwd: target });
        git = { textconv: r.textconv, command: r.command, hooksPath: r.hooksPath, attributes: r.attributes.line };
        written.push('.gitattributes');
        written.sort();
      } catch (e) {
        throw new InputError(
          `${options.dir} was written, but setting up git failed: ${(e as Error).message}`,
          [],
          `in ${options.dir}, run \`git init\` and then \`panform git-setup\``,
        );
      }
    }
  }
  return { folder: target, files: written, planFile: `plans/${planDate}.yaml`, git, gitMissing };
}

export function printNew(r: NewReport, dirArg: string): string {
  const lines = [`Started a formulas repository in ${r.folder}:`, ...r.files.map((f) => `  ${f}`)];
  if (r.git) {
    lines.push(
      'git: a new repository; `git diff` shows formula figures (diff driver "panform"),',
      `  and ${r.git.hooksPath}/pre-commit runs \`panform check\` on what is committed.`,
    );
  } else if (r.gitMissing) {
    lines.push('git is not installed: the folder is not a git repository yet. Once git is there, run `git init` and `panform git-setup` in it.');
  } else lines.push('git: left out (--no-git). Later: `git init` and `panform git-setup` in the folder.');
  lines.push(
    '',
    'Next:',
    `  cd ${dirArg}`,
    '  panform check',
    `  panform sheet ${r.planFile}`,
    ...(r.git ? ['  git add . && git commit -m "Start the formulas repository"'] : []),
    '',
  );
  return lines.join('\n');
}

export const command = new Command('new')
  .description("start a bakery's own formulas repository: starter catalog, sample formula and plan, git with checks")
  .argument('<dir>', 'a new or empty folder')
  .option('--no-git', 'do not set up git (no repository, diff driver or pre-commit hook)')
  .option('--json', 'print what was written as JSON', false)
  .addHelpText(
    'after',
    `
Writes ingredients.yaml (a starter catalog with water contents and their sources),
house-loaf.yaml (a sample formula), plans/<tomorrow>.yaml (a sample plan), schemas/
(for editors; .vscode/settings.json maps them to the files), README.md, .gitignore,
.githooks/pre-commit and ci/check.sh. With git installed: git init, the diff driver
and the hook (as \`panform git-setup\` sets them). Refuses a folder that is not empty.
\`panform init\` adds one formula to a folder; \`panform new\` starts the repository.

Examples:
  $ panform new tidewater-formulas
  $ cd tidewater-formulas && panform check && git add . && git commit -m "Start"
`,
  )
  .action(async (dir: string, flags: { git?: boolean; json?: boolean }) => {
    const options: NewOptions = { dir, git: flags.git !== false, json: flags.json === true };
    const report = await collectNew(options);
    process.stdout.write(options.json ? `${JSON.stringify(report, null, 2)}\n` : printNew(report, dir));
  });
