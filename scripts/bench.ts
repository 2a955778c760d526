// `npm run bench [-- --quick] [--runs N]`: the product against the bare pipeline on this machine, with its
// own PostgreSQL, broker and service. Prints the figures and writes them to bench-results/*.json.
// `npm run bench -- --only history [--quick]` runs the history step alone (same fleet size and data);
// `--only weekend` the weekend replay alone, `--runs N` times; `--only throughput` the bare pipeline and the
// product at full speed alone; `--only half [--rate N] [--units N]` half the bare ceiling alone (the ceiling
// measured first unless --rate gives the load in messages/s), over the ceiling's gateways unless --units.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startLocalPostgres } from './lib/local-postgres';
import { bare, historyQuery, productLive, productMax, startProduct, weekendReplay, type LiveFigures, type ServiceUnderTest, type ThroughputFigures } from './bench/scenarios';

const args = process.argv.slice(2);
const quick = args.includes('--quick');
const runsArg = args.indexOf('--runs');
const runs = runsArg >= 0 ? Number(args[runsArg + 1]) : quick ? 1 : 3;
const onlyArg = args.indexOf('--only');
const only = onlyArg >= 0 ? args[onlyArg + 1] : null;
const P = quick
  ? { gateways: 100, durationS: 6, liveUnits: 1000, liveS: 20, events: 40, weekendUnits: 40, historyTries: 20 }
  : { gateways: 200, durationS: 20, liveUnits: 10_000, liveS: 45, events: 200, weekendUnits: 200, historyTries: 100 };
const say = (s: string) => process.stderr.write(`${s}\n`);

const stats = (xs: (number | null)[]) => {
  const v = xs.filter((x): x is number => x !== null).sort((a, b) => a - b);
  return v.length ? { median: v[Math.floor(v.length / 2)], min: v[0], max: v[v.length - 1] } : null;
};
const fmt = (s: ReturnType<typeof stats>, unit = '', digits = 0) =>
  s ? `${s.median.toFixed(digits)}${unit} (${s.min.toFixed(digits)}–${s.max.toFixed(digits)})` : 'n/a';

/** The history step alone, on a fleet of the live run's size (its data is made by the step itself). */
async function historyOnly(adminUrl: string) {
  say(`history only: ${P.liveUnits} units, 90 days of purges each, a depot's history page`);
  const live = await startProduct(adminUrl, 'bench_history', P.liveUnits);
  try {
    const history = await historyQuery(live, P.historyTries);
    process.stdout.write(`history          a depot's 90-day page over ${history.episodes} episodes: p50 ${history.p50Ms?.toFixed(1)} ms, p95 ${history.p95Ms?.toFixed(1)} ms (target < 200 ms)\n`);
    writeResults('history-', { at: new Date().toISOString(), quick, only: 'history', params: P, history });
  } finally {
    await live.stop();
  }
}

/** The weekend replay alone, `runs` times. */
async function weekendOnly(adminUrl: string) {
  const walls: number[] = [];
  for (let r = 0; r < runs; r++) {
    say(`weekend replay ${r + 1}: ${P.weekendUnits} units`);
    const w = await weekendReplay(adminUrl, P.weekendUnits);
    say(w.summary);
    walls.push(w.wallS);
  }
  process.stdout.write(`weekend replay   ${P.weekendUnits} units, Fri 15:00 to Mon 08:00: ${fmt(stats(walls), ' s', 1)} wall time (target < 60 s)\n`);
  writeResults('weekend-', { at: new Date().toISOString(), quick, only: 'weekend', params: P, weekend: { units: P.weekendUnits, wallS: walls } });
}

/** The bare pipeline and the product at full speed, `runs` times each, one after the other. */
async function throughputRuns(adminUrl: string) {
  const bareRuns: ThroughputFigures[] = [];
  const prodRuns: ThroughputFigures[] = [];
  for (let r = 0; r < runs; r++) {
    say(`run ${r + 1}: bare pipeline, ${P.gateways} gateways, ${P.durationS} s at full speed`);
    bareRuns.push(await bare(adminUrl, r, P.gateways, P.durationS));
    say(`run ${r + 1}: product, ${P.gateways} gateways, ${P.durationS} s at full speed`);
    prodRuns.push(await productMax(adminUrl, r, P.gateways, P.durationS));
  }
  return { bareRuns, prodRuns };
}

