// The embedded broker: aedes on a TCP port, with the protocol's rules as hooks passed in as functions.
import { Aedes } from 'aedes';
import { createServer, type Server, type Socket } from 'node:net';
import type { Logger } from 'pino';
import { createAuthenticate } from './hooks/authenticate';
import { createAuthorizePublish } from './hooks/authorize-publish';
import { createAuthorizeSubscribe } from './hooks/authorize-subscribe';
import { zeroCounters, type Accept, type BrokerCounters, type BrokerEvents, type CheckCredential } from './types';
import { ReadGate } from './read-gate';

export interface BrokerOptions extends BrokerEvents {
  host: string;
  port: number;
  checkCredential: CheckCredential;
  accept: Accept;
  log: Logger;
  /** At most this many publishes wait for their commit before the broker stops reading from every connection. */
  maxUnsettled?: number;
  /** Where to count (the broker's thread passes counters in shared memory); fresh ones by default. */
  counters?: BrokerCounters;
}

export interface BrokerHandle {
  broker: Aedes;
  port: number;
  counters: BrokerCounters;
  gate: ReadGate;
  isConnected(gatewayId: string): boolean;
  /** Drops a gateway's connection and its cached credential (after revocation). */
  revoke(gatewayId: string): void;
  publish(topic: string, payload: string, opts: { qos: 0 | 1; retain: boolean }): Promise<void>;
  close(): Promise<void>;
}

export async function createBroker(opts: BrokerOptions): Promise<BrokerHandle> {
  const counters: BrokerCounters = opts.counters ?? zeroCounters();
  const onRefuse = (id: string, reason: string) => opts.log.warn({ gatewayId: id, reason }, 'broker refused');
  const auth = createAuthenticate(opts.checkCredential, counters, onRefuse);
  const gate = new ReadGate(opts.maxUnsettled ?? 20_000, () => counters.readPauses++);
  const broker = await Aedes.createBroker({
    authenticate: auth.authenticate as never,
    authorizePublish: createAuthorizePublish(opts.accept, counters, onRefuse, gate) as never,
    authorizeSubscribe: createAuthorizeSubscribe(counters, onRefuse) as never,
    concurrency: 1000,
    queueLimit: 1000,
  });
  broker.on('clientReady', (c) => opts.onConnect?.(c.id));
  broker.on('clientDisconnect', (c) => opts.onDisconnect?.(c.id));
  broker.on('clientError', (c, err) => opts.log.debug({ gatewayId: c?.id, err: err.message }, 'client error'));
  const sockets = new Set<Socket>();
  const server: Server = createServer((socket) => {
    socket.setNoDelay(true); // latency matters more than packet count here
    sockets.add(socket);
    gate.attach(socket);
    socket.on('close', () => sockets.delete(socket));
    broker.handle(socket);
  });
  await new Promise<void>((res, rej) => {
    server.once('error', rej);
    server.listen(opts.port, opts.host, () => res());
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : opts.port;
  opts.log.info({ host: opts.host, port }, 'broker listening');
  const clients = () => (broker as unknown as { clients: Record<string, { close(): void }> }).clients;
  return {
    broker,
    port,
    counters,
    gate,
    isConnected: (id) => Boolean(clients()[id]),
    revoke(id) {
      auth.forget(id);
      clients()[id]?.close();
    },
    publish: (topic, payload, o) =>
      new Promise((res, rej) =>
        broker.publish({ cmd: 'publish', topic, payload: Buffer.from(payload), qos: o.qos, retain: o.retain, dup: false } as never, (err?: Error) => (err ? rej(err) : res())),
      ),
    async close() {
      for (const s of sockets) s.destroy();
      await new Promise<void>((res) => server.close(() => res()));
      await new Promise<void>((res) => broker.close(() => res()));
    },
  };
}
