// The documented scale-out path for the tests of it: Mosquitto from Debian on loopback with the configuration
// Afterwatch writes, and ingest workers (real service processes) behind it sharing one database.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';
import pg from 'pg';
import request from 'supertest';
import { createTestDatabase } from './test-db';
import { serviceProcess, type ServiceProcess } from './service-process';
import { freePort } from '../../scripts/lib/local-postgres';
import { mosquittoConf } from '../../server/modules/gateways/mosquitto-files';
import { ApiClient } from '../../simulator/net/api-client';
import { compareEpisodes, fetchSettledEpisodes } from '../../simulator/truth/verify';
import type { Truth } from '../../simulator/truth/truth-schema';
import { ADMIN } from './service';
import { connectGateway, provision, type TestGateway } from './gateway';
import { until } from './until';

export const MOSQUITTO = '/usr/sbin/mosquitto';
/** The workers' account on the test broker (the service's default user name, this password). */
export const SERVICE_ACCOUNT = { user: 'afterwatch-service', password: 'service-password-for-tests' } as const;

export interface MosquittoFleet {
  dir: string;
  mqttUrl: string;
  dbUrl: string;
  workers: ServiceProcess[];
  /** Stops Mosquitto with the signal (SIGTERM saves its persistence file first, SIGKILL does not) and waits for it to exit. */
  stopBroker(signal: NodeJS.Signals): Promise<void>;
  /** Starts Mosquitto again on the same port with the same files. */
  startBroker(): void;
}

/**
 * A fresh database, Mosquitto and `workerIds.length` workers. The first worker writes the password and ACL
 * files before Mosquitto starts; the rest start once it is up. Everything is stopped through `cleanups`.
 */
export async function startMosquittoFleet(workerIds: string[], cleanups: (() => Promise<void> | void)[]): Promise<MosquittoFleet> {
  expect(existsSync(MOSQUITTO), 'mosquitto is installed (apt-get install -y mosquitto; .ci/run does it)').toBe(true);
  const dir = mkdtempSync(join(tmpdir(), 'afterwatch-mosquitto-'));
  mkdirSync(join(dir, 'data'));
  const port = await freePort();
  const mqttUrl = `mqtt://127.0.0.1:${port}`;
  writeFileSync(join(dir, 'mosquitto.conf'), mosquittoConf(dir, { host: '127.0.0.1', port, runAsRoot: process.getuid?.() === 0 }));
  const db = await createTestDatabase();
  cleanups.push(db.drop);
  const env = { MQTT_URL: mqttUrl, MQTT_SERVICE_PASSWORD: SERVICE_ACCOUNT.password, MOSQUITTO_DIR: dir };

  let broker: ChildProcess | null = null;
  const startBroker = () => {
    broker = spawn(MOSQUITTO, ['-c', join(dir, 'mosquitto.conf')], { stdio: 'ignore' });
  };
  const stopBroker = async (signal: NodeJS.Signals) => {
    const b = broker;
    broker = null;
    if (!b || b.exitCode !== null || b.signalCode !== null) return;
    await new Promise<void>((res) => {
      b.once('exit', () => res());
      b.kill(signal);
    });
  };
  cleanups.push(() => stopBroker('SIGTERM'));

  const workers: ServiceProcess[] = [];
  for (const id of workerIds) {
    const w = await serviceProcess(db.url, { ...env, INGEST_WORKER_ID: id });
    const started = w.start();
    if (!broker) {
      for (let i = 0; i < 100 && !existsSync(join(dir, 'acl')); i++) await new Promise((r) => setTimeout(r, 100));
      startBroker();
    }
    await started;
    cleanups.push(w.stop);
    workers.push(w);
  }
  return { dir, mqttUrl, dbUrl: db.url, workers, stopBroker, startBroker };
}

/**
 * The simulator's verdict on a run through Mosquitto, once the workers have caught up. Mosquitto acknowledged
 * the gateways at once and the workers take the queued rest at their own pace; after a broker restart that can
 * take many seconds, the first of them spent on the redelivered copies of what was in flight (committed already,
 * they add no row), so a pause in the stored rows says nothing. Caught up means every message the gateways sent
 * is stored: each gateway's count of distinct (boot, seq) equals what it sent. Within `limitMs`; then the
 * episodes are read once none is pending. That can take a while too: a key-off judged after the replay has
 * ended, with no evidence after it, turns undetermined at C + 30 s by its unit's clock, and where most of the
 * fleet is parked for the weekend the fleet's clock (their median) stands still, so the unit's own clock
 * decides: up to purge time + 30 s of wall time after its last message.
 */
