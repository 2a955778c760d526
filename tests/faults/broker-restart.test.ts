// The broker restarts (the embedded one restarts with the service): gateways reconnect, and the service
// re-publishes every unit's indicator, so a gateway that subscribes again finds its light retained.
import { afterAll, describe, expect, it } from 'vitest';
import mqtt from 'mqtt';
import { createTestDatabase } from '../helpers/test-db';
import { serviceProcess } from '../helpers/service-process';
import { ADMIN } from '../helpers/service';
import { MessageSeq } from '../helpers/messages';
import { until } from '../helpers/until';
import { indicatorTopic, uplinkTopic } from '../../shared/protocol/topics';
import { IndicatorSchema } from '../../shared/protocol/messages';

const cleanups: (() => Promise<void> | void)[] = [];
afterAll(async () => {
  for (const c of cleanups.reverse()) await c();
});

describe('a broker restart', () => {
  it('the gateway reconnects by itself and finds its indicator re-published', async () => {
    const db = await createTestDatabase();
    cleanups.push(db.drop);
    const svc = await serviceProcess(db.url);
    cleanups.push(svc.stop);
    await svc.start();
    const login = await (await fetch(`${svc.url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(ADMIN) })).json();
    const post = (path: string, body: object) =>
      fetch(`${svc.url}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', authorization: `Bearer ${login.token}` }, body: JSON.stringify(body) }).then((r) => r.json());
    await post('/api/units', { id: 'BR-1', name: 'Broker restart', depot: 'North', systemVoltage: 12, purgeSeconds: 600 });
    const { secret } = await post('/api/gateways', { gatewayId: 'gw-BR-1', unitId: 'BR-1' });
    // A gateway as the protocol describes it: persistent session, reconnecting on its own.
    const client = mqtt.connect(svc.mqttUrl, { clientId: 'gw-BR-1', username: 'gw-BR-1', password: secret, clean: false, reconnectPeriod: 200, protocolVersion: 4 });
    cleanups.push(() => void client.end(true));
    const lights: string[] = [];
    let connects = 0;
    client.on('connect', () => {
      connects++;
      client.subscribe(indicatorTopic('gw-BR-1'), { qos: 1 });
    });
    client.on('error', () => {}); // refused while the service is down: mqtt.js keeps retrying
    client.on('message', (_t, payload) => lights.push(IndicatorSchema.parse(JSON.parse(payload.toString())).state));
    await until(() => connects === 1);
    const m = new MessageSeq(1);
    const t0 = Date.now() - 1000;
    const pub = (kind: 'telemetry', body: object) => new Promise<void>((res, rej) => client.publish(uplinkTopic('gw-BR-1', kind), JSON.stringify(body), { qos: 1 }, (e) => (e ? rej(e) : res())));
    await pub('telemetry', m.telemetry(t0, 'on', 13.9));
    await pub('telemetry', m.telemetry(t0 + 500, 'off', 12.6));
    await until(() => lights.includes('hold'));
    await svc.kill9();
    const before = lights.length;
    await svc.start();
    await until(() => connects >= 2, 15_000);
    // The purge is still running (600 s): the re-published light is hold again.
    await until(() => lights.length > before, 15_000);
    expect(lights.slice(before)).toContain('hold');
  }, 90_000);
});
