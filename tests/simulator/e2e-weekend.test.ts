import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient } from '../../simulator/net/api-client';
import { runScenario } from '../../simulator/run-scenario';
import { compareEpisodes } from '../../simulator/truth/compare';
import { compareFaults } from '../../simulator/truth/compare-faults';
import { fetchFaults, fetchSettledEpisodes, formatVerdict } from '../../simulator/truth/verify';
import { ADMIN, startTestService, type TestService } from '../helpers/service';

// The whole chain: the simulator provisions through the real HTTP API, sends a weekend over the
// real broker into the real service (PostgreSQL included), and the service's findings are
// compared with what really happened.
let svc: TestService;
let dataDir: string;
// The service's unit clock is event time running on in wall time after the last message; after a
// replay at full speed, the wall clock is moved on so that silent purges pass C + 30 s (rule 6).
let wallOffset = 0;

beforeAll(async () => {
  svc = await startTestService({}, { wallNow: () => Date.now() + wallOffset });
  dataDir = mkdtempSync(join(tmpdir(), 'aw-e2e-sim-'));
}, 120_000);
afterAll(async () => {
  await svc?.stop();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('a weekend of a small fleet through the real broker and service', () => {
  it('is judged with zero misses and zero false findings', async () => {
    const truth = await runScenario({
      apiUrl: svc.url, mqttUrl: svc.mqttUrl, adminEmail: ADMIN.email, adminPassword: ADMIN.password,
      scenario: 'weekend', units: 12, seed: 'e2e', speed: 'max', dataDir, truthPath: null, progress: false,
    });
    expect(truth.keyOffs.filter((k) => k.expectedOutcome === 'interrupted').length).toBeGreaterThan(0);
    wallOffset = 3600_000;
    const api = new ApiClient(svc.url);
    await api.login(ADMIN.email, ADMIN.password);
    const episodes = await fetchSettledEpisodes(api, truth, 30_000, () => {});
    const v = compareEpisodes(truth, episodes);
    const f = compareFaults(truth, await fetchFaults(api, truth), v);
    expect(v.ok && f.ok, formatVerdict(v, f)).toBe(true);
  }, 180_000);
});
