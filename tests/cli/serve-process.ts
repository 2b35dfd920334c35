// `panform serve --demo` from source as a child process, for tests that drive a real server on a
// data folder (and run the CLI against the folder it holds).
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ROOT } from './arithmetic-cli.ts';

export interface ServeProcess {
  url: string;
  child: ChildProcess;
  stdout: () => string;
  exited: Promise<number | null>;
}

/** Starts `panform serve --demo` in `dir` on `data`; resolves with its output once it listens. */
export function startServe(dir: string, data: string, onChild: (child: ChildProcess) => void = () => {}): Promise<ServeProcess> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', pathToFileURL(join(ROOT, 'node_modules/tsx/dist/loader.mjs')).href, join(ROOT, 'cli/index.ts'), 'serve', '--demo', '--port', '0', '--host', '127.0.0.1', '--data', data], {
      cwd: dir,
      env: { ...process.env, PANFORM_OUTBOX: join(dir, 'outbox'), NO_COLOR: '1' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    onChild(child);
    let out = '';
    let err = '';
    const exited = new Promise<number | null>((r) => child.on('exit', (code) => r(code)));
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = /serving on (http:\/\/localhost:\d+)/.exec(out);
      if (m && out.includes('Press Ctrl+C')) resolve({ url: m[1].replace('localhost', '127.0.0.1'), child, stdout: () => out, exited });
    });
    child.stderr!.on('data', (d: Buffer) => (err += d.toString()));
    void exited.then((code) => reject(new Error(`serve exited with ${code} before listening:\n${out}\n${err}`)));
  });
}
