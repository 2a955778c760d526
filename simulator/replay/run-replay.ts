import { formatSummary, startProgress } from '../cli/progress';
import { ApiClient } from '../net/api-client';
import { gatewayStorePath, loadGatewayStore, saveGatewayStore } from '../net/gateway-store';
import { Sender, type Speed } from '../net/sender';
import { readCandump, readTelemetryLines, type ReplayLine } from './replay-input';
import { replayTimeline } from './replay-timeline';

export interface RunReplayOptions {
  apiUrl: string;
  mqttUrl: string;
  adminEmail: string;
  adminPassword: string;
  candumpPath: string;
  telemetryPath?: string;
  gatewayId: string;
  /** The unit to provision the gateway for, when the simulator's gateway file does not know it. */
  unitId?: string;
  speed: Speed;
  dataDir: string;
  seed: string;
  progress: boolean;
}

/** Finds the gateway's secret in the simulator's file, or provisions the gateway for `unitId`. */
async function credentialFor(o: RunReplayOptions): Promise<{ secret: string; firstBoot: number; unitId: string }> {
  const path = gatewayStorePath(o.dataDir);
  const store = await loadGatewayStore(path);
  const known = [...store].find(([, g]) => g.gatewayId === o.gatewayId);
  if (known && (o.unitId === undefined || o.unitId === known[0])) return { secret: known[1].secret, firstBoot: known[1].nextBoot, unitId: known[0] };
  if (o.unitId === undefined) throw new Error(`gateway ${o.gatewayId} is not in ${path}; give --unit <unit id> to provision it for an existing unit`);
  const api = new ApiClient(o.apiUrl);
  await api.login(o.adminEmail, o.adminPassword);
  const created = await api.createGateway(o.gatewayId, o.unitId);
  store.set(o.unitId, { gatewayId: created.gatewayId, secret: created.secret, nextBoot: 0 });
  await saveGatewayStore(path, store);
  return { secret: created.secret, firstBoot: 0, unitId: o.unitId };
}

/** Replays a recorded candump log (and readings) through one gateway, at the log's own pace times `speed`. */
export async function runReplay(o: RunReplayOptions): Promise<string> {
  const lines: ReplayLine[] = [...(await readCandump(o.candumpPath)), ...(o.telemetryPath ? await readTelemetryLines(o.telemetryPath) : [])];
  if (lines.length === 0) throw new Error(`nothing to replay in ${o.candumpPath}${o.telemetryPath ? ` and ${o.telemetryPath}` : ''}`);
  const cred = await credentialFor(o);
  const { timeline, nextBoot } = replayTimeline(lines, { gatewayId: o.gatewayId, firstBoot: cred.firstBoot });
  const sender = new Sender({ mqttUrl: o.mqttUrl, secrets: new Map([[o.gatewayId, cred.secret]]), speed: o.speed, simStart: timeline[0].sendAt, seed: o.seed });
  const total = timeline.filter((e) => e.kind === 'publish').length;
  const progress = o.progress ? startProgress(sender, total) : null;
  const started = Date.now();
  try {
    await sender.dispatch(timeline);
    await sender.drain();
  } finally {
    progress?.stop();
    await sender.close();
  }
  const path = gatewayStorePath(o.dataDir);
  const store = await loadGatewayStore(path);
  const g = store.get(cred.unitId);
  if (g) store.set(cred.unitId, { ...g, nextBoot: Math.max(g.nextBoot, nextBoot) });
  await saveGatewayStore(path, store);
  return formatSummary(sender.stats, Date.now() - started, {
    replay: `${lines.filter((l) => l.kind === 'frame').length} frames and ${lines.filter((l) => l.kind !== 'frame').length} readings through ${o.gatewayId} (unit ${cred.unitId})`,
  });
}
