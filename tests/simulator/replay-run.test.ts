import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBroker, type BrokerHandle } from '../../broker/create-broker';
import { runReplay } from '../../simulator/replay/run-replay';
import { startContractApi, type ContractApi } from './fixtures/contract-api';

const admin = { email: 'admin@example.test', password: 'correct horse battery' };
let api: ContractApi;
let broker: BrokerHandle;
let dir: string;
const received: { topic: string; payload: Record<string, unknown> }[] = [];

beforeAll(async () => {
  api = await startContractApi(admin);
  api.units.set('TRK-900', { id: 'TRK-900', name: 'Rigid 900', depot: 'Harrowgate Yard', systemVoltage: 24, purgeSeconds: 120, gatewayId: null });
  broker = await createBroker({
    host: '127.0.0.1', port: 0, log: pino({ level: 'silent' }),
    checkCredential: async (user, password) => ({ ok: api.secrets.get(user) === password }),
    accept: async (_gw, topic, payload) => {
      const p = JSON.parse(payload.toString());
      if (p.state !== 'offline') received.push({ topic, payload: p });
    },
  });
  dir = await mkdtemp(join(tmpdir(), 'aw-replay-run-'));
  // DM1 from source address 0x3D: SPN 520310 FMI 7, count 1 (SAE J1939-73 layout), amber lamp on.
  await writeFile(join(dir, 'bus.log'), '(1795800000.100000) can0 18FECA3D#0400F6F0070701FF\n(1795800001.100000) can0 18FECA3D#0400F6F0070701FF\n');
  await writeFile(join(dir, 'gw.jsonl'), `${JSON.stringify({ ts: '2026-11-27T17:19:59.000Z', key: 'on', supplyV: 28.2, ecmAwake: true })}\n`);
});
afterAll(async () => {
  await broker?.close();
  await api?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('npm run sim -- --replay', () => {
  it('provisions the named gateway for the unit, sends the log through it, and keeps its boot counter for next time', async () => {
    const base = {
      apiUrl: api.url, mqttUrl: `mqtt://127.0.0.1:${broker.port}`, adminEmail: admin.email, adminPassword: admin.password,
      candumpPath: join(dir, 'bus.log'), telemetryPath: join(dir, 'gw.jsonl'), gatewayId: 'REPLAY-900', speed: 'max' as const, dataDir: dir, seed: 'r', progress: false,
    };
    await expect(runReplay(base)).rejects.toThrow(/give --unit/);
    await runReplay({ ...base, unitId: 'TRK-900' });
    expect(api.gateways.map((g) => g.gatewayId)).toEqual(['REPLAY-900']);
    expect(received.map((r) => r.topic.split('/').pop())).toEqual(['status', 'power', 'telemetry', 'can']);
    expect(received[3].payload).toMatchObject({ boot: 0, seq: 2, frames: [{ t: '2026-11-27T17:20:00.100Z', id: '18FECA3D' }, { t: '2026-11-27T17:20:01.100Z' }] });
    const store = JSON.parse(await readFile(join(dir, 'sim-gateways.json'), 'utf8'));
    expect(store.gateways['TRK-900']).toMatchObject({ gatewayId: 'REPLAY-900', nextBoot: 1 });
    received.length = 0;
    await runReplay(base); // known now: no --unit needed, and the next boot is 1
    expect(received.find((r) => r.topic.endsWith('/power'))!.payload).toMatchObject({ boot: 1, seq: 0, event: 'boot' });
  }, 30_000);
});
