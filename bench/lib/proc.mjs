// Child processes for the bench: timed runs, servers started and always stopped, free ports.
// Everything started here is tracked and killed on exit (normal, error or Ctrl-C).
import { spawn, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { setTimeout as sleep } from 'node:timers/promises';

/** @type {Set<import('node:child_process').ChildProcess>} */
const live = new Set();
/** @type {(() => Promise<void> | void)[]} */
const cleanups = [];

/** Registers work to undo at the end (temporary folders, browsers). Runs last-in first-out. */
export function onCleanup(fn) {
  cleanups.push(fn);
}

let cleaning = false;
export async function cleanupAll() {
  if (cleaning) return;
  cleaning = true;
  for (const child of live) await stopChild(child);
  while (cleanups.length > 0) {
    const fn = cleanups.pop();
    try {
      await fn();
    } catch (e) {
      process.stderr.write(`bench: cleanup failed: ${e?.message ?? e}\n`);
    }
  }
}

// A last resort when the process exits without running cleanupAll (uncaught error): no child survives.
process.on('exit', () => {
  for (const child of live) {
    try {
      child.kill('SIGKILL');
    } catch {
      // already gone
    }
  }
});
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    process.stderr.write(`\nbench: ${signal}, stopping what the bench started...\n`);
    cleanupAll().finally(() => process.exit(130));
  });
}

/** A free TCP port on the loopback interface. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = /** @type {import('node:net').AddressInfo} */ (srv.address());
      srv.close(() => resolve(port));
    });
  });
}

/**
 * CPU time (user + system) used so far by this process's finished children, in ms, from
 * /proc/self/stat (Linux; clock ticks of 10 ms); null elsewhere. The difference around a run is
 * that run's CPU time: a figure a busy machine disturbs far less than wall time.
 */
export function childrenCpuMs() {
  try {
    const stat = readFileSync('/proc/self/stat', 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    // Fields 16 and 17 of proc(5) (cutime, cstime); `fields` starts at field 3.
    return ((Number(fields[13]) + Number(fields[14])) * 1000) / 100;
  } catch {
    return null;
  }
}

/**
 * Runs a command to completion and returns its wall time in ms (spawn to exit), its status and
 * output. Throws when `check` and the exit status is not 0.
 */
export function timedRun(cmd, args, { env, cwd, input, check = true } = {}) {
  const cpu0 = childrenCpuMs();
  const t0 = process.hrtime.bigint();
  const r = spawnSync(cmd, args, { env: env ?? process.env, cwd, input, encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const cpu1 = childrenCpuMs();
  const cpuMs = cpu0 === null || cpu1 === null ? null : cpu1 - cpu0;
  if (r.error) throw r.error;
  if (check && r.status !== 0) {
    throw new Error(`${[cmd, ...args].join(' ')} exited with ${r.status ?? r.signal}:\n${(r.stderr || r.stdout).slice(-2000)}`);
  }
  return { ms, cpuMs, status: r.status, signal: r.signal, stdout: r.stdout, stderr: r.stderr };
}

/**
 * Starts a long-running child (a server). Output is kept (the last 64 KB) for error messages.
 * `ready` is polled until it resolves true, the child exits, or `timeoutMs` passes.
 */
export async function startChild(cmd, args, { env, cwd, ready, timeoutMs = 90_000, name = args.join(' ') } = {}) {
  const child = spawn(cmd, args, { env: env ?? process.env, cwd, stdio: ['ignore', 'pipe', 'pipe'] });
  live.add(child);
  let output = '';
  const keep = (chunk) => {
    output = (output + chunk.toString()).slice(-65536);
  };
  child.stdout.on('data', keep);
  child.stderr.on('data', keep);
  let exited = null;
  const exit = new Promise((resolve) => {
    child.on('exit', (code, signal) => {
      exited = { code, signal };
      live.delete(child);
      resolve(exited);
    });
  });
  const handle = {
    child,
    pid: child.pid,
    name,
    output: () => output,
    exited: () => exited,
    exit,
    stop: () => stopChild(child),
  };
  if (ready) {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      if (exited) throw new Error(`${name} exited (${exited.code ?? exited.signal}) before it was ready:\n${output.slice(-3000)}`);
      if (await ready(handle).catch(() => false)) break;
      if (Date.now() > deadline) {
        await stopChild(child);
        throw new Error(`${name} was not ready after ${timeoutMs / 1000} s:\n${output.slice(-3000)}`);
      }
      await sleep(100);
    }
  }
  return handle;
}

/** SIGTERM, then SIGKILL if the child is still there after `graceMs`. */
export async function stopChild(child, graceMs = 10_000) {
  if (child.exitCode !== null || child.signalCode !== null) {
    live.delete(child);
    return;
  }
  const gone = new Promise((resolve) => child.once('exit', resolve));
  child.kill('SIGTERM');
  const timer = sleep(graceMs).then(() => 'timeout');
  if ((await Promise.race([gone, timer])) === 'timeout') {
    child.kill('SIGKILL');
    await gone;
  }
  live.delete(child);
}

/** Peak and current resident memory of a live process, from /proc (Linux), in bytes. */
export function memoryOf(pid) {
  try {
    const status = readFileSync(`/proc/${pid}/status`, 'utf8');
    const kb = (key) => {
      const m = new RegExp(`^${key}:\\s+(\\d+) kB`, 'm').exec(status);
      return m ? Number(m[1]) * 1024 : null;
    };
    return { peak: kb('VmHWM'), current: kb('VmRSS') };
  } catch {
    return { peak: null, current: null };
  }
}

/** Any HTTP answer at all from `url` (the server is listening). */
export async function answers(url) {
  try {
    const res = await fetch(url, { signal: AbortSignal.timeout(2000) });
    await res.arrayBuffer();
    return true;
  } catch {
    return false;
  }
}
