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
  const env = { MQTT_URL: mqttUrl, MQTT_SERVICE_PASSWORD: 'service-password-for-tests', MOSQUITTO_DIR: dir };

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
 * The simulator's verdict on a run through Mosquitto. Mosquitto acknowledged the gateways at once and the
 * workers take the queued rest at their own pace, so this waits until the stored messages have been quiet for
 * 6 s (longer than a worker's longest retry pause after a failed commit, 5 s) before it reads the episodes.
 */
export async function verdictAfterQuiet(fleet: MosquittoFleet, truth: Truth) {
  const counter = new pg.Client({ connectionString: fleet.dbUrl });
  await counter.connect();
  try {
    let last = -1;
    for (let stable = 0; stable < 6; ) {
      await new Promise((r) => setTimeout(r, 1000));
      const n = Number((await counter.query('SELECT count(*) n FROM messages')).rows[0].n);
      stable = n === last ? stable + 1 : 0;
      last = n;
    }
  } finally {
    await counter.end();
  }
  const api = new ApiClient(fleet.workers[fleet.workers.length - 1].url);
  await api.login(ADMIN.email, ADMIN.password);
  const verdict = compareEpisodes(truth, await fetchSettledEpisodes(api, truth, 30_000, () => {}));
  if (verdict.misses.length || verdict.falseFindings.length) console.error(`worker logs on failure:\n${fleet.workers.map((w) => w.output()).join('\n---\n')}`);
  return verdict;
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
