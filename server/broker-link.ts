// The service's side of MQTT, embedded or external: one shape for publishing indicators, health and revocation.
import type { Worker } from 'node:worker_threads';
import type { Logger } from 'pino';
import type { Config } from './config';
import { startBrokerThread } from '../broker/threaded-broker';
import type { Accept, BrokerCounters } from '../broker/types';
import { checkGatewayCredential } from './modules/gateways/credentials';
import { startExternalIngest } from './ingest/external-subscriber';
import { writeMosquittoFiles, type GateWrite } from './modules/gateways/mosquitto-files';

export interface BrokerLink {
  kind: 'embedded' | 'external';
  /** The embedded broker's port (0 behind an external broker). */
  port: number;
  counters: BrokerCounters | null;
  healthy(): boolean;
  isConnected(gatewayId: string): boolean;
  publish(topic: string, payload: string, opts: { qos: 0 | 1; retain: boolean }): Promise<void>;
  /** Called whenever the broker is back after it was lost (the embedded thread restarted, or the external broker reconnected): what it retained may be gone. */
  onReconnect(fn: () => void): void;
  /** The embedded broker's thread (tests stop it to see the service recover); null behind an external broker. */
  thread(): Worker | null;
  /** After a gateway was provisioned or revoked. */
  gatewaysChanged(revokedGatewayId?: string): Promise<void>;
  close(): Promise<void>;
}

/** Runs fn while holding a lock that every worker of this service shares (behind an external broker, for the files they all write). */
export type SharedLock = <T>(fn: () => Promise<T>) => Promise<T>;

/** How long a worker that lost the broker waits for that broker's process to end before it leaves the gateways in. */
const HOLD_OFF_WAIT_MS = 30_000;

export async function openBrokerLink(config: Config, accept: Accept, log: Logger, sharedLock: SharedLock = (fn) => fn()): Promise<BrokerLink> {
  if (!config.MQTT_URL) {
    const b = await startBrokerThread({
      host: config.MQTT_HOST,
      port: config.MQTT_PORT,
      log,
      checkCredential: async (username, password) => ({ ok: await checkGatewayCredential(username, password) }),
      accept,
      maxUnsettled: config.INGEST_MAX_BACKLOG,
    });
    return {
      kind: 'embedded',
      port: b.port,
      counters: b.counters,
      healthy: b.healthy,
      isConnected: b.isConnected,
      publish: b.publish,
      onReconnect: b.onRestart,
      thread: () => b.thread,
      gatewaysChanged: async (revoked) => {
        if (revoked) b.revoke(revoked);
      },
      close: b.close,
    };
  }
  const password = config.MQTT_SERVICE_PASSWORD!;
  const dir = config.MOSQUITTO_DIR;
  // The gateways are admitted once this worker has subscribed, and held off when the broker it lost has gone
  // (why, and why only then: mosquitto-files.ts). The workers' writes take turns under the shared lock.
  let subscribed = false;
  let writing: Promise<GateWrite | null> = Promise.resolve(null);
  const files = (admitGateways: boolean) => {
    if (!dir) return writing;
    writing = writing
      .then(() =>
        sharedLock(async () => {
          // Decided when the write's turn comes, not when it was asked for: a worker that has lost the broker
          // since (its turn can come late, behind a slow database) must not let the gateways into the file a
          // restarted Mosquitto reads before any worker has subscribed again.
          if (admitGateways && !subscribed) return null;
          return writeMosquittoFiles(dir, config.MQTT_SERVICE_USERNAME, password, { admitGateways, stillAdmit: () => subscribed });
        }),
      )
      .catch((err: Error) => {
        log.error({ err: err.message, admitGateways }, 'Mosquitto password and ACL files not written');
        return null;
      });
    return writing;
  };
  // After a lost connection: hold the gateways off as soon as no broker runs from the directory (the one that
  // was lost may take a moment to exit after closing its sockets), unless this worker has subscribed again.
  let holdingOff = false;
  const holdOffOnceDown = async () => {
    if (holdingOff) return;
    holdingOff = true;
    try {
      for (const since = Date.now(); !subscribed; await new Promise((r) => setTimeout(r, 100))) {
        const done = await files(false);
        if (done === 'heldOff') {
          log.warn('external broker gone: gateways held off in its password file until a worker has subscribed again');
          return;
        }
        if (Date.now() - since > HOLD_OFF_WAIT_MS) {
          log.warn('external broker connection lost but a Mosquitto still runs from its directory: gateways left in its password file');
          return;
        }
      }
    } finally {
      holdingOff = false;
    }
  };
  await files(false);
  const ext = await startExternalIngest({
    url: config.MQTT_URL,
    username: config.MQTT_SERVICE_USERNAME,
    password,
    clientId: `afterwatch-ingest-${config.INGEST_WORKER_ID}`,
    group: 'afterwatch-ingest',
    accept,
    log,
  });
  // Subscribed, but the pid file in MOSQUITTO_DIR names no running Mosquitto: the directory is not the one this
  // broker was started from, and the gateways cannot be let in. Said once per connection.
  const admit = async () => {
    if ((await files(true)) === 'noBrokerRunning' && subscribed) {
      log.error({ dir }, 'subscribed to the external broker, but no Mosquitto runs from MOSQUITTO_DIR (its mosquitto.pid): gateways are not let in; start Mosquitto with the configuration written there');
    }
  };
  subscribed = true;
  await admit();
  ext.onSubscribed(() => {
    subscribed = true;
    void admit();
  });
  ext.onLost(() => {
    if (!subscribed) return;
    subscribed = false;
    if (dir) void holdOffOnceDown();
  });
  return {
    kind: 'external',
    port: 0,
    counters: null,
    healthy: ext.connected,
    isConnected: () => false, // the external broker's connection view is its own
    publish: ext.publish,
    onReconnect: ext.onReconnect,
    thread: () => null,
    gatewaysChanged: async () => {
      if (subscribed) await files(true);
    },
    close: ext.close,
  };
}
