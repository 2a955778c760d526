// Scale-out on an existing broker: Mosquitto from Debian with password and ACL files written from the
// gateways table, and two ingest workers sharing the gateways' messages through a shared subscription.
import { afterAll, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import mqtt from 'mqtt';
import { createTestDatabase } from '../helpers/test-db';
import { serviceProcess } from '../helpers/service-process';
import { ADMIN } from '../helpers/service';
import { freePort } from '../../scripts/lib/local-postgres';
import { mosquittoConf } from '../../server/modules/gateways/mosquitto-files';
import { runScenario } from '../../simulator/run-scenario';
import { ApiClient } from '../../simulator/net/api-client';
import { compareEpisodes, fetchSettledEpisodes } from '../../simulator/truth/verify';

const MOSQUITTO = '/usr/sbin/mosquitto';
const cleanups: (() => Promise<void> | void)[] = [];
afterAll(async () => {
  for (const c of cleanups.reverse()) await c();
});

describe('behind Mosquitto with two ingest workers', () => {
  it('judges a weekend correctly whichever worker receives each message', async () => {
    expect(existsSync(MOSQUITTO), 'mosquitto is installed (apt-get install -y mosquitto; .ci/run does it)').toBe(true);
    const dir = mkdtempSync(join(tmpdir(), 'afterwatch-mosquitto-'));
    mkdirSync(join(dir, 'data'));
    const port = await freePort();
    writeFileSync(join(dir, 'mosquitto.conf'), mosquittoConf(dir, { host: '127.0.0.1', port, runAsRoot: process.getuid?.() === 0 }));
    const db = await createTestDatabase();
    cleanups.push(db.drop);
    const env = { MQTT_URL: `mqtt://127.0.0.1:${port}`, MQTT_SERVICE_PASSWORD: 'service-password-for-tests', MOSQUITTO_DIR: dir };
    // Worker 1 writes the password and ACL files before Mosquitto starts; both then subscribe.
    const w1 = await serviceProcess(db.url, { ...env, INGEST_WORKER_ID: 'w1' });
    const startW1 = w1.start();
    let broker: ChildProcess | null = null;
    for (let i = 0; i < 100 && !existsSync(join(dir, 'acl')); i++) await new Promise((r) => setTimeout(r, 100));
    broker = spawn(MOSQUITTO, ['-c', join(dir, 'mosquitto.conf')], { stdio: 'ignore' });
    cleanups.push(() => void broker?.kill('SIGTERM'));
    await startW1;
    cleanups.push(w1.stop);
    const w2 = await serviceProcess(db.url, { ...env, INGEST_WORKER_ID: 'w2' });
    await w2.start();
    cleanups.push(w2.stop);

    // The ACL holds: a gateway may not read another's indicator (nor anything else).
    const stranger = mqtt.connect(`mqtt://127.0.0.1:${port}`, { clientId: 'nobody', username: 'nobody', password: 'x', reconnectPeriod: 0 });
    const refused = await new Promise<boolean>((res) => {
      stranger.once('connect', () => res(false));
      stranger.once('error', () => res(true));
    });
    stranger.end(true);
    expect(refused).toBe(true);

    const truth = await runScenario({
      apiUrl: w1.url, mqttUrl: `mqtt://127.0.0.1:${port}`, adminEmail: ADMIN.email, adminPassword: ADMIN.password,
      scenario: 'weekend', units: 12, seed: 'ci-mosquitto', speed: 'max',
      dataDir: mkdtempSync(join(tmpdir(), 'afterwatch-sim-')), truthPath: null, progress: false,
    });
    // Mosquitto acknowledged the gateways at once; the workers take the queued rest at their own pace.
    const { default: pgm } = await import('pg');
    const counter = new pgm.Client({ connectionString: db.url });
    await counter.connect();
    let last = -1;
    // Quiet for 6 s: longer than a worker's longest retry pause (5 s) after a failed commit.
    for (let stable = 0; stable < 6; ) {
      await new Promise((r) => setTimeout(r, 1000));
      const n = Number((await counter.query('SELECT count(*) n FROM messages')).rows[0].n);
      stable = n === last ? stable + 1 : 0;
      last = n;
    }
    await counter.end();
    const api = new ApiClient(w2.url);
    await api.login(ADMIN.email, ADMIN.password);
    const episodes = await fetchSettledEpisodes(api, truth, 30_000, () => {});
    const verdict = compareEpisodes(truth, episodes);
    if (verdict.misses.length || verdict.falseFindings.length) console.error(`worker logs on failure:\n${w1.output()}\n---\n${w2.output()}`);
    expect(verdict.misses).toEqual([]);
    expect(verdict.falseFindings).toEqual([]);
    // Both workers took part.
    const metrics = async (url: string) => {
      const token = (await (await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(ADMIN) })).json()).token;
      return (await (await fetch(`${url}/api/metrics`, { headers: { authorization: `Bearer ${token}` } })).json()) as { ingest: { accepted: number } };
    };
    const [m1, m2] = await Promise.all([metrics(w1.url), metrics(w2.url)]);
    expect(m1.ingest.accepted).toBeGreaterThan(1000);
    expect(m2.ingest.accepted).toBeGreaterThan(1000);
  }, 240_000);
});
