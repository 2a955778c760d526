// The messages between the service's thread and the broker's thread (broker/broker-thread.ts), and the
// counters both see in one piece of shared memory.
import { zeroCounters, type BrokerCounters } from './types';

export interface ThreadInit {
  host: string;
  port: number;
  maxUnsettled?: number;
  /** The lowest pino level the service logs at: the thread sends nothing below it. */
  level: number;
  /** Float64 slots: the counters in COUNTER_NAMES' order. */
  shared: SharedArrayBuffer;
}

const COUNTER_NAMES = Object.keys(zeroCounters()) as (keyof BrokerCounters)[];
export const SHARED_BYTES = COUNTER_NAMES.length * Float64Array.BYTES_PER_ELEMENT;

/** Counters whose fields read and write the shared slots (one writer, the broker's thread). */
export function sharedCounters(shared: SharedArrayBuffer): BrokerCounters {
  const slots = new Float64Array(shared);
  const counters = {} as BrokerCounters;
  COUNTER_NAMES.forEach((name, i) =>
    Object.defineProperty(counters, name, {
      enumerable: true,
      get: () => slots[i],
      set: (v: number) => {
        slots[i] = v;
      },
    }),
  );
  return counters;
}

/**
 * A batch of gateways' publishes waiting for accept(): their payloads end to end in one transferred buffer.
 * `seq` numbers the first; the others follow it.
 */
export interface AcceptBatch {
  t: 'accept';
  seq: number;
  gatewayIds: string[];
  topics: string[];
  /** Payload i is bytes [ends[i-1], ends[i]) of `bytes`. */
  ends: Uint32Array;
  bytes: ArrayBuffer;
}

export type FromThread =
  | AcceptBatch
  | { t: 'ready'; port: number }
  | { t: 'failed'; message: string }
  | { t: 'credential'; id: number; username: string; password: string }
  | { t: 'connection'; gatewayId: string; connected: boolean; event: 'connect' | 'disconnect' }
  | { t: 'published'; id: number; error?: string }
  | { t: 'log'; level: 'debug' | 'info' | 'warn' | 'error'; obj: Record<string, unknown>; msg: string }
  | { t: 'closed' };

export type ToThread =
  /** Settled publishes: `ok` committed (or quarantined), `failed` not committed, with the reason. */
  | { t: 'settled'; ok: number[]; failed: [number, string][] }
  | { t: 'credential'; id: number; ok: boolean; service?: boolean; error?: string }
  | { t: 'publish'; id: number; topic: string; payload: string; qos: 0 | 1; retain: boolean }
  | { t: 'revoke'; gatewayId: string }
  | { t: 'close' };
