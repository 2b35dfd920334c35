// Signing in and out, who am I, and password reset by e-mail link.
import { and, eq, gt, isNull } from 'drizzle-orm';
import { Router, type Request, type Response } from 'express';
import type { Me } from '#shared/api';
import { permissionsOf } from '#shared/permissions';
import { isUnitSystem, UNIT_SYSTEMS, type UnitSystem } from '#shared/units';
import { requireUser } from '../auth/guards.ts';
import { checkNewPassword, MAX_PASSWORD_LENGTH, verifyPassword } from '../auth/password.ts';
import { sendPasswordLink, sha256 } from '../auth/password-links.ts';
import { SESSION_COOKIE } from '../auth/sessions.ts';
import { findUserByEmail, normalizeEmail, readUnitSystem, setPassword, toUserInfo, writeUnitSystem } from '../auth/users.ts';
import type { ServerContext } from '../context.ts';
import { passwordResetsTable } from '../db/schema.ts';
import { readStringFields } from '../http/body.ts';
import { HttpError, invalid, rateLimited } from '../http/errors.ts';

export { RESET_PAGE, RESET_TTL_MS } from '../auth/password-links.ts';

/** GET /api/me's answer (the server's first render of a page uses it too). */
export const me = (user: Me['user'], unitSystem: UnitSystem = 'metric'): Me => ({ user, permissions: permissionsOf(user.role), unitSystem });

function clientAddress(req: Request): string {
  return req.ip ?? req.socket.remoteAddress ?? 'unknown';
}

function setSessionCookie(res: Response, req: Request, token: string, maxAgeMs: number): void {
  // httpOnly: page scripts cannot read the token. SameSite=Lax: not sent on cross-site
  // sub-requests or POSTs, still sent when someone follows a link to the viewer. Secure when the
  // request came over HTTPS (directly or through a trusted proxy: TRUST_PROXY).
  res.cookie(SESSION_COOKIE, token, { httpOnly: true, sameSite: 'lax', secure: req.secure, path: '/', maxAge: maxAgeMs });
}

function clearSessionCookie(res: Response, req: Request): void {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: req.secure, path: '/' });
}

const spentLink = () =>
  invalid('this reset link does not work: it was used already, it expired, or it was mistyped; ask for a new one', [
    { path: 'token', message: 'unknown, used or expired' },
  ]);

