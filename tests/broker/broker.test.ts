import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mqtt from 'mqtt';
import { startTestService, type TestService } from '../helpers/service';
import { connectGateway, provision } from '../helpers/gateway';
import { indicatorTopic, uplinkTopic } from '../../shared/protocol/topics';

let t: TestService;
let a: { gatewayId: string; secret: string };
let b: { gatewayId: string; secret: string };
beforeAll(async () => {
  t = await startTestService();
  const token = await t.token();
  a = await provision(t.api, token, { id: 'BR-A' });
  b = await provision(t.api, token, { id: 'BR-B' });
});
afterAll(async () => t?.stop());

const closed = (client: mqtt.MqttClient) => new Promise<void>((res) => client.once('close', () => res()));

describe('the embedded broker enforces the protocol', () => {
  it('accepts a gateway with its own id and secret', async () => {
    const gw = await connectGateway(t.mqttUrl, a.gatewayId, a.secret);
    expect(gw.client.connected).toBe(true);
    await gw.end();
  });

  it('refuses a wrong secret with "bad user name or password" and counts it', async () => {
    const before = t.service.broker.counters!.authRefused;
    const err = await connectGateway(t.mqttUrl, a.gatewayId, 'not-the-secret').catch((e) => e);
    expect(err).toBeInstanceOf(Error);
    expect(String(err.message)).toMatch(/Bad username or password|bad user/i);
    expect(t.service.broker.counters!.authRefused).toBe(before + 1);
  });

  it('refuses a client id that differs from the user name', async () => {
    const err = await connectGateway(t.mqttUrl, a.gatewayId, a.secret, { clientId: 'someone-else' }).catch((e) => e);
    expect(err).toBeInstanceOf(Error);
  });

  it('refuses a revoked gateway', async () => {
    const token = await t.token();
    const c = await provision(t.api, token, { id: 'BR-C' });
    await t.api.delete(`/api/gateways/${c.gatewayId}`).set('Authorization', `Bearer ${token}`);
    const err = await connectGateway(t.mqttUrl, c.gatewayId, c.secret).catch((e) => e);
    expect(err).toBeInstanceOf(Error);
  });

  it('closes the connection of a gateway that publishes under another gateway\'s id, and counts it', async () => {
    const gw = await connectGateway(t.mqttUrl, a.gatewayId, a.secret);
    const before = t.service.broker.counters!.publishRefused;
    const wasClosed = closed(gw.client);
    gw.client.publish(uplinkTopic(b.gatewayId, 'telemetry'), JSON.stringify({ boot: 0, seq: 0, ts: '2026-11-27T17:02:11.250Z', key: 'on', supplyV: 12.6, ambientC: 1, ecmAwake: true }), { qos: 1 });
    await wasClosed;
    expect(t.service.broker.counters!.publishRefused).toBe(before + 1);
    await gw.end();
  });

  it('closes the connection of a gateway that publishes over 64 KiB', async () => {
    const gw = await connectGateway(t.mqttUrl, a.gatewayId, a.secret);
    const before = t.service.broker.counters!.oversized;
    const wasClosed = closed(gw.client);
    gw.client.publish(uplinkTopic(a.gatewayId, 'telemetry'), 'x'.repeat(64 * 1024 + 1), { qos: 1 });
    await wasClosed;
    expect(t.service.broker.counters!.oversized).toBe(before + 1);
    await gw.end();
  });

  it('grants a gateway its own indicator topic and refuses another\'s, or a wildcard, with 0x80', async () => {
    const gw = await connectGateway(t.mqttUrl, a.gatewayId, a.secret);
    // mqtt.js reports a refused subscription as an error that carries the SUBACK: read its return code.
    const grant = (topic: string) =>
      new Promise<number>((res) =>
        gw.client.subscribe(topic, { qos: 1 }, (err, granted) => {
          const codes = (err as (Error & { packet?: { granted?: number[] } }) | null)?.packet?.granted;
          res(err ? (codes?.[0] ?? -1) : granted![0].qos);
        }),
      );
    expect(await grant(indicatorTopic(a.gatewayId))).toBe(1);
    const before = t.service.broker.counters!.subscribeRefused;
    expect(await grant(indicatorTopic(b.gatewayId))).toBe(128);
    expect(await grant('afterwatch/v1/gw/+/indicator')).toBe(128);
    expect(await grant('#')).toBe(128);
    expect(t.service.broker.counters!.subscribeRefused).toBe(before + 3);
    await gw.end();
  });
});
