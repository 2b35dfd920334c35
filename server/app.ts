// The Express app: the JSON API under /api and the built viewer (dist/web). Built by a factory so
// tests and the benchmark can drive it without a fixed port; server/start.ts listens.
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import helmet from 'helmet';
import express, { Router, type Express, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import { csrfProtection } from './auth/csrf.ts';
import { DEFAULT_SCRYPT, hashPassword, randomPassword, type ScryptParams } from './auth/password.ts';
import { createLimiters, DEFAULT_LIMITS, type Clock, type Limiters, type SignInLimits } from './auth/rate-limit.ts';
import { readCookie, SESSION_CACHE_MS, SESSION_COOKIE, SessionStore } from './auth/sessions.ts';
import type { OutgoingMail, ServerContext } from './context.ts';
import type { DatabaseHandle } from './db/client.ts';
import type { Env } from './env.ts';
import { errorMiddleware, notFound } from './http/errors.ts';
import { DataCache } from './routes/data.ts';
import { formulasRouter } from './routes/formulas.ts';
import { plansRouter } from './routes/plans.ts';
import { sessionRouter } from './routes/session.ts';
import { usersRouter } from './routes/users.ts';
import { isRecordUpload, recordsRouter } from './routes/records.ts';
import { createPhotoStore, type PhotoStore } from './records/photo-store.ts';
import { createInternalUsersRouter } from './routes/internal-users.ts';
import { createInternalFrictionRouter } from './routes/internal-friction.ts';
import { schemasRouter } from './routes/schemas.ts';
import { sendMail as sendMailDefault } from './mail.ts';
import { MailOutbox } from './mail-outbox.ts';

/** Largest JSON body accepted (sign-in and reset bodies are a few hundred bytes). */
export const JSON_LIMIT = '16kb';

export interface AppOptions {
  handle: DatabaseHandle;
  env: Env;
  /** Clock for sessions, reset links and rate limits (tests move it forward). */
  now?: Clock;
  limits?: SignInLimits;
  /** Password-hash cost for new hashes (tests use a low one). */
  scrypt?: ScryptParams;
  /** How one message is handed over (after the mail_outbox table); default server/mail.ts (SMTP_URL, else the local fake outbox). */
  sendMail?: (message: OutgoingMail) => Promise<void>;
  /** The built viewer; default dist/web of this installation; null: serve the API only. */
  webDir?: string | null;
  /** Mounted at /api/internal/load (the local load channel) when given. */
  internalLoadRouter?: express.Router;
  /** The lock file's token: mounts /api/internal/users (`panform user` while this server holds the folder). */
  localChannelToken?: string;
  log?: (message: string) => void;
  /** Where record photos go; default from the environment (PANFORM_S3_*, else the database). */
  photoStore?: PhotoStore;
}

export interface AppInternals {
  /** The router mounted at /api: every route on it is session-guarded or deliberately public. */
  api: Router;
  context: ServerContext;
  limiters: Limiters;
  sessions: SessionStore;
  /** Resolves when background work (reset e-mails) has finished. */
  idle(): Promise<void>;
  /** Stops background work (the outbox's timer); after idle(), before the database closes. */
  stop(): Promise<void>;
}

const INTERNALS = Symbol('panform');

/** The built viewer next to this installation (found from this module upward). */
export function findWebDir(): string | null {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 6; i++) {
    if (existsSync(join(dir, 'dist', 'web', 'index.html'))) return join(dir, 'dist', 'web');
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  return null;
}

export function appInternals(app: Express): AppInternals {
  const internals = (app as unknown as Record<symbol, AppInternals>)[INTERNALS];
  if (!internals) throw new Error('not a Panform app');
  return internals;
}

/**
 * Security headers on every response. The CSP allows exactly what the built viewer loads: its
 * own scripts, styles and fonts (bundled, no CDN), images including data: URLs (inline SVG
 * icons), fetches to this origin, and PDFs of this origin in a frame for print preview. Inline
 * styles are allowed because React sets style attributes; inline scripts are not.
 */
function securityHeaders(publicUrl: string): RequestHandler {
  const https = publicUrl.startsWith('https:');
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        baseUri: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        fontSrc: ["'self'", 'data:'],
        imgSrc: ["'self'", 'data:', 'blob:'],
        connectSrc: ["'self'"],
        frameSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        formAction: ["'self'"],
        frameAncestors: ["'self'"],
        // Only over HTTPS: on a plain-HTTP bakery network this would break every request.
        ...(https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    // HSTS makes sense only when the viewer is published over HTTPS.
    strictTransportSecurity: https ? { maxAge: 180 * 24 * 60 * 60 } : false,
    referrerPolicy: { policy: 'same-origin' },
  });
}

/** The built viewer: its hashed assets, and index.html for every other GET (a page of the viewer). */
function viewerRoutes(app: Express, webDir: string | null): void {
  if (webDir) {
    // Vite names built assets by content hash: they never change, so browsers keep them a year.
    app.use(
      express.static(webDir, {
        index: false,
        setHeaders(res, path) {
          res.setHeader('Cache-Control', /[\\/]assets[\\/]/.test(path) ? 'public, max-age=31536000, immutable' : 'public, max-age=3600');
        },
      }),
    );
  }
  // Every other GET is a page of the single-page viewer: its index.html, the same for everyone,
  // never cached, so a new build is picked up at once.
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      next();
      return;
    }
    if (!webDir) {
      res.status(503).type('text/plain').send('The Panform viewer is not built. Run `npm run build`, then start the server again.\n');
      return;
    }
    // A target no browser sends ("//[" reads as a host) is the client's mistake: 400, not a stack.
    if (!URL.canParse(req.originalUrl, 'http://panform.local')) {
      res.status(400).type('text/plain').send('That address is not a page of Panform.\n');
      return;
    }
    res.sendFile(join(webDir, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }, (err) => {
      if (err) next(err);
    });
  });
}

