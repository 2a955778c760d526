// An interrupted purge leaves DEF in the lines until the next completed purge; its freeze figures stay open
// that long. Through the real broker and PostgreSQL: the figures follow every later reading, while the
// unit's memory holds a handful of events, not the day's (window.ts, context.wet).
// AUS 32 (DEF) freezes at -11 °C (ISO 22241-1); the bands above it are this project's (freeze.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../../helpers/service';
import { connectGateway, provision, type TestGateway } from '../../helpers/gateway';
import { MessageSeq } from '../../helpers/messages';

let t: TestService;
let token: string;
const get = async (path: string) => (await t.api.get(path).set('Authorization', `Bearer ${token}`)).body;

beforeAll(async () => {
  t = await startTestService();
  token = await t.token();
});
afterAll(async () => t?.stop());

async function gatewayFor(id: string): Promise<TestGateway> {
  const g = await provision(t.api, token, { id });
  return connectGateway(t.mqttUrl, g.gatewayId, g.secret);
}

const memory = (unitId: string) => t.service.ingest.book.peek(unitId)!;
const episodes = async (unitId: string) => (await get(`/api/episodes?unitId=${unitId}`)).sort((a: { keyOffAt: string }, b: { keyOffAt: string }) => a.keyOffAt.localeCompare(b.keyOffAt));

/**
 * A new gateway for `unitId`: key-off at -3 °C, supply lost 38 s into the purge (boot 3), then the next
 * boot's record an hour later. Returns when that next boot's driving may start.
 */
async function afterInterruption(unitId: string) {
  const gw = await gatewayFor(unitId);
  const m = new MessageSeq(3);
  const t0 = Date.now() - 6 * 3_600_000;
  await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
  await gw.publish('telemetry', m.telemetry(t0 + 5_000, 'off', 12.6, { ambientC: -3 }));
  await gw.publish('power', m.power(t0 + 43_000, 'supply-lost', 2.1));
  m.nextBoot();
  await gw.publish('power', m.power(t0 + 3_600_000, 'boot', 12.4, { ts: t0 + 43_000, cause: 'supply-lost' }));
  return { gw, m, morning: t0 + 3_600_000 + 5_000 };
}

/** A key-off at `at` and samples every 10 s to 130 s, past the 120 s purge: a purge held to its end. */
function heldPurge(m: MessageSeq, at: number, ambientC: number) {
  const messages = [m.telemetry(at, 'off', 12.6, { ambientC })];
  for (let s = 10; s <= 130; s += 10) messages.push(m.telemetry(at + s * 1_000, 'off', 12.5, { ambientC }));
  return messages;
}

/** Key-on samples every 5 s from `from`, at -4 °C unless `cold` says otherwise for a sample's index. */
async function drive(gw: TestGateway, m: MessageSeq, from: number, count: number, cold: Record<number, number> = {}) {
  await Promise.all(Array.from({ length: count }, (_, i) => gw.publish('telemetry', m.telemetry(from + i * 5_000, 'on', 13.9, { ambientC: cold[i] ?? -4 }))));
}

describe('the lines stay wet after an interrupted purge', () => {
  it('a day of driving after it: the figures take every reading, the memory keeps a few events, a late reading still counts', async () => {
    const { gw, m, morning } = await afterInterruption('WL-1');
    await drive(gw, m, morning, 150, { 60: -9 });
    // One reading of the drive is held back by the network and comes in at the end.
    const late = m.telemetry(morning + 150 * 5_000, 'on', 13.9, { ambientC: -13 });
    await drive(gw, m, morning + 151 * 5_000, 150);

    let [episode] = await episodes('WL-1');
    expect(episode).toMatchObject({ outcome: 'interrupted', ambientC: -3, minAmbientAfterC: -9, freezeExposure: 'atRisk' });
    expect(memory('WL-1').events.length).toBeLessThanOrEqual(4);
    expect(memory('WL-1').context?.wet?.map((e) => e.nextKeyOnAt)).toEqual([morning]);

    await gw.publish('telemetry', late);
    [episode] = await episodes('WL-1');
    expect(episode).toMatchObject({ outcome: 'interrupted', minAmbientAfterC: -13, freezeExposure: 'frozen' });
    expect(memory('WL-1').events.length).toBeLessThanOrEqual(4);
    await gw.end();
  });

  it('rebuilt from the database, the unit carries the stored figures on, and a completed purge closes them', async () => {
    const { gw, m, morning } = await afterInterruption('WL-2');
    await drive(gw, m, morning, 20, { 5: -7 });
    // A stop with the key back on 20 s into the purge: resumed, final, the lines still wet.
    const stop = morning + 20 * 5_000;
    await gw.publish('telemetry', m.telemetry(stop, 'off', 12.6));
    await drive(gw, m, stop + 20_000, 40);
    // The service forgets the unit (as after a restart or another worker's judgement) and rebuilds it.
    t.service.ingest.book.forget('WL-2');
    await drive(gw, m, stop + 20_000 + 40 * 5_000, 1, { 0: -15 });
    let list = await episodes('WL-2');
    expect(list.map((e: { outcome: string }) => e.outcome)).toEqual(['interrupted', 'resumed']);
    expect(list[0]).toMatchObject({ minAmbientAfterC: -15, freezeExposure: 'frozen' });
    expect(memory('WL-2').context?.wet).toHaveLength(1);

    // A purge held to its end: the lines are emptied, later readings no longer count.
    const last = stop + 20_000 + 41 * 5_000;
    for (const msg of heldPurge(m, last, -5)) await gw.publish('telemetry', msg);
    await drive(gw, m, last + 600_000, 3, { 0: -25, 1: -25, 2: -25 });
    list = await episodes('WL-2');
    expect(list.map((e: { outcome: string }) => e.outcome)).toEqual(['interrupted', 'resumed', 'completed']);
    expect(list[0]).toMatchObject({ minAmbientAfterC: -15, freezeExposure: 'frozen' });
    expect(memory('WL-2').context?.wet).toBeUndefined();
    await gw.end();
  });

  it('a completed purge that arrives late into an old gap closes the figures too', async () => {
    const { gw, m, morning } = await afterInterruption('WL-3');
    await drive(gw, m, morning, 3);
    // A whole stop with a purge held to its end is held back by the network...
    const stop = morning + 3 * 5_000;
    const held = heldPurge(m, stop, -6);
    // ...while the drive after it arrives.
    await drive(gw, m, stop + 600_000, 10);
    expect(memory('WL-3').context?.wet).toHaveLength(1);
    for (const msg of held) await gw.publish('telemetry', msg);
    const list = await episodes('WL-3');
    expect(list.map((e: { outcome: string }) => e.outcome)).toEqual(['interrupted', 'completed']);
    expect(list[0]).toMatchObject({ minAmbientAfterC: -6, freezeExposure: 'watch' });
    expect(memory('WL-3').context?.wet).toBeUndefined();
    await drive(gw, m, stop + 600_000 + 10 * 5_000, 1, { 0: -20 });
    expect((await episodes('WL-3'))[0]).toMatchObject({ minAmbientAfterC: -6, freezeExposure: 'watch' });
    await gw.end();
  });
});
