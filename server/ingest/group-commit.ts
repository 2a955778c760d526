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
  private settling: Promise<void> = Promise.resolve();
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
    await this.settling;
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
      let settle: (p: Pending<T>, i: number) => void;
      try {
        const outcome = await this.opts.flush(batch.map((p) => p.item));
        settle = (p, i) => (outcome?.[i] ? p.reject(outcome[i]!) : p.resolve());
      } catch (err) {
        settle = (p) => p.reject(err as Error);
      }
      this.inFlight = 0;
      this.flushing = null;
      this.roomWaiters = this.roomWaiters.filter((w) => (this.backlog < w.limit ? (w.resolve(), false) : true));
      // What arrived during the write goes next, at once; then the callers hear of this batch.
      if (this.current.length) this.cut();
      // Chained: a batch's callers hear of it only after the batch before has been settled to its last
      // slice, so they are settled in the order they came (MQTT 3.1.1 §4.6: PUBACKs in the order of the
      // PUBLISH packets), and drain() waits for both.
      this.settling = this.settling.then(() => settleInSlices(batch, settle));
    })();
  }
}

/** Callers' continuations (a PUBACK, the next packets read from that connection) per turn of the event loop. */
const SETTLE_SLICE = 250;

/**
 * Settles a batch's callers in order, a slice per turn of the event loop: a few thousand continuations in
 * one turn would hold the database's answers for the next batch (its BEGIN, its insert) up behind them.
 */
function settleInSlices<P>(batch: P[], settle: (p: P, i: number) => void): Promise<void> {
  return new Promise((done) => {
    const slice = (from: number) => {
      const to = Math.min(batch.length, from + SETTLE_SLICE);
      for (let i = from; i < to; i++) settle(batch[i], i);
      if (to < batch.length) setImmediate(slice, to);
      else done();
    };
    slice(0);
  });
}
