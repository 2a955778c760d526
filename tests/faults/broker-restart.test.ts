// The broker restarts (with the service, or its thread alone): gateways reconnect, and the service
// re-publishes every unit's indicator, so a gateway that subscribes again finds its light retained.
import { afterAll, describe, expect, it } from 'vitest';
import { createTestDatabase } from '../helpers/test-db';
import { serviceProcess } from '../helpers/service-process';
import { ADMIN, startTestService } from '../helpers/service';
import { provision, watchLight } from '../helpers/gateway';
import { MessageSeq } from '../helpers/messages';
import { until } from '../helpers/until';

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
    const gw = watchLight(svc.mqttUrl, 'gw-BR-1', secret);
    cleanups.push(gw.end);
    const { lights } = gw;
    await until(() => gw.connects() === 1);
    const m = new MessageSeq(1);
    const t0 = Date.now() - 1000;
    await gw.telemetry(m.telemetry(t0, 'on', 13.9));
    await gw.telemetry(m.telemetry(t0 + 500, 'off', 12.6));
    await until(() => lights.includes('hold'));
    await svc.kill9();
    const before = lights.length;
    await svc.start();
    await until(() => gw.connects() >= 2, 15_000);
    // The purge is still running (600 s): the re-published light is hold again.
    await until(() => lights.length > before, 15_000);
    expect(lights.slice(before)).toContain('hold');
  }, 90_000);

  it('when the broker\'s thread stops alone and starts again, its retained lights are gone with it and the service publishes them again', async () => {
    const t = await startTestService();
    cleanups.push(t.stop);
    const token = await t.token();
    const purging = await provision(t.api, token, { id: 'BT-1', purgeSeconds: 600 });
    const safe = await provision(t.api, token, { id: 'BT-2', purgeSeconds: 10 });
    const [held, cleared] = [purging, safe].map(({ gatewayId, secret }) => {
      const gw = watchLight(t.mqttUrl, gatewayId, secret);
      cleanups.push(gw.end);
      return gw;
    });
    await until(() => held.connects() === 1 && cleared.connects() === 1);
    const t0 = Date.now() - 60_000;
    const m1 = new MessageSeq(1);
    await held.telemetry(m1.telemetry(Date.now() - 1000, 'on', 13.9));
    await held.telemetry(m1.telemetry(Date.now() - 500, 'off', 12.6));
    // The second unit's purge was held to its end a minute ago: safe to isolate.
    const m2 = new MessageSeq(1);
    await cleared.telemetry(m2.telemetry(t0, 'on', 13.9));
    await cleared.telemetry(m2.telemetry(t0 + 1000, 'off', 12.6));
    await cleared.telemetry(m2.telemetry(t0 + 12_000, 'off', 12.5));
    await until(() => held.lights.includes('hold') && cleared.lights.includes('clear'));

    const [heldBefore, clearedBefore] = [held.lights.length, cleared.lights.length];
    await t.service.broker.thread()!.terminate();
    await until(() => held.connects() >= 2 && cleared.connects() >= 2, 15_000);
    await until(() => held.lights.length > heldBefore && cleared.lights.length > clearedBefore, 15_000);
    // (Once, or twice where the gateway subscribed again just as the light went out: the same light either way.)
    expect(new Set(held.lights.slice(heldBefore))).toEqual(new Set(['hold']));
    expect(new Set(cleared.lights.slice(clearedBefore))).toEqual(new Set(['clear']));
    expect((await t.api.get('/api/health')).body).toMatchObject({ status: 'ok', broker: 'ok' });
  }, 60_000);
});
