// Behind Mosquitto: the access list written from the gateways table holds, and the broker's restarts lose
// nothing. A restart as a service manager does it (SIGTERM: Mosquitto saves its sessions and queues first)
// in the middle of a weekend; and a broker that comes back empty, whose retained lights the workers publish again.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import mqtt from 'mqtt';
import pg from 'pg';
import request from 'supertest';
import { ADMIN } from '../helpers/service';
import { provision, watchLight } from '../helpers/gateway';
import { provisionBehindMosquitto, SERVICE_ACCOUNT, startMosquittoFleet, verdictWhenStored, type MosquittoFleet } from '../helpers/mosquitto';
import { MessageSeq } from '../helpers/messages';
import { until } from '../helpers/until';
import { indicatorTopic, uplinkTopic } from '../../shared/protocol/topics';
import { runScenarioDetailed } from '../../simulator/run-scenario';
import type { ProgressSource } from '../../simulator/cli/progress';
import { connectDb } from '../../server/db/index';
import { writeMosquittoFiles } from '../../server/modules/gateways/mosquitto-files';

const cleanups: (() => Promise<void> | void)[] = [];
let fleet: MosquittoFleet;
let token: string;
let db: pg.Client;

beforeAll(async () => {
  fleet = await startMosquittoFleet(['w1', 'w2'], cleanups);
  token = (await request(fleet.workers[0].url).post('/api/auth/login').send(ADMIN)).body.token;
  db = new pg.Client({ connectionString: fleet.dbUrl });
  await db.connect();
  cleanups.push(() => db.end());
}, 90_000);
afterAll(async () => {
  for (const c of cleanups.reverse()) await c();
});

const storedOf = async (gatewayId: string) =>
  Number((await db.query('SELECT count(*) n FROM messages WHERE gateway_id = $1', [gatewayId])).rows[0].n);

async function gateway(unitId: string) {
  const g = await provisionBehindMosquitto(fleet, token, { id: unitId });
  cleanups.push(() => g.gw.end());
  return g;
}

describe('behind Mosquitto, its access list', () => {
  it('lets a gateway read only its own light and publish only under its own id; strangers are refused', async () => {
    const a = await gateway('MA-1');
    const b = await gateway('MA-2');
    // Another gateway's light: Mosquitto 2.0 (measured) grants the subscription and delivers nothing on it; the
    // embedded broker answers 0x80 as the protocol says. Either way the light does not reach the wrong gateway.
    const seen: string[] = [];
    a.gw.client.on('message', (topic) => seen.push(topic));
    const bSeen: string[] = [];
    b.gw.client.on('message', (topic) => bSeen.push(topic));
    await b.gw.client.subscribeAsync(indicatorTopic(b.gatewayId), { qos: 1 });
    const m2 = new MessageSeq(1);
    await b.gw.publish('telemetry', m2.telemetry(Date.now(), 'on', 13.9));
    await until(() => bSeen.length > 0, 10_000); // B's light (dark: key on) is out, and retained
    await a.gw.client.subscribeAsync(indicatorTopic(b.gatewayId), { qos: 1 });
    const ma = new MessageSeq(1);
    await a.gw.publish('telemetry', ma.telemetry(Date.now(), 'on', 13.9));
    await a.gw.client.subscribeAsync(indicatorTopic(a.gatewayId), { qos: 1 });
    // A's own retained light comes after B's would have (a broker sends retained messages in subscription order).
    await until(() => seen.includes(indicatorTopic(a.gatewayId)), 10_000);
    expect(seen).not.toContain(indicatorTopic(b.gatewayId));
    // A publish under another gateway's id is dropped by the broker (MQTT 3.1.1 has no refusal to send back).
    const forged = new MessageSeq(1);
    await a.gw.client.publishAsync(uplinkTopic(b.gatewayId, 'telemetry'), JSON.stringify(forged.telemetry(Date.now(), 'on', 13.9)), { qos: 1 });
    // Its own messages after it arrive, whichever worker takes them; the forged one never does.
    for (let i = 0; i < 5; i++) await a.gw.publish('telemetry', ma.telemetry(Date.now(), 'on', 13.9));
    await until(async () => (await storedOf(a.gatewayId)) === 6);
    expect(await storedOf(b.gatewayId)).toBe(1);
    const stranger = mqtt.connect(fleet.mqttUrl, { clientId: 'nobody', username: 'nobody', password: 'x', reconnectPeriod: 0 });
    const refused = await new Promise<boolean>((res) => {
      stranger.once('connect', () => res(false));
      stranger.once('error', () => res(true));
    });
    stranger.end(true);
    expect(refused).toBe(true);
  });
});

