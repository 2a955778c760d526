// One measurement each: the bare pipeline, the product at full speed, the product at a given rate with
// the board watching, a weekend replay, and the planner's history query.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort, PG_SYSTEM_USER } from '../lib/local-postgres';
import { postgresCpu, spawnService, spawnTs, treeCpu, treePeakRssMb, waitFor, type Child } from './processes';
import { createDatabase, provisionFleet, type BenchGateway } from './fleet';
import { eventLatencies, observe, quantile } from './observer';
import { fillHistory } from './history-data';

export const ADMIN = { email: 'bench@afterwatch.local', password: 'bench-password-1' };

interface PublisherResult {
  published: number; acked: number; failed: number; elapsedS: number; p50: number | null; p99: number | null;
  events: { gatewayId: string; kind: 'keyOff' | 'supplyLost'; at: number }[];
  cpuS: number;
}

async function publish(mqttUrl: string, gateways: BenchGateway[], plan: Record<string, unknown>) {
  const file = join(mkdtempSync(join(tmpdir(), 'afterwatch-bench-')), 'plan.json');
  writeFileSync(file, JSON.stringify({ mqttUrl, gateways: gateways.map((g) => ({ id: g.id, secret: g.secret })), ...plan }));
  let result: PublisherResult | null = null;
  const child = spawnTs('scripts/bench/publisher.ts', [file], {}, (line) => {
    if (line.startsWith('{')) result = JSON.parse(line);
  });
  const code = await child.exited;
  if (code !== 0 || !result) throw new Error(`publisher failed (${code}):\n${child.output().slice(-2000)}`);
  return { result: result as PublisherResult };
}

const cpuOf = (c: Child) => treeCpu(c.proc.pid!);
const rssOf = (c: Child) => treePeakRssMb(c.proc.pid!);

export interface ThroughputFigures {
  msgsPerS: number; p50Ms: number | null; p99Ms: number | null; cpu: Record<string, number>; rssMb?: number; failed: number;
  /** Messages committed in the run. */
  messages: number;
}

/** The bare pipeline over `gateways` connections: at full speed, or at `rate` messages/s spread over them. */
export async function bare(adminUrl: string, run: number, gateways: number, durationS: number, rate?: number): Promise<ThroughputFigures> {
  const db = await createDatabase(adminUrl, `bench_bare_${run}`);
  const port = await freePort();
  let ready = false;
  const child = spawnTs('scripts/bench/bare.ts', [db, String(port)], {}, (l) => (ready ||= l === 'ready'));
  await waitFor(async () => ready, 20_000, 'the bare pipeline');
  const gws = Array.from({ length: gateways }, (_, i) => ({ id: `bare-gw-${i}`, secret: 'x', unitId: '' }));
  const pg0 = postgresCpu(PG_SYSTEM_USER);
  const c0 = cpuOf(child);
  const plan = rate === undefined ? { mode: 'max', window: 20, durationS } : { mode: 'rate', rate, durationS };
  const { result } = await publish(`mqtt://127.0.0.1:${port}`, gws, plan);
  const figures = {
    msgsPerS: result.acked / (rate === undefined ? result.elapsedS : durationS), p50Ms: result.p50, p99Ms: result.p99, failed: result.failed, messages: result.acked,
    cpu: { pipeline: cpuOf(child) - c0, postgres: postgresCpu(PG_SYSTEM_USER) - pg0, publishers: result.cpuS }, rssMb: rssOf(child),
  };
  await child.stop();
  return figures;
}

export interface ServiceUnderTest {
  child: Child; url: string; mqttUrl: string; databaseUrl: string; gateways: BenchGateway[]; token: string;
  stop(): Promise<void>;
}

export async function startProduct(adminUrl: string, name: string, units: number): Promise<ServiceUnderTest> {
  const databaseUrl = await createDatabase(adminUrl, name);
  const port = await freePort();
  const mqttPort = await freePort();
  const env = {
    DATABASE_URL: databaseUrl, PORT: String(port), MQTT_PORT: String(mqttPort), DATA_DIR: mkdtempSync(join(tmpdir(), 'afterwatch-bench-data-')),
    ADMIN_EMAIL: ADMIN.email, ADMIN_PASSWORD: ADMIN.password, LOG_LEVEL: 'warn', DEMO: 'off', LOGIN_RATE_LIMIT: '1000',
  };
  // The service makes the schema; the fleet goes in before the ingest loads it.
  let child = spawnService(env);
  const url = `http://127.0.0.1:${port}`;
  await waitFor(async () => (await fetch(`${url}/api/health`)).status === 200, 60_000, 'the service');
  await child.stop();
  const gateways = await provisionFleet(databaseUrl, units);
  child = spawnService(env);
  await waitFor(async () => (await fetch(`${url}/api/health`)).status === 200, 120_000, 'the service with its fleet');
  const login = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(ADMIN) });
  const token = ((await login.json()) as { token: string }).token;
  return { child, url, mqttUrl: `mqtt://127.0.0.1:${mqttPort}`, databaseUrl, gateways, token, stop: () => child.stop() };
}

