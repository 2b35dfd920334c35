// Files that ship with Panform (the schemas, ...), found from this module upward: in the source
// tree, in the bundled CLI (dist/cli/chunks/) and in an installed package alike, whatever the
// current folder is.
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * The folder `relDir` of this installation that holds `marker`, searched from this module's
 * folder upward; null when there is none.
 */
export function findInstalled(relDir: string, marker: string, from = dirname(fileURLToPath(import.meta.url))): string | null {
  let dir = from;
  for (let i = 0; i < 8; i++) {
    const candidate = join(dir, relDir);
    if (existsSync(join(candidate, marker))) return candidate;
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  return null;
}

/** Panform's JSON Schemas (shared/schema/*.schema.json, shipped in the package). */
export function schemaFolder(): string | null {
  return findInstalled(join('shared', 'schema'), 'formula.schema.json');
}
