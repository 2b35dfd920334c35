// Reading what a load will take in: the files under the given paths, their text, and where known
// the git commit and author that last touched each one. The I/O edge of the load core.
import { execFile } from 'node:child_process';
import { closeSync, existsSync, openSync, readdirSync, readSync, statSync } from 'node:fs';
import { basename, dirname, join, relative, resolve, sep } from 'node:path';
import { promisify } from 'node:util';
import { CATALOG_FILE, MAX_FILE_BYTES, tooLargeProblem } from '#shared/check/check-file';
import { compareText } from '#shared/text';
import { fileKindOf, isYamlName, orderableFormula, orderFiles, skippedEntry, type FileKind } from '#shared/files';

const run = promisify(execFile);

export { CATALOG_FILE, type FileKind };

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

/**
 * The .yaml/.yml files under `dir`, for `panform check` and for a load alike: every folder below
 * it, hidden entries and node_modules skipped (shared/files.ts), a linked file counted, a linked
 * folder not followed. Sorted by name within each folder.
 */
export function listYamlFiles(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    let entries;
    try {
      entries = readdirSync(d, { withFileTypes: true });
    } catch (e) {
      throw new LoadPathError(`cannot read the folder ${d}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
    }
    for (const e of entries.sort((a, b) => compareText(a.name, b.name))) {
      if (skippedEntry(e.name)) continue;
      const p = join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (isYamlName(e.name) && (e.isFile() || (e.isSymbolicLink() && statSync(p, { throwIfNoEntry: false })?.isFile()))) out.push(p);
    }
  };
  walk(dir);
  return out;
}

/** A formulas folder's files (the catalog, formulas, plans/<date>.yaml), each with the folder as its root. */
function folderFiles(dir: string): { kind: FileKind; absPath: string; root: string }[] {
  return orderFiles(listYamlFiles(dir)).map((f) => ({ kind: f.kind, absPath: f.path, root: dir }));
}


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
      if (!isYamlName(abs)) throw new LoadPathError(`${given} is not a YAML file (.yaml or .yml)`);
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
  const list = orderFiles([...picked.keys()]).map((o) => picked.get(o.path)!);
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
      for (const f of folderFiles(root)) {
        if (f.kind === 'formula' && orderableFormula(relative(root, f.absPath))) folderFormulas.set(basename(f.absPath).replace(/\.ya?ml$/i, ''), {});
      }
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
