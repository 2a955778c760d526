// Behind Mosquitto with two ingest workers, a board connected to one worker sees every unit change
// state and every alert, whichever worker judged it or handled it: the workers relay them through PostgreSQL.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import request from 'supertest';
import type { ServiceProcess } from '../helpers/service-process';
import { provisionBehindMosquitto, startMosquittoFleet, type MosquittoFleet } from '../helpers/mosquitto';
import { ADMIN } from '../helpers/service';
import type { TestGateway } from '../helpers/gateway';
import { openLive, type LiveClient } from '../helpers/live-client';
import { MessageSeq } from '../helpers/messages';
import { until } from '../helpers/until';
import { indicatorTopic } from '../../shared/protocol/topics';
import { IndicatorSchema } from '../../shared/protocol/messages';
import type { AlertView, ServerMessage, UnitDelta } from '../../shared/realtime/envelope';

const PURGE_S = 120;
const cleanups: (() => Promise<void> | void)[] = [];
let fleet: MosquittoFleet;
let w: { w1: ServiceProcess; w2: ServiceProcess };
const tokens: Record<string, string> = {};
type Worker = 'w1' | 'w2';

beforeAll(async () => {
  fleet = await startMosquittoFleet(['w1', 'w2'], cleanups);
  w = { w1: fleet.workers[0], w2: fleet.workers[1] };
  for (const k of ['w1', 'w2'] as const) tokens[k] = (await request(w[k].url).post('/api/auth/login').send(ADMIN)).body.token;
}, 90_000);
afterAll(async () => {
  for (const c of cleanups.reverse()) await c();
});

const get = async (k: Worker, path: string) => (await request(w[k].url).get(path).set('Authorization', `Bearer ${tokens[k]}`)).body;
interface Metrics { ingest: { accepted: number }; relay: { connected: boolean; connects: number; unitsAccepted: number; asksSent: number; asksAnswered: number; alertsAccepted: number; resyncs: number } }
const metrics = (k: Worker): Promise<Metrics> => get(k, '/api/metrics');
const board = async (k: Worker) => {
  const b = await openLive(`${w[k].url.replace('http', 'ws')}/api/live?token=${tokens[k]}`);
  await b.waitFor((m) => m.type === 'hello');
  return b;
};
/** The first unit delta of `unitId` in `state` that the board received after message number `from`. */
const delta = (b: LiveClient, from: number, unitId: string, state: string) =>
  until(() => b.messages.slice(from).flatMap((m) => (m.type === 'units' ? m.units : [])).find((u: UnitDelta) => u.id === unitId && u.state === state), 10_000);

async function gateway(unitId: string): Promise<TestGateway> {
  return (await provisionBehindMosquitto(fleet, tokens.w1, { id: unitId, purgeSeconds: PURGE_S, depot: 'Relay depot' })).gw;
}

/** Publishes one message and tells which worker committed it (messages are published one at a time). */
async function publishTo(gw: TestGateway, msg: object, kind: 'telemetry' | 'power' = 'telemetry'): Promise<Worker> {
  const [a, b] = await Promise.all([metrics('w1'), metrics('w2')]);
  await gw.publish(kind, msg);
  return until(async () => {
    const [a2, b2] = await Promise.all([metrics('w1'), metrics('w2')]);
    return a2.ingest.accepted > a.ingest.accepted ? 'w1' : b2.ingest.accepted > b.ingest.accepted ? ('w2' as const) : null;
  }, 10_000);
}

/** Key on, then key off until worker 2 is the one that judges the key-off (the shared subscription picks the worker). */
async function keyOffJudgedByW2(gw: TestGateway, m: MessageSeq, before?: () => void): Promise<number> {
  for (let attempt = 0; attempt < 12; attempt++) {
    // One or two key-on samples: the next key-off lands one message further along the broker's rotation.
    for (let i = 0; i <= attempt % 2; i++) await publishTo(gw, m.telemetry(Date.now(), 'on', 13.9));
    before?.();
    const at = Date.now();
    if ((await publishTo(gw, m.telemetry(at, 'off', 12.6))) === 'w2') return at;
  }
  throw new Error('worker 2 never judged a key-off');
}

