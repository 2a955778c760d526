// Real mqtt.js gateways -> the real broker -> PostgreSQL -> the episodes, faults and units API.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestService, type TestService } from '../../helpers/service';
import { connectGateway, provision, type TestGateway } from '../../helpers/gateway';
import { MessageSeq } from '../../helpers/messages';
import { encodeDm1 } from '../../../shared/j1939/dm1';
import { bytesToHex } from '../../../shared/j1939/hex';
import { encodeCanId } from '../../../shared/j1939/can-id';

let t: TestService;
let token: string;
const get = async (path: string) => (await t.api.get(path).set('Authorization', `Bearer ${token}`)).body;

beforeAll(async () => {
  t = await startTestService();
  token = await t.token();
});
afterAll(async () => t?.stop());

async function gatewayFor(id: string, opts: { systemVoltage?: 12 | 24 } = {}): Promise<TestGateway> {
  const g = await provision(t.api, token, { id, ...opts });
  return connectGateway(t.mqttUrl, g.gatewayId, g.secret);
}

describe('ingest and judgement through the real broker', () => {
  it('when a gateway loses supply 38 s into the purge, the episode is interrupted and the unit shows it', async () => {
    const gw = await gatewayFor('IN-1');
    const m = new MessageSeq(3);
    const t0 = Date.now() - 120_000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
    await gw.publish('telemetry', m.telemetry(t0 + 5_000, 'off', 12.6)); // key-off
    await gw.publish('telemetry', m.telemetry(t0 + 10_000, 'off', 12.5));
    await gw.publish('power', m.power(t0 + 5_000 + 38_250, 'supply-lost', 2.1));
    const [episode] = await get('/api/episodes?unitId=IN-1');
    expect(episode).toMatchObject({ unitId: 'IN-1', outcome: 'interrupted', settledBy: 'supplyLost', secondsIntoPurge: 38.25, purgeSeconds: 120, ambientC: -4 });
    expect(episode.keyOffAt).toBe(new Date(t0 + 5_000).toISOString());
    expect(episode.endedAt).toBe(new Date(t0 + 43_250).toISOString());
    const unit = await get('/api/units/IN-1');
    expect(unit).toMatchObject({ state: 'interrupted', stateSince: new Date(t0 + 43_250).toISOString(), gatewayId: 'gw-IN-1' });
    await gw.end();
  });

  it('a purge held to its end completes with powerHeld; the unit is safe to isolate with its last readings', async () => {
    const gw = await gatewayFor('IN-2', { systemVoltage: 24 });
    const m = new MessageSeq(0);
    const t0 = Date.now() - 200_000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 27.9));
    await gw.publish('telemetry', m.telemetry(t0 + 1_000, 'off', 25.4));
    for (let s = 5; s <= 125; s += 5) await gw.publish('telemetry', m.telemetry(t0 + 1_000 + s * 1000, 'off', 25.3, { ambientC: -12.5 }));
    const [episode] = await get('/api/episodes?unitId=IN-2');
    expect(episode).toMatchObject({ outcome: 'completed', settledBy: 'powerHeld', secondsIntoPurge: null, endedAt: new Date(t0 + 121_000).toISOString() });
    const unit = await get('/api/units/IN-2');
    expect(unit).toMatchObject({ state: 'safeToIsolate', lastSupplyV: 25.3, lastAmbientC: -12.5, systemVoltage: 24 });
    await gw.end();
  });

  it('a redelivered message changes nothing, and a bad payload is quarantined without blocking the next good one', async () => {
    const gw = await gatewayFor('IN-3');
    const m = new MessageSeq(1);
    const t0 = Date.now() - 60_000;
    const on = m.telemetry(t0, 'on', 13.8);
    const off = m.telemetry(t0 + 2_000, 'off', 12.6);
    await gw.publish('telemetry', on);
    await gw.publish('telemetry', off);
    const dupBefore = t.service.ingest.counters.duplicates;
    await gw.publish('telemetry', off);
    await gw.publish('telemetry', { ...off, supplyV: 1.0 }); // same (boot, seq): the first copy wins
    expect(t.service.ingest.counters.duplicates).toBe(dupBefore + 2);
    const qBefore = t.service.ingest.counters.quarantined;
    await gw.publish('telemetry', '{"boot": 1, "seq": 99, "ts": "yesterday"');
    await gw.publish('telemetry', { boot: 1, seq: 100, ts: '2026-11-27T17:02:11.250Z', key: 'sideways', supplyV: 12, ecmAwake: true });
    expect(t.service.ingest.counters.quarantined).toBe(qBefore + 2);
    expect(gw.client.connected).toBe(true);
    await gw.publish('telemetry', m.telemetry(t0 + 2_000 + 60_000, 'off', 12.5, { ecmAwake: false }));
    const episodes = await get('/api/episodes?unitId=IN-3');
    expect(episodes).toHaveLength(1);
    expect(episodes[0]).toMatchObject({ outcome: 'completed', settledBy: 'ecmAsleep' });
    const [q] = await t.service.ctx.sequelize.query<{ reason: string; excerpt: string; topic: string }>(`SELECT gateway_id, topic, reason, excerpt FROM quarantine WHERE gateway_id = 'gw-IN-3' ORDER BY id`, { type: QueryTypes.SELECT });
    expect(q.reason).toMatch(/not JSON/);
    expect(q.topic).toBe('afterwatch/v1/gw/gw-IN-3/telemetry');
    expect(q.excerpt).toContain('yesterday');
    await gw.end();
  });

  it('in one burst, new messages, copies of each other and copies of stored ones: each new one counted and judged once', async () => {
    const gw = await gatewayFor('IN-3B');
    const m = new MessageSeq(1);
    const t0 = Date.now() - 60_000;
    const on = m.telemetry(t0, 'on', 13.8);
    await gw.publish('telemetry', on);
    const acc0 = t.service.ingest.counters.accepted;
    const dup0 = t.service.ingest.counters.duplicates;
    const off = m.telemetry(t0 + 2_000, 'off', 12.6);
    const later = m.telemetry(t0 + 2_000 + 60_000, 'off', 12.5, { ecmAwake: false });
    // Sent together, so that they share a batch: 2 new, 3 copies (of `on`, stored before, and of the new ones).
    await Promise.all([off, on, off, later, later].map((msg) => gw.publish('telemetry', msg)));
    expect(t.service.ingest.counters.accepted - acc0).toBe(2);
    expect(t.service.ingest.counters.duplicates - dup0).toBe(3);
    const [n] = await t.service.ctx.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM messages WHERE gateway_id = 'gw-IN-3B'`, { type: QueryTypes.SELECT });
    expect(Number(n.n)).toBe(3);
    const episodes = await get('/api/episodes?unitId=IN-3B');
    expect(episodes).toHaveLength(1);
    expect(episodes[0]).toMatchObject({ outcome: 'completed', settledBy: 'ecmAsleep' });
    await gw.end();
  });

  it('a silent purge is settled by the next boot\'s record, and the fault at the next key-on is linked to it', async () => {
    const gw = await gatewayFor('IN-4');
    const m = new MessageSeq(7);
    const t0 = Date.now() - 30 * 60_000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
    await gw.publish('telemetry', m.telemetry(t0 + 1_000, 'off', 12.6));
    // Nothing more from boot 7. Boot 8 reports how boot 7 ended: supply lost 20 s into the purge.
    m.nextBoot();
    const restart = Date.now() - 60_000;
    await gw.publish('power', m.power(restart, 'boot', 12.4, { ts: t0 + 21_000, cause: 'supply-lost' }));
    await gw.publish('telemetry', m.telemetry(restart + 1_000, 'on', 12.3));
    // SAE J1939-73 DM1 layout: amber lamp on, one DTC (SPN 5246, FMI 5, OC 1) from source address 0x00.
    const dm1 = bytesToHex(encodeDm1({ lamps: { mil: 'off', redStop: 'off', amberWarning: 'on', protect: 'off' }, dtcs: [{ spn: 5246, fmi: 5, occurrenceCount: 1 }] }));
    const id = encodeCanId({ priority: 6, pgn: 65226, sourceAddress: 0 });
    await gw.publish('can', m.can(restart + 3_000, [{ t: restart + 2_500, id, data: dm1 }]));
    const [episode] = await get('/api/episodes?unitId=IN-4');
    expect(episode).toMatchObject({ outcome: 'interrupted', settledBy: 'bootRecord', secondsIntoPurge: 20, endedAt: new Date(t0 + 21_000).toISOString() });
    const faults = await get('/api/faults?unitId=IN-4');
    expect(faults).toEqual([
      expect.objectContaining({ unitId: 'IN-4', at: new Date(restart + 2_500).toISOString(), sourceAddress: 0, spn: 5246, fmi: 5, occurrenceCount: 1, episodeId: episode.id,
        lamps: { mil: 'off', redStop: 'off', amberWarning: 'on', protect: 'off' } }),
    ]);
    expect((await get('/api/units/IN-4')).state).toBe('keyOn');
    await gw.end();
  });

  it('filters episodes by outcome and time, refuses an unknown outcome with 400', async () => {
    const interrupted = await get('/api/episodes?outcome=interrupted');
    expect(interrupted.map((e: { unitId: string }) => e.unitId).sort()).toEqual(['IN-1', 'IN-4']);
    const res = await t.api.get('/api/episodes?outcome=sideways').set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_error');
    const future = await get(`/api/episodes?from=${new Date(Date.now() + 3600_000).toISOString()}`);
    expect(future).toEqual([]);
  });
});
