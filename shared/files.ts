// Which files of a bakery's folder Panform reads, what kind each is, and in which order they are
// checked: one rule for `panform check` and for a load (the node-side walker that lists a
// folder is `listYamlFiles` in server/load/read.ts). Pure: works on paths as strings.
import { CATALOG_FILE } from './check/check-file.ts';
import { compareText } from './text.ts';

export type FileKind = 'catalog' | 'formula' | 'plan';

/** The order files are checked in: each kind needs what the one before it reads. */
export const KIND_ORDER: Readonly<Record<FileKind, number>> = { catalog: 0, formula: 1, plan: 2 };

export const isYamlName = (name: string): boolean => /\.ya?ml$/i.test(name);

/** Entries a folder walk leaves alone: hidden ones (.git, editor files) and node_modules. */
export const skippedEntry = (name: string): boolean => name.startsWith('.') || name === 'node_modules';

const segments = (path: string) => path.split(/[\\/]+/).filter((s) => s !== '' && s !== '.');

/**
 * Which kind a file is, by where it lies: ingredients.yaml is the catalog, a file in a plans/
 * folder a plan, any other .yaml/.yml a formula. `catalogPath`: a catalog given by name
 * (`--catalog`), compared as given.
 */
export function fileKindOf(path: string, catalogPath?: string): FileKind {
  const parts = segments(path);
  if (catalogPath !== undefined && parts.join('/') === segments(catalogPath).join('/')) return 'catalog';
  if (parts[parts.length - 1] === CATALOG_FILE) return 'catalog';
  if (parts[parts.length - 2] === 'plans') return 'plan';
  return 'formula';
}

/** Paths in the order they are checked: the catalog, then formulas, then plans; by name within a kind. */
export function orderFiles(paths: readonly string[], catalogPath?: string): { path: string; kind: FileKind }[] {
  return paths
    .map((path) => ({ path, kind: fileKindOf(path, catalogPath) }))
    .sort((a, b) => KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || compareText(a.path, b.path));
}

/**
 * Whether a plan's orders can name a formula at this path (from the folder that holds plans/):
 * only the formulas directly in that folder, as `panform sheet` finds them by id.
 */
export function orderableFormula(pathFromRoot: string): boolean {
  return segments(pathFromRoot).length === 1;
}
