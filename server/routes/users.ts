// Accounts for admins: list, add (the person is mailed a link to set a password), change a role,
// remove, send a reset link, and the audit list of who changed what. Every other role gets 403.
import { Router, type Request } from 'express';
import type { AccountListResponse, AccountSummary, AuditListResponse } from '#shared/api';
import { isRole, ROLES } from '#shared/permissions';
import { AccountRuleError, addAccount, changeRole, listAudit, removeAccount, audit } from '../auth/accounts.ts';
import { requirePermission } from '../auth/guards.ts';
import { sendPasswordLink } from '../auth/password-links.ts';
import { DuplicateUserError, findUserById, isEmail, listUsers, normalizeEmail, type UserRecord } from '../auth/users.ts';
import type { ServerContext } from '../context.ts';
import { readStringFields } from '../http/body.ts';
import { HttpError, invalid, notFound } from '../http/errors.ts';

function summary(u: UserRecord): AccountSummary {
  return { id: u.id, email: u.email, name: u.name, role: u.role, createdAt: u.createdAt.toISOString(), passwordChangedAt: u.passwordChangedAt.toISOString() };
}

function readRole(value: string) {
  if (!isRole(value)) throw invalid(`role must be one of ${ROLES.join(', ')}; got "${value}"`, [{ path: 'role', message: 'unknown role' }]);
  return value;
}

async function accountOf(ctx: ServerContext, req: Request): Promise<UserRecord> {
  const text = String(req.params.id);
  const id = /^[0-9]{1,9}$/.test(text) ? Number(text) : NaN;
  const user = Number.isNaN(id) ? undefined : await findUserById(ctx.db, id);
  if (!user) throw notFound(`no account ${text}`);
  return user;
}

const conflict = (message: string) => new HttpError(409, { error: 'conflict', message });

export function usersRouter(ctx: ServerContext): Router {
  const r = Router();
  const at = () => new Date(ctx.now());

  r.get('/users', async (req, res) => {
    requirePermission(req, 'manage:users');
    const body: AccountListResponse = { users: (await listUsers(ctx.db)).map(summary) };
    res.json(body);
  });

  r.post('/users', async (req, res) => {
    const admin = requirePermission(req, 'manage:users');
    const body = readStringFields(req.body, { email: { max: 254 }, name: { max: 200, min: 0 }, role: { max: 20 } });
    const email = normalizeEmail(body.email);
    if (!isEmail(email)) throw invalid(`not an e-mail address: "${body.email}"`, [{ path: 'email', message: 'not an e-mail address' }]);
    const role = readRole(body.role);
    let user: UserRecord;
    try {
      user = await addAccount(ctx.db, { email, name: body.name.trim(), role }, admin.email, { scrypt: ctx.scrypt, now: at() });
    } catch (e) {
      if (e instanceof DuplicateUserError) throw conflict(e.message);
      throw e;
    }
    await sendPasswordLink(ctx, user, 'welcome');
    res.status(201).json({ user: summary(user) });
  });

  r.patch('/users/:id', async (req, res) => {
    const admin = requirePermission(req, 'manage:users');
    const body = readStringFields(req.body, { role: { max: 20 } });
    const role = readRole(body.role);
    const user = await accountOf(ctx, req);
    let changed: UserRecord;
    try {
      changed = await changeRole(ctx.db, user, role, admin.email, at());
    } catch (e) {
      if (e instanceof AccountRuleError) throw conflict(e.message);
      throw e;
    }
    // Sessions kept in memory carry the role: the next request reads the new one.
    ctx.sessions.forgetUser(user.id);
    res.json({ user: summary(changed) });
  });

  r.delete('/users/:id', async (req, res) => {
    const admin = requirePermission(req, 'manage:users');
    const user = await accountOf(ctx, req);
    try {
      await removeAccount(ctx.db, user, admin.email, at());
    } catch (e) {
      if (e instanceof AccountRuleError) throw conflict(e.message);
      throw e;
    }
    ctx.sessions.forgetUser(user.id);
    res.status(204).end();
  });

  r.post('/users/:id/password-reset', async (req, res) => {
    const admin = requirePermission(req, 'manage:users');
    const user = await accountOf(ctx, req);
    await sendPasswordLink(ctx, user, 'reset');
    await audit(ctx.db, { actor: admin.email, action: 'account.reset-link', target: user.email }, at());
    res.status(202).json({ message: `a link to set a new password is on its way to ${user.email}` });
  });

  r.get('/audit', async (req, res) => {
    requirePermission(req, 'manage:users');
    const body: AuditListResponse = { entries: await listAudit(ctx.db) };
    res.json(body);
  });

  return r;
}
