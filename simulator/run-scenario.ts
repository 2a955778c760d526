import { join } from 'node:path';
import { startProgress, formatSummary, type ProgressSource } from './cli/progress';
import { buildFleet } from './model/fleet';
import { ApiClient } from './net/api-client';
import { gatewayStorePath } from './net/gateway-store';
import { provisionFleet, saveNextBoots } from './net/provision';
import { Sender, type Speed } from './net/sender';
import { generateScenario } from './scenario/generate';
import { SCENARIOS, type ScenarioName } from './scenario/scenarios';
import { writeTruth } from './truth/truth-file';
import type { Truth } from './truth/truth-schema';
import type { TimelineEntry } from './scenario/timeline';

export interface RunScenarioOptions {
  apiUrl: string;
  mqttUrl: string;
  adminEmail: string;
  adminPassword: string;
  scenario: Exclude<ScenarioName, 'demo'>;
  units?: number;
  seed: string | number;
  speed: Speed;
  /** Where the gateways' secrets live (default `.data`). */
  dataDir?: string;
  /** Where to write the ground truth; default `<dataDir>/sim-truth-<scenario>.json`; null: do not write. */
  truthPath?: string | null;
  /** Override the scenario's fixed start (epoch ms). */
  start?: number;
  /** Progress bar and summary on stderr (default: when stderr is a terminal). */
  progress?: boolean;
  /** Called once sending begins, with the sender's live counts (tests act on the sending's progress). */
  onSending?: (source: ProgressSource, total: number) => void;
}

export interface RunResult {
  truth: Truth;
  truthPath: string | null;
  summary: string;
  /** Each gateway's count of the distinct messages it sent on the topics the service stores (telemetry, can, power). */
  sentByGateway: Map<string, number>;
}

/** Distinct (boot, seq) per gateway on the stored topics: what the service holds once it has caught up. */
export function distinctStoredMessages(timeline: readonly TimelineEntry[]): Map<string, number> {
  const seen = new Map<string, Set<string>>();
  for (const e of timeline) {
    if (e.kind !== 'publish' || !/\/(telemetry|can|power)$/.test(e.topic)) continue;
    const set = seen.get(e.gatewayId) ?? new Set<string>();
    set.add(`${e.payload.boot}/${e.payload.seq}`);
    seen.set(e.gatewayId, set);
  }
  return new Map([...seen].map(([g, set]) => [g, set.size]));
}

/** Provisions the fleet through the API, generates the scenario, sends it over MQTT, writes the truth. */
export async function runScenarioDetailed(opts: RunScenarioOptions): Promise<RunResult> {
  const seed = String(opts.seed);
  const dataDir = opts.dataDir ?? '.data';
  const def = SCENARIOS[opts.scenario];
  const units = opts.units ?? def.defaultUnits;
  const began = Date.now();
  const api = new ApiClient(opts.apiUrl);
  await api.login(opts.adminEmail, opts.adminPassword);
  const storePath = gatewayStorePath(dataDir);
  const gateways = await provisionFleet(api, buildFleet({ units, seed, roundTheClock: def.roundTheClock }), storePath, seed);
  const generated = generateScenario({ scenario: opts.scenario, units, seed, start: opts.start, gateways });
  const secrets = new Map([...gateways.values()].map((g) => [g.gatewayId, g.secret]));
  const sender = new Sender({ mqttUrl: opts.mqttUrl, secrets, speed: opts.speed, simStart: Date.parse(generated.truth.start), seed });
  const total = generated.timeline.filter((e) => e.kind === 'publish').length;
  const showProgress = opts.progress ?? process.stderr.isTTY === true;
  const progress = showProgress ? startProgress(sender, total) : null;
  const started = Date.now();
  opts.onSending?.(sender, total);
  try {
    await sender.dispatch(generated.timeline);
    await sender.drain();
  } finally {
    progress?.stop();
    await sender.close();
  }
  await saveNextBoots(storePath, generated.nextBoots);
  const truthPath = opts.truthPath === undefined ? join(dataDir, `sim-truth-${opts.scenario}.json`) : opts.truthPath;
  if (truthPath !== null) await writeTruth(truthPath, generated.truth);
  const t = generated.truth;
  const summary = formatSummary(sender.stats, Date.now() - started, {
    'provisioning and generation': `${((started - began) / 1000).toFixed(1)} s`,
    scenario: `${opts.scenario} (${t.start} to ${t.end}), ${units} units, seed ${seed}`,
    'key-offs': t.keyOffs.length,
    interrupted: t.keyOffs.filter((k) => k.outcome === 'interrupted').length,
    'coverage gaps': t.coverageGaps.length,
    truth: truthPath ?? '(not written)',
  });
  if (showProgress) process.stderr.write(`${summary}\n`);
  return { truth: t, truthPath, summary, sentByGateway: distinctStoredMessages(generated.timeline) };
}

/** For tests and scripts: runs a whole scenario and returns what really happened. */
export async function runScenario(opts: RunScenarioOptions): Promise<Truth> {
  return (await runScenarioDetailed(opts)).truth;
}
