// Behind an external broker: an mqtt.js worker with a persistent shared subscription. Its PUBACK to the
// broker waits for accept() (handleMessage's callback), so the broker keeps what was not committed.
import mqtt, { type MqttClient } from 'mqtt';
import type { Logger } from 'pino';
import { parseTopic } from '../../shared/protocol/topics';
import { TOPIC_ROOT } from '../../shared/protocol/limits';
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
  /** Called at each reconnection to the broker after the first connection (it may have restarted and lost retained messages). */
  onReconnect(fn: () => void): void;
  /** Called each time the worker's subscription is confirmed after a reconnection (the first one is done when this starts). */
  onSubscribed(fn: () => void): void;
  /** Called each time the connection to the broker is lost (and at each failed attempt to reconnect). */
  onLost(fn: () => void): void;
  close(): Promise<void>;
}

export async function startExternalIngest(opts: ExternalIngestOptions): Promise<ExternalIngest> {
  const client = mqtt.connect(opts.url, {
    clientId: opts.clientId, username: opts.username, password: opts.password,
    clean: false, protocolVersion: 4, reconnectPeriod: 1000, connectTimeout: 10_000,
    // Subscribed again below at every connection, whatever the broker says of the session.
    resubscribe: false,
  });
  // The gateways' uplink topics only: the indicators the workers publish are not theirs to ingest.
  const topics = (['telemetry', 'can', 'power', 'status'] as const).map((k) => `$share/${opts.group}/${TOPIC_ROOT}/+/${k}`);
  const subscribe = () => new Promise<void>((res, rej) => client.subscribe(topics, { qos: 1 }, (err) => (err ? rej(err) : res())));
  let connection = 0;
  const reconnectListeners: (() => void)[] = [];
  const subscribedListeners: (() => void)[] = [];
  const lostListeners: (() => void)[] = [];
  client.on('connect', () => {
    if (++connection === 1) return;
    // A restarted Mosquitto (2.0, measured) restores a persistent session and its queue but not its shared
    // subscriptions, and says the session is present, so mqtt.js would not subscribe again: nothing would
    // reach this worker any more. Subscribing to the same filters again replaces them (MQTT 3.1.1, 3.8.4).
    subscribe().then(
      () => {
        opts.log.info({ connection }, 'subscribed again after reconnecting to the external broker');
        for (const fn of subscribedListeners) fn();
      },
      (err: Error) => opts.log.error({ err: err.message }, 'not subscribed again after reconnecting; the next reconnection tries again'),
    );
    for (const fn of reconnectListeners) fn();
  });
  client.on('close', () => {
    for (const fn of lostListeners) fn();
  });
  // mqtt.js handles incoming packets one at a time and sends the PUBACK from handleMessage's callback,
  // so waiting there for the commit would let one message through per batch. Instead the callback is
  // told to skip its PUBACK (it moves on to the next packet) and the PUBACK goes out here after the
  // commit, on the same connection only: after a reconnect the broker redelivers, and the copy is a duplicate.
  // The connection is told by its socket: mqtt.js hands over the publishes that follow a CONNACK before it
  // emits 'connect' (it first resends its own stored packets), so a count kept by 'connect' would file the
  // broker's redeliveries under the connection before and never acknowledge them, and a worker whose in-flight
  // window filled so would receive nothing more (measured behind Mosquitto 2.0, restarted mid-stream).
  const SKIP_ACK = new Error('acknowledged after commit');
  client.handleMessage = (packet, callback) => {
    const topic = packet.topic;
    const parsed = parseTopic(topic);
    const payload = Buffer.isBuffer(packet.payload) ? packet.payload : Buffer.from(packet.payload);
    const gatewayId = parsed?.gatewayId ?? '';
    const qos = packet.qos;
    const messageId = packet.messageId;
    const receivedOn = client.stream;
    if (qos === 1) callback(SKIP_ACK);
    const attempt = (delay: number) => {
      opts.accept(gatewayId, topic, payload).then(
        () => {
          if (qos === 0) return callback();
          if (receivedOn === client.stream && client.connected) {
            (client as unknown as { _sendPacket(p: object, cb: () => void): void })._sendPacket({ cmd: 'puback', messageId }, () => {});
          }
        },
        (err: Error) => {
          // Not committed (the database is away): keep trying; the broker holds the rest meanwhile.
          opts.log.warn({ err: err.message, gatewayId, retryInMs: delay }, 'ingest paused: message not committed');
          if (receivedOn === client.stream) setTimeout(() => attempt(Math.min(delay * 2, 5000)), delay);
        },
      );
    };
    attempt(100);
  };
  // The broker may come up after the service: mqtt.js retries every second; give up after 30 s with the last error.
  await new Promise<void>((res, rej) => {
    let last = 'no answer';
    const onError = (err: Error) => (last = err.message);
    const timer = setTimeout(() => {
      client.off('error', onError);
      client.end(true);
      rej(new Error(`could not reach the external broker at ${opts.url} within 30 s (${last})`));
    }, 30_000);
    client.on('error', onError);
    client.once('connect', () => {
      clearTimeout(timer);
      client.off('error', onError);
      res();
    });
  });
  const topic = topics.join(', ');
  await subscribe();
  client.on('error', (err) => opts.log.warn({ err: err.message }, 'external broker connection error'));
  opts.log.info({ url: opts.url, topic }, 'ingest subscribed on the external broker');
  return {
    client,
    publish: (t, payload, o) => new Promise((res, rej) => client.publish(t, payload, { qos: o.qos, retain: o.retain }, (err) => (err ? rej(err) : res()))),
    connected: () => client.connected,
    onReconnect: (fn) => void reconnectListeners.push(fn),
    onSubscribed: (fn) => void subscribedListeners.push(fn),
    onLost: (fn) => void lostListeners.push(fn),
    close: () => new Promise<void>((res) => client.end(false, {}, () => res())),
  };
}
