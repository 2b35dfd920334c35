// One run at a time, and a call during a run makes it go round once more (the mail and record outboxes).
import { describe, expect, it } from 'vitest';
import { SingleFlight } from '#shared/single-flight';

describe('SingleFlight', () => {
  it('joins calls made during a run and goes round once more for them', async () => {
    let rounds = 0;
    let release!: () => void;
    let ended = 0;
    const f = new SingleFlight(
      async () => {
        rounds++;
        if (rounds === 1) await new Promise<void>((r) => (release = r));
      },
      () => ended++,
    );
    const first = f.run();
    const second = f.run();
    const third = f.run();
    expect(second).toBe(first);
    expect(third).toBe(first);
    release();
    await first;
    // Two calls came during the first round: one more round serves both.
    expect(rounds).toBe(2);
    expect(ended).toBe(1);
    await f.run();
    expect(rounds).toBe(3);
  });

  it('ends the run when a round throws, and runs again on the next call', async () => {
    let fail = true;
    let ended = 0;
    const f = new SingleFlight(async () => {
      if (fail) throw new Error('no connection');
    }, () => ended++);
    await expect(f.run()).rejects.toThrow('no connection');
    expect(ended).toBe(1);
    await f.idle();
    fail = false;
    await expect(f.run()).resolves.toBeUndefined();
  });
});
