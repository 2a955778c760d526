// The service's end of the broker thread (broker/broker-thread.ts): the same rules as createBroker, with
// the sockets on another thread. Credentials are checked and publishes accepted here; the thread is told
// which publishes are settled, a turn of the event loop at a time, and only then writes their PUBACKs.
import { Worker } from 'node:worker_threads';
import type { Logger } from 'pino';
import type { BrokerHandle, BrokerOptions } from './create-broker';
import { brokerThreadModule } from './thread-bundle';
import { SHARED_BYTES, sharedCounters, type AcceptBatch, type FromThread, type ThreadInit, type ToThread } from './thread-protocol';

export interface ThreadedBrokerHandle extends Pick<BrokerHandle, 'counters' | 'isConnected' | 'revoke' | 'publish' | 'close'> {
  /** The port listened on (a restarted thread listens on the same). */
  readonly port: number;
  /** False from the moment the thread has stopped unasked until it is listening again. */
  healthy(): boolean;
  /** The thread itself, for the tests of what happens when it stops. */
  readonly thread: Worker;
  /** Called each time a thread that stopped unasked is listening again (its retained messages are gone with it). */
  onRestart(fn: () => void): void;
}

/** After the thread stops unasked it is started again this much later (gateways reconnect and resend). */
const RESTART_MS = 500;

export async function startBrokerThread(opts: BrokerOptions): Promise<ThreadedBrokerHandle> {
  const shared = new SharedArrayBuffer(SHARED_BYTES);
  const counters = sharedCounters(shared);
  const log: Logger = opts.log;
  const connected = new Set<string>();
  const publishes = new Map<number, { resolve(): void; reject(err: Error): void }>();
  let nextPublish = 0;
  let closing = false;
  let running = false;
  let port = opts.port;
  let thread!: Worker;
  const restartListeners: (() => void)[] = [];
  // Settlements of the current thread, sent once per turn of the event loop. A restarted thread numbers its
  // publishes afresh, so settlements of an older one are dropped by their generation.
  let generation = 0;
  let ok: number[] = [];
  let failed: [number, string][] = [];
  let settling = false;
  const sendSettled = () => {
    settling = false;
    const m: ToThread = { t: 'settled', ok, failed };
    ok = [];
    failed = [];
    thread.postMessage(m);
  };
  const settle = () => {
    if (!settling) {
      settling = true;
      setImmediate(sendSettled);
    }
  };

  function acceptBatch(m: AcceptBatch) {
    const gen = generation;
    const bytes = Buffer.from(m.bytes);
    let start = 0;
    for (let i = 0; i < m.ends.length; i++) {
      const seq = m.seq + i;
      const end = m.ends[i];
      opts.accept(m.gatewayIds[i], m.topics[i], bytes.subarray(start, end)).then(
        () => {
          if (gen !== generation) return;
          ok.push(seq);
          settle();
        },
        (err: Error) => {
          if (gen !== generation) return;
          failed.push([seq, err.message]);
          settle();
        },
      );
      start = end;
    }
  }

  function onMessage(m: FromThread) {
    switch (m.t) {
      case 'accept':
        return acceptBatch(m);
      case 'credential':
        opts.checkCredential(m.username, m.password).then(
          (r) => thread.postMessage({ t: 'credential', id: m.id, ok: r.ok, service: r.service } satisfies ToThread),
          (err: Error) => thread.postMessage({ t: 'credential', id: m.id, ok: false, error: err.message } satisfies ToThread),
        );
        return;
      case 'connection':
        if (m.connected) connected.add(m.gatewayId);
        else connected.delete(m.gatewayId);
        if (m.event === 'connect') opts.onConnect?.(m.gatewayId);
        else opts.onDisconnect?.(m.gatewayId);
        return;
      case 'published': {
        const p = publishes.get(m.id);
        publishes.delete(m.id);
        if (m.error === undefined) p?.resolve();
        else p?.reject(new Error(m.error));
        return;
      }
      case 'log':
        return log[m.level](m.obj, m.msg);
      default:
        return; // ready, failed and closed are awaited where the thread is started and stopped
    }
  }

  const entry = await brokerThreadModule();

  /** Starts a thread and waits until it listens (or could not). */
  function start(): Promise<void> {
    generation++;
    ok = [];
    failed = [];
    connected.clear();
    const init: ThreadInit = { host: opts.host, port, maxUnsettled: opts.maxUnsettled, level: log.levelVal, shared };
    const w = new Worker(entry, { workerData: init, execArgv: [], name: 'afterwatch-broker' }); // its young generation: the process's flag (scripts/lib/service-node-flags.ts)
    thread = w;
    return new Promise<void>((resolve, reject) => {
      let listening = false;
      w.on('message', (m: FromThread) => {
        if (m.t === 'ready') {
          listening = running = true;
          port = m.port; // a restart listens on the same port as the first start
          resolve();
        } else if (m.t === 'failed') reject(new Error(m.message));
        else onMessage(m);
      });
      w.on('error', (err) => {
        log.error({ err: err.message }, 'broker thread failed');
        if (!listening) reject(err);
      });
      w.on('exit', (code) => {
        running = false;
        if (!listening) return reject(new Error(`broker thread exited with code ${code} before listening`));
        if (closing || thread !== w) return;
        connected.clear();
        for (const p of publishes.values()) p.reject(new Error('broker thread stopped'));
        publishes.clear();
        log.error({ code }, 'broker thread stopped; starting it again');
        restartLater(0);
      });
    });
  }

  /** After an unasked stop: a new thread on the same port, tried again (the pause doubling up to 5 s) until one listens. */
  function restartLater(attempt: number) {
    setTimeout(() => {
      if (closing) return;
      start().then(
        () => {
          for (const fn of restartListeners) fn();
        },
        (err: Error) => {
          log.error({ err: err.message, attempt }, 'broker thread did not start again; trying again');
          restartLater(attempt + 1);
        },
      );
    }, Math.min(RESTART_MS * 2 ** attempt, 5000)).unref();
  }

  await start();
  return {
    get port() {
      return port;
    },
    counters,
    healthy: () => running && !closing,
    isConnected: (id) => connected.has(id),
    revoke: (gatewayId) => thread.postMessage({ t: 'revoke', gatewayId } satisfies ToThread),
    publish: (topic, payload, o) =>
      new Promise<void>((resolve, reject) => {
        if (!running) return reject(new Error('broker is not running'));
        const id = nextPublish++;
        publishes.set(id, { resolve, reject });
        thread.postMessage({ t: 'publish', id, topic, payload, qos: o.qos, retain: o.retain } satisfies ToThread);
      }),
    async close() {
      if (closing) return;
      closing = true;
      const w = thread;
      if (!running) return void (await w.terminate());
      await new Promise<void>((resolve) => {
        w.on('exit', () => resolve());
        w.postMessage({ t: 'close' } satisfies ToThread);
      });
    },
    get thread() {
      return thread;
    },
    onRestart: (fn) => void restartListeners.push(fn),
  };
}