export async function verdictWhenStored(fleet: MosquittoFleet, run: { truth: Truth; sentByGateway: Map<string, number> }, limitMs = 150_000) {
  const counter = new pg.Client({ connectionString: fleet.dbUrl });
  await counter.connect();
  const gateways = [...run.sentByGateway.keys()];
  const short = async () => {
    const { rows } = await counter.query('SELECT gateway_id, count(*) n FROM messages WHERE gateway_id = ANY($1) GROUP BY gateway_id', [gateways]);
    const stored = new Map(rows.map((r) => [r.gateway_id as string, Number(r.n)]));
    return gateways.filter((g) => (stored.get(g) ?? 0) < run.sentByGateway.get(g)!).map((g) => `${g}: ${stored.get(g) ?? 0} of ${run.sentByGateway.get(g)}`);
  };
  let missing: string[] = [];
  try {
    for (const end = Date.now() + limitMs; ; ) {
      missing = await short();
      if (missing.length === 0 || Date.now() > end) break;
      await new Promise((r) => setTimeout(r, 500));
    }
  } finally {
    await counter.end();
  }
  const api = new ApiClient(fleet.workers[fleet.workers.length - 1].url);
  await api.login(ADMIN.email, ADMIN.password);
  const verdict = compareEpisodes(run.truth, await fetchSettledEpisodes(api, run.truth, 180_000, () => {}));
  if (missing.length || verdict.misses.length || verdict.falseFindings.length) {
    console.error(`worker logs on failure:\n${fleet.workers.map((w) => w.output()).join('\n---\n')}`);
    console.error(`stored sequence of the missed units' gateways:\n${await storedGaps(fleet.dbUrl, [...missing.map((m) => m.split(':')[0]), ...verdict.misses.map((m) => m.truth.gatewayId)])}`);
    console.error(`the missed units' stored episodes and judgement counts:\n${await storedEpisodes(fleet.dbUrl, verdict.misses.map((m) => m.truth.unitId))}`);
  }
  return { ...verdict, notStored: missing };
}

/** The units' judgement counts and their episodes' rows around the missed ones, for a failure's report. */
async function storedEpisodes(dbUrl: string, unitIds: string[]): Promise<string> {
  const c = new pg.Client({ connectionString: dbUrl });
  await c.connect();
  try {
    const units = await c.query('SELECT id, judged_version FROM units WHERE id = ANY($1)', [[...new Set(unitIds)]]);
    const eps = await c.query(
      `SELECT unit_id, id, boot, seq, key_off_at, outcome, settled_by, final, evidence FROM episodes WHERE unit_id = ANY($1) ORDER BY unit_id, stream, boot, seq`,
      [[...new Set(unitIds)]],
    );
    return [...units.rows.map((u) => `${u.id}: judged ${u.judged_version} times`), ...eps.rows.map((e) => JSON.stringify(e))].join('\n');
  } finally {
    await c.end();
  }
}

/** Each gateway's stored messages as runs of consecutive (boot, seq), so that a failure shows what never arrived. */
async function storedGaps(dbUrl: string, gatewayIds: string[]): Promise<string> {
  const c = new pg.Client({ connectionString: dbUrl });
  await c.connect();
  try {
    const { rows } = await c.query(
      `SELECT gateway_id, boot, min(seq) first, max(seq) last, min(ts) from_ts, max(ts) to_ts, min(received_at) first_in, max(received_at) last_in
         FROM (SELECT *, seq - row_number() OVER (PARTITION BY gateway_id, boot ORDER BY seq) run FROM messages WHERE gateway_id = ANY($1)) r
        GROUP BY gateway_id, boot, run ORDER BY gateway_id, boot, first`,
      [[...new Set(gatewayIds)]],
    );
    return rows.slice(0, 40).map((r) => `${r.gateway_id} boot ${r.boot} seq ${r.first}..${r.last} (ts ${r.from_ts.toISOString()}..${r.to_ts.toISOString()}, received ${r.first_in.toISOString()}..${r.last_in.toISOString()})`).join('\n');
  } finally {
    await c.end();
  }
}

/**
 * Provisions a unit through the first worker and connects its gateway, retrying until Mosquitto has reloaded
 * the password file the worker rewrote.
 */
export async function provisionBehindMosquitto(
  fleet: MosquittoFleet,
  token: string,
  unit: Parameters<typeof provision>[2],
): Promise<{ gw: TestGateway; gatewayId: string; secret: string }> {
  const g = await provision(request(fleet.workers[0].url), token, unit);
  const gw = await until(() => connectGateway(fleet.mqttUrl, g.gatewayId, g.secret).catch(() => null), 10_000);
  return { gw, ...g };
}
