// Protection against cross-site requests that change state (sign-in, sign-out, password reset,
// loads). Two independent checks, either of which stops a forged request:
// 1. A body must be JSON (`application/json`). A page on another site cannot send that content
//    type without a CORS preflight, which this server never answers, so a plain HTML form or a
//    "simple" fetch cannot reach a handler.
// 2. The browser's own account of where the request comes from: `Sec-Fetch-Site` must be
//    same-origin (or none: typed, bookmarked), and `Origin`, when sent, must be this server's
//    origin or PANFORM_PUBLIC_URL's. Programs (curl, the CLI) send neither header and pass.
// The session cookie is also SameSite=Lax, so browsers do not attach it to cross-site POSTs.
import type { Request, RequestHandler } from 'express';
import { HttpError } from '../http/errors.ts';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function hasBody(headers: Record<string, string | string[] | undefined>): boolean {
  const length = headers['content-length'];
  if (typeof length === 'string' && length.trim() !== '' && Number(length) > 0) return true;
  return headers['transfer-encoding'] !== undefined;
}

/**
 * `multipartAllowed` names the requests that may send `multipart/form-data` (photo uploads): such a
 * body can be sent by a plain HTML form, so for those the browser's Origin / Sec-Fetch-Site (checked
 * above for every request) and the SameSite=Lax cookie are what stop a forged request.
 */
export function csrfProtection(publicUrl: string, multipartAllowed: (req: Request) => boolean = () => false): RequestHandler {
  const publicOrigin = new URL(publicUrl).origin;
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) {
      next();
      return;
    }
    const site = req.get('sec-fetch-site');
    if (site !== undefined && site !== 'same-origin' && site !== 'none') {
      throw new HttpError(403, { error: 'forbidden', message: `cross-site requests may not change anything here (Sec-Fetch-Site: ${site})` });
    }
    const origin = req.get('origin');
    if (origin !== undefined) {
      const own = `${req.protocol}://${req.get('host')}`;
      if (origin !== own && origin !== publicOrigin) {
        throw new HttpError(403, { error: 'forbidden', message: `requests from ${origin} may not change anything here` });
      }
    }
    if (hasBody(req.headers) && !req.is('application/json') && !(req.is('multipart/form-data') && multipartAllowed(req))) {
      throw new HttpError(415, { error: 'invalid', message: `send the body as application/json; got ${req.get('content-type') ?? 'no content type'}` });
    }
    next();
  };
}
