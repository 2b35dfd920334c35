// Listening, and shutting down cleanly: stop taking connections, let requests in flight finish
// (a few seconds at most), let background mail go out, then close the database (an open PGlite
// would keep the process alive and its lock file in place).
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Router } from 'express';
import { appInternals, createApp, type AppOptions } from './app.ts';
import type { DatabaseHandle } from './db/client.ts';
import { listenForLoads } from './db/listen.ts';
import type { Env } from './env.ts';

export interface RunningServer {
  server: Server;
  port: number;
  /** The local address to open, e.g. http://localhost:3000. */
  url: string;
  /** The address links in e-mails use (PANFORM_PUBLIC_URL, else the local one). */
  publicUrl: string;
  /** Stops the server and closes the database; safe to call more than once. */
  close(): Promise<void>;
  /** Resolves once the server has shut down (by close() or a signal). */
  closed: Promise<void>;
}

export interface StartOptions extends Omit<AppOptions, 'handle' | 'env'> {
  handle: DatabaseHandle;
  env: Env;
  /** Interface to listen on; default all (the bakery's network). */
  host?: string;
  /** Shut down on SIGINT and SIGTERM (the CLI); tests leave it off. */
  handleSignals?: boolean;
  /** Grace period for requests in flight, ms. */
  graceMs?: number;
}

/** The local load channel of the database helper, mounted when the data directory is held. */
async function internalLoadRouter(handle: DatabaseHandle): Promise<Router | undefined> {
  if (!handle.lock) return undefined;
  const { createInternalLoadRouter } = await import('./routes/internal-load.ts');
  return createInternalLoadRouter({ handle, dataDir: handle.dataDir!, token: handle.lock.info.token });
}

export async function startServer(opts: StartOptions): Promise<RunningServer> {
  const { handle, env, host, handleSignals = false, graceMs = 5_000, ...appOptions } = opts;
  const loadRouter = appOptions.internalLoadRouter ?? (await internalLoadRouter(handle));
  // Listen first, then build the app: with PORT=0 the default public address needs the real
  // port. From 'listening' to attaching the app everything is synchronous, so no request can
  // arrive in between.
  const server = createServer();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    const onListening = () => {
      server.off('error', reject);
      resolve();
    };
    // Without a host, Node listens on every interface (IPv6 and IPv4 where available).
    if (host === undefined) server.listen(env.port, onListening);
    else server.listen(env.port, host, onListening);
  });
  const port = (server.address() as AddressInfo).port;
  const finalEnv: Env = env.publicUrlSet ? env : { ...env, port, publicUrl: `http://localhost:${port}` };
  let app: ReturnType<typeof createApp>;
  try {
    app = createApp({ handle, env: finalEnv, localChannelToken: handle.lock?.info.token, ...appOptions, internalLoadRouter: loadRouter });
  } catch (e) {
    server.close();
    throw e;
  }
  server.on('request', app);
  // On a PostgreSQL server, loads by other servers and the CLI are announced (LISTEN/NOTIFY).
  const log = appOptions.log ?? ((m: string) => process.stderr.write(`${m}\n`));
  const listening = await listenForLoads(handle, () => appInternals(app).context.data.invalidate(), log);
  // Slow clients must not hold connections forever.
  server.headersTimeout = 20_000;
  server.requestTimeout = 60_000;
  handle.lock?.setPort(port);

  let resolveClosed!: () => void;
  const closed = new Promise<void>((r) => (resolveClosed = r));
  let closing: Promise<void> | null = null;
  const onSignal = () => {
    void close();
  };

  function close(): Promise<void> {
    closing ??= (async () => {
      if (handleSignals) {
        process.off('SIGINT', onSignal);
        process.off('SIGTERM', onSignal);
      }
      const stopped = new Promise<void>((r) => server.close(() => r()));
      server.closeIdleConnections();
      const timer = setTimeout(() => server.closeAllConnections(), graceMs);
      await stopped;
      clearTimeout(timer);
      await appInternals(app).idle();
      await appInternals(app).stop();
      await listening.stop();
      await handle.close();
      resolveClosed();
    })();
    return closing;
  }

  if (handleSignals) {
    process.on('SIGINT', onSignal);
    process.on('SIGTERM', onSignal);
  }
  return { server, port, url: `http://localhost:${port}`, publicUrl: finalEnv.publicUrl, close, closed };
}
