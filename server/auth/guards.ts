// Guards: each returns what the route needs or throws an HttpError the error middleware sends.
// Every /api route calls one of them first (tests/server/route-guards.test.ts checks this for
// every route on the router).
import type { Request } from 'express';
import { roleHasPermission, type Permission } from '#shared/permissions';
import type { UserInfo } from '#shared/api';
import { forbidden, unauthenticated } from '../http/errors.ts';
import type { Session } from './sessions.ts';

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by the session middleware: the signed-in session, or null. */
    auth?: Session | null;
  }
}

export function requireUser(req: Request): UserInfo {
  const user = req.auth?.user;
  if (!user) throw unauthenticated();
  return user;
}

export function requirePermission(req: Request, permission: Permission): UserInfo {
  const user = requireUser(req);
  if (!roleHasPermission(user.role, permission)) throw forbidden(permission);
  return user;
}
