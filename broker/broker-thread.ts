// The embedded broker on a thread of its own: socket reads, MQTT parsing, topic matching and the PUBACK
// writes are a quarter to a third of the service's work at fleet rates, and here they run beside the
// ingest instead of taking turns with it. Everything the service decides stays on the service's thread:
// credentials are checked there, and each publish is handed over and acknowledged only when the service
// says it is committed (so PUBACK still means "committed"). Started by broker/threaded-broker.ts.
import { parentPort, workerData } from 'node:worker_threads';
import type { Logger } from 'pino';
import { createBroker, type BrokerHandle } from './create-broker';
import { sharedCounters, type FromThread, type ThreadInit, type ToThread } from './thread-protocol';
import type { CredentialResult } from './types';

const channel = parentPort!;
const init = workerData as ThreadInit;
const send = (m: FromThread, transfer?: ArrayBuffer[]) => channel.postMessage(m, transfer);

// pino's numeric levels (https://getpino.io/#/docs/api?id=loggerlevels-object).
const LEVELS = { debug: 20, info: 30, warn: 40, error: 50 } as const;
const forward = (level: keyof typeof LEVELS) =>
  LEVELS[level] < init.level ? () => {} : (obj: Record<string, unknown>, msg: string) => send({ t: 'log', level, obj, msg });
/** The broker logs only these, always as (object, message): they go to the service's logger. */
const log = { debug: forward('debug'), info: forward('info'), warn: forward('warn'), error: forward('error') } as unknown as Logger;

interface Waiting {
  resolve(): void;
  reject(err: Error): void;
}

// Publishes waiting for accept(): gathered for one turn of the event loop, then sent as one message.
let nextSeq = 0;
const waiting = new Map<number, Waiting>();
let batchSeq = 0;
let gatewayIds: string[] = [];
let topics: string[] = [];
let payloads: Buffer[] = [];
let flushing = false;

function flush() {
  flushing = false;
  const n = payloads.length;
  const ends = new Uint32Array(n);
  let total = 0;
  for (let i = 0; i < n; i++) ends[i] = total += payloads[i].length;
  const bytes = new ArrayBuffer(total);
  const view = new Uint8Array(bytes);
  for (let i = 0; i < n; i++) view.set(payloads[i], i ? ends[i - 1] : 0);
  send({ t: 'accept', seq: batchSeq, gatewayIds, topics, ends, bytes }, [bytes]);
  gatewayIds = [];
  topics = [];
  payloads = [];
}

function accept(gatewayId: string, topic: string, payload: Buffer): Promise<void> {
  if (!flushing) {
    flushing = true;
    batchSeq = nextSeq;
    setImmediate(flush);
  }
  gatewayIds.push(gatewayId);
  topics.push(topic);
  payloads.push(payload);
  const seq = nextSeq++;
  return new Promise<void>((resolve, reject) => waiting.set(seq, { resolve, reject }));
}

let nextCredential = 0;
const credentials = new Map<number, { resolve(r: CredentialResult): void; reject(err: Error): void }>();

let handle: BrokerHandle | undefined;

channel.on('message', (m: ToThread) => {
  switch (m.t) {
    case 'settled':
      for (const seq of m.ok) {
        const w = waiting.get(seq);
        waiting.delete(seq);
        w?.resolve();
      }
      for (const [seq, reason] of m.failed) {
        const w = waiting.get(seq);
        waiting.delete(seq);
        w?.reject(new Error(reason));
      }
      break;
    case 'credential': {
      const c = credentials.get(m.id);
      credentials.delete(m.id);
      if (m.error !== undefined) c?.reject(new Error(m.error));
      else c?.resolve({ ok: m.ok, service: m.service });
      break;
    }
    case 'publish':
      if (!handle) return send({ t: 'published', id: m.id, error: 'broker is not running' });
      handle.publish(m.topic, m.payload, { qos: m.qos, retain: m.retain }).then(
        () => send({ t: 'published', id: m.id }),
        (err: Error) => send({ t: 'published', id: m.id, error: err.message }),
      );
      break;
    case 'revoke':
      handle?.revoke(m.gatewayId);
      break;
    case 'close':
      (handle ? handle.close() : Promise.resolve()).then(() => {
        send({ t: 'closed' });
        channel.close();
      });
      break;
  }
});

const connection = (event: 'connect' | 'disconnect') => (gatewayId: string) =>
  send({ t: 'connection', gatewayId, event, connected: handle?.isConnected(gatewayId) ?? false });

createBroker({
  host: init.host,
  port: init.port,
  maxUnsettled: init.maxUnsettled,
  counters: sharedCounters(init.shared),
  log,
  accept,
  checkCredential: (username, password) =>
    new Promise((resolve, reject) => {
      const id = nextCredential++;
      credentials.set(id, { resolve, reject });
      send({ t: 'credential', id, username, password });
    }),
  onConnect: connection('connect'),
  onDisconnect: connection('disconnect'),
}).then(
  (h) => {
    handle = h;
    send({ t: 'ready', port: h.port });
  },
  (err: Error) => {
    send({ t: 'failed', message: err.message });
    channel.close();
  },
);
