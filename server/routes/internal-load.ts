// The local load channel: while `panform serve` holds a PGlite data directory, `panform load`
// cannot open it, so it hands the load to the server here. Only requests from this machine
// (loopback) with the token from the directory's lock file are accepted; the server then runs the
// same load core in its own process, one load at a time.
import { createHash, timingSafeEqual } from 'node:crypto';
import { isAbsolute } from 'node:path';
import express, { Router, type Request, type RequestHandler, type Response } from 'express';
import type { Finding } from '#shared/parse';
import type { DatabaseHandle } from '../db/client.ts';
import { applyLoad, LoadPathError, prepareLoad, type LoadSummary } from '../load/index.ts';

export const LOAD_TOKEN_HEADER = 'x-panform-load-token';

/** POST /api/internal/load: either `paths` (absolute) or `folder` (absolute). */
export interface InternalLoadRequest {
  paths?: string[];
  folder?: string;
  /** Who loads (recorded in the loads log). */
  by?: string;
}

export type InternalLoadResponse =
  | { ok: true; dataDir: string; summary: LoadSummary }
  | { ok: false; error: 'unauthenticated' | 'forbidden' | 'invalid' | 'internal'; message: string; findings?: Finding[] };

export interface InternalLoadOptions {
  handle: DatabaseHandle;
  /** The data directory the server holds (sent back so the client knows whom it talked to). */
  dataDir: string;
  /** The token in the lock file. */
  token: string;
  log?: (message: string) => void;
}

const LOOPBACK = new Set(['127.0.0.1', '::1', '::ffff:127.0.0.1']);

const digest = (s: string) => createHash('sha256').update(s, 'utf8').digest();

/** Constant-time comparison (hashing first makes the lengths equal). */
export function tokenMatches(given: unknown, expected: string): boolean {
  if (typeof given !== 'string' || given.length === 0 || expected.length === 0) return false;
  return timingSafeEqual(digest(given), digest(expected));
}

function send(res: Response, status: number, body: InternalLoadResponse): void {
  res.status(status).set('Cache-Control', 'no-store').json(body);
}

/**
 * Who may use a local channel (loads, and `panform user` while a server holds the folder) is
 * decided before any body is read: the socket's own address (never a forwarded header), then the
 * token from the lock file.
 */
export function localChannelGuard(token: string): RequestHandler {
  return (req: Request, res: Response, next) => {
    if (!LOOPBACK.has(req.socket.remoteAddress ?? '')) {
      send(res, 403, { ok: false, error: 'forbidden', message: 'the load channel answers only on this machine (loopback)' });
      return;
    }
    if (!tokenMatches(req.get(LOAD_TOKEN_HEADER), token)) {
      send(res, 401, { ok: false, error: 'unauthenticated', message: `missing or wrong ${LOAD_TOKEN_HEADER}` });
      return;
    }
    next();
  };
}

export function createInternalLoadRouter(opts: InternalLoadOptions): Router {
  const { handle, dataDir, token } = opts;
  const log = opts.log ?? ((m: string) => process.stderr.write(`${m}\n`));
  const router = Router();
  // One load at a time; a second waits for the first.
  let queue: Promise<unknown> = Promise.resolve();

  router.use(localChannelGuard(token));
  router.use(express.json({ limit: '1mb', strict: true }));

  router.post('/', async (req: Request, res: Response) => {
    const body = (req.body ?? {}) as InternalLoadRequest;
    let paths: string[];
    if (Array.isArray(body.paths) && body.paths.length > 0 && body.paths.every((p) => typeof p === 'string' && p.length > 0)) paths = body.paths;
    else if (typeof body.folder === 'string' && body.folder.length > 0) paths = [body.folder];
    else {
      send(res, 422, { ok: false, error: 'invalid', message: 'give `paths` (a list of files and folders) or `folder`' });
      return;
    }
    const relative = paths.find((p) => !isAbsolute(p));
    if (relative) {
      send(res, 422, { ok: false, error: 'invalid', message: `paths must be absolute (the server's working folder differs); got ${relative}` });
      return;
    }
    const by = typeof body.by === 'string' ? body.by.slice(0, 200) : 'panform load';
    const run = queue.then(async (): Promise<[number, InternalLoadResponse]> => {
      try {
        const { input, checked } = await prepareLoad(paths);
        if (!checked.ok) {
          const errors = checked.findings.filter((f) => f.severity === 'error').length;
          return [422, { ok: false, error: 'invalid', message: `nothing loaded: ${errors} error${errors === 1 ? '' : 's'} in the files`, findings: checked.findings }];
        }
        const summary = await applyLoad(handle, input, checked, { by });
        log(`panform serve: loaded ${summary.files} files for ${by} (load ${summary.loadId})`);
        return [200, { ok: true, dataDir, summary }];
      } catch (e) {
        if (e instanceof LoadPathError) return [422, { ok: false, error: 'invalid', message: e.message }];
        log(`panform serve: a handed-over load failed: ${(e as Error)?.stack ?? String(e)}`);
        return [500, { ok: false, error: 'internal', message: 'the load failed inside the server; nothing was loaded (see the server log)' }];
      }
    });
    queue = run.catch(() => undefined);
    const [status, out] = await run;
    send(res, status, out);
  });
  return router;
}
