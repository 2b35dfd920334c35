// Changing accounts with a record of who did it: used by the admin routes (/api/users), by
// `panform user` and by the local channel `panform user` uses while a server holds the PGlite
// folder. Every change adds a row to audit_log.
import { desc, eq } from 'drizzle-orm';
import type { AuditEntry } from '#shared/api';
import type { Role } from '#shared/permissions';
import type { Database } from '../db/client.ts';
import { auditTable, usersTable } from '../db/schema.ts';
import { randomPassword, type ScryptParams } from './password.ts';
import { createUser, findUserById, setPassword, type UserRecord } from './users.ts';

export type AuditAction = 'account.add' | 'account.role' | 'account.remove' | 'account.reset-link' | 'account.password';

/** The account change cannot be made; the message says why, for the person asking. */
export class AccountRuleError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AccountRuleError';
  }
}

export async function audit(db: Database, entry: { actor: string; action: AuditAction; target: string; detail?: string }, now: Date = new Date()): Promise<void> {
  await db.insert(auditTable).values({ at: now, actor: entry.actor, action: entry.action, target: entry.target, detail: entry.detail ?? '' });
}

export async function listAudit(db: Database, limit = 200): Promise<AuditEntry[]> {
  const rows = await db.select().from(auditTable).orderBy(desc(auditTable.at), desc(auditTable.id)).limit(limit);
  return rows.map((r) => ({ id: r.id, at: r.at.toISOString(), actor: r.actor, action: r.action, target: r.target, detail: r.detail }));
}

/**
 * A new account. Without a password (the admin page) it gets a random one nobody knows: the
 * person sets their own through the link they are sent.
 */
export async function addAccount(
  db: Database,
  input: { email: string; name: string; role: Role; password?: string },
  actor: string,
  opts: { scrypt?: ScryptParams; now?: Date } = {},
): Promise<UserRecord> {
  const user = await createUser(db, { email: input.email, name: input.name, role: input.role, password: input.password ?? randomPassword(32) }, opts.scrypt);
  await audit(db, { actor, action: 'account.add', target: user.email, detail: `as ${user.role}` }, opts.now);
  return user;
}

async function otherAdmins(db: Database, id: number): Promise<number> {
  const admins = await db.select({ id: usersTable.id }).from(usersTable).where(eq(usersTable.role, 'admin'));
  return admins.filter((a) => a.id !== id).length;
}

export async function changeRole(db: Database, user: UserRecord, role: Role, actor: string, now: Date = new Date()): Promise<UserRecord> {
  if (user.role === role) return user;
  if (user.role === 'admin' && (await otherAdmins(db, user.id)) === 0) {
    throw new AccountRuleError(`${user.email} is the only admin; make another account admin first`);
  }
  await db.update(usersTable).set({ role }).where(eq(usersTable.id, user.id));
  await audit(db, { actor, action: 'account.role', target: user.email, detail: `${user.role} → ${role}` }, now);
  return { ...user, role };
}

/** Removes an account; its sessions and reset links go with it (on delete cascade). */
export async function removeAccount(db: Database, user: UserRecord, actor: string, now: Date = new Date()): Promise<void> {
  if (user.role === 'admin' && (await otherAdmins(db, user.id)) === 0) {
    throw new AccountRuleError(`${user.email} is the only admin; make another account admin first`);
  }
  await db.delete(usersTable).where(eq(usersTable.id, user.id));
  await audit(db, { actor, action: 'account.remove', target: user.email, detail: `was ${user.role}` }, now);
}

/** Sets a password typed at `panform user reset` (the account is signed out everywhere). */
export async function resetPassword(db: Database, user: UserRecord, password: string, actor: string, opts: { scrypt?: ScryptParams; now?: Date } = {}): Promise<void> {
  await setPassword(db, user.id, password, opts.scrypt, opts.now);
  await audit(db, { actor, action: 'account.password', target: user.email }, opts.now);
}

export { findUserById };
