import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBroker, type BrokerHandle } from '../../broker/create-broker';
import { generateScenario } from '../../simulator/scenario/generate';
import { runScenario } from '../../simulator/run-scenario';
import { TruthSchema } from '../../simulator/truth/truth-schema';
import { startContractApi, type ContractApi } from './fixtures/contract-api';

// The simulator through real HTTP provisioning and the project's real MQTT broker (its hooks for
// credentials and topics), with an ingest that records what it is handed.
const admin = { email: 'admin@example.test', password: 'correct horse battery' };
let api: ContractApi;
let broker: BrokerHandle;
let dataDir: string;
const received: { gatewayId: string; topic: string; payload: Record<string, unknown> }[] = [];
const wills: string[] = [];

beforeAll(async () => {
  api = await startContractApi(admin);
  broker = await createBroker({
    host: '127.0.0.1',
    port: 0,
    log: pino({ level: 'silent' }),
    checkCredential: async (user, password) => ({ ok: api.secrets.get(user) === password }),
    accept: async (gatewayId, topic, payload) => {
      const parsed = JSON.parse(payload.toString('utf8'));
      // The broker hands the will ("offline") to the ingest too, on the gateway's behalf.
      if (topic.endsWith('/status') && parsed.state === 'offline') wills.push(topic);
      else received.push({ gatewayId, topic, payload: parsed });
    },
  });
  dataDir = await mkdtemp(join(tmpdir(), 'aw-sim-'));
});

afterAll(async () => {
  await broker?.close();
  await api?.close();
  await rm(dataDir, { recursive: true, force: true });
});

const opts = () => ({
  apiUrl: api.url, mqttUrl: `mqtt://127.0.0.1:${broker.port}`, adminEmail: admin.email, adminPassword: admin.password,
  scenario: 'coverage-gaps' as const, units: 4, seed: 'wire', speed: 'max' as const, dataDir, progress: false,
});
const key = (m: { gatewayId: string; topic: string; payload: unknown }) => `${m.gatewayId} ${m.topic} ${JSON.stringify(m.payload)}`;

describe('runScenario over HTTP and MQTT', () => {
  it('provisions the fleet as an admin, sends every generated message through the broker, and returns the truth', async () => {
    const truth = await runScenario(opts());
    expect(TruthSchema.safeParse(truth).success).toBe(true);
    expect([...api.units.keys()].sort()).toEqual(['TRK-101', 'TRK-102', 'TRK-103', 'TRK-104']);
    expect(api.gateways.map((g) => g.gatewayId).sort()).toEqual(['TRK-101-gw1', 'TRK-102-gw1', 'TRK-103-gw1', 'TRK-104-gw1']);
    const expected = generateScenario({ scenario: 'coverage-gaps', units: 4, seed: 'wire' });
    expect(truth).toEqual(expected.truth);
    const sent = expected.timeline.flatMap((e) => (e.kind === 'publish' ? [{ gatewayId: e.gatewayId, topic: e.topic, payload: e.payload }] : []));
    expect(received.map(key).sort()).toEqual(sent.map(key).sort());
    // A gateway's messages arrive in the order it sent them.
    for (const gw of new Set(sent.map((s) => s.gatewayId))) {
      expect(received.filter((r) => r.gatewayId === gw).map(key)).toEqual(sent.filter((s) => s.gatewayId === gw).map(key));
    }
    // Planned losses of power or coverage drop the connection without DISCONNECT: the broker announces the will.
    expect(wills.length).toBeGreaterThan(0);
    expect(JSON.parse(await readFile(join(dataDir, 'sim-truth-coverage-gaps.json'), 'utf8'))).toEqual(truth);
  }, 120_000);

  it('a second start reuses the stored secrets and carries on the boot counters; a lost secret gets a new gateway', async () => {
    const store = JSON.parse(await readFile(join(dataDir, 'sim-gateways.json'), 'utf8'));
    const lastBoot = Math.max(...received.filter((r) => r.gatewayId === 'TRK-102-gw1' && typeof r.payload.boot === 'number').map((r) => r.payload.boot as number));
    expect(store.gateways['TRK-102'].nextBoot).toBe(lastBoot + 1);
    delete store.gateways['TRK-103'];
    await writeFile(join(dataDir, 'sim-gateways.json'), JSON.stringify(store));
    received.length = 0;
    await runScenario({ ...opts(), start: Date.parse('2026-12-01T03:00:00.000Z') });
    expect(api.gateways.map((g) => `${g.gatewayId}${g.revokedAt ? ' revoked' : ''}`).sort()).toEqual([
      'TRK-101-gw1', 'TRK-102-gw1', 'TRK-103-gw1 revoked', 'TRK-103-gw2', 'TRK-104-gw1',
    ]);
    const firstBoot = received.find((r) => r.gatewayId === 'TRK-102-gw1' && r.topic.endsWith('/power'))!.payload.boot;
    expect(firstBoot).toBe(lastBoot + 1);
  }, 120_000);
});
