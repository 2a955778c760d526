// A simulated weekend through the real broker and service, judged against the simulator's ground truth.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ADMIN, startTestService, type TestService } from '../helpers/service';
import { runScenario } from '../../simulator/run-scenario';
import { ApiClient } from '../../simulator/net/api-client';
import { compareEpisodes, fetchSettledEpisodes } from '../../simulator/truth/verify';

let t: TestService;
beforeAll(async () => {
  t = await startTestService();
});
afterAll(async () => t?.stop());

describe('weekend replay', () => {
  it('a weekend of 24 units replayed as fast as the service takes it gives zero misses and zero false findings', async () => {
    const truth = await runScenario({
      apiUrl: t.url, mqttUrl: t.mqttUrl, adminEmail: ADMIN.email, adminPassword: ADMIN.password,
      scenario: 'weekend', units: 24, seed: 'ci-weekend', speed: 'max',
      dataDir: mkdtempSync(join(tmpdir(), 'afterwatch-sim-')), truthPath: null, progress: false,
    });
    expect(truth.keyOffs.length).toBeGreaterThan(50);
    expect(truth.keyOffs.some((k) => k.outcome === 'interrupted')).toBe(true);
    const api = new ApiClient(t.url);
    await api.login(ADMIN.email, ADMIN.password);
    const episodes = await fetchSettledEpisodes(api, truth, 20_000, () => {});
    const verdict = compareEpisodes(truth, episodes);
    expect(verdict.misses).toEqual([]);
    expect(verdict.falseFindings).toEqual([]);
    expect(verdict.rows.interrupted.found).toBe(truth.keyOffs.filter((k) => k.outcome === 'interrupted').length);
    expect(verdict.ok).toBe(true);
  }, 180_000);
});
