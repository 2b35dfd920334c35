// How `panform` starts (compiled to dist/cli/launch.cjs; bin/panform.js calls it).
//
// Each quick command (check, scale, temp, convert, sheet, cost, label, and --version) lives in a
// CommonJS bundle of its own, quick-<command>.cjs, holding only that command's code. Node 20 keeps
// no compiled code between runs, and compiling is a good part of a quick command's start, so this
// compiles the bundle with V8's code cache: the first run writes the cache beside the bundle
// (cache/<command>.v8), later runs start from it. V8 refuses a cache made by another Node
// version, other flags or another bundle (a rebuild); the run then compiles as usual and writes a
// fresh one. Every other command (and help, and a mistyped name) goes to the ES module build,
// index.js.
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Script } from 'node:vm';

interface QuickBundle {
  run(argv: string[]): Promise<number>;
}

/** The quick bundle's name for the first command-line word, if that word could have one. */
export function quickName(word: string | undefined): string | null {
  if (word === '--version' || word === '-V') return 'version';
  return word !== undefined && /^[a-z][a-z-]*$/.test(word) ? word : null;
}

function readCache(file: string): Buffer | undefined {
  try {
    return readFileSync(file);
  } catch {
    return undefined;
  }
}

/** Written beside, then renamed: a reader sees a whole cache or none. Never fails the command. */
function writeCache(file: string, data: Buffer): void {
  const part = `${file}.${process.pid}.part`;
  try {
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(part, data);
    renameSync(part, file);
  } catch {
    // A read-only installation runs without a cache.
    try {
      rmSync(part, { force: true });
    } catch {
      // Nothing was written.
    }
  }
}

function loadQuick(file: string, cacheFile: string): { bundle: QuickBundle; script: Script; fromCache: boolean } {
  const source = readFileSync(file, 'utf8');
  const cachedData = readCache(cacheFile);
  // The CommonJS wrapper on the bundle's first line, so line numbers in messages stay true.
  const script = new Script(`(function (exports, require, module, __filename, __dirname) {${source}\n})`, { filename: file, cachedData });
  const module = { exports: {} as QuickBundle };
  (script.runInThisContext() as (...args: unknown[]) => void).call(module.exports, module.exports, createRequire(file), module, file, dirname(file));
  return { bundle: module.exports, script, fromCache: cachedData !== undefined && !script.cachedDataRejected };
}

export async function launch(dir: string, argv: string[] = process.argv): Promise<void> {
  const name = quickName(argv[2]);
  const file = name ? join(dir, `quick-${name}.cjs`) : null;
  if (!name || !file || !existsSync(file)) {
    await import(pathToFileURL(join(dir, 'index.js')).href);
    return;
  }
  const cacheFile = join(dir, 'cache', `${name}.v8`);
  const { bundle, script, fromCache } = loadQuick(file, cacheFile);
  // Made at exit, when the command's own code has been compiled too.
  if (!fromCache) process.once('exit', () => writeCache(cacheFile, script.createCachedData()));
  process.exitCode = await bundle.run(argv);
}
