// Counting failures (failed sign-ins, reset requests) per key in a sliding window, in memory.
// One server process serves a bakery, so memory is enough; a restart forgets the counts, which
// only gives an attacker one more window. The clock is injected so tests need no waiting.

export interface LimitRule {
  /** Failures allowed within the window; the next attempt is refused. */
  max: number;
  windowMs: number;
}

export type Clock = () => number;

export class FailureLimiter {
  private readonly hits = new Map<string, number[]>();

  constructor(
    private readonly rule: LimitRule,
    private readonly now: Clock = Date.now,
    /** Keys kept at most; the oldest are dropped first, so a flood of addresses cannot exhaust memory. */
    private readonly maxKeys = 50_000,
  ) {}

  private recent(key: string, t: number): number[] {
    const list = this.hits.get(key);
    if (!list) return [];
    const from = t - this.rule.windowMs;
    const kept = list.filter((x) => x > from);
    if (kept.length === 0) this.hits.delete(key);
    else if (kept.length !== list.length) this.hits.set(key, kept);
    return kept;
  }

  /** Milliseconds until another attempt is allowed; 0 when allowed now. */
  blockedFor(key: string): number {
    const t = this.now();
    const list = this.recent(key, t);
    if (list.length < this.rule.max) return 0;
    return list[list.length - this.rule.max] + this.rule.windowMs - t;
  }

  fail(key: string): void {
    const t = this.now();
    const list = this.recent(key, t);
    list.push(t);
    this.hits.delete(key);
    this.hits.set(key, list.slice(-this.rule.max));
    if (this.hits.size > this.maxKeys) {
      const oldest = this.hits.keys().next().value;
      if (oldest !== undefined) this.hits.delete(oldest);
    }
  }

  /** Takes back the newest hit (an attempt counted in advance that turned out fine). */
  forgive(key: string): void {
    const list = this.hits.get(key);
    if (!list) return;
    list.pop();
    if (list.length === 0) this.hits.delete(key);
  }

  reset(key: string): void {
    this.hits.delete(key);
  }
}

export interface SignInLimits {
  /** Failed sign-ins per account (e-mail address). */
  account: LimitRule;
  /** Failed sign-ins per client address, across accounts. */
  address: LimitRule;
  /** Password-reset requests per client address. */
  resetAddress: LimitRule;
  /** Password-reset e-mails per account. */
  resetAccount: LimitRule;
}

const MINUTE = 60_000;
export const DEFAULT_LIMITS: SignInLimits = {
  account: { max: 5, windowMs: 15 * MINUTE },
  address: { max: 20, windowMs: 15 * MINUTE },
  resetAddress: { max: 10, windowMs: 60 * MINUTE },
  resetAccount: { max: 3, windowMs: 60 * MINUTE },
};

export interface Limiters {
  account: FailureLimiter;
  address: FailureLimiter;
  resetAddress: FailureLimiter;
  resetAccount: FailureLimiter;
}

export function createLimiters(limits: SignInLimits = DEFAULT_LIMITS, now: Clock = Date.now): Limiters {
  return {
    account: new FailureLimiter(limits.account, now),
    address: new FailureLimiter(limits.address, now),
    resetAddress: new FailureLimiter(limits.resetAddress, now),
    resetAccount: new FailureLimiter(limits.resetAccount, now),
  };
}
