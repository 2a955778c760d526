// The live feed, the indicator, alerts and the switch page, through real ws, mqtt.js and HTTP clients.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../../helpers/service';
import { connectGateway, provision, type TestGateway } from '../../helpers/gateway';
import { MessageSeq } from '../../helpers/messages';
import { openLive } from '../../helpers/live-client';
import { until } from '../../helpers/until';
import { indicatorTopic } from '../../../shared/protocol/topics';
import { IndicatorSchema } from '../../../shared/protocol/messages';

let t: TestService;
let admin: string;
let monitor: string;
let technician: string;
const wsUrl = (q: string) => `${t.url.replace('http', 'ws')}/api/live?${q}`;

beforeAll(async () => {
  t = await startTestService();
  admin = await t.token();
  for (const role of ['monitor', 'technician']) {
    await t.api.post('/api/users').set('Authorization', `Bearer ${admin}`).send({ email: `${role}@test.local`, name: role, role, password: `${role}-password-1` });
  }
  monitor = await t.token('monitor@test.local', 'monitor-password-1');
  technician = await t.token('technician@test.local', 'technician-password-1');
});
afterAll(async () => t?.stop());

function indicatorInbox(gw: TestGateway) {
  const got: ReturnType<typeof IndicatorSchema.parse>[] = [];
  gw.client.on('message', (_topic, payload) => got.push(IndicatorSchema.parse(JSON.parse(payload.toString()))));
  return got;
}

describe('live feed and indicator', () => {
  it('refuses a socket without a valid token', async () => {
    await expect(openLive(wsUrl('token=nonsense'))).rejects.toThrow(/401/);
  });

  it('a board sees purging then safe to isolate, and the gateway\'s light goes hold then clear', async () => {
    const g = await provision(t.api, admin, { id: 'LV-1', purgeSeconds: 60 });
    const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
    await new Promise<void>((res, rej) => gw.client.subscribe(indicatorTopic(g.gatewayId), { qos: 1 }, (e) => (e ? rej(e) : res())));
    const lights = indicatorInbox(gw);
    const board = await openLive(wsUrl(`token=${admin}`));
    await board.waitFor((m) => m.type === 'hello');
    const m = new MessageSeq(1);
    const t0 = Date.now() - 1000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
    const sentAt = Date.now();
    await gw.publish('telemetry', m.telemetry(t0 + 500, 'off', 12.6));
    const purging = await board.waitFor((x) => x.type === 'units' && x.units.some((u) => u.id === 'LV-1' && u.state === 'purging'));
    // The protocol's budget is one second from the gateway's message to every open board.
    expect(Date.now() - sentAt).toBeLessThan(1000);
    expect(purging.type === 'units' && purging.units.find((u) => u.id === 'LV-1')!.purgeRemainingS).toBeGreaterThan(55);
    const hold = await until(() => lights.find((l) => l.state === 'hold'));
    expect(hold).toMatchObject({ state: 'hold', remainingS: expect.any(Number) });
    expect((hold as { remainingS: number }).remainingS).toBeGreaterThan(55);
    // The controller goes to sleep: the purge is complete.
    await gw.publish('telemetry', m.telemetry(t0 + 30_000, 'off', 12.5, { ecmAwake: false }));
    await board.waitFor((x) => x.type === 'units' && x.units.some((u) => u.id === 'LV-1' && u.state === 'safeToIsolate'));
    await until(() => lights.find((l) => l.state === 'clear'));
    expect(lights.map((l) => l.state)).toEqual(['dark', 'hold', 'clear']);
    board.close();
    await gw.end();
  });

  it('a replacement gateway finds the current light retained on its own topic, and the replaced one is refused', async () => {
    const old = (await t.api.get('/api/units/LV-1').set('Authorization', `Bearer ${admin}`)).body.gatewayId as string;
    const fresh = await t.api.post('/api/gateways').set('Authorization', `Bearer ${admin}`).send({ gatewayId: 'gw-LV-1b', unitId: 'LV-1' });
    const gw = await connectGateway(t.mqttUrl, 'gw-LV-1b', fresh.body.secret);
    const lights = indicatorInbox(gw);
    await new Promise<void>((res, rej) => gw.client.subscribe(indicatorTopic('gw-LV-1b'), { qos: 1 }, (e) => (e ? rej(e) : res())));
    await until(() => lights.find((l) => l.state === 'clear'));
    await gw.end();
    await expect(connectGateway(t.mqttUrl, old, 'whatever-it-was')).rejects.toThrow();
  });
});

