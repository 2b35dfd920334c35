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
}

export interface GitSetupReport {
  repository: string;
  textconv: string;
  /** The .gitattributes line, and whether this run added it. */
  attributes: { file: string; line: string; added: boolean };
}

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
    top = (await run('git', ['rev-parse', '--show-toplevel'])).stdout.trim();
  } catch {
    throw new UsageError('not inside a git repository', 'run panform git-setup in the repository that holds your formulas');
  }
  const folder = relative(top, resolve(top, options.folder)).split('\\').join('/');
  if (folder.startsWith('..')) throw new UsageError(`--folder ${options.folder} is outside the repository ${top}`);
  const textconv = `${shellQuote(process.execPath)} ${shellQuote(findLauncher())} diff --textconv`;
  await run('git', ['config', 'diff.panform.textconv', textconv], { cwd: top });
  const file = join(top, '.gitattributes');
  const line = `${folder || '.'}/*.yaml diff=panform`;
  const existing = existsSync(file) ? readFileSync(file, 'utf8') : '';
  const has = existing.split(/\r?\n/).some((l) => l.trim().replace(/\s+/g, ' ') === line);
  if (!has) writeFileSync(file, `${existing}${existing === '' || existing.endsWith('\n') ? '' : '\n'}${line}\n`);
  return { repository: top, textconv, attributes: { file, line, added: !has } };
}

export function printGitSetup(r: GitSetupReport): string {
  return [
    `git diff driver "panform" set in ${r.repository}/.git/config:`,
    `  diff.panform.textconv = ${r.textconv}`,
    r.attributes.added ? `added to ${r.attributes.file}: ${r.attributes.line}` : `${r.attributes.file} already has: ${r.attributes.line}`,
    'Now `git diff` and `git log -p` on formula files show the figures of each version above its YAML.',
    'Commit .gitattributes so the team gets the same; each clone runs `panform git-setup` once.',
    '',
  ].join('\n');
}

export const command = new Command('git-setup')
  .description('make `git diff` and `git log -p` show the figures of formula files (registers a git diff driver)')
  .option('--folder <dir>', 'the formulas folder, relative to the repository top', 'formulas')
  .option('--json', 'print what was set as JSON', false)
  .addHelpText(
    'after',
    `
Sets diff.panform.textconv in this repository's git config and adds
"formulas/*.yaml diff=panform" to .gitattributes. Safe to run again.

Examples:
  $ panform git-setup
  $ git log -p formulas/harbour-ciabatta.yaml  # each change with its figures
  $ panform git-setup --folder recipes/formulas
`,
  )
  .action(async (flags: { folder?: string; json?: boolean }) => {
    const options: GitSetupOptions = { folder: flags.folder ?? 'formulas', json: flags.json === true };
    const report = await collectGitSetup(options);
    process.stdout.write(options.json ? `${JSON.stringify(report, null, 2)}\n` : printGitSetup(report));
  });
