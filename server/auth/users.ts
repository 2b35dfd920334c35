// Accounts in the database: used by the sign-in routes and by `panform user`.
import { asc, eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { sessionsTable, usersTable } from '../db/schema.ts';
import { isRole, type Role } from '#shared/permissions';
import type { UserInfo } from '#shared/api';
import { isUnitSystem, type UnitSystem } from '#shared/units';
import { hashPassword, type ScryptParams } from './password.ts';

export interface UserRecord extends UserInfo {
  passwordHash: string;
  createdAt: Date;
  passwordChangedAt: Date;
}

/** E-mail addresses are compared trimmed and in lower case. */
export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}

// Deliberately loose: one @, something on both sides, a dot in the domain, no spaces.
export function isEmail(email: string): boolean {
  return email.length <= 254 && /^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email);
}

function toRecord(row: typeof usersTable.$inferSelect): UserRecord {
  if (!isRole(row.role)) throw new Error(`user ${row.email} has an unknown role "${row.role}" in the database`);
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    passwordHash: row.passwordHash,
    createdAt: row.createdAt,
    passwordChangedAt: row.passwordChangedAt,
  };
}

export function toUserInfo(u: UserRecord): UserInfo {
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}

export async function findUserByEmail(db: Database, email: string): Promise<UserRecord | undefined> {
  const rows = await db.select().from(usersTable).where(eq(usersTable.email, normalizeEmail(email))).limit(1);
  return rows[0] ? toRecord(rows[0]) : undefined;
}

/** The units a person reads the viewer in; metric for an unknown value. */
export async function readUnitSystem(db: Database, userId: number): Promise<UnitSystem> {
  const rows = await db.select({ unitSystem: usersTable.unitSystem }).from(usersTable).where(eq(usersTable.id, userId)).limit(1);
  return isUnitSystem(rows[0]?.unitSystem) ? rows[0].unitSystem : 'metric';
}

export async function writeUnitSystem(db: Database, userId: number, unitSystem: UnitSystem): Promise<void> {
  await db.update(usersTable).set({ unitSystem }).where(eq(usersTable.id, userId));
}

export async function findUserById(db: Database, id: number): Promise<UserRecord | undefined> {
  const rows = await db.select().from(usersTable).where(eq(usersTable.id, id)).limit(1);
  return rows[0] ? toRecord(rows[0]) : undefined;
}

export async function listUsers(db: Database): Promise<UserRecord[]> {
  const rows = await db.select().from(usersTable).orderBy(asc(usersTable.email));
  return rows.map(toRecord);
}

export async function countUsers(db: Database): Promise<number> {
  return (await db.select({ id: usersTable.id }).from(usersTable)).length;
}

export class DuplicateUserError extends Error {
  constructor(readonly email: string) {
    super(`an account for ${email} already exists`);
    this.name = 'DuplicateUserError';
  }
}

/** Adds an account; with `passwordHash` (from `hashPassword`) the password was hashed beforehand. */
export async function createUser(
  db: Database,
  input: { email: string; name?: string; role: Role } & ({ password: string } | { passwordHash: string }),
  params?: ScryptParams,
): Promise<UserRecord> {
  const email = normalizeEmail(input.email);
  if (await findUserByEmail(db, email)) throw new DuplicateUserError(email);
  const passwordHash = 'passwordHash' in input ? input.passwordHash : await hashPassword(input.password, params);
  const rows = await db
    .insert(usersTable)
    .values({ email, name: input.name?.trim() ?? '', role: input.role, passwordHash })
    .returning();
  return toRecord(rows[0]);
}

/** Sets a new password and signs the account out everywhere. */
export async function setPassword(db: Database, userId: number, password: string, params?: ScryptParams, now: Date = new Date()): Promise<void> {
  const passwordHash = await hashPassword(password, params);
  await db.transaction(async (tx) => {
    await tx.update(usersTable).set({ passwordHash, passwordChangedAt: now }).where(eq(usersTable.id, userId));
    await tx.delete(sessionsTable).where(eq(sessionsTable.userId, userId));
  });
}

/** Removes an account (its sessions and reset tokens go with it). Whether one was removed. */
export async function removeUser(db: Database, email: string): Promise<boolean> {
  const rows = await db.delete(usersTable).where(eq(usersTable.email, normalizeEmail(email))).returning({ id: usersTable.id });
  return rows.length > 0;
}
