// The broker on its own thread: what a gateway sees must not change. PUBACK still waits for the service's
// commit, a refused commit still gets no PUBACK, the bytes arrive as sent, credentials are the service's to
// check, the counters and connections are seen from the service's thread, and a thread that stops is
// started again on the same port, where the gateways reconnect and resend what was not acknowledged.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mqtt from 'mqtt';
import pino from 'pino';
import { startBrokerThread, type ThreadedBrokerHandle } from '../../broker/threaded-broker';
import { indicatorTopic, uplinkTopic } from '../../shared/protocol/topics';
import { until } from '../helpers/until';

const LIMIT = 40;
let broker: ThreadedBrokerHandle;
/** What accept() received, in order. */
const received: { gatewayId: string; topic: string; payload: Buffer }[] = [];
let held: { release(): void; fail(reason: string): void }[] = [];
let holding = false;
const checked: string[] = [];

beforeAll(async () => {
  broker = await startBrokerThread({
    host: '127.0.0.1',
    port: 0,
    log: pino({ level: 'silent' }),
    maxUnsettled: LIMIT,
    checkCredential: async (username, password) => {
      checked.push(username);
      return { ok: password === `secret-of-${username}` };
    },
    accept: (gatewayId, topic, payload) =>
      new Promise<void>((resolve, reject) => {
        received.push({ gatewayId, topic, payload: Buffer.from(payload) });
        if (holding) held.push({ release: resolve, fail: (reason) => reject(new Error(reason)) });
        else resolve();
      }),
  });
});
afterAll(async () => broker?.close());

const connect = (id: string, opts: mqtt.IClientOptions = {}) =>
  new Promise<mqtt.MqttClient>((res, rej) => {
    const c = mqtt.connect(`mqtt://127.0.0.1:${broker.port}`, { clientId: id, username: id, password: `secret-of-${id}`, reconnectPeriod: 0, protocolVersion: 4, ...opts });
    c.once('connect', () => res(c));
    c.once('error', rej);
  });
const end = (c: mqtt.MqttClient) => new Promise<void>((r) => c.end(true, {}, () => r()));
const telemetry = (seq: number) => JSON.stringify({ boot: 1, seq, ts: new Date().toISOString(), key: 'on', supplyV: 13.9, ambientC: 2, ecmAwake: true });