/** The results as JSON in bench-results/, named by the step and the time. */
function writeResults(step: string, data: Record<string, unknown>) {
  mkdirSync('bench-results', { recursive: true });
  const file = join('bench-results', `bench-${step}${quick ? 'quick-' : ''}${new Date().toISOString().replace(/[:.]/g, '-')}.json`);
  writeFileSync(file, JSON.stringify(data, null, 2));
  process.stdout.write(`results written to ${file}\n`);
}

/** The bare pipeline and the product at full speed, `runs` times each, nothing else. */
async function throughputOnly(adminUrl: string) {
  const { bareRuns, prodRuns } = await throughputRuns(adminUrl);
  const lines = throughputLines(bareRuns, prodRuns);
  process.stdout.write(`${lines.join('\n')}\n`);
  writeResults('throughput-', { at: new Date().toISOString(), quick, only: 'throughput', params: P, bareRuns, prodRuns });
}

/** CPU microseconds a process spent per committed message, over the runs. */
const perMessage = (runs: ThroughputFigures[], who: string) => stats(runs.map((r) => (r.messages ? (r.cpu[who] * 1e6) / r.messages : null)));

function throughputLines(bareRuns: ThroughputFigures[], prodRuns: ThroughputFigures[]) {
  const bareRate = stats(bareRuns.map((b) => b.msgsPerS))!;
  const prodRate = stats(prodRuns.map((p) => p.msgsPerS))!;
  return [
    `bare pipeline    sustained ${fmt(bareRate, ' msg/s')}, publish→commit p50 ${fmt(stats(bareRuns.map((b) => b.p50Ms)), ' ms', 1)}, p99 ${fmt(stats(bareRuns.map((b) => b.p99Ms)), ' ms', 1)}`,
    `                 CPU s: pipeline ${fmt(stats(bareRuns.map((b) => b.cpu.pipeline)), '', 1)}, postgres ${fmt(stats(bareRuns.map((b) => b.cpu.postgres)), '', 1)}, publishers ${fmt(stats(bareRuns.map((b) => b.cpu.publishers)), '', 1)}; peak RSS ${fmt(stats(bareRuns.map((b) => b.rssMb ?? null)), ' MB')}`,
    `product          sustained ${fmt(prodRate, ' msg/s')}, publish→commit p50 ${fmt(stats(prodRuns.map((b) => b.p50Ms)), ' ms', 1)}, p99 ${fmt(stats(prodRuns.map((b) => b.p99Ms)), ' ms', 1)}`,
    `                 CPU s: service ${fmt(stats(prodRuns.map((b) => b.cpu.service)), '', 1)}, postgres ${fmt(stats(prodRuns.map((b) => b.cpu.postgres)), '', 1)}, publishers ${fmt(stats(prodRuns.map((b) => b.cpu.publishers)), '', 1)}; peak RSS ${fmt(stats(prodRuns.map((b) => b.rssMb ?? null)), ' MB')}`,
    `ratio            product / bare = ${(prodRate.median / bareRate.median).toFixed(2)} (target ≥ 0.75)`,
    `CPU per message  bare: pipeline ${fmt(perMessage(bareRuns, 'pipeline'), ' µs', 1)}, postgres ${fmt(perMessage(bareRuns, 'postgres'), ' µs', 1)}, publishers ${fmt(perMessage(bareRuns, 'publishers'), ' µs', 1)}`,
    `                 product: service ${fmt(perMessage(prodRuns, 'service'), ' µs', 1)}, postgres ${fmt(perMessage(prodRuns, 'postgres'), ' µs', 1)}, publishers ${fmt(perMessage(prodRuns, 'publishers'), ' µs', 1)}`,
  ];
}

/**
 * Half the bare ceiling, `runs` times: the product with the board watching, over `live` (a started fleet,
 * the load over all of it) or over `units` gateways of a fleet started and stopped here, with probe
 * gateways of their own beside them (fresh ones each run). The bare pipeline at the same load goes beside
 * it (bareAt).
 */
