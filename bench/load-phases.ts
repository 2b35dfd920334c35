// Times the phases of a load of a formulas folder into a PGlite data directory, separately:
// opening (creating a fresh directory runs initdb), migrating, reading + checking + writing the
// files, a second load of the same files (nothing changed), closing, and opening the directory
// again. Run by bench/run.mjs in its own process (through tsx); prints one JSON line.
//   node --import tsx bench/load-phases.ts <dataDir> <folder>
import { migrateDatabase, openDatabase } from '#server/db/client';
import { loadFolder, type KindSummary } from '#server/load/index';

const counts = (k: KindSummary) => ({ added: k.added.length, changed: k.changed.length, unchanged: k.unchanged.length, removed: k.removed.length });

const [dataDir, folder] = process.argv.slice(2);
if (!dataDir || !folder) {
  process.stderr.write('usage: load-phases.ts <dataDir> <folder>\n');
  process.exit(2);
}

const now = () => performance.now();
const phases: Record<string, number> = {};
let t = now();
const lap = (name: string) => {
  const n = now();
  phases[name] = n - t;
  t = n;
};

const handle = await openDatabase({ dataDir });
lap('open');
await migrateDatabase(handle);
lap('migrate');
const first = await loadFolder(handle, folder, { git: false, by: 'bench' });
lap('load');
const again = await loadFolder(handle, folder, { git: false, by: 'bench' });
lap('reload');
await handle.close();
lap('close');
const reopened = await openDatabase({ dataDir });
lap('reopen');
await reopened.close();

process.stdout.write(
  `${JSON.stringify({
    phases,
    files: first.files,
    formulas: counts(first.formulas),
    reloaded: counts(again.formulas),
  })}\n`,
);