describe('the broker on its own thread', () => {
  it('asks the service to check credentials and refuses a wrong secret, counted where the service reads it', async () => {
    const before = broker.counters.authRefused;
    const err = await connect('TH-1', { password: 'wrong' }).catch((e: Error) => e);
    expect(err).toBeInstanceOf(Error);
    expect(String((err as Error).message)).toMatch(/bad user ?name or password/i);
    expect(checked).toContain('TH-1');
    expect(broker.counters.authRefused).toBe(before + 1);
    expect(JSON.parse(JSON.stringify(broker.counters)).authRefused).toBe(before + 1); // as the metrics route shows it
  });

  it('hands every payload over byte for byte, in each gateway\'s order, batched or not', async () => {
    received.length = 0;
    const c = await connect('TH-2');
    const sent: Buffer[] = [];
    // Sizes from empty to 20 KB, and bytes that are not UTF-8: the batching must not mix or recode them.
    for (let i = 0; i < 300; i++) {
      const b = Buffer.alloc((i * 733) % 20_000);
      for (let j = 0; j < b.length; j++) b[j] = (i * 31 + j * 7) & 0xff;
      sent.push(b);
    }
    await Promise.all(sent.map((b) => c.publishAsync(uplinkTopic('TH-2', 'telemetry'), b, { qos: 1 })));
    expect(received.map((r) => r.gatewayId)).toEqual(sent.map(() => 'TH-2'));
    expect(received.map((r) => r.topic)).toEqual(sent.map(() => uplinkTopic('TH-2', 'telemetry')));
    received.forEach((r, i) => expect(r.payload.equals(sent[i])).toBe(true));
    await end(c);
  });

  it('acknowledges a publish only once the service has settled it, and not at all when the commit failed', async () => {
    holding = true;
    received.length = 0;
    const c = await connect('TH-3');
    let acked = 0;
    const first = c.publishAsync(uplinkTopic('TH-3', 'telemetry'), telemetry(1), { qos: 1 }).then(() => acked++);
    await until(() => held.length === 1);
    await new Promise((r) => setTimeout(r, 200));
    expect(acked).toBe(0);
    held.shift()!.release();
    await first;
    expect(acked).toBe(1);

    const failedBefore = broker.counters.acceptFailed;
    const closed = new Promise<void>((r) => c.once('close', () => r()));
    c.publish(uplinkTopic('TH-3', 'telemetry'), telemetry(2), { qos: 1 }, (err) => {
      if (!err) acked++;
    });
    await until(() => held.length === 1);
    held.shift()!.fail('database unavailable');
    await closed; // not committed: the connection is closed so the gateway resends later
    expect(acked).toBe(1);
    expect(broker.counters.acceptFailed).toBe(failedBefore + 1);
    holding = false;
    c.end(true);
  });

  it('stops reading from every connection while too many publishes are unsettled, and counts the pause', async () => {
    holding = true;
    received.length = 0;
    const pausesBefore = broker.counters.readPauses;
    const clients = await Promise.all(['TH-4', 'TH-5', 'TH-6'].map((id) => connect(id)));
    let acked = 0;
    for (const [i, c] of clients.entries())
      for (let seq = 0; seq < 150; seq++)
        c.publish(uplinkTopic(`TH-${i + 4}`, 'telemetry'), telemetry(seq), { qos: 1 }, (err) => {
          if (!err) acked++;
        });
    await until(() => held.length >= LIMIT && broker.counters.readPauses > pausesBefore, 5000);
    await new Promise((r) => setTimeout(r, 300));
    const whileClosed = held.length;
    expect(whileClosed).toBeLessThan(450);
    await new Promise((r) => setTimeout(r, 300));
    expect(held.length).toBe(whileClosed);
    expect(acked).toBe(0);
    holding = false;
    for (const h of held.splice(0)) h.release();
    // Released ones settle the gate; what comes in from now on is accepted at once.
    const drain = setInterval(() => held.splice(0).forEach((h) => h.release()), 20);
    await until(() => acked === 450, 10_000);
    clearInterval(drain);
    expect(received.length).toBe(450);
    await Promise.all(clients.map(end));
  });

  it('tells the service which gateways are connected', async () => {
    const c = await connect('TH-7');
    await until(() => broker.isConnected('TH-7'));
    await end(c);
    await until(() => !broker.isConnected('TH-7'));
  });

  it('publishes the service\'s retained messages for gateways to receive', async () => {
    const c = await connect('TH-8');
    await c.subscribeAsync(indicatorTopic('TH-8'), { qos: 1 });
    const got = new Promise<string>((r) => c.once('message', (_t, p) => r(p.toString())));
    await broker.publish(indicatorTopic('TH-8'), '{"light":"test"}', { qos: 1, retain: true });
    expect(await got).toBe('{"light":"test"}');
    await end(c);
  });

  it('when the thread stops unasked, starts it again on the same port; the gateway reconnects and its unacknowledged publish arrives', async () => {
    const port = broker.port;
    holding = true;
    received.length = 0;
    const c = mqtt.connect(`mqtt://127.0.0.1:${port}`, { clientId: 'TH-9', username: 'TH-9', password: 'secret-of-TH-9', reconnectPeriod: 200, protocolVersion: 4, clean: false });
    await new Promise<void>((r) => c.once('connect', () => r()));
    const acked = c.publishAsync(uplinkTopic('TH-9', 'telemetry'), telemetry(42), { qos: 1 });
    await until(() => held.length === 1);
    const reconnected = new Promise<void>((r) => c.once('reconnect', () => r()));
    await broker.thread.terminate();
    expect(broker.healthy()).toBe(false);
    held.shift()!.release(); // settles a publish of the stopped thread: dropped, never acknowledged to anyone
    await reconnected;
    await until(() => broker.healthy(), 10_000);
    expect(broker.port).toBe(port);
    holding = false;
    await until(() => held.length === 1 || received.length >= 2, 10_000);
    held.splice(0).forEach((h) => h.release());
    await acked; // mqtt.js resent it after reconnecting, and this time it was committed
    expect(received.map((r) => JSON.parse(r.payload.toString()).seq)).toEqual([42, 42]);
    await end(c);
  });
});
