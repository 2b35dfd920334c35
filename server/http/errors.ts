// Errors that become JSON responses. Routes and guards throw `HttpError`; the one error
// middleware (server/app.ts) turns it, and anything else, into an `ApiError` body.
import type { ErrorRequestHandler } from 'express';
import type { ApiError } from '#shared/api';
import type { Permission } from '#shared/permissions';

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiError,
    /** Extra response headers (e.g. Retry-After). */
    readonly headers: Record<string, string> = {},
  ) {
    super(body.message);
    this.name = 'HttpError';
  }
}

export const unauthenticated = (message = 'sign in first'): HttpError => new HttpError(401, { error: 'unauthenticated', message });

export const forbidden = (requiredPermission: Permission, message?: string): HttpError =>
  new HttpError(403, { error: 'forbidden', message: message ?? `your role lacks the permission ${requiredPermission}`, requiredPermission });

export const notFound = (message: string): HttpError => new HttpError(404, { error: 'not_found', message });

export const invalid = (message: string, issues?: { path: string; message: string }[]): HttpError =>
  new HttpError(422, issues ? { error: 'invalid', message, issues } : { error: 'invalid', message });

export const rateLimited = (message: string, retryAfterSeconds: number): HttpError =>
  new HttpError(429, { error: 'rate_limited', message }, { 'Retry-After': String(Math.max(1, Math.ceil(retryAfterSeconds))) });

/** Errors that body-parser and other Express middleware raise carry `status`/`type`. */
interface MiddlewareError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
  message?: string;
}

/**
 * The one error middleware: HttpError as given; body-parser's errors as 400/413/415; anything else
 * as a 500 whose details are logged, not sent.
 */
export function errorMiddleware(log: (message: string) => void): ErrorRequestHandler {
  return (err: unknown, _req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    if (err instanceof HttpError) {
      res.set(err.headers).status(err.status).json(err.body);
      return;
    }
    const e = (err ?? {}) as MiddlewareError;
    const status = e.status ?? e.statusCode;
    if (e.type === 'entity.too.large' || status === 413) {
      res.status(413).json({ error: 'payload_too_large', message: 'the request body is too large' } satisfies ApiError);
      return;
    }
    if (e.type === 'entity.parse.failed') {
      res.status(400).json({ error: 'invalid', message: 'the request body is not valid JSON' } satisfies ApiError);
      return;
    }
    if (e.type === 'encoding.unsupported' || e.type === 'charset.unsupported') {
      res.status(415).json({ error: 'invalid', message: 'send the body as UTF-8 JSON' } satisfies ApiError);
      return;
    }
    if (typeof status === 'number' && status >= 400 && status < 500 && e.expose !== false) {
      res.status(status).json({ error: 'invalid', message: e.message ?? 'bad request' } satisfies ApiError);
      return;
    }
    log(`panform serve: internal error: ${(err as Error)?.stack ?? String(err)}`);
    res.status(500).json({ error: 'internal', message: 'something went wrong on the server; the error is in its log' } satisfies ApiError);
  };
}
