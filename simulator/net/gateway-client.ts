import mqtt, { type MqttClient } from 'mqtt';
import { uplinkTopic } from '../../shared/protocol/topics';
import type { Rng } from '../core/rng';
import type { TimelineEntry } from '../scenario/timeline';
import type { Slots } from './slots';

export interface SendStats {
  published: number;
  acked: number;
  duplicates: number;
  connects: number;
  reconnects: number;
  errors: number;
}

export interface GatewayClientOptions {
  mqttUrl: string;
  gatewayId: string;
  secret: string;
  perClientLimit: number;
  slots: Slots;
  rng: Rng;
  stats: SendStats;
  onFatal: (err: Error) => void;
  onIdle: () => void;
  /** How long the broker may refuse the credentials before the run stops (default 30 s). */
  refusedGiveUpMs?: number;
}

const OFFLINE = JSON.stringify({ state: 'offline' }); // protocol: the will on the status topic

/**
 * One gateway's MQTT connection: client id = username = gateway id, password = secret, a
 * persistent session (clean false), QoS 1, will "offline". Its entries go out in order; a
 * planned disconnect (power or coverage lost) drops the socket without DISCONNECT so the broker
 * announces the will; an unplanned one is retried with jittered exponential back-off.
 */
export class GatewayClient {
  private queue: TimelineEntry[] = [];
  private head = 0;
  private client: MqttClient | null = null;
  private state: 'down' | 'connecting' | 'up' = 'down';
  /** Published and not yet acknowledged, in order; resent on a new connection after an unplanned drop. */
  private readonly pending = new Map<number, TimelineEntry & { kind: 'publish' }>();
  private nextRef = 0;
  private failures = 0;
  private retryTimer: NodeJS.Timeout | null = null;
  /** Since when the broker has refused every attempt (null: it has not, or it let the last one in). */
  private refusedSince: number | null = null;
  private closed = false;
  private readonly pumpFn = () => this.pump();

  constructor(private readonly o: GatewayClientOptions) {}

  get idle(): boolean {
    return this.head >= this.queue.length && this.pending.size === 0;
  }

  enqueue(e: TimelineEntry): void {
    this.queue.push(e);
    if (this.queue.length - this.head === 1) this.pump();
  }

  private open(): void {
    this.state = 'connecting';
    const c = mqtt.connect(this.o.mqttUrl, {
      clientId: this.o.gatewayId,
      username: this.o.gatewayId,
      password: this.o.secret,
      clean: false,
      protocolVersion: 4,
      keepalive: 30,
      reconnectPeriod: 0,
      connectTimeout: 10_000,
      will: { topic: uplinkTopic(this.o.gatewayId, 'status'), payload: Buffer.from(OFFLINE), qos: 1, retain: false },
    });
    this.client = c;
    c.on('connect', () => {
      if (this.client !== c) return;
      this.state = 'up';
      this.failures = 0;
      this.refusedSince = null;
      this.o.stats.connects++;
      // QoS 1: what the broker did not acknowledge before the drop goes again, first and in order.
      for (const [ref, e] of this.pending) this.send(c, ref, e, true);
      this.pump();
    });
    c.on('error', (err: Error & { code?: number }) => {
      if (this.client !== c) return;
      // CONNACK 4/5 (MQTT 3.1.1) or 134/135 (MQTT 5): the broker refuses these credentials. For a while that is
      // the service holding gateways off (behind Mosquitto, until a worker has subscribed): retried like a drop.
      if (err.code === 4 || err.code === 5 || err.code === 134 || err.code === 135) {
        const giveUpMs = this.o.refusedGiveUpMs ?? 30_000;
        this.refusedSince ??= Date.now();
        if (Date.now() - this.refusedSince >= giveUpMs) {
          this.o.onFatal(new Error(`gateway ${this.o.gatewayId}: the broker refused its credentials for ${Math.round(giveUpMs / 1000)} s (${err.message}); delete the simulator's gateway file to provision new ones`));
        }
      }
    });
    c.on('close', () => {
      if (this.client !== c || this.closed) return;
      // Unplanned: this client is given up (its late callbacks are ignored) and a new one connects later.
      this.client = null;
      this.state = 'down';
      c.end(true);
      this.scheduleRetry();
    });
  }

  private scheduleRetry(): void {
    if (this.retryTimer) return;
    this.failures++;
    this.o.stats.reconnects++;
    const base = Math.min(30_000, 250 * 2 ** Math.min(this.failures, 7));
    const delay = base * (0.5 + this.o.rng.next()); // jitter, so that a fleet does not reconnect in step
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      if (this.closed || this.client !== null) return;
      this.open();
    }, delay);
  }

  private send(c: MqttClient, ref: number, e: TimelineEntry & { kind: 'publish' }, resend: boolean): void {
    c.publish(e.topic, JSON.stringify(e.payload), { qos: 1, dup: resend || e.duplicate === true }, (err) => {
      if (this.client !== c || !this.pending.has(ref)) return; // a dropped connection's callback
      if (err) return; // not acknowledged: it stays pending and goes again on the next connection
      this.pending.delete(ref);
      this.o.slots.give();
      this.o.stats.acked++;
      this.pump();
    });
  }

  /** A planned loss of connection: no DISCONNECT, so the broker publishes the will. */
  private drop(): void {
    const c = this.client;
    this.client = null;
    this.state = 'down';
    if (!c) return;
    c.stream?.destroy();
    c.end(true);
  }

  private pump(): void {
    while (this.head < this.queue.length && !this.closed) {
      const e = this.queue[this.head];
      if (e.kind === 'connect') {
        if (this.state === 'down' && this.client === null) this.open();
        if (this.state !== 'up') return;
        this.head++;
        continue;
      }
      if (e.kind === 'disconnect') {
        if (this.pending.size > 0) return; // every message the gateway sent is acknowledged before it goes dark
        this.drop();
        this.head++;
        continue;
      }
      if (this.state !== 'up' || !this.client) return;
      if (this.pending.size >= this.o.perClientLimit) return;
      if (!this.o.slots.tryTake(this.pumpFn)) return;
      this.head++;
      this.o.stats.published++;
      if (e.duplicate) this.o.stats.duplicates++;
      const ref = this.nextRef++;
      this.pending.set(ref, e);
      this.send(this.client, ref, e, false);
    }
    if (this.head > 4096 && this.head * 2 > this.queue.length) {
      this.queue = this.queue.slice(this.head);
      this.head = 0;
    }
    if (this.idle) this.o.onIdle();
  }

  async close(): Promise<void> {
    this.closed = true;
    if (this.retryTimer) clearTimeout(this.retryTimer);
    const c = this.client;
    this.client = null;
    for (let i = 0; i < this.pending.size; i++) this.o.slots.give();
    this.o.stats.errors += this.pending.size; // closed before they were acknowledged
    this.pending.clear();
    if (c) await new Promise<void>((resolve) => c.end(false, {}, () => resolve()));
  }
}
