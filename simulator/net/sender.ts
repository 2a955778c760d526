import { createRng } from '../core/rng';
import type { TimelineEntry } from '../scenario/timeline';
import { GatewayClient, type SendStats } from './gateway-client';
import { Slots } from './slots';

export type Speed = number | 'max';

export interface SenderOptions {
  mqttUrl: string;
  secrets: ReadonlyMap<string, string>;
  speed: Speed;
  /** Simulated time that maps to the moment sending starts. */
  simStart: number;
  seed: string;
  perClientInFlight?: number;
  totalInFlight?: number;
  /** How long a broker may refuse a gateway's credentials before the run stops (default 30 s). */
  refusedGiveUpMs?: number;
}

const BACKLOG_LIMIT = 20_000;
const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

/** Sends timeline entries over real MQTT, one client per gateway, paced by `speed` (or as fast as acknowledged). */
export class Sender {
  readonly stats: SendStats = { published: 0, acked: 0, duplicates: 0, connects: 0, reconnects: 0, errors: 0 };
  private readonly clients = new Map<string, GatewayClient>();
  private readonly slots: Slots;
  private readonly wallStart = Date.now();
  private fatal: Error | null = null;
  private handedOver = 0;
  private idleWaiters: (() => void)[] = [];
  /** The send time (simulated) of the last entry handed to a client. */
  simNow: number;

  constructor(private readonly o: SenderOptions) {
    this.slots = new Slots(o.totalInFlight ?? 16000);
    this.simNow = o.simStart;
  }

  private clientFor(gatewayId: string): GatewayClient {
    let c = this.clients.get(gatewayId);
    if (c) return c;
    const secret = this.o.secrets.get(gatewayId);
    if (secret === undefined) throw new Error(`no secret for gateway ${gatewayId}`);
    c = new GatewayClient({
      mqttUrl: this.o.mqttUrl,
      gatewayId,
      secret,
      perClientLimit: this.o.perClientInFlight ?? (this.o.speed === 'max' ? 128 : 16),
      slots: this.slots,
      rng: createRng(`${this.o.seed}/backoff/${gatewayId}`),
      stats: this.stats,
      onFatal: (err) => {
        this.fatal ??= err;
        this.wakeIdle();
      },
      onIdle: () => this.wakeIdle(),
      refusedGiveUpMs: this.o.refusedGiveUpMs,
    });
    this.clients.set(gatewayId, c);
    return c;
  }

  private wallAt(sendAt: number): number {
    if (this.o.speed === 'max') return 0;
    return this.wallStart + (sendAt - this.o.simStart) / this.o.speed;
  }

  /** Hands entries to their gateways at their time; at max speed, as fast as the backlog allows. */
  async dispatch(entries: readonly TimelineEntry[], stop?: () => boolean): Promise<void> {
    for (const e of entries) {
      if (this.fatal) throw this.fatal;
      if (stop?.()) return;
      if (this.o.speed !== 'max') await this.waitUntil(e.sendAt, stop);
      // Keep the handed-over backlog bounded so memory and latency stay small at max speed.
      while (this.handedOver - this.stats.acked - this.stats.errors > BACKLOG_LIMIT && !this.fatal) await sleep(1);
      this.clientFor(e.gatewayId).enqueue(e);
      if (e.kind === 'publish') this.handedOver++;
      this.simNow = e.sendAt;
    }
  }

  async waitUntil(sendAt: number, stop?: () => boolean): Promise<void> {
    while (!stop?.()) {
      const wait = this.wallAt(sendAt) - Date.now();
      if (wait <= 2) return;
      await sleep(Math.min(wait, 1000));
    }
  }

  /** Resolves when every client has sent everything and every publish is acknowledged. */
  async drain(): Promise<void> {
    for (;;) {
      if (this.fatal) throw this.fatal;
      if ([...this.clients.values()].every((c) => c.idle)) return;
      await new Promise<void>((r) => {
        this.idleWaiters.push(r);
        setTimeout(r, 200);
      });
    }
  }

  private wakeIdle(): void {
    const w = this.idleWaiters;
    this.idleWaiters = [];
    for (const r of w) r();
  }

  async close(): Promise<void> {
    await Promise.all([...this.clients.values()].map((c) => c.close()));
  }
}
