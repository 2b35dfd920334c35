// The load core: read a formulas folder (or files), check everything, then write it all in one
// transaction. Used by `panform load`, by the server's local load channel and by `serve --demo`.
import type { Finding } from '#shared/parse';
import type { DatabaseHandle } from '../db/client.ts';
import { checkLoadInput, type CheckResult, type ExtraCheck } from './check.ts';
import { readLoadInput, LoadPathError, type LoadInput } from './read.ts';
import { writeLoad, type LoadSummary, type WriteOptions } from './write.ts';

export type { LoadSummary, LoadProgress, KindSummary } from './write.ts';
export type { LoadInput, LoadFile, FileKind } from './read.ts';
export { readLoadInput, LoadPathError } from './read.ts';
export { checkLoadInput, contentHash } from './check.ts';
export { referenceFigures } from '#shared/figures';
export { writeLoad } from './write.ts';

/** The files have errors: nothing was loaded. */
export class LoadCheckError extends Error {
  constructor(readonly findings: Finding[]) {
    const errors = findings.filter((f) => f.severity === 'error').length;
    super(`nothing loaded: ${errors} error${errors === 1 ? '' : 's'} in the files`);
    this.name = 'LoadCheckError';
  }
}

export interface LoadOptions extends WriteOptions {
  /** Skip reading git commits and authors. */
  git?: boolean;
  /** Checks beyond those of `panform check` (none by default). */
  checks?: ExtraCheck[];
}

/** Reads and checks without touching the database. Throws LoadPathError for bad paths. */
export async function prepareLoad(
  paths: string | string[],
  opts: Pick<LoadOptions, 'git' | 'checks' | 'onProgress'> = {},
): Promise<{ input: LoadInput; checked: CheckResult }> {
  const list = Array.isArray(paths) ? paths : [paths];
  opts.onProgress?.({ phase: 'read', done: 0, total: list.length });
  const input = await readLoadInput(list, { git: opts.git });
  if (input.files.length === 0) {
    throw new LoadPathError(`no formula, catalog or plan files in ${list.join(', ')}`);
  }
  opts.onProgress?.({ phase: 'check', done: 0, total: input.files.length });
  const checked = checkLoadInput(input, opts.checks ?? [], { folderFormulas: input.folderFormulas });
  opts.onProgress?.({ phase: 'check', done: input.files.length, total: input.files.length });
  return { input, checked };
}

/** Writes an input that passed the checks. */
export async function applyLoad(handle: DatabaseHandle, input: LoadInput, checked: CheckResult, opts: WriteOptions = {}): Promise<LoadSummary> {
  if (!checked.ok) throw new LoadCheckError(checked.findings);
  return writeLoad(handle.db, input, checked, opts);
}

/**
 * Loads a folder (default layout: ingredients.yaml, <id>.yaml, plans/<date>.yaml) or a list of
 * folders and files. Everything is checked first; any error throws LoadCheckError and nothing is
 * written. The database must be migrated.
 */
export async function loadFolder(handle: DatabaseHandle, paths: string | string[], opts: LoadOptions = {}): Promise<LoadSummary> {
  const { input, checked } = await prepareLoad(paths, opts);
  return applyLoad(handle, input, checked, opts);
}
