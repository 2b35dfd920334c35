// Security headers on every response, as helmet sets them, worked out once. helmet runs eleven
// middlewares per request to set headers that, with Panform's fixed options (no per-request
// nonces), are the same every time; here helmet runs once at start against a recorder, and each
// response gets the recorded headers in one call.
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import helmet, { type HelmetOptions } from 'helmet';

/** The headers helmet would set with these options (every directive must be a fixed string). */
export function helmetHeaders(options: Readonly<HelmetOptions>): Map<string, string> {
  const headers = new Map<string, string>();
  const recorder = {
    setHeader(name: string, value: string | number | readonly string[]) {
      headers.set(name, Array.isArray(value) ? value.join(', ') : String(value));
    },
    removeHeader(name: string) {
      headers.delete(name);
    },
  };
  let done = false;
  let failure: unknown;
  helmet(options)({} as Request, recorder as unknown as Response, (err?: unknown) => {
    done = true;
    failure = err;
  });
  if (!done || failure) throw new Error(`helmet did not finish setting headers at start${failure ? `: ${String(failure)}` : ''}`);
  return headers;
}

export function securityHeaders(options: Readonly<HelmetOptions>): RequestHandler {
  const headers = helmetHeaders(options);
  return (_req: Request, res: Response, next: NextFunction) => {
    res.setHeaders(headers);
    next();
  };
}
