// The ingest: accept() -> group commit -> raw history + judgement + faults in one transaction -> announce.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Logger } from 'pino';
import { GroupCommit } from './group-commit';
import { GatewayDirectory } from './gateway-directory';
import { createAccept, type IngestCounters } from './accept';
import type { IngestItem, MessageItem, QuarantineItem } from './items';
import { CopyInBatch, inBatchTransaction, insertMessages, insertQuarantine, messageKey } from './store';
import { judgeUnitInBatch, type JudgeResult } from './unit-judge';
import { judgeCan, linkSpan, relinkFaults, type CanOutcome } from './unit-faults';
import { emptyWrites, writeBatch, type BatchWrites } from './batch-writes';
import type { UnitMemory } from './unit-memory';
import { createFleetEvents, type EpisodeChange, type UnitChange } from './fleet-events';
import { UnitBook } from './unit-book';
import { positionKey } from '../detection/positions';
import type { StatusMessage } from '../../shared/protocol/messages';

interface Judged {
  unitId: string;
  memory: UnitMemory;
  r: JudgeResult;
  faults: CanOutcome;
}

export interface IngestOptions {
  sequelize: Sequelize;
  log: Logger;
  batchMax: number;
  batchMs: number;
  maxBacklog?: number;
  wallNow?: () => number;
  /** Several workers share the gateways' messages (external broker): serialise each unit's judging across them. */
  shared?: boolean;
  /** A gateway's status message (online, or its will: offline), for the connection view. */
  onStatus?(gatewayId: string, unitId: string | null, status: StatusMessage): void;
}

