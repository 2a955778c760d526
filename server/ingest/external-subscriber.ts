// Behind an external broker: an mqtt.js worker with a persistent shared subscription. Its PUBACK to the
// broker waits for accept() (handleMessage's callback), so the broker keeps what was not committed.
import mqtt, { type MqttClient } from 'mqtt';
import type { Logger } from 'pino';
import { parseTopic, UPLINK_WILDCARD } from '../../shared/protocol/topics';
import type { Accept } from '../../broker/types';

export interface ExternalIngestOptions {
  url: string;
  username: string;
  password: string;
  /** One per worker, stable across restarts, so the broker keeps the worker's session. */
  clientId: string;
  /** Workers with the same group share the gateways' messages ($share). */
  group: string;
  accept: Accept;
  log: Logger;
}

export interface ExternalIngest {
  client: MqttClient;
  publish(topic: string, payload: string, opts: { qos: 0 | 1; retain: boolean }): Promise<void>;
  connected(): boolean;
  close(): Promise<void>;
}

export async function startExternalIngest(opts: ExternalIngestOptions): Promise<ExternalIngest> {
  const client = mqtt.connect(opts.url, {
    clientId: opts.clientId, username: opts.username, password: opts.password,
    clean: false, protocolVersion: 4, reconnectPeriod: 1000, connectTimeout: 10_000,
  });
  // mqtt.js answers a QoS 1 message when this callback is called: only after the commit.
  client.handleMessage = (packet, callback) => {
    const topic = packet.topic;
    const parsed = parseTopic(topic);
    const payload = Buffer.isBuffer(packet.payload) ? packet.payload : Buffer.from(packet.payload);
    const gatewayId = parsed?.gatewayId ?? '';
    const attempt = (delay: number) => {
      opts.accept(gatewayId, topic, payload).then(
        () => callback(),
        (err: Error) => {
          // Not committed (the database is away): keep trying; the broker holds the rest meanwhile.
          opts.log.warn({ err: err.message, gatewayId, retryInMs: delay }, 'ingest paused: message not committed');
          setTimeout(() => attempt(Math.min(delay * 2, 5000)), delay);
        },
      );
    };
    attempt(100);
  };
  await new Promise<void>((res, rej) => {
    client.once('connect', () => res());
    client.once('error', rej);
  });
  const topic = `$share/${opts.group}/${UPLINK_WILDCARD}`;
  await new Promise<void>((res, rej) => client.subscribe(topic, { qos: 1 }, (err) => (err ? rej(err) : res())));
  client.on('error', (err) => opts.log.warn({ err: err.message }, 'external broker connection error'));
  opts.log.info({ url: opts.url, topic }, 'ingest subscribed on the external broker');
  return {
    client,
    publish: (t, payload, o) => new Promise((res, rej) => client.publish(t, payload, { qos: o.qos, retain: o.retain }, (err) => (err ? rej(err) : res()))),
    connected: () => client.connected,
    close: () => new Promise<void>((res) => client.end(false, {}, () => res())),
  };
}
