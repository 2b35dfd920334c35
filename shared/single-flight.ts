// One run at a time of a job that sends what waits (the server's mail outbox, the tablet's record
// outbox): a call during a run returns that run and makes it go round once more when it ends, so
// nothing written meanwhile waits for the next call. Pure; no I/O of its own.

export class SingleFlight {
  private running: Promise<void> | null = null;
  private again = false;

  /** `work` does one round; `after` runs when a run ends, however it ends. */
  constructor(
    private readonly work: () => Promise<void>,
    private readonly after?: () => void,
  ) {}

  run(): Promise<void> {
    if (this.running) {
      this.again = true;
      return this.running;
    }
    this.running = (async () => {
      try {
        do {
          this.again = false;
          await this.work();
        } while (this.again);
      } finally {
        this.running = null;
        this.after?.();
      }
    })();
    return this.running;
  }

  /** The run under way, or a settled promise when none is. */
  idle(): Promise<void> {
    return this.running ?? Promise.resolve();
  }
}