export function createIngest(opts: IngestOptions) {
  const { sequelize, log } = opts;
  const wallNow = opts.wallNow ?? Date.now;
  const directory = new GatewayDirectory();
  const events = createFleetEvents();
  const counters: IngestCounters = { accepted: 0, duplicates: 0, quarantined: 0, quarantinedByReason: {} };
  const judgeErrors = { count: 0 };
  const book = new UnitBook(sequelize, wallNow, log);

  const batch = new GroupCommit<IngestItem>({ maxItems: opts.batchMax, maxAgeMs: opts.batchMs, flush: flushOrIsolate });

  /** Set while the database cannot be reached: the batch waits for it, and nothing is acknowledged meanwhile. */
  let pausedSince: number | null = null;
  let stopping = false;
  let wakeRetry: (() => void) | null = null;

  /**
   * One bad row must not hold back the good ones beside it: if a batch fails while the database is up,
   * its items are written one by one and only the one that cannot be written is refused (not acknowledged).
   * While the database is away the batch waits and tries again (back-off up to 2 s): the ingest pauses,
   * PUBACKs wait, the backlog limit stops the reading, and the gateways' connections stay open.
   */
  async function flushOrIsolate(items: IngestItem[]): Promise<(Error | null)[] | void> {
    for (let waitMs = 100; ; waitMs = Math.min(waitMs * 2, 2000)) {
      try {
        const done = await flush(items);
        if (pausedSince !== null) {
          log.info({ pausedMs: wallNow() - pausedSince }, 'database back: ingest resumed');
          pausedSince = null;
        }
        return done;
      } catch (err) {
        const up = await sequelize.query('SELECT 1').then(() => true, () => false);
        if (up) return isolate(items, err as Error);
        if (stopping) throw err;
        if (pausedSince === null) {
          pausedSince = wallNow();
          log.warn({ err }, 'database unreachable: ingest paused until it is back (nothing is acknowledged meanwhile)');
        }
        await new Promise<void>((res) => {
          const timer = setTimeout(res, waitMs);
          wakeRetry = () => (clearTimeout(timer), res());
        });
        wakeRetry = null;
      }
    }
  }

  async function isolate(items: IngestItem[], err: Error): Promise<(Error | null)[]> {
    if (items.length === 1) throw err;
    log.warn({ err, items: items.length }, 'a batch failed: writing its items one by one');
    const outcome: (Error | null)[] = [];
    for (const item of items) outcome.push(await flush([item]).then(() => null, (e: Error) => e));
    return outcome;
  }

  /** A batch whose COPY met a stored copy is written again, copies told apart (store.ts). */
  async function flush(items: IngestItem[]) {
    try {
      return await flushOnce(items, false);
    } catch (err) {
      if (!(err instanceof CopyInBatch)) throw err;
      return await flushOnce(items, true);
    }
  }

  async function flushOnce(items: IngestItem[], dedupe: boolean) {
    const messages = items.filter((i): i is MessageItem => i.type === 'message');
    const quarantined = items.filter((i): i is QuarantineItem => i.type === 'quarantine');
    const ticks = new Set(items.flatMap((i) => (i.type === 'tick' ? [i.unitId] : [])));
    const outcome = await inBatchTransaction(sequelize, async (t) => {
      const fresh = await insertMessages(t, messages, dedupe);
      await t.open(); // a batch of ticks or refusals only: no COPY opened it
      await insertQuarantine(sequelize, t, quarantined);
      const byUnit = new Map<string, MessageItem[]>();
      const seen = new Set<string>();
      for (const m of messages) {
        if (!fresh.all) {
          const k = messageKey(m);
          if (!fresh.keys.has(k) || seen.has(k)) continue; // a duplicate: the first accepted copy already won
          seen.add(k);
        }
        const list = byUnit.get(m.unitId) ?? [];
        list.push(m);
        byUnit.set(m.unitId, list);
      }
      // Sorted, so that workers taking units' locks in one batch never deadlock one another.
      const units = [...new Set([...byUnit.keys(), ...ticks])].sort();
      const next = new Map<string, UnitMemory>();
      const failed: string[] = [];
      const writes = emptyWrites();
      const judged: Judged[] = [];
      for (const unitId of units) {
        let mem = await book.get(unitId, t);
        if (!mem) continue;
        // Counted even if the judgement below fails: no worker may keep trusting a memory that lacks
        // the messages this batch stores.
        const version = opts.shared ? await claimUnit(t, unitId) : null;
        try {
          // Another worker judged this unit since our memory was made: start again from the database.
          if (version !== null && version !== mem.version + 1) mem = await book.rebuild(mem.profile, t);
          const j = await judgeOne(t, mem, byUnit.get(unitId) ?? []);
          if (version !== null) j.memory.version = version;
          collect(writes, j);
          judged.push(j);
        } catch (err) {
          // Judging only reads, so nothing of this unit is half-written; its raw messages still commit,
          // and its memory is rebuilt from the database next time.
          failed.push(unitId);
          judgeErrors.count++;
          log.error({ err, unitId }, 'judging a unit failed; its messages are stored');
        }
      }
      await writeBatch(sequelize, t, writes);
      const episodeChanges: EpisodeChange[] = [];
      for (const j of judged) {
        await relinkFor(t, j);
        next.set(j.unitId, j.memory);
        for (const c of j.r.changed) episodeChanges.push({ unitId: j.unitId, id: c.id, episode: c.episode, before: j.r.before.get(positionKey(c.episode.keyOff)) ?? null });
      }
      return { fresh: fresh.size, next, episodeChanges, failed };
    });
    counters.accepted += outcome.fresh;
    counters.duplicates += messages.length - outcome.fresh;
    for (const unitId of outcome.failed) {
      book.forget(unitId);
      void book.get(unitId).catch((err) => log.warn({ err, unitId }, 'could not rebuild a unit'));
    }
    const unitChanges: UnitChange[] = [];
    for (const [unitId, mem] of outcome.next) {
      const previous = book.peek(unitId);
      book.set(unitId, mem);
      unitChanges.push({ unitId, depot: mem.profile.depot, view: book.view(unitId), previous: previous?.state ?? null, state: mem.state });
    }
    if (unitChanges.length) events.emit('units', unitChanges);
    if (outcome.episodeChanges.length) events.emit('episodes', outcome.episodeChanges);
  }

  /** Locks the unit for this transaction and counts one more judgement of it; returns the new count. */
  async function claimUnit(t: Transaction, unitId: string): Promise<number> {
    await sequelize.query('SELECT pg_advisory_xact_lock(hashtext($1))', { bind: [unitId], transaction: t });
    const [row] = await sequelize.query<{ judged_version: string }>(
      'UPDATE units SET judged_version = judged_version + 1 WHERE id = $1 RETURNING judged_version',
      { bind: [unitId], type: QueryTypes.SELECT, transaction: t },
    );
    return Number(row.judged_version);
  }

  /** A unit's judgement in this batch: reads only; its writes are collected for the batch. */
  async function judgeOne(t: Transaction, mem: UnitMemory, items: MessageItem[]): Promise<Judged> {
    const wall = wallNow();
    const r = await judgeUnitInBatch(sequelize, t, mem, items.map((i) => ({ event: i.event, receivedAt: i.receivedAt })), (m) => book.clock(m, wall));
    const can = items.filter((i) => i.frames).map((i) => ({ position: i.event, frames: i.frames! }));
    const faults = await judgeCan(sequelize, t, r.memory, can);
    return { unitId: mem.profile.unitId, memory: r.memory, r, faults };
  }

  function collect(w: BatchWrites, j: Judged) {
    for (const entry of j.r.changed) w.episodes.push({ unitId: j.unitId, entry });
    w.deleted.push(...j.r.deleted);
    if (j.faults.recomputed) w.faultResets.push(j.unitId);
    for (const activation of j.faults.activations) w.faults.push({ unitId: j.unitId, activation });
    if (j.faults.dm1) w.dm1.push({ unitId: j.unitId, ...j.faults.dm1 });
  }

  /** Links can change where a fault arrived or where an interrupted episode changed (before or after). */
  async function relinkFor(t: Transaction, j: Judged) {
    const spans: [number, number][] = [];
    if (j.faults.recomputed) spans.push([0, Date.UTC(9999, 0, 1)]); // every fault of the unit (a date PostgreSQL can hold)
    for (const f of j.faults.activations) spans.push([f.at, f.at]);
    for (const c of j.r.changed) {
      for (const s of [linkSpan(c.episode), linkSpan(j.r.before.get(positionKey(c.episode.keyOff)))]) if (s) spans.push(s);
    }
    if (!spans.length) return;
    await relinkFaults(sequelize, t, j.memory, Math.min(...spans.map((s) => s[0])), Math.max(...spans.map((s) => s[1])));
  }

  const accept = createAccept({
    directory,
    batch,
    counters,
    wallNow,
    maxBacklog: opts.maxBacklog ?? 20_000,
    onStatus: (gatewayId, status) => {
      void directory.get(gatewayId).then((gw) => opts.onStatus?.(gatewayId, gw?.unitId ?? null, status));
    },
  });

  let ticker: NodeJS.Timeout | null = null;
  const ticking = new Set<string>();
  function tick() {
    const wall = wallNow();
    book.updateFleetClock(wall);
    for (const unitId of book.dueUnits(wall)) {
      if (ticking.has(unitId)) continue;
      ticking.add(unitId);
      batch.add({ type: 'tick', unitId }).then(
        () => ticking.delete(unitId),
        (err) => {
          ticking.delete(unitId);
          log.warn({ err, unitId }, 'deadline re-judgement failed; retried next tick');
        },
      );
    }
  }

  return {
    accept,
    events,
    counters,
    judgeErrors,
    directory,
    book,
    async start() {
      await directory.load();
      await book.loadAll();
      ticker = setInterval(tick, 250);
      ticker.unref();
    },
    /** Re-judges a unit now (after a profile change), through the batch like any message. */
    rejudge: (unitId: string) => batch.add({ type: 'tick', unitId }),
    drain: () => batch.drain(),
    get backlog() {
      return batch.backlog;
    },
    /** Since when (wall ms) the ingest waits for the database, or null. */
    get pausedSince() {
      return pausedSince;
    },
    async stop() {
      if (ticker) clearInterval(ticker);
      // A batch waiting for an absent database gives up now: unacknowledged, the gateways send it again.
      stopping = true;
      wakeRetry?.();
      await batch.drain();
    },
  };
}

export type Ingest = ReturnType<typeof createIngest>;
