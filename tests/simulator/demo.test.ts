import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBroker, type BrokerHandle } from '../../broker/create-broker';
import { TelemetrySchema } from '../../shared/protocol/messages';
import { runDemo } from '../../simulator/run-demo';
import { TruthSchema } from '../../simulator/truth/truth-schema';
import { startContractApi, type ContractApi } from './fixtures/contract-api';

const admin = { email: 'admin@example.test', password: 'correct horse battery' };
let api: ContractApi;
let broker: BrokerHandle;
let dataDir: string;
const telemetry: { ts: string }[] = [];

beforeAll(async () => {
  api = await startContractApi(admin);
  broker = await createBroker({
    host: '127.0.0.1', port: 0, log: pino({ level: 'silent' }),
    checkCredential: async (user, password) => ({ ok: api.secrets.get(user) === password }),
    accept: async (_gw, topic, payload) => {
      if (topic.endsWith('/telemetry')) telemetry.push(TelemetrySchema.parse(JSON.parse(payload.toString())));
    },
  });
  dataDir = await mkdtemp(join(tmpdir(), 'aw-demo-'));
});
afterAll(async () => {
  await broker?.close();
  await api?.close();
  await rm(dataDir, { recursive: true, force: true });
});

describe('the live demo', () => {
  it('provisions about 40 trucks over three depots, 12 V and 24 V, and sends from the current time on until stopped', async () => {
    let stop!: () => void;
    const stopped = new Promise<void>((r) => (stop = r));
    const startedAt = Date.now();
    const run = runDemo({
      apiUrl: api.url, mqttUrl: `mqtt://127.0.0.1:${broker.port}`, adminEmail: admin.email, adminPassword: admin.password,
      seed: 'demo', speed: 120, dataDir, truthPath: join(dataDir, 'demo-truth.json'), stopped, log: () => {},
    });
    while (telemetry.length < 200 && Date.now() - startedAt < 20_000) await new Promise((r) => setTimeout(r, 100));
    stop();
    await run;
    const units = [...api.units.values()];
    expect(units).toHaveLength(40);
    expect(new Set(units.map((u) => u.depot)).size).toBe(3);
    expect(new Set(units.map((u) => u.systemVoltage))).toEqual(new Set([12, 24]));
    expect(telemetry.length).toBeGreaterThanOrEqual(200);
    // Event time starts at the wall clock (gateway clocks drift by a few seconds).
    expect(Math.abs(Date.parse(telemetry[0].ts) - startedAt)).toBeLessThan(60_000);
    const store = JSON.parse(await readFile(join(dataDir, 'sim-gateways.json'), 'utf8'));
    expect(Object.keys(store.gateways)).toHaveLength(40);
    expect(TruthSchema.safeParse(JSON.parse(await readFile(join(dataDir, 'demo-truth.json'), 'utf8'))).success).toBe(true);
  }, 60_000);
});
