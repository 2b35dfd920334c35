// Panform's outgoing mail goes through a table (mail_outbox) first: a message is written in the
// request that asks for it and sent afterwards by whichever server sharing the database gets to it,
// retried with a growing wait when the mail server does not take it. A server that stops half-way
// leaves its message for the next try; nothing is lost.
//
// Claiming a message moves its next try forward in the same statement (FOR UPDATE SKIP LOCKED),
// so two servers never send one message twice at once; a claim that dies with its process simply
// comes due again.
import { and, asc, eq, inArray, isNull, lte, sql } from 'drizzle-orm';
import type { OutgoingMail } from './context.ts';
import type { Database } from './db/client.ts';
import { mailOutboxTable } from './db/schema.ts';
import { SingleFlight } from '#shared/single-flight';

/** Tries before a message is given up (about a day and a half of waiting in all). */
export const MAX_ATTEMPTS = 8;
/** How often each server looks for messages that came due (retries, other servers' leftovers). */
export const POLL_MS = 30_000;

/** Wait after the n-th failed try: 1, 2, 4 ... minutes, at most 6 hours. */
export function retryDelayMs(attempts: number): number {
  return Math.min(6 * 60, 2 ** Math.max(0, attempts - 1)) * 60_000;
}

export class MailOutbox {
  private readonly sending = new SingleFlight(async () => {
    while (await this.sendOne());
  });
  private timer: NodeJS.Timeout | null = null;

  constructor(
    private readonly db: Database,
    /** Hands one message to the mail server (or the local outbox folder); throws when it fails. */
    private readonly transport: (message: OutgoingMail) => Promise<void>,
    private readonly now: () => number,
    private readonly log: (message: string) => void,
  ) {}

  /** Writes a message to the outbox; it is sent by `drain`. */
  async enqueue(message: OutgoingMail): Promise<void> {
    const t = new Date(this.now());
    await this.db.insert(mailOutboxTable).values({ to: message.to, subject: message.subject, text: message.text, createdAt: t, nextAttemptAt: t });
  }

  /** Sends every message that is due; one run at a time (a call during a run makes it go round again). */
  drain(): Promise<void> {
    return this.sending.run();
  }

  /** Claims and sends the oldest due message; false when none is due. */
  private async sendOne(): Promise<boolean> {
    const t = this.now();
    const due = this.db
      .select({ id: mailOutboxTable.id })
      .from(mailOutboxTable)
      .where(and(isNull(mailOutboxTable.sentAt), isNull(mailOutboxTable.failedAt), lte(mailOutboxTable.nextAttemptAt, new Date(t))))
      .orderBy(asc(mailOutboxTable.id))
      .limit(1)
      .for('update', { skipLocked: true });
    const claimed = await this.db
      .update(mailOutboxTable)
      .set({ attempts: sql`${mailOutboxTable.attempts} + 1`, nextAttemptAt: sql`${new Date(t).toISOString()}::timestamptz + (least(360, power(2, ${mailOutboxTable.attempts})) * interval '1 minute')` })
      .where(inArray(mailOutboxTable.id, due))
      .returning();
    const row = claimed[0];
    if (!row) return false;
    try {
      await this.transport({ to: row.to, subject: row.subject, text: row.text });
    } catch (e) {
      const last = row.attempts >= MAX_ATTEMPTS;
      const message = (e as Error)?.message ?? String(e);
      await this.db
        .update(mailOutboxTable)
        .set({ lastError: message.slice(0, 1000), ...(last ? { failedAt: new Date(this.now()), text: '' } : {}) })
        .where(eq(mailOutboxTable.id, row.id));
      this.log(
        last
          ? `panform serve: gave up mailing "${row.subject}" to ${row.to} after ${row.attempts} tries: ${message}`
          : `panform serve: mailing "${row.subject}" to ${row.to} failed (try ${row.attempts} of ${MAX_ATTEMPTS}, next in ${retryDelayMs(row.attempts) / 60_000} min): ${message}`,
      );
      return true;
    }
    // Sent: the text (it may hold a reset link) is not kept.
    await this.db.update(mailOutboxTable).set({ sentAt: new Date(this.now()), text: '', lastError: null }).where(eq(mailOutboxTable.id, row.id));
    return true;
  }

  /** Looks for due messages every POLL_MS until `stop`. */
  start(onError: (e: unknown) => void): void {
    if (this.timer) return;
    this.timer = setInterval(() => {
      this.drain().catch(onError);
    }, POLL_MS);
    this.timer.unref();
  }

  async stop(): Promise<void> {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    await this.sending.idle();
  }
}
