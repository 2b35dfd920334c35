// `panform user` while a server holds the PGlite folder: the command cannot open the database, so
// it hands the change to the server over the local channel (loopback and the lock file's token,
// as for loads). The server makes the same change `panform user` makes directly, records who did
// it, and drops the person's sessions kept in memory.
import express, { Router, type Request, type Response } from 'express';
import { isRole, type Role } from '#shared/permissions';
import { AccountRuleError, addAccount, removeAccount, resetPassword } from '../auth/accounts.ts';
import { checkNewPassword } from '../auth/password.ts';
import { DuplicateUserError, findUserByEmail, isEmail, listUsers, normalizeEmail } from '../auth/users.ts';
import type { ServerContext } from '../context.ts';
import { localChannelGuard } from './internal-load.ts';

export type InternalUsersRequest =
  | { action: 'list'; by: string }
  | { action: 'add'; by: string; email: string; role: Role; name: string; password: string }
  | { action: 'remove'; by: string; email: string }
  | { action: 'reset'; by: string; email: string; password: string };

export interface AccountListEntry {
  email: string;
  name: string;
  role: string;
  createdAt: string;
  passwordChangedAt: string;
}

export type InternalUsersResponse =
  | { ok: true; users?: AccountListEntry[] }
  | { ok: false; error: 'invalid' | 'not_found' | 'conflict'; message: string };

export async function accountList(ctx: Pick<ServerContext, 'db'>): Promise<AccountListEntry[]> {
  return (await listUsers(ctx.db)).map((u) => ({
    email: u.email,
    name: u.name,
    role: u.role,
    createdAt: u.createdAt.toISOString(),
    passwordChangedAt: u.passwordChangedAt.toISOString(),
  }));
}

export function createInternalUsersRouter(ctx: ServerContext, token: string): Router {
  const router = Router();
  router.use(localChannelGuard(token));
  router.use(express.json({ limit: '16kb', strict: true }));
  router.post('/', async (req: Request, res: Response) => {
    const body = (req.body ?? {}) as InternalUsersRequest;
    const send = (status: number, out: InternalUsersResponse) => res.status(status).set('Cache-Control', 'no-store').json(out);
    const by = typeof body.by === 'string' && body.by ? body.by.slice(0, 200) : 'panform user';
    if (body.action === 'list') {
      send(200, { ok: true, users: await accountList(ctx) });
      return;
    }
    const email = typeof (body as { email?: unknown }).email === 'string' ? normalizeEmail((body as { email: string }).email) : '';
    if (!isEmail(email)) {
      send(422, { ok: false, error: 'invalid', message: `not an e-mail address: "${email}"` });
      return;
    }
    const now = new Date(ctx.now());
    try {
      if (body.action === 'add') {
        const problem = typeof body.password === 'string' ? checkNewPassword(body.password) : 'a password is required';
        if (problem || !isRole(body.role)) {
          send(422, { ok: false, error: 'invalid', message: problem ?? `unknown role "${String(body.role)}"` });
          return;
        }
        await addAccount(ctx.db, { email, name: typeof body.name === 'string' ? body.name.trim() : '', role: body.role, password: body.password }, by, { scrypt: ctx.scrypt, now });
        send(200, { ok: true });
        return;
      }
      const user = await findUserByEmail(ctx.db, email);
      if (!user) {
        send(404, { ok: false, error: 'not_found', message: `no account for ${email}` });
        return;
      }
      if (body.action === 'remove') {
        await removeAccount(ctx.db, user, by, now);
      } else if (body.action === 'reset') {
        const problem = typeof body.password === 'string' ? checkNewPassword(body.password) : 'a password is required';
        if (problem) {
          send(422, { ok: false, error: 'invalid', message: problem });
          return;
        }
        await resetPassword(ctx.db, user, body.password, by, { scrypt: ctx.scrypt, now });
      } else {
        send(422, { ok: false, error: 'invalid', message: 'action must be list, add, remove or reset' });
        return;
      }
      ctx.sessions.forgetUser(user.id);
      send(200, { ok: true });
    } catch (e) {
      if (e instanceof DuplicateUserError || e instanceof AccountRuleError) {
        send(409, { ok: false, error: 'conflict', message: e.message });
        return;
      }
      throw e;
    }
  });
  return router;
}