describe('behind Mosquitto, a broker restart', () => {
  it('in the middle of a weekend (SIGTERM, then started again): the gateways reconnect with jittered back-off, zero misses, zero false findings', async () => {
    let sending: { source: ProgressSource; total: number } | null = null;
    const run = runScenarioDetailed({
      apiUrl: fleet.workers[0].url, mqttUrl: fleet.mqttUrl, adminEmail: ADMIN.email, adminPassword: ADMIN.password,
      scenario: 'weekend', units: 12, seed: 'ci-mosquitto-restart', speed: 'max',
      dataDir: mkdtempSync(join(tmpdir(), 'afterwatch-sim-')), truthPath: null, progress: false,
      onSending: (source, total) => (sending = { source, total }),
    });
    // A fifth of the weekend sent, then the broker goes down with the rest in the gateways and in its queues.
    // The trigger is the sender's count: Mosquitto acknowledges a gateway before any worker has stored the message,
    // so a slow database could let the gateways finish (and leave) before a trigger on stored rows fired.
    await until(() => sending !== null && sending.source.stats.acked >= sending.total / 5, 60_000);
    await fleet.stopBroker('SIGTERM');
    await new Promise((r) => setTimeout(r, 1000));
    fleet.startBroker();
    const result = await run;
    // The simulator's gateways lost their connection and came back on their own.
    expect(Number(/unplanned reconnect attempts (\d+)/.exec(result.summary)?.[1])).toBeGreaterThan(0);
    // Every message a gateway had acknowledged is stored (none lost with the broker), and the episodes are right.
    const verdict = await verdictWhenStored(fleet, result);
    expect(verdict.notStored).toEqual([]);
    expect(verdict.misses).toEqual([]);
    expect(verdict.falseFindings).toEqual([]);
    const doubled = await db.query(`SELECT count(*) n FROM (SELECT unit_id, key_off_at FROM episodes GROUP BY unit_id, key_off_at HAVING count(*) > 1) d`);
    expect(Number(doubled.rows[0].n)).toBe(0);
  }, 480_000);

  it('leaves the gateways in while a Mosquitto runs, whoever lost a connection, and holds them off only once it is down', async () => {
    // Two workers write the same files. One that lost only its own connection must not write the file without
    // the gateways: another worker's reload would then make the running broker drop them all.
    const db = await connectDb(fleet.dbUrl);
    cleanups.push(() => db.close());
    const passwd = () => readFileSync(join(fleet.dir, 'passwd'), 'utf8');
    const holdOff = () => writeMosquittoFiles(fleet.dir, SERVICE_ACCOUNT.user, SERVICE_ACCOUNT.password, { admitGateways: false });
    const g = await gateway('MH-1');
    expect(passwd()).toContain(`${g.gatewayId}:`);
    expect(await holdOff()).toBe('leftWhileRunning');
    expect(passwd()).toContain(`${g.gatewayId}:`);
    // A reload now (as after a provisioning) keeps the connected gateway connected.
    process.kill(Number(readFileSync(join(fleet.dir, 'mosquitto.pid'), 'utf8')), 'SIGHUP');
    const m = new MessageSeq(1);
    await g.gw.publish('telemetry', m.telemetry(Date.now(), 'on', 13.9));
    await until(async () => (await storedOf(g.gatewayId)) === 1, 10_000);
    // Down: the file a restarted Mosquitto reads holds the gateways off (the workers wrote it already).
    await fleet.stopBroker('SIGTERM');
    await until(() => !passwd().includes(`${g.gatewayId}:`), 10_000);
    expect(await holdOff()).toBe('heldOff');
    expect(passwd().trim().split('\n')).toEqual([expect.stringMatching(/^afterwatch-service:/)]);
    // A worker that has not yet noticed the broker's end, or whose turn came late, cannot let them back in.
    const late = await writeMosquittoFiles(fleet.dir, SERVICE_ACCOUNT.user, SERVICE_ACCOUNT.password, { admitGateways: true, stillAdmit: () => true });
    expect(late).toBe('noBrokerRunning');
    expect(passwd()).not.toContain(`${g.gatewayId}:`);
    // Up again: the first worker to subscribe lets them back in.
    fleet.startBroker();
    await until(() => passwd().includes(`${g.gatewayId}:`), 20_000);
  }, 60_000);

  it('that comes back empty (its persistence file lost): the workers reconnect and publish every light again', async () => {
    const g = await provision(request(fleet.workers[0].url), token, { id: 'ME-1', purgeSeconds: 600 });
    const gw = watchLight(fleet.mqttUrl, g.gatewayId, g.secret);
    cleanups.push(gw.end);
    const { lights } = gw;
    await until(() => gw.connects() >= 1, 10_000);
    const m = new MessageSeq(1);
    await gw.telemetry(m.telemetry(Date.now() - 1000, 'on', 13.9));
    await gw.telemetry(m.telemetry(Date.now() - 500, 'off', 12.6));
    await until(() => lights.includes('hold'), 10_000);
    const mark = lights.length;
    const connectsBefore = gw.connects();
    await fleet.stopBroker('SIGKILL');
    rmSync(join(fleet.dir, 'data', 'mosquitto.db'), { force: true });
    fleet.startBroker();
    await until(() => gw.connects() > connectsBefore, 15_000);
    // The purge is still running (600 s): the light published again is hold.
    await until(() => lights.length > mark, 15_000);
    expect(new Set(lights.slice(mark))).toEqual(new Set(['hold']));
  }, 60_000);
});