describe('alerts', () => {
  it('an interrupted purge raises an alert on the feed; a monitor acknowledges it, a technician may not', async () => {
    const g = await provision(t.api, admin, { id: 'AL-1' });
    const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
    const board = await openLive(wsUrl(`token=${monitor}`));
    const m = new MessageSeq(4);
    const t0 = Date.now() - 60_000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9, { ambientC: -14 }));
    await gw.publish('telemetry', m.telemetry(t0 + 1000, 'off', 12.6, { ambientC: -14 }));
    await gw.publish('power', m.power(t0 + 13_000, 'supply-lost', 1.2));
    const pushed = await board.waitFor((x) => x.type === 'alert' && x.alert.unitId === 'AL-1');
    expect(pushed.type === 'alert' && pushed.alert).toMatchObject({ kind: 'interruptedPurge', status: 'open', secondsIntoPurge: 12, ambientC: -14, freezeExposure: 'frozen' });
    const [alert] = (await t.api.get('/api/alerts?status=open&unitId=AL-1').set('Authorization', `Bearer ${monitor}`)).body;
    expect(alert.kind).toBe('interruptedPurge');
    const denied = await t.api.post(`/api/alerts/${alert.id}/acknowledge`).set('Authorization', `Bearer ${technician}`).send({});
    expect(denied.status).toBe(403);
    const ack = await t.api.post(`/api/alerts/${alert.id}/acknowledge`).set('Authorization', `Bearer ${monitor}`).send({ comment: 'Driver called back' });
    expect(ack.body).toMatchObject({ status: 'acknowledged', acknowledgedBy: 'monitor@test.local', comment: 'Driver called back' });
    expect((await t.api.post(`/api/alerts/${alert.id}/acknowledge`).set('Authorization', `Bearer ${monitor}`).send({})).status).toBe(409);
    const done = await t.api.post(`/api/alerts/${alert.id}/resolve`).set('Authorization', `Bearer ${monitor}`).send({ comment: 'Purge rerun, safe to isolate' });
    expect(done.body).toMatchObject({ status: 'resolved', resolvedBy: 'monitor@test.local' });
    const audit = (await t.api.get('/api/audit').set('Authorization', `Bearer ${admin}`)).body.map((a: { action: string }) => a.action);
    expect(audit).toEqual(expect.arrayContaining(['alert.acknowledge', 'alert.resolve']));
    board.close();
    await gw.end();
  });
});

describe('switch page', () => {
  it('shows one unit\'s hold or clear without sign-in, live, until an admin revokes it', async () => {
    const g = await provision(t.api, admin, { id: 'SW-1', purgeSeconds: 90 });
    const issued = await t.api.post('/api/switch-pages/SW-1').set('Authorization', `Bearer ${admin}`);
    expect(issued.status).toBe(201);
    expect(issued.body.path).toMatch(/^\/switch\/[A-Za-z0-9_-]{32}$/);
    expect((await t.api.post('/api/switch-pages/SW-1').set('Authorization', `Bearer ${monitor}`)).status).toBe(403);
    const token = issued.body.token as string;
    const first = await t.api.get(`/api/switch/${token}`);
    expect(first.body.unit).toMatchObject({ id: 'SW-1', purgeSeconds: 90 });
    expect(first.body.indicator.state).toBe('unknown');
    const page = await openLive(wsUrl(`switch=${token}`));
    const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
    const m = new MessageSeq(0);
    const t0 = Date.now() - 2000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
    await gw.publish('telemetry', m.telemetry(t0 + 1000, 'off', 12.6));
    await page.waitFor((x) => x.type === 'switch' && x.indicator.state === 'hold' && (x.indicator.remainingS ?? 0) > 80);
    await gw.publish('telemetry', m.telemetry(t0 + 20_000, 'off', 12.5, { ecmAwake: false }));
    await page.waitFor((x) => x.type === 'switch' && x.indicator.state === 'clear');
    // The page sees nothing of other units.
    expect(page.messages.every((x) => x.type === 'hello' || (x.type === 'switch' && x.unitId === 'SW-1'))).toBe(true);
    const sheet = await t.api.get('/api/switch-pages').set('Authorization', `Bearer ${admin}`);
    expect(sheet.body[0]).toMatchObject({ unitId: 'SW-1', url: expect.stringContaining(`/switch/${token}`), qrSvg: expect.stringContaining('<svg') });
    const closed = new Promise<number>((res) => page.ws.once('close', (code) => res(code)));
    expect((await t.api.delete('/api/switch-pages/SW-1').set('Authorization', `Bearer ${admin}`)).status).toBe(204);
    expect(await closed).toBe(4003);
    expect((await t.api.get(`/api/switch/${token}`)).status).toBe(404);
    await expect(openLive(wsUrl(`switch=${token}`))).rejects.toThrow(/403/);
    await gw.end();
  });
});