export function createApp(opts: AppOptions): Express {
  const { handle, env } = opts;
  const now = opts.now ?? Date.now;
  const log = opts.log ?? ((m: string) => process.stderr.write(`${m}\n`));
  const scrypt = opts.scrypt ?? DEFAULT_SCRYPT;
  const limiters = createLimiters(handle.db, opts.limits ?? DEFAULT_LIMITS, now);
  // A PGlite folder belongs to this process alone, so every sign-out passes here and a session
  // may be reused for a moment; on a PostgreSQL server other servers sign people out too.
  const sessions = new SessionStore(handle.db, env.sessionDays, now, handle.kind === 'pglite' ? SESSION_CACHE_MS : 0);
  /** The session the request's cookie belongs to, if it is still valid. */
  const sessionOf = (req: Request) => {
    const token = readCookie(req.headers.cookie, SESSION_COOKIE);
    return token ? sessions.find(token) : Promise.resolve(null);
  };
  const pending = new Set<Promise<unknown>>();
  const mailer = opts.sendMail ?? ((m: OutgoingMail) => sendMailDefault(m, { smtpUrl: env.smtpUrl, outbox: env.outbox, from: env.mailFrom }).then(() => undefined));
  const outbox = new MailOutbox(handle.db, mailer, now, log);
  const photoStore = opts.photoStore ?? createPhotoStore(env.photoStore);
  const logFailure = (e: unknown) => log(`panform serve: background task failed: ${(e as Error)?.stack ?? String(e)}`);

  const context: ServerContext = {
    db: handle.db,
    env,
    now,
    sessions,
    limiters,
    scrypt,
    dummyHash: hashPassword(randomPassword(), scrypt),
    async sendMail(message) {
      await outbox.enqueue(message);
      context.background(() => outbox.drain());
    },
    data: new DataCache(handle.db, now),
    background(task) {
      const p = task()
        .catch(logFailure)
        .finally(() => pending.delete(p));
      pending.add(p);
    },
    log,
  };

  const app = express();
  app.disable('x-powered-by');
  // Behind a reverse proxy, req.ip, req.secure and req.protocol come from X-Forwarded-* only when
  // the proxy is trusted; otherwise a client could pick its own address and dodge rate limits.
  app.set('trust proxy', env.trustProxy);
  app.set('etag', 'weak');

  app.use(securityHeaders(env.publicUrl));

  // The local load channel authenticates with its own token header (a custom header forces a
  // CORS preflight, so browsers cannot forge it) and takes larger bodies: mounted before the
  // session, CSRF and body-size rules of the rest of the API.
  if (opts.internalLoadRouter) {
    const loadRouter = opts.internalLoadRouter;
    app.use(
      '/api/internal/load',
      (_req: Request, res: Response, next: NextFunction) => {
        // After a load, the next API request reads the new formulas.
        res.on('finish', () => context.data.invalidate());
        next();
      },
      loadRouter,
    );
  }

  if (opts.localChannelToken) {
    app.use('/api/internal/users', createInternalUsersRouter(context, opts.localChannelToken));
    app.use('/api/internal/friction', createInternalFrictionRouter(context, opts.localChannelToken));
  }

  // The file formats for editors, public (server/routes/schemas.ts).
  app.use(schemasRouter());

  const api = Router();
  // The busiest routes first: each request is matched against the routes in this order.
  api.use(formulasRouter(context));
  api.use(plansRouter(context));
  api.use(recordsRouter(context, photoStore));
  api.use(sessionRouter(context));
  api.use(usersRouter(context));

  app.use(
    '/api',
    (_req: Request, res: Response, next: NextFunction) => {
      // API answers are per user: never stored by shared caches.
      res.set('Cache-Control', 'private, no-cache');
      next();
    },
    // Order matters: refuse cross-site and non-JSON writes before reading any body, then parse
    // (bounded), then find the session, then route.
    csrfProtection(env.publicUrl, isRecordUpload),
    express.json({ limit: JSON_LIMIT, strict: true }),
    async (req: Request, _res: Response, next: NextFunction) => {
      req.auth = await sessionOf(req);
      next();
    },
    api,
    (req: Request) => {
      throw notFound(`no API route ${req.method} ${req.originalUrl.split('?')[0]}`);
    },
  );

  viewerRoutes(app, opts.webDir === undefined ? findWebDir() : opts.webDir);
  app.use(errorMiddleware(log));

  // Messages left by a server that stopped, and retries, are picked up now and then.
  outbox.start(logFailure);
  context.background(() => outbox.drain());

  const internals: AppInternals = {
    api,
    context,
    limiters,
    sessions,
    async idle() {
      while (pending.size > 0) await Promise.allSettled([...pending]);
    },
    async stop() {
      await outbox.stop();
      if (!opts.photoStore) photoStore.close();
    },
  };
  (app as unknown as Record<symbol, AppInternals>)[INTERNALS] = internals;
  return app;
}