async function halfRuns(adminUrl: string, rate: number, units: number, live: ServiceUnderTest | null, boot0: number) {
  const probes = Math.min(P.events, units);
  const s = live ?? (await startProduct(adminUrl, `bench_half_${units}`, units + probes * runs));
  const product: LiveFigures[] = [];
  try {
    for (let r = 0; r < runs; r++) {
      say(`run ${r + 1}: product, ${units} gateways at ${Math.round(rate)} messages/s and ${probes} probes, board watching`);
      const at = live ? { probeFrom: (boot0 - 1 + r) * probes } : { probeFrom: units + r * probes, loadCount: units };
      product.push(await productLive(s, { rate, durationS: P.liveS, probes, ...at, boot: boot0 + r }));
    }
  } finally {
    if (!live) await s.stop();
  }
  return { units, rate, product, bare: [] as ThroughputFigures[] };
}

/** The bare pipeline at the load of `h` over as many connections, `runs` times (no product running meanwhile). */
async function bareAt(adminUrl: string, h: Half) {
  for (let r = 0; r < runs; r++) {
    say(`run ${r + 1}: bare pipeline, ${h.units} gateways at ${Math.round(h.rate)} messages/s`);
    h.bare.push(await bare(adminUrl, 100 + r, h.units, P.liveS, h.rate));
  }
}
type Half = Awaited<ReturnType<typeof halfRuns>>;

/** The half-ceiling step alone (the ceiling measured first unless --rate gives it), over --units gateways (default: the ceiling's). */
async function halfOnly(adminUrl: string) {
  const rateArg = args.indexOf('--rate');
  let rate = rateArg >= 0 ? Number(args[rateArg + 1]) : NaN;
  if (!Number.isFinite(rate)) {
    say(`bare pipeline, ${P.gateways} gateways, ${P.durationS} s at full speed (for the ceiling)`);
    rate = (await bare(adminUrl, 0, P.gateways, P.durationS)).msgsPerS / 2;
  }
  const unitsArg = args.indexOf('--units');
  const units = unitsArg >= 0 ? Number(args[unitsArg + 1]) : P.gateways;
  const half = await halfRuns(adminUrl, rate, units, null, 1);
  await bareAt(adminUrl, half);
  process.stdout.write(`${halfLines('half ceiling', half).join('\n')}\n`);
  writeResults('half-', { at: new Date().toISOString(), quick, only: 'half', params: P, half });
}

function liveLines(name: string, xs: LiveFigures[]) {
  return [
    `${name.padEnd(16)} ${xs[0].units} gateways + ${xs[0].probes} probes, ${Math.round(xs[0].rate)} msg/s asked (offered ${fmt(stats(xs.map((x) => x.offeredPerS)))}): committed ${fmt(stats(xs.map((x) => x.committedPerS)), ' msg/s')}, publish→commit p50 ${fmt(stats(xs.map((x) => x.commitP50Ms)), ' ms', 1)}, p99 ${fmt(stats(xs.map((x) => x.commitP99Ms)), ' ms', 1)}`,
    `                 publish→board key-off p50 ${fmt(stats(xs.map((x) => x.keyOffBoardP50Ms)), ' ms')}, p99 ${fmt(stats(xs.map((x) => x.keyOffBoardP99Ms)), ' ms')}; supply loss p50 ${fmt(stats(xs.map((x) => x.supplyLossBoardP50Ms)), ' ms')}, p99 ${fmt(stats(xs.map((x) => x.supplyLossBoardP99Ms)), ' ms')}; events not seen ${xs.reduce((s, x) => s + x.eventsMissing, 0)}`,
    `                 service RSS ${fmt(stats(xs.map((x) => x.serviceRssMb)), ' MB')}, CPU s: service ${fmt(stats(xs.map((x) => x.cpu.service)), '', 1)}, postgres ${fmt(stats(xs.map((x) => x.cpu.postgres)), '', 1)}, publishers ${fmt(stats(xs.map((x) => x.cpu.publishers)), '', 1)}`,
  ];
}

