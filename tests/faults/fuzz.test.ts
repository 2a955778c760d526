// 100,000 malformed or hostile payloads through the real broker, beside good traffic: no crash, each one
// refused with a reason and counted, and the good unit still judged correctly.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mqtt from 'mqtt';
import { QueryTypes } from 'sequelize';
import { startTestService, type TestService } from '../helpers/service';
import { connectGateway, provision } from '../helpers/gateway';
import { MessageSeq } from '../helpers/messages';
import { uplinkTopic } from '../../shared/protocol/topics';
import { rng } from '../helpers/rng';

const TS = '2026-11-27T17:02:11.250Z';
type Maker = (r: () => number, i: number) => { kind: 'telemetry' | 'can' | 'power'; body: Buffer | string };
const MAKERS: Maker[] = [
  (r) => ({ kind: 'telemetry', body: Buffer.from(Array.from({ length: 1 + Math.floor(r() * 200) }, () => Math.floor(r() * 256))) }),
  (_r, i) => ({ kind: 'telemetry', body: JSON.stringify({ boot: 'one', seq: i, ts: TS, key: 'on', supplyV: 12, ecmAwake: true }) }),
  (_r, i) => ({ kind: 'telemetry', body: JSON.stringify({ boot: 1, seq: i, ts: TS, key: 'on', supplyV: '12.6', ecmAwake: 'yes' }) }),
  (_r, i) => ({ kind: 'telemetry', body: `{"boot": 1e400, "seq": ${i}, "ts": "${TS}", "key": "on", "supplyV": 1e308, "ecmAwake": true}` }),
  (_r, i) => ({ kind: 'telemetry', body: JSON.stringify({ boot: -1, seq: i + 0.5, ts: TS, key: 'on', supplyV: 12, ecmAwake: true }) }),
  (r) => ({ kind: 'telemetry', body: '['.repeat(2000 + Math.floor(r() * 3000)) + ']'.repeat(2000) }),
  (_r, i) => ({ kind: 'telemetry', body: JSON.stringify({ boot: 1, seq: i, ts: '2026-02-30T25:61:00.000Z', key: 'on', supplyV: 12, ecmAwake: true }) }),
  (_r, i) => ({ kind: 'can', body: JSON.stringify({ boot: 1, seq: i, ts: TS, frames: [{ t: TS, id: 'XYZ12345', data: 'GG' }] }) }),
  (_r, i) => ({ kind: 'can', body: JSON.stringify({ boot: 1, seq: i, ts: TS, frames: [{ t: TS, id: '18FECA00', data: '0102030405060708090A' }] }) }),
  (_r, i) => ({ kind: 'can', body: JSON.stringify({ boot: 1, seq: i, ts: TS, frames: Array.from({ length: 201 }, () => ({ t: TS, id: '18FECA00', data: '00' })) }) }),
  (_r, i) => ({ kind: 'power', body: JSON.stringify({ boot: 1, seq: i, ts: TS, event: 'explode', supplyV: 12 }) }),
  (_r, i) => ({ kind: 'power', body: JSON.stringify({ boot: 1, seq: i, ts: TS, event: 'boot', supplyV: 12, prevShutdown: { ts: 'never', cause: 'aliens' } }) }),
  () => ({ kind: 'telemetry', body: '"just a string"' }),
  () => ({ kind: 'telemetry', body: 'null' }),
  () => ({ kind: 'telemetry', body: Buffer.from([0xc3, 0x28, 0x7b, 0x7d]) }),
  () => ({ kind: 'telemetry', body: '' }),
];

let t: TestService;
beforeAll(async () => {
  t = await startTestService({ INGEST_BATCH_MAX: '5000' });
});
afterAll(async () => t?.stop());

