// Group commit: each add() joins the current batch and settles with that batch's commit.
// A batch is cut at a size or an age, whichever comes first. Flushes run one at a time, in order, so
// the judgement sees a unit's messages in commit order; while one is being written the next batch
// keeps growing, which is what makes the batches large under load.

interface Pending<T> {
  item: T;
  resolve(): void;
  reject(err: Error): void;
}

export interface GroupCommitOptions<T> {
  maxItems: number;
  maxAgeMs: number;
  /** Writes the items; may return one error (or null) per item where only some could be written. */
  flush(items: T[]): Promise<void | (Error | null)[]>;
}

export class GroupCommit<T> {
  private current: Pending<T>[] = [];
  private timer: NodeJS.Timeout | null = null;
  private flushing: Promise<void> | null = null;
  private inFlight = 0;
  private roomWaiters: { limit: number; resolve(): void }[] = [];

  constructor(private opts: GroupCommitOptions<T>) {}

  add(item: T): Promise<void> {
    return new Promise<void>((resolve, reject) => {
      this.current.push({ item, resolve, reject });
      if (this.current.length >= this.opts.maxItems) this.cut();
      else if (!this.timer && !this.flushing) this.timer = setTimeout(() => this.cut(), this.opts.maxAgeMs);
    });
  }

  /** Items waiting or being written. */
  get backlog() {
    return this.current.length + this.inFlight;
  }

  /**
   * Backpressure: resolves once fewer than `limit` items wait or are being written. Callers hold back
   * their PUBACK meanwhile, and aedes reads no more from a socket whose messages are unsettled.
   */
  room(limit: number): Promise<void> {
    if (this.backlog < limit) return Promise.resolve();
    return new Promise((resolve) => this.roomWaiters.push({ limit, resolve }));
  }

  /** Resolves when everything added so far is settled. */
  async drain(): Promise<void> {
    this.cut();
    while (this.flushing) {
      await this.flushing;
      this.cut();
    }
  }

  private cut() {
    if (this.timer) {
      clearTimeout(this.timer);
      this.timer = null;
    }
    if (this.flushing || this.current.length === 0) return;
    const batch = this.current.splice(0, this.opts.maxItems);
    this.inFlight = batch.length;
    this.flushing = (async () => {
      try {
        const outcome = await this.opts.flush(batch.map((p) => p.item));
        batch.forEach((p, i) => {
          const err = outcome?.[i];
          if (err) p.reject(err);
          else p.resolve();
        });
      } catch (err) {
        for (const p of batch) p.reject(err as Error);
      } finally {
        this.inFlight = 0;
        this.flushing = null;
        this.roomWaiters = this.roomWaiters.filter((w) => (this.backlog < w.limit ? (w.resolve(), false) : true));
        // What arrived during the write goes next, at once.
        if (this.current.length) this.cut();
      }
    })();
  }
}
