// Reading what a load will take in: the files under the given paths, their text, and where known
// the git commit and author that last touched each one. The I/O edge of the load core.
import { execFile } from 'node:child_process';
import { closeSync, existsSync, openSync, readdirSync, readSync, statSync } from 'node:fs';
import { basename, dirname, join, relative, resolve, sep } from 'node:path';
import { promisify } from 'node:util';
import { CATALOG_FILE, MAX_FILE_BYTES, tooLargeProblem } from '#shared/check/check-file';

const run = promisify(execFile);

export type FileKind = 'catalog' | 'formula' | 'plan';

export { CATALOG_FILE };

export interface LoadFile {
  kind: FileKind;
  /** Absolute path on disk. */
  absPath: string;
  /** The path recorded in the database: `<folder>/<file>`, e.g. `formulas/harbour-ciabatta.yaml`. */
  path: string;
  text: string;
  /** Why the file could not be read as text (too large, unreadable); `text` is then empty. */
  problem?: string;
  gitCommit: string | null;
  gitAuthor: string | null;
  /** The commit's author date (ISO 8601) and subject line. */
  gitDate: string | null;
  gitMessage: string | null;
}

export interface LoadInput {
  files: LoadFile[];
  /**
   * True when whole folders were given: formulas and plans in the database but not in the folder
   * are then marked removed (formulas, kept) or deleted (plans). A load of single files touches
   * only those files.
   */
  complete: boolean;
  /** HEAD of the repository holding the files, where known. */
  gitCommit: string | null;
  /**
   * For a load of single files: the formula ids on disk in the folders they belong to, so a
   * plan's orders can name formulas that are not part of this load.
   */
  folderFormulas?: Map<string, { status?: string }>;
}

const isYaml = (name: string) => /\.ya?ml$/i.test(name);

/** A formulas folder's files: ingredients.yaml, <id>.yaml, plans/<date>.yaml. */
function folderFiles(dir: string): { kind: FileKind; absPath: string; root: string }[] {
  const out: { kind: FileKind; absPath: string; root: string }[] = [];
  for (const name of readdirSync(dir).sort()) {
    const p = join(dir, name);
    if (!isYaml(name) || !statSync(p).isFile()) continue;
    out.push({ kind: name === CATALOG_FILE ? 'catalog' : 'formula', absPath: p, root: dir });
  }
  const plans = join(dir, 'plans');
  if (existsSync(plans) && statSync(plans).isDirectory()) {
    for (const name of readdirSync(plans).sort()) {
      const p = join(plans, name);
      if (isYaml(name) && statSync(p).isFile()) out.push({ kind: 'plan', absPath: p, root: dir });
    }
  }
  return out;
}

/**
 * Which kind a file is, by where it lies (for `panform check` and a load alike): ingredients.yaml
 * is the catalog, a file in a plans/ folder a plan, any other .yaml/.yml a formula.
 */
export function fileKindOf(path: string): FileKind {
  if (basename(path) === CATALOG_FILE) return 'catalog';
  if (basename(dirname(resolve(path))) === 'plans') return 'plan';
  return 'formula';
}

/** The order files are checked in: each kind needs what the one before it reads. */
export const KIND_ORDER: Readonly<Record<FileKind, number>> = { catalog: 0, formula: 1, plan: 2 };

/** A single file: which kind, and the formulas folder it belongs to. */
function classifyFile(absPath: string): { kind: FileKind; absPath: string; root: string } {
  const kind = fileKindOf(absPath);
  const dir = dirname(absPath);
  return { kind, absPath, root: kind === 'plan' ? dirname(dir) : dir };
}

export class LoadPathError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'LoadPathError';
  }
}

/**
 * The files under `paths` (folders or files). A single file brings the catalog beside it (or in
 * its parent folder) along, since the figures and checks need it.
 */
