// The service's side of MQTT, embedded or external: one shape for publishing indicators, health and revocation.
import type { Logger } from 'pino';
import type { Config } from './config';
import { startBrokerThread } from '../broker/threaded-broker';
import type { Accept, BrokerCounters } from '../broker/types';
import { checkGatewayCredential } from './modules/gateways/credentials';
import { startExternalIngest } from './ingest/external-subscriber';
import { writeMosquittoFiles } from './modules/gateways/mosquitto-files';

export interface BrokerLink {
  kind: 'embedded' | 'external';
  /** The embedded broker's port (0 behind an external broker). */
  port: number;
  counters: BrokerCounters | null;
  healthy(): boolean;
  isConnected(gatewayId: string): boolean;
  publish(topic: string, payload: string, opts: { qos: 0 | 1; retain: boolean }): Promise<void>;
  /** After a gateway was provisioned or revoked. */
  gatewaysChanged(revokedGatewayId?: string): Promise<void>;
  close(): Promise<void>;
}

export async function openBrokerLink(config: Config, accept: Accept, log: Logger): Promise<BrokerLink> {
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
      gatewaysChanged: async (revoked) => {
        if (revoked) b.revoke(revoked);
      },
      close: b.close,
    };
  }
  const password = config.MQTT_SERVICE_PASSWORD!;
  const files = async () => {
    if (config.MOSQUITTO_DIR) await writeMosquittoFiles(config.MOSQUITTO_DIR, config.MQTT_SERVICE_USERNAME, password);
  };
  await files();
  const ext = await startExternalIngest({
    url: config.MQTT_URL,
    username: config.MQTT_SERVICE_USERNAME,
    password,
    clientId: `afterwatch-ingest-${config.INGEST_WORKER_ID}`,
    group: 'afterwatch-ingest',
    accept,
    log,
  });
  return {
    kind: 'external',
    port: 0,
    counters: null,
    healthy: ext.connected,
    isConnected: () => false, // the external broker's connection view is its own
    publish: ext.publish,
    gatewaysChanged: files,
    close: ext.close,
  };
}
