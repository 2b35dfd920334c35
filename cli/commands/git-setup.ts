// `panform git-setup`: registers Panform as git's diff driver for formula files, so `git diff` and
// `git log -p` show each version's figures above its YAML. Writes the repository's git config
// (diff.panform.textconv) and a line in .gitattributes; running it again changes nothing.
import { execFile } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { Command } from 'commander';
import { InputError, UsageError } from '../errors.ts';

const run = promisify(execFile);

export interface GitSetupOptions {
  /** The formulas folder, relative to the repository's top (default formulas). */
  folder: string;
  json: boolean;
  /** Where to find the repository (default the current folder). */
  cwd?: string;
}

export interface GitSetupReport {
  repository: string;
  textconv: string;
  /** How this installation runs `panform` (git config panform.command; the pre-commit hook's fallback). */
  command: string;
  /** The .gitattributes line, and whether this run added it. */
  attributes: { file: string; line: string; added: boolean };
  /** core.hooksPath, set when the repository keeps its hooks in .githooks/ (as `panform new` makes it); else null. */
  hooksPath: string | null;
}

/** The folder of versioned hooks `panform new` writes (its pre-commit runs `panform check`). */
export const HOOKS_FOLDER = '.githooks';

/** This installation's bin/panform.js, found from this module upward (works bundled too). */
export function findLauncher(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 8; i++) {
    const candidate = join(dir, 'bin', 'panform.js');
    if (existsSync(candidate)) return candidate;
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  throw new InputError('cannot find bin/panform.js of this Panform installation');
}

/** Quoted for the shell git runs the driver with. */
export function shellQuote(s: string): string {
  return /^[A-Za-z0-9_./@%+=:,-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

export async function collectGitSetup(options: GitSetupOptions): Promise<GitSetupReport> {
  let top: string;
  try {
    top = (await run('git', ['rev-parse', '--show-toplevel'], { cwd: options.cwd })).stdout.trim();
  } catch {
    throw new UsageError('not inside a git repository', 'run panform git-setup in the repository that holds your formulas');
  }
  const folder = relative(top, resolve(top, options.folder)).split('\\').join('/');
  if (folder.startsWith('..')) throw new UsageError(`--folder ${options.folder} is outside the repository ${top}`);
  const command = `${shellQuote(process.execPath)} ${shellQuote(findLauncher())}`;
  const textconv = `${command} diff --textconv`;
  await run('git', ['config', 'diff.panform.textconv', textconv], { cwd: top });
  await run('git', ['config', 'panform.command', command], { cwd: top });
  let hooksPath: string | null = null;
  if (existsSync(join(top, HOOKS_FOLDER, 'pre-commit'))) {
    hooksPath = HOOKS_FOLDER;
    await run('git', ['config', 'core.hooksPath', hooksPath], { cwd: top });
  }
  const file = join(top, '.gitattributes');
  // Formulas at the repository's top (a `panform new` repository): "/*.yaml", top level only, so
  // plans/ keeps git's plain diff.
  const line = `${folder ? `${folder}/` : '/'}*.yaml diff=panform`;
  const existing = existsSync(file) ? readFileSync(file, 'utf8') : '';
  const has = existing.split(/\r?\n/).some((l) => l.trim().replace(/\s+/g, ' ') === line);
  if (!has) writeFileSync(file, `${existing}${existing === '' || existing.endsWith('\n') ? '' : '\n'}${line}\n`);
  return { repository: top, textconv, command, attributes: { file, line, added: !has }, hooksPath };
}

/** formulas/, or the repository's top when it holds the catalog (a `panform new` repository). */
async function defaultGitFolder(): Promise<string> {
  try {
    const top = (await run('git', ['rev-parse', '--show-toplevel'])).stdout.trim();
    if (!existsSync(join(top, 'formulas')) && existsSync(join(top, 'ingredients.yaml'))) return '.';
  } catch {
    // not in a repository: collectGitSetup says so
  }
  return 'formulas';
}

export function printGitSetup(r: GitSetupReport): string {
  return [
    `git diff driver "panform" set in ${r.repository}/.git/config:`,
    `  diff.panform.textconv = ${r.textconv}`,
    `  panform.command = ${r.command}`,
    ...(r.hooksPath ? [`  core.hooksPath = ${r.hooksPath} (its pre-commit runs \`panform check\` on what is committed)`] : []),
    r.attributes.added ? `added to ${r.attributes.file}: ${r.attributes.line}` : `${r.attributes.file} already has: ${r.attributes.line}`,
    'Now `git diff` and `git log -p` on formula files show the figures of each version above its YAML.',
    'Commit .gitattributes so the team gets the same; each clone runs `panform git-setup` once.',
    '',
  ].join('\n');
}

export const command = new Command('git-setup')
  .description('make `git diff` and `git log -p` show the figures of formula files (registers a git diff driver)')
  .option('--folder <dir>', 'the formulas folder, relative to the repository top (default: formulas, or the top itself when it holds ingredients.yaml)')
  .option('--json', 'print what was set as JSON', false)
  .addHelpText(
    'after',
    `
Sets diff.panform.textconv and panform.command in this repository's git config
and adds "formulas/*.yaml diff=panform" to .gitattributes ("/*.yaml" when the
formulas are at the top, as in a \`panform new\` repository). When the repository
has .githooks/pre-commit, sets core.hooksPath to it. Safe to run again; run it
once in each clone.

Examples:
  $ panform git-setup
  $ git log -p formulas/harbour-ciabatta.yaml  # each change with its figures
  $ panform git-setup --folder recipes/formulas
`,
  )
  .action(async (flags: { folder?: string; json?: boolean }) => {
    const options: GitSetupOptions = { folder: flags.folder ?? (await defaultGitFolder()), json: flags.json === true };
    const report = await collectGitSetup(options);
    process.stdout.write(options.json ? `${JSON.stringify(report, null, 2)}\n` : printGitSetup(report));
  });