describe('hostile input', () => {
  it('refuses 100,000 bad payloads with reasons while a good unit beside them is judged correctly', async () => {
    const token = await t.token();
    const bad = await Promise.all([0, 1, 2, 3].map((i) => provision(t.api, token, { id: `FZ-${i}` })));
    const good = await provision(t.api, token, { id: 'FZ-GOOD' });
    const clients = await Promise.all(bad.map((g) => connectGateway(t.mqttUrl, g.gatewayId, g.secret)));
    const goodGw = await connectGateway(t.mqttUrl, good.gatewayId, good.secret);
    const r = rng(20261202);
    const TOTAL = 100_000;
    const before = t.service.ingest.counters.quarantined;

    // Good traffic in the middle of it: a purge interrupted 25 s in.
    const m = new MessageSeq(9);
    const t0 = Date.now() - 600_000;
    const goodTraffic = (async () => {
      await goodGw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
      await goodGw.publish('telemetry', m.telemetry(t0 + 1000, 'off', 12.6));
      for (let s = 5; s <= 20; s += 5) await goodGw.publish('telemetry', m.telemetry(t0 + 1000 + s * 1000, 'off', 12.5));
      await goodGw.publish('power', m.power(t0 + 26_000, 'supply-lost', 0.8));
    })();

    const WINDOW = 400;
    let sent = 0;
    for (; sent < TOTAL; sent += WINDOW * clients.length) {
      await Promise.all(
        clients.map((c, ci) =>
          Promise.all(
            Array.from({ length: WINDOW }, (_, k) => {
              const made = MAKERS[Math.floor(r() * MAKERS.length)](r, sent + ci * WINDOW + k);
              return c.publish(made.kind, made.body);
            }),
          ),
        ),
      );
    }
    await goodTraffic;
    // Every bad payload sent (whole windows: a little over TOTAL) is quarantined: none slipped through as a message.
    expect(sent).toBeGreaterThanOrEqual(TOTAL);
    const quarantined = t.service.ingest.counters.quarantined - before;
    expect(quarantined).toBe(sent);
    const [q] = await t.service.ctx.sequelize.query<{ n: string; reasons: string }>(
      `SELECT count(*) n, count(DISTINCT split_part(reason, ':', 1)) reasons FROM quarantine WHERE gateway_id LIKE 'gw-FZ-%'`,
      { type: QueryTypes.SELECT },
    );
    expect(Number(q.n)).toBe(sent);
    const [stored] = await t.service.ctx.sequelize.query<{ n: string }>(
      `SELECT count(*) n FROM messages WHERE gateway_id LIKE 'gw-FZ-%' AND gateway_id <> $1`,
      { type: QueryTypes.SELECT, bind: [good.gatewayId] },
    );
    expect(Number(stored.n)).toBe(0);
    expect(Number(q.reasons)).toBeGreaterThan(5);
    const [noReason] = await t.service.ctx.sequelize.query<{ n: string }>(`SELECT count(*) n FROM quarantine WHERE reason = ''`, { type: QueryTypes.SELECT });
    expect(Number(noReason.n)).toBe(0);
    expect(Object.keys(t.service.ingest.counters.quarantinedByReason).length).toBeGreaterThan(5);

    // Publishing outside its own topics closes a gateway's connection and is counted; the service carries on.
    const refusedBefore = t.service.broker.counters!.publishRefused;
    for (let i = 0; i < 20; i++) {
      const c = mqtt.connect(t.mqttUrl, { clientId: bad[0].gatewayId, username: bad[0].gatewayId, password: bad[0].secret, reconnectPeriod: 0 });
      await new Promise<void>((res) => c.once('connect', () => res()));
      const closed = new Promise<void>((res) => c.once('close', () => res()));
      c.publish(i % 2 ? 'afterwatch/v1/gw/FZ-GOOD/telemetry' : `afterwatch/v1/gw/${bad[0].gatewayId}/indicator`, '{}', { qos: 1 });
      await closed;
      c.end(true);
    }
    expect(t.service.broker.counters!.publishRefused - refusedBefore).toBe(20);

    const health = await t.api.get('/api/health');
    expect(health.body.status).toBe('ok');
    const [episode] = (await t.api.get('/api/episodes?unitId=FZ-GOOD').set('Authorization', `Bearer ${token}`)).body;
    expect(episode).toMatchObject({ outcome: 'interrupted', settledBy: 'supplyLost', secondsIntoPurge: 25 });
    expect((await t.api.get('/api/episodes?unitId=FZ-0').set('Authorization', `Bearer ${token}`)).body).toEqual([]);
    await Promise.all([...clients, goodGw].map((c) => c.end()));
  }, 240_000);
});
