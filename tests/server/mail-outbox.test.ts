// The durable outbox: a message is written to the database first and sent after; a mail server
// that refuses it gets it again later (1, 2, 4 ... minutes), and a sent message keeps no text.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OutgoingMail } from '../../server/context.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { mailOutboxTable } from '../../server/db/schema.ts';
import { MAX_ATTEMPTS, MailOutbox, retryDelayMs } from '../../server/mail-outbox.ts';
import { openTestDatabase } from './harness.ts';

let handle: DatabaseHandle;
beforeAll(async () => {
  handle = await openTestDatabase();
}, 180_000);
afterAll(async () => handle?.close());

const message: OutgoingMail = { to: 'ines@tidewater.example', subject: 'Panform: set a new password', text: 'link: https://panform.tidewater.example/reset-password?token=abc' };

describe('the mail outbox', () => {
  it('keeps a message the mail server refused and sends it on a later try, then forgets its text', async () => {
    const clock = { now: Date.parse('2026-12-02T20:00:00Z') };
    const sent: OutgoingMail[] = [];
    let refuse = 2;
    const logged: string[] = [];
    const outbox = new MailOutbox(
      handle.db,
      async (m) => {
        if (refuse-- > 0) throw new Error('421 try again later');
        sent.push(m);
      },
      () => clock.now,
      (m) => logged.push(m),
    );
    await outbox.enqueue(message);
    await outbox.drain();
    const [row] = await handle.db.select().from(mailOutboxTable);
    expect(row).toMatchObject({ attempts: 1, sentAt: null, failedAt: null, lastError: '421 try again later', text: message.text });
    expect(row.nextAttemptAt.getTime() - clock.now).toBe(retryDelayMs(1));
    expect(logged[0]).toMatch(/try 1 of 8, next in 1 min/);
    // Not due yet: nothing happens.
    await outbox.drain();
    expect(sent).toEqual([]);
    clock.now += retryDelayMs(1);
    await outbox.drain();
    clock.now += retryDelayMs(2);
    await outbox.drain();
    expect(sent).toEqual([message]);
    const [done] = await handle.db.select().from(mailOutboxTable).where(eq(mailOutboxTable.id, row.id));
    expect(done).toMatchObject({ attempts: 3, text: '', lastError: null });
    expect(done.sentAt).not.toBeNull();
  });

  it('gives up after MAX_ATTEMPTS tries and says so in the log', async () => {
    await handle.db.delete(mailOutboxTable);
    const clock = { now: Date.parse('2026-12-03T04:00:00Z') };
    const logged: string[] = [];
    const outbox = new MailOutbox(handle.db, async () => Promise.reject(new Error('connection refused')), () => clock.now, (m) => logged.push(m));
    await outbox.enqueue(message);
    for (let i = 1; i <= MAX_ATTEMPTS + 2; i++) {
      await outbox.drain();
      clock.now += retryDelayMs(i);
    }
    const [row] = await handle.db.select().from(mailOutboxTable);
    expect(row).toMatchObject({ attempts: MAX_ATTEMPTS, text: '' });
    expect(row.failedAt).not.toBeNull();
    expect(logged.at(-1)).toMatch(/gave up mailing "Panform: set a new password" to ines@tidewater.example after 8 tries: connection refused/);
  });
});
