import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBroker, type BrokerHandle } from '../../broker/create-broker';
import { Sender } from '../../simulator/net/sender';
import { generateScenario } from '../../simulator/scenario/generate';

// The sender against the project's real broker: a dropped connection is retried with back-off and
// nothing the gateway sent is lost (QoS 1 resends what was not acknowledged).
let broker: BrokerHandle;
const secrets = new Map<string, string>();
const received = new Set<string>();
let acceptedCount = 0;

beforeAll(async () => {
  broker = await createBroker({
    host: '127.0.0.1', port: 0, log: pino({ level: 'silent' }),
    checkCredential: async (user, password) => ({ ok: secrets.get(user) === password }),
    accept: async (gatewayId, topic, payload) => {
      acceptedCount++;
      received.add(`${gatewayId} ${topic} ${payload.toString()}`);
    },
  });
});
afterAll(() => broker?.close());

describe('the MQTT sender', () => {
  it('reconnects after the broker drops its gateways and delivers every message at least once', async () => {
    const run = generateScenario({ scenario: 'weekday', units: 3, seed: 'drops' });
    for (const u of run.truth.fleet) secrets.set(u.gatewayId, `secret-of-${u.gatewayId}`);
    const sender = new Sender({ mqttUrl: `mqtt://127.0.0.1:${broker.port}`, secrets, speed: 'max', simStart: Date.parse(run.truth.start), seed: 'drops', perClientInFlight: 8, totalInFlight: 16 });
    const total = run.timeline.filter((e) => e.kind === 'publish').length;
    let dropped = 0;
    const dropper = setInterval(() => {
      if (sender.stats.acked > total * 0.3 && dropped < 2) {
        dropped++;
        // revoke() forgets the cached credential and closes the connection, as after a revocation.
        for (const u of run.truth.fleet) if (broker.isConnected(u.gatewayId)) broker.revoke(u.gatewayId);
      }
    }, 20);
    try {
      await sender.dispatch(run.timeline);
      await sender.drain();
    } finally {
      clearInterval(dropper);
      await sender.close();
    }
    expect(dropped).toBeGreaterThan(0);
    expect(sender.stats.reconnects).toBeGreaterThan(0);
    expect(sender.stats.errors).toBe(0);
    const sent = run.timeline.flatMap((e) => (e.kind === 'publish' ? [`${e.gatewayId} ${e.topic} ${JSON.stringify(e.payload)}`] : []));
    for (const s of sent) expect(received.has(s), s).toBe(true);
    expect(acceptedCount).toBeGreaterThanOrEqual(new Set(sent).size);
  }, 60_000);

  it('retries a gateway the broker refuses, and stops with a clear error once the refusals have lasted too long', async () => {
    const run = generateScenario({ scenario: 'weekday', units: 1, seed: 'refused' });
    const sender = new Sender({ mqttUrl: `mqtt://127.0.0.1:${broker.port}`, secrets: new Map([[run.truth.fleet[0].gatewayId, 'wrong']]), speed: 'max', simStart: 0, seed: 'x', refusedGiveUpMs: 2000 });
    const began = Date.now();
    await expect((async () => {
      await sender.dispatch(run.timeline);
      await sender.drain();
    })()).rejects.toThrow(/refused its credentials for 2 s/);
    expect(Date.now() - began).toBeGreaterThanOrEqual(2000);
    expect(sender.stats.reconnects).toBeGreaterThan(1);
    await sender.close();
  }, 30_000);
});
