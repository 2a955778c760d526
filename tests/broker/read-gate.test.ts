// Backpressure across connections: while too many publishes wait for their commit, the broker reads from
// no connection; nothing is lost, and reading starts again once the backlog has fallen.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mqtt from 'mqtt';
import pino from 'pino';
import { createBroker, type BrokerHandle } from '../../broker/create-broker';
import { uplinkTopic } from '../../shared/protocol/topics';
import { until } from '../helpers/until';

const LIMIT = 40;
let broker: BrokerHandle;
let held: (() => void)[] = [];
let accepted = 0;
let peakUnsettled = 0;
let holding = true;

beforeAll(async () => {
  broker = await createBroker({
    host: '127.0.0.1',
    port: 0,
    log: pino({ level: 'silent' }),
    maxUnsettled: LIMIT,
    checkCredential: async () => ({ ok: true }),
    // A commit that takes as long as the test wants: each publish waits until released.
    accept: () =>
      new Promise<void>((resolve) => {
        peakUnsettled = Math.max(peakUnsettled, broker.gate.unsettled);
        const done = () => {
          accepted++;
          resolve();
        };
        if (holding) held.push(done);
        else done();
      }),
  });
});
afterAll(async () => broker?.close());

const connect = (id: string) =>
  new Promise<mqtt.MqttClient>((res, rej) => {
    const c = mqtt.connect(`mqtt://127.0.0.1:${broker.port}`, { clientId: id, username: id, password: 'x', reconnectPeriod: 0, protocolVersion: 4 });
    c.once('connect', () => res(c));
    c.once('error', rej);
  });

describe('the broker stops reading while too many publishes are unsettled', () => {
  it('holds the backlog near the limit across connections, then takes in every message', async () => {
    const clients = await Promise.all(['RG-1', 'RG-2', 'RG-3', 'RG-4'].map(connect));
    const perClient = 150;
    let acked = 0;
    for (const [i, c] of clients.entries()) {
      for (let seq = 0; seq < perClient; seq++) {
        const body = JSON.stringify({ boot: 1, seq, ts: new Date().toISOString(), key: 'on', supplyV: 13.9, ambientC: 2, ecmAwake: true });
        c.publish(uplinkTopic(`RG-${i + 1}`, 'telemetry'), body, { qos: 1 }, (err) => {
          if (!err) acked++;
        });
      }
    }
    // The gate closes at the limit; what was already read from the sockets may still come in, but no more.
    await until(() => broker.gate.isClosed && held.length >= LIMIT, 5000);
    await new Promise((r) => setTimeout(r, 300));
    expect(broker.counters.readPauses).toBeGreaterThanOrEqual(1);
    const whileClosed = held.length;
    expect(whileClosed).toBeLessThan(clients.length * perClient);
    await new Promise((r) => setTimeout(r, 300));
    expect(held.length).toBe(whileClosed); // nothing more was read meanwhile
    expect(acked).toBe(0); // PUBACK waits for the commit

    // Commits go through: reading resumes, and every message arrives and is acknowledged once.
    holding = false;
    for (const done of held.splice(0)) done();
    await until(() => acked === clients.length * perClient, 10_000);
    expect(accepted).toBe(clients.length * perClient);
    expect(broker.gate.unsettled).toBe(0);
    expect(broker.gate.isClosed).toBe(false);
    expect(peakUnsettled).toBeGreaterThanOrEqual(LIMIT);
    await Promise.all(clients.map((c) => new Promise<void>((r) => c.end(true, {}, () => r()))));
  });
});
