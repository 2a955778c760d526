// kill -9 of the service in the middle of a weekend replay, then a restart: the gateways' QoS 1 redelivery
// brings in everything that was not acknowledged, and nothing is lost or doubled.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { QueryTypes, Sequelize } from 'sequelize';
import { createTestDatabase } from '../helpers/test-db';
import { serviceProcess } from '../helpers/service-process';
import { ADMIN } from '../helpers/service';
import { runScenario } from '../../simulator/run-scenario';
import { ApiClient } from '../../simulator/net/api-client';
import { compareEpisodes, fetchSettledEpisodes } from '../../simulator/truth/verify';

const cleanups: (() => Promise<void>)[] = [];
afterAll(async () => {
  for (const c of cleanups.reverse()) await c().catch(() => {});
});

describe('a crash mid-stream loses nothing', () => {
  it('kill -9 during a weekend replay, restart: zero misses, zero false findings, no episode doubled', async () => {
    const db = await createTestDatabase();
    cleanups.push(db.drop);
    const svc = await serviceProcess(db.url);
    cleanups.push(svc.stop);
    await svc.start();
    const run = runScenario({
      apiUrl: svc.url, mqttUrl: svc.mqttUrl, adminEmail: ADMIN.email, adminPassword: ADMIN.password,
      scenario: 'weekend', units: 16, seed: 'ci-crash', speed: 'max',
      dataDir: mkdtempSync(join(tmpdir(), 'afterwatch-sim-')), truthPath: null, progress: false,
    });
    const sql = new Sequelize(db.url, { logging: false });
    cleanups.push(() => sql.close());
    const stored = async () => Number((await sql.query<{ n: string }>('SELECT count(*) n FROM messages', { type: QueryTypes.SELECT }))[0].n);
    // Let a good part of the weekend in, then pull the plug.
    for (let i = 0; i < 200 && (await stored()) < 8000; i++) await new Promise((r) => setTimeout(r, 50));
    expect(await stored()).toBeGreaterThanOrEqual(8000);
    await svc.kill9();
    await new Promise((r) => setTimeout(r, 1500));
    await svc.start();
    const truth = await run;
    const api = new ApiClient(svc.url);
    await api.login(ADMIN.email, ADMIN.password);
    const episodes = await fetchSettledEpisodes(api, truth, 30_000, () => {});
    const verdict = compareEpisodes(truth, episodes);
    expect(verdict.misses).toEqual([]);
    expect(verdict.falseFindings).toEqual([]);
    const doubled = await sql.query<{ n: string }>(
      `SELECT count(*) n FROM (SELECT unit_id, key_off_at FROM episodes GROUP BY unit_id, key_off_at HAVING count(*) > 1) d`,
      { type: QueryTypes.SELECT },
    );
    expect(Number(doubled[0].n)).toBe(0);
  }, 240_000);
});
