import { uplinkTopic, type UplinkKind } from '../../shared/protocol/topics';
import type { Rng } from '../core/rng';
import { SECOND, iso } from '../core/time';
import type { TimelineEntry } from '../scenario/timeline';

/** Marks an episode as observable by the service once a message that settles it is delivered. */
export interface Evidence {
  observed: boolean;
}

interface Stored {
  topic: string;
  payload: Record<string, unknown>;
  evidence?: Evidence;
}

export interface OutboxOptions {
  gatewayId: string;
  firstBoot: number;
  /** True time → the gateway's clock (ms). */
  clock: (t: number) => number;
  rng: Rng;
  /** Chance that a delivered message is delivered again (a QoS 1 resend). */
  duplicateP: number;
}

/**
 * One gateway's side of the protocol: boot counter and seq (one counter for telemetry, can and
 * power within a boot, from 0), its connection, store-and-forward while out of coverage (oldest
 * first on reconnect) and the odd QoS 1 duplicate.
 */
export class Outbox {
  private entries: TimelineEntry[] = [];
  private lastSendAt = -Infinity;
  boot: number;
  private seq = 0;
  private booted = false;
  powered = false;
  private covered = true;
  private connected = false;
  private readonly buffer: Stored[] = [];
  private dups: { due: number; stored: Stored }[] = [];
  lastBoot: number | null = null;

  constructor(private readonly o: OutboxOptions) {
    this.boot = o.firstBoot;
  }

  /** Hands over the entries made since the last call. */
  takeEntries(): TimelineEntry[] {
    const out = this.entries;
    this.entries = [];
    return out;
  }

  get gatewayId(): string {
    return this.o.gatewayId;
  }

  ts(t: number): string {
    return iso(this.o.clock(t));
  }

  clockMs(t: number): number {
    return Math.round(this.o.clock(t));
  }

  powerUp(t: number): void {
    if (this.booted) this.boot += 1;
    this.booted = true;
    this.lastBoot = this.boot;
    this.seq = 0;
    this.powered = true;
    if (this.covered) this.connect(t);
  }

  powerDown(t: number): void {
    if (this.connected) this.disconnect(t);
    this.powered = false;
  }

  setCoverage(t: number, covered: boolean): void {
    this.covered = covered;
    if (!covered && this.connected) this.disconnect(t);
    if (covered && this.powered && !this.connected) this.connect(t);
  }

  /** A telemetry, can or power message of the current boot, stamped with the gateway's clock. */
  publish(t: number, kind: Exclude<UplinkKind, 'status'>, body: Record<string, unknown>, evidence?: Evidence): Record<string, unknown> {
    const payload = { boot: this.boot, seq: this.seq++, ts: this.ts(t), ...body };
    this.deliver(t, { topic: uplinkTopic(this.o.gatewayId, kind), payload, evidence });
    return payload;
  }

  /** End of the run: the last duplicates go out; what is still stored stays with the gateway (not delivered). */
  finish(t: number): void {
    this.releaseDups(t + 60 * SECOND);
  }

  private deliver(t: number, s: Stored): void {
    if (!this.connected) {
      this.buffer.push(s);
      return;
    }
    this.releaseDups(t);
    this.push({ kind: 'publish', gatewayId: this.o.gatewayId, sendAt: t, topic: s.topic, payload: s.payload });
    if (s.evidence) s.evidence.observed = true;
    if (this.o.rng.chance(this.o.duplicateP)) this.dups.push({ due: t + this.o.rng.float(0.5, 20) * SECOND, stored: s });
  }

  private releaseDups(t: number): void {
    if (this.dups.length === 0) return;
    const due = this.dups.filter((d) => d.due <= t).sort((a, b) => a.due - b.due);
    if (due.length === 0) return;
    this.dups = this.dups.filter((d) => d.due > t);
    for (const d of due) {
      this.push({ kind: 'publish', gatewayId: this.o.gatewayId, sendAt: d.due, topic: d.stored.topic, payload: d.stored.payload, duplicate: true });
    }
  }

  private connect(t: number): void {
    this.connected = true;
    this.push({ kind: 'connect', gatewayId: this.o.gatewayId, sendAt: t, boot: this.boot });
    this.push({ kind: 'publish', gatewayId: this.o.gatewayId, sendAt: t, topic: uplinkTopic(this.o.gatewayId, 'status'), payload: { state: 'online', boot: this.boot } });
    // Store-and-forward: what was kept while offline goes first, oldest first.
    const stored = this.buffer.splice(0, this.buffer.length);
    for (const s of stored) this.deliver(t, s);
  }

  private disconnect(t: number): void {
    this.releaseDups(t);
    // A resend that was still due is lost with the connection; the broker got the original.
    this.dups = [];
    this.connected = false;
    this.push({ kind: 'disconnect', gatewayId: this.o.gatewayId, sendAt: t });
  }

  private push(e: TimelineEntry): void {
    // A gateway's entries never go back in time (duplicates are released in time order).
    if (e.sendAt < this.lastSendAt) e.sendAt = this.lastSendAt;
    this.lastSendAt = e.sendAt;
    this.entries.push(e);
  }
}