function halfLines(name: string, h: Half) {
  const b = h.bare;
  return [
    ...liveLines(name, h.product),
    `  bare, same load committed ${fmt(stats(b.map((x) => x.msgsPerS)), ' msg/s')}, publish→commit p50 ${fmt(stats(b.map((x) => x.p50Ms)), ' ms', 1)}, p99 ${fmt(stats(b.map((x) => x.p99Ms)), ' ms', 1)}; CPU s: pipeline ${fmt(stats(b.map((x) => x.cpu.pipeline)), '', 1)}, postgres ${fmt(stats(b.map((x) => x.cpu.postgres)), '', 1)}, publishers ${fmt(stats(b.map((x) => x.cpu.publishers)), '', 1)}`,
  ];
}

async function main() {
  if (only !== null && !['history', 'weekend', 'throughput', 'half'].includes(only)) throw new Error(`--only knows four steps: history, weekend, throughput, half (got ${only})`);
  const dir = mkdtempSync(join(tmpdir(), 'afterwatch-bench-pg-'));
  say(`afterwatch bench: ${quick ? 'quick' : 'full'}, ${runs} run(s)`);
  const pg = await startLocalPostgres({ dataDir: dir, database: 'postgres' });
  const adminUrl = pg.url;
  const out: Record<string, unknown> = { at: new Date().toISOString(), quick, runs, params: P };
  try {
    if (only === 'history') return await historyOnly(adminUrl);
    if (only === 'weekend') return await weekendOnly(adminUrl);
    if (only === 'throughput') return await throughputOnly(adminUrl);
    if (only === 'half') return await halfOnly(adminUrl);
    const { bareRuns, prodRuns } = await throughputRuns(adminUrl);
    const bareRate = stats(bareRuns.map((b) => b.msgsPerS))!;
    say(`live fleet: ${P.liveUnits} units`);
    const live = await startProduct(adminUrl, 'bench_live', P.liveUnits);
    const normal: LiveFigures[] = [];
    // The fleet at its normal pace first: an overloaded run leaves a backlog that would spoil the next one.
    for (let r = 0; r < runs; r++) {
      say(`run ${r + 1}: ${P.liveUnits} units, one sample every 5 s each, board watching`);
      normal.push(await productLive(live, { rate: P.liveUnits / 5, durationS: P.liveS, probes: P.events, probeFrom: r * P.events, boot: r + 1 }));
    }
    // Half the ceiling over the whole live fleet's connections (reported beside the bare pipeline at that load) ...
    say(`half the bare ceiling (${Math.round(bareRate.median / 2)} messages/s) over the live fleet`);
    const halfFleet = await halfRuns(adminUrl, bareRate.median / 2, P.liveUnits, live, runs + 1);
    say('history: 90 days of purges for every unit, a depot\'s history page');
    const history = await historyQuery(live, P.historyTries);
    await live.stop();
    // ... and over the connections the ceiling was measured on (the target's load).
    say(`half the bare ceiling over the ceiling's ${P.gateways} gateways`);
    const half = await halfRuns(adminUrl, bareRate.median / 2, P.gateways, null, 1);
    await bareAt(adminUrl, half);
    await bareAt(adminUrl, halfFleet);
    say(`weekend replay: ${P.weekendUnits} units`);
    const weekend = await weekendReplay(adminUrl, P.weekendUnits);
    Object.assign(out, { bareRuns, prodRuns, normal, half, halfFleet, history, weekend: { units: weekend.units, wallS: weekend.wallS } });

    const lines = [
      '',
      `Afterwatch benchmark (${quick ? 'quick' : 'full'}; median of ${runs} run(s), min–max in brackets)`,
      '',
      ...throughputLines(bareRuns, prodRuns),
      '',
      ...liveLines('live', normal),
      ...halfLines('half ceiling', half),
      ...halfLines('half, fleet', halfFleet),
      '',
      `history          a depot's 90-day page over ${history.episodes} episodes: p50 ${history.p50Ms?.toFixed(1)} ms, p95 ${history.p95Ms?.toFixed(1)} ms (target < 200 ms)`,
      `weekend replay   ${weekend.units} units, Fri 15:00 to Mon 08:00: ${weekend.wallS.toFixed(1)} s wall time (target < 60 s)`,
      '',
    ];
    process.stdout.write(lines.join('\n'));
    writeResults('', out);
  } finally {
    await pg.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err) => {
  process.stderr.write(`bench failed: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