/** A cold purge interrupted 12 s in, with units provisioned until worker 2 is the one that judges the supply loss. */
async function interruptionJudgedByW2(): Promise<{ gw: TestGateway; unitId: string }> {
  for (let attempt = 0; attempt < 12; attempt++) {
    const unitId = `RA-${attempt}`;
    const gw = await gateway(unitId);
    const m = new MessageSeq(1);
    const t0 = Date.now() - 60_000;
    await publishTo(gw, m.telemetry(t0, 'on', 13.9, { ambientC: -14 }));
    await publishTo(gw, m.telemetry(t0 + 1000, 'off', 12.6, { ambientC: -14 }));
    if ((await publishTo(gw, m.power(t0 + 13_000, 'supply-lost', 1.2), 'power')) === 'w2') return { gw, unitId };
    await gw.end();
  }
  throw new Error('worker 2 never judged a supply loss');
}

const alertsOf = (b: LiveClient, unitId: string): AlertView[] => b.messages.flatMap((x) => (x.type === 'alert' && x.alert.unitId === unitId ? [x.alert] : []));
const post = (k: Worker, path: string, body: object) => request(w[k].url).post(path).set('Authorization', `Bearer ${tokens[k]}`).send(body);

describe('behind Mosquitto, the live feed and the views of one worker', () => {
  it('show a key-off judged by the other worker: board, units API with its countdown, switch page, episodes notice; the light is published once', async () => {
    const gw = await gateway('RL-1');
    const lights: string[] = [];
    gw.client.on('message', (_t, payload) => lights.push(IndicatorSchema.parse(JSON.parse(payload.toString())).state));
    await new Promise<void>((res, rej) => gw.client.subscribe(indicatorTopic('gw-RL-1'), { qos: 1 }, (e) => (e ? rej(e) : res())));
    const page = (await request(w.w1.url).post('/api/switch-pages/RL-1').set('Authorization', `Bearer ${tokens.w1}`)).body.token as string;
    const b1 = await board('w1');
    const switch1 = await openLive(`${w.w1.url.replace('http', 'ws')}/api/live?switch=${page}`);
    let mark = 0;
    let switchMark = 0;
    let holdsBefore = 0;
    const m = new MessageSeq(1);
    const keyOffAt = await keyOffJudgedByW2(gw, m, () => {
      mark = b1.messages.length;
      switchMark = switch1.messages.length;
      holdsBefore = lights.filter((l) => l === 'hold').length;
    });

    // (1) Worker 1's board gets the purge worker 2 judged, in the usual envelope.
    const d = await delta(b1, mark, 'RL-1', 'purging');
    expect(d).toMatchObject({ depot: 'Relay depot', stateSince: new Date(keyOffAt).toISOString(), lastSupplyV: 12.6 });
    expect(d.purgeRemainingS).toBeGreaterThan(PURGE_S - 10);
    // (3) ...and the notice that the unit's episodes changed (the pending purge).
    await until(() => b1.messages.slice(mark).some((x: ServerMessage) => x.type === 'episodes' && x.unitIds.includes('RL-1')));
    // The switch page on worker 1 turns to hold with the countdown.
    const sw = await until(() => switch1.messages.slice(switchMark).find((x: ServerMessage) => x.type === 'switch' && x.indicator.state === 'hold'));
    expect(sw.type === 'switch' && sw.indicator.remainingS).toBeGreaterThan(PURGE_S - 10);
    expect((await request(w.w1.url).get(`/api/switch/${page}`)).body.indicator).toMatchObject({ state: 'hold', rerunNeeded: false });

    // (2) Worker 1's units API answers from worker 2's judgement, and its countdown keeps running.
    const [u1, u2] = await Promise.all([get('w1', '/api/units/RL-1'), get('w2', '/api/units/RL-1')]);
    expect(u1).toMatchObject({ state: 'purging', stateSince: u2.stateSince, lastSeenAt: u2.lastSeenAt });
    expect(Math.abs(u1.purgeRemainingS - u2.purgeRemainingS)).toBeLessThanOrEqual(1);
    await new Promise((r) => setTimeout(r, 2100));
    const later = await get('w1', '/api/units/RL-1');
    expect(u1.purgeRemainingS - later.purgeRemainingS).toBeGreaterThanOrEqual(2);
    expect(u1.purgeRemainingS - later.purgeRemainingS).toBeLessThanOrEqual(3);
    expect((await get('w1', '/api/units')).find((u: { id: string }) => u.id === 'RL-1').state).toBe('purging');

    // The retained light went out once, from the worker that judged the key-off.
    await until(() => lights.filter((l) => l === 'hold').length > holdsBefore);
    await new Promise((r) => setTimeout(r, 500));
    expect(lights.filter((l) => l === 'hold').length).toBe(holdsBefore + 1);

    // The purge completes (whichever worker takes the message): worker 1 shows safe to isolate.
    const done = b1.messages.length;
    await publishTo(gw, m.telemetry(Date.now(), 'off', 12.5, { ecmAwake: false }));
    await delta(b1, done, 'RL-1', 'safeToIsolate');
    expect((await get('w1', '/api/units/RL-1')).state).toBe('safeToIsolate');
    expect((await metrics('w1')).relay.unitsAccepted).toBeGreaterThan(0);
    b1.close();
    switch1.close();
    await gw.end();
  }, 120_000);

  it('over many gateways, both workers\' boards and units APIs show every unit\'s purge and its end', async () => {
    const ids = Array.from({ length: 8 }, (_, i) => `RM-${i}`);
    const gws = await Promise.all(ids.map(gateway));
    const boards = { w1: await board('w1'), w2: await board('w2') };
    const seqs = ids.map((_, i) => new MessageSeq(i + 10));
    await Promise.all(gws.map(async (gw, i) => {
      await gw.publish('telemetry', seqs[i].telemetry(Date.now() - 1000, 'on', 13.9));
      await gw.publish('telemetry', seqs[i].telemetry(Date.now(), 'off', 12.6));
    }));
    for (const k of ['w1', 'w2'] as const) for (const id of ids) await delta(boards[k], 0, id, 'purging');
    await until(async () => {
      const [l1, l2] = await Promise.all([get('w1', '/api/units'), get('w2', '/api/units')]);
      return ids.every((id) => {
        const [a, b] = [l1.find((u: { id: string }) => u.id === id), l2.find((u: { id: string }) => u.id === id)];
        return a.state === 'purging' && b.state === 'purging' && a.stateSince === b.stateSince && Math.abs(a.purgeRemainingS - b.purgeRemainingS) <= 1;
      });
    });
    await Promise.all(gws.map((gw, i) => gw.publish('telemetry', seqs[i].telemetry(Date.now(), 'off', 12.5, { ecmAwake: false }))));
    for (const k of ['w1', 'w2'] as const) for (const id of ids) await delta(boards[k], 0, id, 'safeToIsolate');
    for (const k of ['w1', 'w2'] as const) {
      const list = await until(async () => {
        const l = await get(k, '/api/units');
        return ids.every((id) => l.find((u: { id: string }) => u.id === id).state === 'safeToIsolate') && l;
      });
      expect(list).toBeTruthy();
    }
    // Both workers judged some of it, and each took in the other's judgements.
    const [m1, m2] = await Promise.all([metrics('w1'), metrics('w2')]);
    expect(m1.relay.unitsAccepted).toBeGreaterThan(0);
    expect(m2.relay.unitsAccepted).toBeGreaterThan(0);
    boards.w1.close();
    boards.w2.close();
    await Promise.all(gws.map((gw) => gw.end()));
  }, 120_000);

  it('after its listening connection is cut, a worker asks the others and catches up on what it missed', async () => {
    const gw = await gateway('RC-1');
    const b1 = await board('w1');
    const admin = new pg.Client({ connectionString: fleet.dbUrl });
    await admin.connect();
    cleanups.push(() => admin.end());
    const before = await metrics('w1');
    // Worker 1's relay connection is refused from here on until the key-off below is judged.
    let cutting = true;
    const cut = (async () => {
      while (cutting) {
        await admin.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE application_name = 'afterwatch-relay-w1' AND datname = current_database()`);
        await new Promise((r) => setTimeout(r, 20));
      }
    })();
    let mark = 0;
    try {
      await until(async () => !(await metrics('w1')).relay.connected);
      // Worker 2 commits the key-off while worker 1's relay is being cut. (Worker 1 may slip in for a moment
      // between two kills, so whether it is connected at any one instant is not asserted; each time it comes
      // back after a gap it asks the others.)
      await keyOffJudgedByW2(gw, new MessageSeq(1), () => (mark = b1.messages.length));
    } finally {
      cutting = false;
      await cut;
    }
    // Once the loop has stopped, worker 1's next connection holds.
    await until(async () => (await metrics('w1')).relay.connected);
    await delta(b1, mark, 'RC-1', 'purging');
    expect((await get('w1', '/api/units/RC-1')).state).toBe('purging');
    const m1 = await until(async () => {
      const m = await metrics('w1');
      return m.relay.asksSent > before.relay.asksSent && m;
    });
    expect(m1.relay.connects).toBeGreaterThan(before.relay.connects);
    expect(await until(async () => (await metrics('w2')).relay.asksAnswered > 0)).toBe(true);
    // Alerts are not held by the other workers: the board is told to re-read (a hello), once the connection held,
    // not at each of the reconnects that were cut.
    await until(() => b1.messages.slice(mark).some((x) => x.type === 'hello'));
    await new Promise((r) => setTimeout(r, 1500));
    expect(b1.messages.slice(mark).filter((x) => x.type === 'hello')).toHaveLength(1);
    expect((await metrics('w1')).relay.resyncs).toBe(before.relay.resyncs + 1);
    b1.close();
    await gw.end();
  }, 120_000);
});

describe('behind Mosquitto, alerts', () => {
  it('a cold interrupted purge judged by one worker alerts the other worker\'s board; acknowledged through one worker and resolved through the other, every board sees each step once', async () => {
    const b1 = await board('w1');
    const b2 = await board('w2');
    const { gw, unitId } = await interruptionJudgedByW2();

    // Worker 2 raised it: its own board has it from its feed, worker 1's board from the relay, the same.
    const raised = await until(() => alertsOf(b1, unitId).find((a) => a.status === 'open'), 10_000);
    expect(raised).toMatchObject({ unitId, depot: 'Relay depot', kind: 'interruptedPurge', status: 'open', secondsIntoPurge: 12, ambientC: -14, escalatedAt: null });
    expect(await until(() => alertsOf(b2, unitId).find((a) => a.status === 'open'))).toEqual(raised);
    // ...and it is the alert both workers' APIs list.
    expect(await get('w1', `/api/alerts?status=open&unitId=${unitId}`)).toEqual([raised]);

    // Acknowledged through worker 1's API: worker 2's board hears it.
    const ack = await post('w1', `/api/alerts/${raised.id}/acknowledge`, { comment: 'Driver called back, purge to be run again' });
    expect(ack.status).toBe(200);
    expect(await until(() => alertsOf(b2, unitId).find((a) => a.status === 'acknowledged'), 10_000)).toEqual(ack.body);
    expect(ack.body).toMatchObject({ status: 'acknowledged', acknowledgedBy: ADMIN.email, comment: 'Driver called back, purge to be run again' });
    // Resolved through worker 2's API: worker 1's board hears it.
    const done = await post('w2', `/api/alerts/${raised.id}/resolve`, {});
    expect(done.status).toBe(200);
    expect(await until(() => alertsOf(b1, unitId).find((a) => a.status === 'resolved'), 10_000)).toEqual(done.body);

    // Once each on both boards: no echo on the worker that raised or handled it.
    await until(() => alertsOf(b1, unitId).length >= 3 && alertsOf(b2, unitId).length >= 3);
    await new Promise((r) => setTimeout(r, 500));
    for (const b of [b1, b2]) expect(alertsOf(b, unitId).map((a) => [a.id, a.status])).toEqual([[raised.id, 'open'], [raised.id, 'acknowledged'], [raised.id, 'resolved']]);
    const [m1, m2] = await Promise.all([metrics('w1'), metrics('w2')]);
    expect(m1.relay.alertsAccepted).toBeGreaterThanOrEqual(2);
    expect(m2.relay.alertsAccepted).toBeGreaterThanOrEqual(1);
    b1.close();
    b2.close();
    await gw.end();
  }, 120_000);
});
