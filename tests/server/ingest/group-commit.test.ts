// The group commit: batches cut at a size or an age, one flush at a time, callers settled in order
// (a slice per turn of the event loop), per-item failures, drain and backpressure.
import { describe, expect, it } from 'vitest';
import { GroupCommit } from '../../../server/ingest/group-commit';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('GroupCommit', () => {
  it('cuts at the size, flushes one batch at a time, and settles every caller in order', async () => {
    const flushed: number[][] = [];
    let running = 0;
    let overlapped = false;
    const g = new GroupCommit<number>({
      maxItems: 1000,
      maxAgeMs: 5,
      flush: async (items) => {
        overlapped ||= running > 0;
        running++;
        flushed.push(items);
        await sleep(10);
        running--;
      },
    });
    const order: number[] = [];
    const all = Array.from({ length: 2600 }, (_, i) => g.add(i).then(() => order.push(i)));
    await Promise.all(all);
    expect(overlapped).toBe(false);
    expect(flushed.map((b) => b.length)).toEqual([1000, 1000, 600]);
    expect(flushed.flat()).toEqual(Array.from({ length: 2600 }, (_, i) => i));
    expect(order).toEqual(Array.from({ length: 2600 }, (_, i) => i));
  });

  it('settles a batch\'s callers only after the batch before it, even when its write is quicker than their settling', async () => {
    // MQTT 3.1.1 §4.6: a receiver sends PUBACKs in the order the PUBLISH packets came. Here the second
    // batch is written at once, while the first is still being settled a slice per turn of the event loop.
    const g = new GroupCommit<number>({ maxItems: 1000, maxAgeMs: 5, flush: async () => {} });
    const order: number[] = [];
    await Promise.all(Array.from({ length: 2000 }, (_, i) => g.add(i).then(() => order.push(i))));
    expect(order).toEqual(Array.from({ length: 2000 }, (_, i) => i));
  });

  it('cuts at the age when the size is not reached', async () => {
    const flushed: number[][] = [];
    const g = new GroupCommit<number>({ maxItems: 1000, maxAgeMs: 20, flush: async (items) => void flushed.push(items) });
    const t0 = Date.now();
    await Promise.all([g.add(1), g.add(2)]);
    expect(flushed).toEqual([[1, 2]]);
    expect(Date.now() - t0).toBeGreaterThanOrEqual(15);
  });

  it('rejects only the items the flush reports as failed, and all of a batch whose flush throws', async () => {
    const g = new GroupCommit<number>({
      maxItems: 10,
      maxAgeMs: 1,
      flush: async (items) => {
        if (items.includes(99)) throw new Error('database down');
        return items.map((i) => (i % 2 ? new Error(`odd ${i}`) : null));
      },
    });
    const r = await Promise.allSettled([g.add(1), g.add(2), g.add(3)]);
    expect(r.map((x) => x.status)).toEqual(['rejected', 'fulfilled', 'rejected']);
    await g.drain();
    const r2 = await Promise.allSettled([g.add(99), g.add(4)]);
    expect(r2.map((x) => x.status)).toEqual(['rejected', 'rejected']);
  });

  it('drain resolves only when every caller added so far has been settled', async () => {
    const g = new GroupCommit<number>({ maxItems: 5000, maxAgeMs: 1000, flush: async () => {} });
    let settled = 0;
    for (let i = 0; i < 3000; i++) void g.add(i).then(() => settled++);
    await g.drain();
    expect(settled).toBe(3000);
  });

  it('room() waits while the backlog is at the limit and resolves once a batch is written', async () => {
    let release!: () => void;
    const g = new GroupCommit<number>({ maxItems: 100, maxAgeMs: 1, flush: () => new Promise<void>((r) => (release = r)) });
    for (let i = 0; i < 100; i++) void g.add(i);
    await sleep(5);
    expect(g.backlog).toBe(100);
    let roomy = false;
    const waiting = g.room(50).then(() => (roomy = true));
    await sleep(10);
    expect(roomy).toBe(false);
    release();
    await waiting;
    expect(g.backlog).toBe(0);
  });
});
