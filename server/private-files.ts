// Files and folders Panform keeps (the PGlite data directory, the local mail outbox) hold password
// hashes, sessions and reset links: private to the user running Panform. New ones are created
// private; ones that already exist (made by an older version, by hand, or under a loose umask)
// are tightened when Panform opens them.
import { chmodSync, lstatSync, mkdirSync, readdirSync } from 'node:fs';
import { join } from 'node:path';

export const PRIVATE_DIR_MODE = 0o700;
export const PRIVATE_FILE_MODE = 0o600;

/** Creates a folder (and its parents) private to this user, or tightens it if it exists. */
export function privateDir(dir: string): void {
  mkdirSync(dir, { recursive: true, mode: PRIVATE_DIR_MODE });
  chmodSync(dir, PRIVATE_DIR_MODE);
}

/**
 * Tightens a folder and everything under it: folders 700, files 600 (an executable bit is
 * dropped too: nothing in a data directory is run). Symbolic links are left alone, and so is
 * what they point to.
 */
export function tightenTree(dir: string): void {
  const st = lstatSync(dir, { throwIfNoEntry: false });
  if (!st || st.isSymbolicLink()) return;
  if (st.isDirectory()) {
    if ((st.mode & 0o777) !== PRIVATE_DIR_MODE) chmodSync(dir, PRIVATE_DIR_MODE);
    for (const name of readdirSync(dir)) tightenTree(join(dir, name));
  } else if (st.isFile() && (st.mode & 0o777) !== PRIVATE_FILE_MODE) {
    chmodSync(dir, PRIVATE_FILE_MODE);
  }
}
