// Sign-in and reset limits, counted in the database (table limit_hits) so that every server
// sharing it counts the same tries, and a restart or a flood of other keys forgets nothing.
//
// Sign-in failures are counted three ways, each in a 15-minute window:
// - per account AND address: 5 failures, then that address is refused for that account
//   (429 with Retry-After). Only the guesser's own address is shut out;
// - per address, across accounts: beyond 20, every attempt from it is answered more slowly
//   (a bakery behind one shared address still gets in, only slower);
// - per account, across addresses: beyond 5, attempts on it from addresses that have failed are
//   answered more slowly. A correct password from an address that has not failed goes straight
//   through: nobody elsewhere can lock a baker out.
// Reset requests: 10 an hour per address (then 429), 3 e-mails an hour per account (silently).
import { and, count, eq, gt, inArray, lt, lte, min } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { limitHitsTable } from '../db/schema.ts';

export type Clock = () => number;

export interface LimitRule {
  /** Hits allowed within the window. */
  max: number;
  windowMs: number;
}

export interface SignInLimits {
  /** Failed sign-ins per account and address: beyond, that address is refused for that account. */
  pair: LimitRule;
  /** Failed sign-ins per address across accounts: beyond `max`, answers slow down. */
  address: LimitRule;
  /** Failed sign-ins per account across addresses: beyond `max`, answers to failed addresses slow down. */
  account: LimitRule;
  /** Added wait per failure beyond a slow-down threshold, and the most it adds up to. */
  slowdownStepMs: number;
  slowdownMaxMs: number;
  /** Password-reset requests per client address (then 429). */
  resetAddress: LimitRule;
  /** Password-reset e-mails per account (beyond: none sent, silently). */
  resetAccount: LimitRule;
  /** Bench records (with their photos) sent per account (then 429). */
  recordPosts: LimitRule;
}

const MINUTE = 60_000;
export const DEFAULT_LIMITS: SignInLimits = {
  pair: { max: 5, windowMs: 15 * MINUTE },
  address: { max: 20, windowMs: 15 * MINUTE },
  account: { max: 5, windowMs: 15 * MINUTE },
  slowdownStepMs: 1_000,
  slowdownMaxMs: 10_000,
  resetAddress: { max: 10, windowMs: 60 * MINUTE },
  resetAccount: { max: 3, windowMs: 60 * MINUTE },
  // A tablet back online sends its queue at once: room for a night's records in a minute.
  recordPosts: { max: 30, windowMs: MINUTE },
};

/** Hits older than this are of no use to any rule and are swept now and then. */
const KEEP_MS = 2 * 60 * MINUTE;

export interface KeyCount {
  count: number;
  /** The oldest hit in the window (epoch ms), or null. */
  oldest: number | null;
}

/** Counting hits per key in the database. */
export class HitCounter {
  constructor(
    private readonly db: Database,
    private readonly now: Clock = Date.now,
  ) {}

  /** Records one hit per key; returns the row ids (to take back with `forgive`). */
  async hit(keys: string[]): Promise<number[]> {
    const at = new Date(this.now());
    const rows = await this.db
      .insert(limitHitsTable)
      .values(keys.map((key) => ({ key, at })))
      .returning({ id: limitHitsTable.id });
    // Now and then, sweep hits no rule looks at any more.
    if (Math.random() < 0.02) await this.db.delete(limitHitsTable).where(lt(limitHitsTable.at, new Date(this.now() - KEEP_MS)));
    return rows.map((r) => r.id);
  }

  /**
   * Hits per key within the window; with `upTo`, only hits recorded no later than that one (ids
   * come from one sequence, so attempts sent at once each see their own place in line).
   */
  async counts(keys: string[], windowMs: number, upTo?: number): Promise<Map<string, KeyCount>> {
    const since = new Date(this.now() - windowMs);
    const rows = await this.db
      .select({ key: limitHitsTable.key, n: count(), oldest: min(limitHitsTable.at) })
      .from(limitHitsTable)
      .where(and(inArray(limitHitsTable.key, keys), gt(limitHitsTable.at, since), upTo === undefined ? undefined : lte(limitHitsTable.id, upTo)))
      .groupBy(limitHitsTable.key);
    const out = new Map<string, KeyCount>(keys.map((k) => [k, { count: 0, oldest: null }]));
    for (const r of rows) out.set(r.key, { count: Number(r.n), oldest: r.oldest ? new Date(r.oldest).getTime() : null });
    return out;
  }

  /** Takes back hits recorded in advance (the attempt turned out fine, or was refused anyway). */
  async forgive(ids: number[]): Promise<void> {
    if (ids.length > 0) await this.db.delete(limitHitsTable).where(inArray(limitHitsTable.id, ids));
  }

  async clear(key: string): Promise<void> {
    await this.db.delete(limitHitsTable).where(eq(limitHitsTable.key, key));
  }
}

