// Scale-out on an existing broker: Mosquitto from Debian with password and ACL files written from the
// gateways table, and two ingest workers sharing the gateways' messages through a shared subscription.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ADMIN } from '../helpers/service';
import { startMosquittoFleet, verdictWhenStored } from '../helpers/mosquitto';
import { runScenarioDetailed } from '../../simulator/run-scenario';

const cleanups: (() => Promise<void> | void)[] = [];
afterAll(async () => {
  for (const c of cleanups.reverse()) await c();
});

describe('behind Mosquitto with two ingest workers', () => {
  it('judges a weekend correctly whichever worker receives each message', async () => {
    const fleet = await startMosquittoFleet(['w1', 'w2'], cleanups);
    const [w1, w2] = fleet.workers;
    const run = await runScenarioDetailed({
      apiUrl: w1.url, mqttUrl: fleet.mqttUrl, adminEmail: ADMIN.email, adminPassword: ADMIN.password,
      scenario: 'weekend', units: 12, seed: 'ci-mosquitto', speed: 'max',
      dataDir: mkdtempSync(join(tmpdir(), 'afterwatch-sim-')), truthPath: null, progress: false,
    });
    const verdict = await verdictWhenStored(fleet, run);
    expect(verdict.notStored).toEqual([]);
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
  }, 480_000);
});