export async function productMax(adminUrl: string, run: number, gateways: number, durationS: number): Promise<ThroughputFigures> {
  const s = await startProduct(adminUrl, `bench_prod_${run}`, gateways);
  const pg0 = postgresCpu(PG_SYSTEM_USER);
  const c0 = cpuOf(s.child);
  const { result } = await publish(s.mqttUrl, s.gateways, { mode: 'max', window: 20, durationS });
  const figures = {
    msgsPerS: result.acked / result.elapsedS, p50Ms: result.p50, p99Ms: result.p99, failed: result.failed, messages: result.acked,
    cpu: { service: cpuOf(s.child) - c0, postgres: postgresCpu(PG_SYSTEM_USER) - pg0, publishers: result.cpuS }, rssMb: rssOf(s.child),
  };
  await s.stop();
  return figures;
}

export interface LiveFigures {
  rate: number; units: number; probes: number; offeredPerS: number; committedPerS: number; commitP50Ms: number | null; commitP99Ms: number | null;
  keyOffBoardP50Ms: number | null; keyOffBoardP99Ms: number | null; supplyLossBoardP50Ms: number | null; supplyLossBoardP99Ms: number | null;
  eventsMissing: number; serviceRssMb: number; cpu: Record<string, number>;
}

/**
 * The fleet live at a rate, the board watching: publish -> committed and publish -> board state change.
 * `probes` gateways from `probeFrom` on key off and lose supply (see the publisher); the load goes over
 * the first `loadCount` gateways (default: all the others).
 */
export async function productLive(s: ServiceUnderTest, opts: { rate: number; durationS: number; probes: number; probeFrom: number; loadCount?: number; boot: number }): Promise<LiveFigures> {
  const board = await observe(s.url, s.token);
  const pg0 = postgresCpu(PG_SYSTEM_USER);
  const c0 = cpuOf(s.child);
  const probes = s.gateways.slice(opts.probeFrom, opts.probeFrom + opts.probes);
  if (probes.length < opts.probes) throw new Error(`the fleet has no ${opts.probes} probe gateways from ${opts.probeFrom}`);
  const isProbe = new Set(probes);
  const load = s.gateways.slice(0, opts.loadCount ?? s.gateways.length).filter((g) => !isProbe.has(g));
  const { result } = await publish(s.mqttUrl, [...probes, ...load], { mode: 'rate', rate: opts.rate, durationS: opts.durationS, eventGateways: probes.length, boot: opts.boot });
  await new Promise((r) => setTimeout(r, 1000));
  board.close();
  const unitOf = new Map(s.gateways.map((g) => [g.id, g.unitId]));
  const lat = eventLatencies(result.events, board.seen, (gw) => unitOf.get(gw)!);
  return {
    rate: opts.rate, units: load.length, probes: probes.length, offeredPerS: result.published / opts.durationS, committedPerS: result.acked / opts.durationS, commitP50Ms: result.p50, commitP99Ms: result.p99,
    keyOffBoardP50Ms: quantile(lat.keyOff, 0.5), keyOffBoardP99Ms: quantile(lat.keyOff, 0.99),
    supplyLossBoardP50Ms: quantile(lat.supplyLost, 0.5), supplyLossBoardP99Ms: quantile(lat.supplyLost, 0.99),
    eventsMissing: lat.missing, serviceRssMb: rssOf(s.child),
    cpu: { service: cpuOf(s.child) - c0, postgres: postgresCpu(PG_SYSTEM_USER) - pg0, publishers: result.cpuS },
  };
}

export async function weekendReplay(adminUrl: string, units: number): Promise<{ units: number; wallS: number; summary: string }> {
  const s = await startProduct(adminUrl, 'bench_weekend', 0);
  const started = Date.now();
  const sim = spawnTs('simulator/cli.ts', ['--scenario', 'weekend', '--units', String(units), '--speed', 'max', '--seed', 'bench', '--data-dir', mkdtempSync(join(tmpdir(), 'afterwatch-bench-sim-'))], {
    API_URL: s.url, MQTT_URL: s.mqttUrl, ADMIN_EMAIL: ADMIN.email, ADMIN_PASSWORD: ADMIN.password,
  });
  const code = await sim.exited;
  const wallS = (Date.now() - started) / 1000;
  await s.stop();
  if (code !== 0) throw new Error(`weekend replay failed:\n${sim.output().slice(-2000)}`);
  return { units, wallS, summary: sim.output().trim().split('\n').slice(-8).join('\n') };
}

/** p95 of a depot's 90-day history page (GET /api/history/episodes) over 90 days of data for every unit. */
export async function historyQuery(s: ServiceUnderTest, tries: number) {
  const rows = await fillHistory(s.databaseUrl, 90);
  const from = new Date(Date.now() - 90 * 86_400_000).toISOString();
  const times: number[] = [];
  for (let i = 0; i < tries; i++) {
    const depot = encodeURIComponent(`Depot ${i % 20}`);
    const t0 = performance.now();
    const res = await fetch(`${s.url}/api/history/episodes?depot=${depot}&from=${from}&page=${1 + (i % 5)}&pageSize=50`, { headers: { authorization: `Bearer ${s.token}` } });
    await res.arrayBuffer();
    if (res.status !== 200) throw new Error(`history query answered ${res.status}`);
    times.push(performance.now() - t0);
  }
  return { episodes: rows, p50Ms: quantile(times, 0.5), p95Ms: quantile(times, 0.95) };
}