export type SignInVerdict =
  | { allowed: false; retryAfterMs: number }
  | {
      allowed: true;
      /** Wait this long before answering (slow-down). */
      delayMs: number;
      /** The failure counted in advance: forgive it when the password is right. */
      hits: number[];
      pairKey: string;
    };

const pairKey = (email: string, address: string) => `signin:pair:${email} ${address}`;
const accountKey = (email: string) => `signin:account:${email}`;
const addressKey = (address: string) => `signin:address:${address}`;

export class SignInThrottle {
  constructor(
    private readonly counter: HitCounter,
    private readonly limits: SignInLimits,
    private readonly now: Clock = Date.now,
  ) {}

  /**
   * Decides on a sign-in attempt before the password is checked. The attempt is counted as a
   * failure first (many guesses sent at once cannot all slip through before the first are
   * verified) and taken back by `succeeded`.
   */
  async attempt(email: string, address: string): Promise<SignInVerdict> {
    const { pair, account, address: perAddress } = this.limits;
    const keys = { pair: pairKey(email, address), account: accountKey(email), address: addressKey(address) };
    const hits = await this.counter.hit([keys.pair, keys.account, keys.address]);
    const window = Math.max(pair.windowMs, account.windowMs, perAddress.windowMs);
    const c = await this.counter.counts([keys.pair, keys.account, keys.address], window, Math.max(...hits));
    const pairCount = c.get(keys.pair)!;
    if (pairCount.count > pair.max) {
      await this.counter.forgive(hits);
      return { allowed: false, retryAfterMs: Math.max(1_000, (pairCount.oldest ?? this.now()) + pair.windowMs - this.now()) };
    }
    // The counts include this attempt: failures before it beyond a threshold each add a step.
    const addressCount = c.get(keys.address)!.count;
    let steps = Math.max(0, addressCount - perAddress.max);
    if (addressCount > 1) steps += Math.max(0, c.get(keys.account)!.count - account.max);
    const delayMs = Math.min(this.limits.slowdownMaxMs, steps * this.limits.slowdownStepMs);
    return { allowed: true, delayMs, hits, pairKey: keys.pair };
  }

  /** The password was right: this attempt and this address's earlier failures on the account are forgiven. */
  async succeeded(verdict: Extract<SignInVerdict, { allowed: true }>): Promise<void> {
    await this.counter.forgive(verdict.hits);
    await this.counter.clear(verdict.pairKey);
  }
}

/** Reset requests: per address (refused beyond the limit) and per account (silently). */
export class ResetThrottle {
  constructor(
    private readonly counter: HitCounter,
    private readonly limits: SignInLimits,
    private readonly now: Clock = Date.now,
  ) {}

  /** Milliseconds until this address may ask again; 0 when the request is taken (and counted). */
  async request(address: string): Promise<number> {
    const key = `reset:address:${address}`;
    const rule = this.limits.resetAddress;
    const hits = await this.counter.hit([key]);
    const c = (await this.counter.counts([key], rule.windowMs, hits[0])).get(key)!;
    if (c.count <= rule.max) return 0;
    await this.counter.forgive(hits);
    return Math.max(1_000, (c.oldest ?? this.now()) + rule.windowMs - this.now());
  }

  /** Whether another e-mail may go to this account now (and counts it). */
  async mayMail(email: string): Promise<boolean> {
    const key = `reset:account:${email}`;
    const rule = this.limits.resetAccount;
    const c = (await this.counter.counts([key], rule.windowMs)).get(key)!;
    if (c.count >= rule.max) return false;
    await this.counter.hit([key]);
    return true;
  }
}

/** Record posts per account: refused beyond the limit, counted in the database like sign-ins. */
export class RecordThrottle {
  constructor(
    private readonly counter: HitCounter,
    private readonly limits: SignInLimits,
    private readonly now: Clock = Date.now,
  ) {}

  /** Milliseconds until this account may send again; 0 when the post is taken (and counted). */
  async post(userId: number): Promise<number> {
    const key = `records:user:${userId}`;
    const rule = this.limits.recordPosts;
    const hits = await this.counter.hit([key]);
    const c = (await this.counter.counts([key], rule.windowMs, hits[0])).get(key)!;
    if (c.count <= rule.max) return 0;
    await this.counter.forgive(hits);
    return Math.max(1_000, (c.oldest ?? this.now()) + rule.windowMs - this.now());
  }
}

export interface Limiters {
  signIn: SignInThrottle;
  reset: ResetThrottle;
  records: RecordThrottle;
}

export function createLimiters(db: Database, limits: SignInLimits = DEFAULT_LIMITS, now: Clock = Date.now): Limiters {
  const counter = new HitCounter(db, now);
  return { signIn: new SignInThrottle(counter, limits, now), reset: new ResetThrottle(counter, limits, now), records: new RecordThrottle(counter, limits, now) };
}