export async function readLoadInput(paths: string[], opts: { git?: boolean } = {}): Promise<LoadInput> {
  if (paths.length === 0) throw new LoadPathError('nothing to load: give a folder or files');
  const picked = new Map<string, { kind: FileKind; absPath: string; root: string }>();
  let complete = true;
  for (const given of paths) {
    const abs = resolve(given);
    const st = statSync(abs, { throwIfNoEntry: false });
    if (!st) throw new LoadPathError(`no such file or folder: ${given}`);
    if (st.isDirectory()) {
      for (const f of folderFiles(abs)) picked.set(f.absPath, f);
    } else {
      if (!isYaml(abs)) throw new LoadPathError(`${given} is not a YAML file (.yaml or .yml)`);
      complete = false;
      const f = classifyFile(abs);
      picked.set(f.absPath, f);
      if (f.kind !== 'catalog') {
        for (const d of [f.root, dirname(f.root)]) {
          const c = join(d, CATALOG_FILE);
          if (existsSync(c)) {
            if (!picked.has(c)) picked.set(c, { kind: 'catalog', absPath: c, root: d });
            break;
          }
        }
      }
    }
  }
  const catalogs = [...picked.values()].filter((f) => f.kind === 'catalog');
  if (catalogs.length > 1) {
    throw new LoadPathError(`one catalog per load; found ${catalogs.map((c) => c.absPath).join(' and ')}`);
  }
  const list = [...picked.values()].sort((a, b) => KIND_ORDER[a.kind] - KIND_ORDER[b.kind]);
  const git = opts.git === false ? null : await readGitInfo(list.map((f) => f.absPath));
  const files: LoadFile[] = list.map((f) => {
    const g = git?.files.get(f.absPath);
    const read = readFileText(f.absPath);
    return {
      kind: f.kind,
      absPath: f.absPath,
      path: [basename(f.root), ...relative(f.root, f.absPath).split(sep)].join('/'),
      text: 'text' in read ? read.text : '',
      ...('problem' in read ? { problem: read.problem } : {}),
      gitCommit: g?.commit ?? null,
      gitAuthor: g?.author ?? null,
      gitDate: g?.date ?? null,
      gitMessage: g?.message ?? null,
    };
  });
  let folderFormulas: Map<string, { status?: string }> | undefined;
  if (!complete) {
    folderFormulas = new Map();
    for (const root of new Set(list.map((f) => f.root))) {
      for (const f of folderFiles(root)) if (f.kind === 'formula') folderFormulas.set(basename(f.absPath).replace(/\.ya?ml$/i, ''), {});
    }
  }
  return { files, complete, gitCommit: git?.head ?? null, folderFormulas };
}

/**
 * A formula, catalog or plan file's text, for `panform check` and for a load alike: a file larger
 * than MAX_FILE_BYTES is not one of them and is not read whole (nor kept in the server's memory).
 */
export function readFileText(path: string): { text: string } | { problem: string } {
  try {
    const size = statSync(path).size;
    if (size > MAX_FILE_BYTES) return { problem: tooLargeProblem(size) };
    const fd = openSync(path, 'r');
    try {
      const buf = Buffer.alloc(size);
      let read = 0;
      while (read < size) {
        const n = readSync(fd, buf, read, size - read, read);
        if (n === 0) break;
        read += n;
      }
      return { text: buf.subarray(0, read).toString('utf8') };
    } finally {
      closeSync(fd);
    }
  } catch (e) {
    return { problem: `cannot read the file: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}` };
  }
}

interface GitInfo {
  head: string | null;
  files: Map<string, GitFileCommit>;
}

export interface GitFileCommit {
  commit: string;
  author: string;
  /** Author date, ISO 8601. */
  date: string;
  /** Subject line of the message. */
  message: string;
}

/**
 * The last commit and author of each file, from one `git log` over all of them (one process, not
 * one per file). Files changed since that commit or not committed get none: the loaded text is not
 * what the commit holds. Outside a repository, or without git, returns null.
 */
export async function readGitInfo(absPaths: string[]): Promise<GitInfo | null> {
  if (absPaths.length === 0) return null;
  const cwd = dirname(absPaths[0]);
  let top: string;
  try {
    top = (await run('git', ['rev-parse', '--show-toplevel'], { cwd })).stdout.trim();
  } catch {
    return null;
  }
  const rel = new Map<string, string>();
  for (const p of absPaths) {
    const r = relative(top, p);
    if (!r.startsWith('..')) rel.set(r.split(sep).join('/'), p);
  }
  const files = new Map<string, GitFileCommit>();
  let head: string | null = null;
  try {
    head = (await run('git', ['rev-parse', 'HEAD'], { cwd: top })).stdout.trim() || null;
  } catch {
    return { head: null, files };
  }
  // The folders, not each file: one short command line however many formulas there are.
  const pathspecs = [...new Set([...rel.keys()].map((r) => (r.includes('/') ? r.slice(0, r.lastIndexOf('/')) : '.')))];
  const dirty = new Set<string>();
  try {
    const status = await run('git', ['-c', 'core.quotePath=false', 'status', '--porcelain=v1', '-z', '--untracked-files=all', '--', ...pathspecs], {
      cwd: top,
      maxBuffer: 64 * 1024 * 1024,
    });
    for (const entry of status.stdout.split('\0')) if (entry.length > 3) dirty.add(entry.slice(3));
    const log = await run('git', ['-c', 'core.quotePath=false', 'log', '--format=%x01%H%x00%an%x00%aI%x00%s', '--name-only', '--no-renames', '--', ...pathspecs], {
      cwd: top,
      maxBuffer: 256 * 1024 * 1024,
    });
    let current: GitFileCommit | null = null;
    for (const line of log.stdout.split('\n')) {
      if (line.startsWith('\u0001')) {
        const [commit, author, date, message] = line.slice(1).split('\0');
        current = { commit, author, date, message };
      } else if (line && current && rel.has(line) && !dirty.has(line)) {
        const abs = rel.get(line)!;
        if (!files.has(abs)) files.set(abs, current);
      }
    }
  } catch {
    // git failed on these paths (too many for one command line, a broken repository): no git info.
    files.clear();
  }
  return { head, files };
}
