// Signed-in sessions. The browser holds a random 256-bit token in an httpOnly cookie; the
// database holds only its SHA-256, so a copy of the database cannot be used to sign in.
//
// On PGlite, lookups are kept in memory for a few seconds: every API request needs the session,
// the embedded database answers one query at a time, and the folder belongs to this process alone
// (`panform user` hands its changes to the running server), so signing out, a password change, a
// reset or a removal drops the kept entries at once. On a PostgreSQL server, other servers and the
// CLI change sessions too: nothing is kept, every request asks the database.
import { createHash, randomBytes } from 'node:crypto';
import { and, eq, gt, lte } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { sessionsTable, usersTable } from '../db/schema.ts';
import { isRole } from '#shared/permissions';
import type { UserInfo } from '#shared/api';
import type { Clock } from './rate-limit.ts';

export const SESSION_COOKIE = 'panform_session';
export const SESSION_CACHE_MS = 5_000;
const DAY_MS = 24 * 60 * 60 * 1000;

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function newToken(): string {
  return randomBytes(32).toString('base64url');
}

export interface Session {
  tokenHash: string;
  user: UserInfo;
  expiresAt: Date;
}

interface Cached {
  tokenHash: string;
  session: Session | null;
  until: number;
}

export class SessionStore {
  private readonly cache = new Map<string, Cached>();
  /** Look-ups under way: a burst of requests with one uncached token asks the database once. */
  private readonly inflight = new Map<string, Promise<Session | null>>();

  constructor(
    private readonly db: Database,
    private readonly sessionDays: number,
    private readonly now: Clock = Date.now,
    /** How long a lookup is reused; 0: never (a database other processes change). */
    private readonly cacheMs = 0,
  ) {}

  get lifetimeMs(): number {
    return this.sessionDays * DAY_MS;
  }

  /** A new session for a user; returns the token for the cookie. */
  async create(userId: number): Promise<{ token: string; expiresAt: Date }> {
    const token = newToken();
    const t = this.now();
    const expiresAt = new Date(t + this.lifetimeMs);
    await this.db.insert(sessionsTable).values({ tokenHash: hashToken(token), userId, createdAt: new Date(t), expiresAt });
    // Now and then, sweep expired sessions so the table does not grow without end.
    if (Math.random() < 0.05) await this.db.delete(sessionsTable).where(lte(sessionsTable.expiresAt, new Date(t)));
    return { token, expiresAt };
  }

  /** The live session for a token, or null (unknown, expired, or its user removed). */
  async find(token: string): Promise<Session | null> {
    if (!token || token.length > 200) return null;
    const t = this.now();
    // Keyed by the token itself: a hit costs no hashing.
    const hit = this.cache.get(token);
    if (hit && hit.until > t) {
      if (hit.session && hit.session.expiresAt.getTime() <= t) return null;
      return hit.session;
    }
    const pending = this.inflight.get(token);
    if (pending) return pending;
    const lookup = this.lookup(token, t).finally(() => this.inflight.delete(token));
    this.inflight.set(token, lookup);
    return lookup;
  }

  private async lookup(token: string, t: number): Promise<Session | null> {
    const tokenHash = hashToken(token);
    const rows = await this.db
      .select({
        expiresAt: sessionsTable.expiresAt,
        id: usersTable.id,
        email: usersTable.email,
        name: usersTable.name,
        role: usersTable.role,
      })
      .from(sessionsTable)
      .innerJoin(usersTable, eq(usersTable.id, sessionsTable.userId))
      .where(and(eq(sessionsTable.tokenHash, tokenHash), gt(sessionsTable.expiresAt, new Date(t))))
      .limit(1);
    const row = rows[0];
    const session: Session | null =
      row && isRole(row.role)
        ? { tokenHash, expiresAt: row.expiresAt, user: { id: row.id, email: row.email, name: row.name, role: row.role } }
        : null;
    if (this.cacheMs > 0) {
      if (this.cache.size > 10_000) this.cache.clear();
      this.cache.set(token, { tokenHash, session, until: t + this.cacheMs });
    }
    return session;
  }

  async destroy(tokenHash: string): Promise<void> {
    for (const [k, v] of this.cache) if (v.tokenHash === tokenHash) this.cache.delete(k);
    await this.db.delete(sessionsTable).where(eq(sessionsTable.tokenHash, tokenHash));
  }

  /** Signs a user out everywhere. */
  async destroyAllFor(userId: number): Promise<void> {
    this.forgetUser(userId);
    await this.db.delete(sessionsTable).where(eq(sessionsTable.userId, userId));
  }

  /** Drops cached sessions of a user (after their password changed in this process). */
  forgetUser(userId: number): void {
    for (const [k, v] of this.cache) if (v.session?.user.id === userId) this.cache.delete(k);
  }
}

/** The value of one cookie from a Cookie header. */
export function readCookie(header: string | undefined, name: string): string | undefined {
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const i = part.indexOf('=');
    if (i < 0) continue;
    if (part.slice(0, i).trim() === name) {
      const v = part.slice(i + 1).trim();
      try {
        return decodeURIComponent(v.startsWith('"') && v.endsWith('"') ? v.slice(1, -1) : v);
      } catch {
        return undefined;
      }
    }
  }
  return undefined;
}