export function sessionRouter(ctx: ServerContext): Router {
  const r = Router();

  // Public: sign in.
  r.post('/session', async (req, res) => {
    const body = readStringFields(req.body, { email: { max: 254 }, password: { max: MAX_PASSWORD_LENGTH } });
    const email = normalizeEmail(body.email);
    const address = clientAddress(req);
    const verdict = await ctx.limiters.signIn.attempt(email, address);
    if (!verdict.allowed) {
      throw rateLimited(`too many failed sign-ins from here for this account; try again in ${Math.ceil(verdict.retryAfterMs / 60_000)} min`, verdict.retryAfterMs / 1000);
    }
    if (verdict.delayMs > 0) await new Promise((r) => setTimeout(r, verdict.delayMs));
    const user = await findUserByEmail(ctx.db, email);
    // Verify against a dummy hash for unknown addresses so the answer takes as long either way.
    const ok = await verifyPassword(body.password, user?.passwordHash ?? (await ctx.dummyHash));
    if (!user || !ok) {
      throw new HttpError(401, { error: 'unauthenticated', message: 'that e-mail address and password do not match an account' });
    }
    await ctx.limiters.signIn.succeeded(verdict);
    const { token } = await ctx.sessions.create(user.id);
    setSessionCookie(res, req, token, ctx.sessions.lifetimeMs);
    res.status(200).json(me(toUserInfo(user), await readUnitSystem(ctx.db, user.id)));
  });

  r.delete('/session', async (req, res) => {
    const token = req.auth?.tokenHash;
    clearSessionCookie(res, req);
    requireUser(req);
    if (token) await ctx.sessions.destroy(token);
    res.status(204).end();
  });

  r.get('/me', async (req, res) => {
    const user = requireUser(req);
    res.json(me(user, await readUnitSystem(ctx.db, user.id)));
  });

  // The person's own settings, kept on the account so every device they sign in on follows them.
  r.put('/me/preferences', async (req, res) => {
    const user = requireUser(req);
    const { unitSystem } = readStringFields(req.body, { unitSystem: { max: 10 } });
    if (!isUnitSystem(unitSystem)) {
      throw invalid(`unitSystem must be one of ${UNIT_SYSTEMS.join(', ')}; got "${unitSystem}"`, [{ path: 'unitSystem', message: 'unknown unit system' }]);
    }
    await writeUnitSystem(ctx.db, user.id, unitSystem);
    res.json(me(user, unitSystem));
  });

  // Public: ask for a reset link. Always 202, whether or not the address has an account, and the
  // work (token, e-mail) happens after the answer so its timing tells nothing either.
  r.post('/password-reset', async (req, res) => {
    const body = readStringFields(req.body, { email: { max: 254 } });
    const address = clientAddress(req);
    const wait = await ctx.limiters.reset.request(address);
    if (wait > 0) throw rateLimited(`too many reset requests; try again in ${Math.ceil(wait / 60_000)} min`, wait / 1000);
    const email = normalizeEmail(body.email);
    ctx.background(async () => {
      const user = await findUserByEmail(ctx.db, email);
      if (!user) return;
      // A few e-mails per account and hour at most, silently: the answer must not differ.
      if (!(await ctx.limiters.reset.mayMail(email))) return;
      await sendPasswordLink(ctx, user, 'reset');
    });
    res.status(202).json({ message: 'if that address has an account, a link to set a new password is on its way' });
  });

  // Public: is this link still good? The reset page asks as it opens, so a spent or expired link
  // is said at once, not after the new password was typed twice. Nothing is changed.
  r.post('/password-reset/check', async (req, res) => {
    const { token } = readStringFields(req.body, { token: { max: 200 } });
    const now = new Date(ctx.now());
    const rows = await ctx.db
      .select({ userId: passwordResetsTable.userId })
      .from(passwordResetsTable)
      .where(and(eq(passwordResetsTable.tokenHash, sha256(token)), isNull(passwordResetsTable.usedAt), gt(passwordResetsTable.expiresAt, now)))
      .limit(1);
    if (rows.length === 0) throw spentLink();
    res.json({ valid: true });
  });

  // Public: set a new password with the token from the link.
  r.post('/password-reset/confirm', async (req, res) => {
    const body = readStringFields(req.body, { token: { max: 200 }, password: { max: MAX_PASSWORD_LENGTH } });
    const problem = checkNewPassword(body.password);
    if (problem) throw invalid(problem, [{ path: 'password', message: problem }]);
    const now = new Date(ctx.now());
    // Marking the token used in the same statement that checks it: two requests with one token
    // cannot both succeed.
    const used = await ctx.db
      .update(passwordResetsTable)
      .set({ usedAt: now })
      .where(and(eq(passwordResetsTable.tokenHash, sha256(body.token)), isNull(passwordResetsTable.usedAt), gt(passwordResetsTable.expiresAt, now)))
      .returning({ userId: passwordResetsTable.userId });
    if (used.length === 0) throw spentLink();
    const userId = used[0].userId;
    // Other links sent to this account stop working too.
    await ctx.db
      .update(passwordResetsTable)
      .set({ usedAt: now })
      .where(and(eq(passwordResetsTable.userId, userId), isNull(passwordResetsTable.usedAt)));
    await setPassword(ctx.db, userId, body.password, ctx.scrypt, now);
    ctx.sessions.forgetUser(userId);
    res.status(204).end();
  });

  return r;
}
