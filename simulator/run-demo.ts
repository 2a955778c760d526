import { startProgress } from './cli/progress';
import { HOUR, MINUTE, SECOND } from './core/time';
import { buildFleet } from './model/fleet';
import { ApiClient, ApiError } from './net/api-client';
import { gatewayStorePath } from './net/gateway-store';
import { provisionFleet, saveNextBoots } from './net/provision';
import { Sender, type Speed } from './net/sender';
import { FleetSim } from './scenario/fleet-sim';
import { SCENARIOS } from './scenario/scenarios';
import { writeTruth } from './truth/truth-file';

export interface RunDemoOptions {
  apiUrl: string;
  mqttUrl: string;
  adminEmail: string;
  adminPassword: string;
  units?: number;
  seed: string;
  speed: Speed;
  dataDir: string;
  truthPath?: string;
  /** Resolves when the demo should stop. */
  stopped: Promise<void>;
  log: (line: string) => void;
}

const STEP_MS = 30 * SECOND;
const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

/** The service may still be starting: sign in with patience (a minute and a half at most). */
async function signIn(api: ApiClient, email: string, password: string, log: (l: string) => void): Promise<void> {
  for (let attempt = 0; ; attempt++) {
    try {
      await api.login(email, password);
      return;
    } catch (err) {
      const retriable = err instanceof ApiError && (err.status === 0 || err.status >= 500);
      if (!retriable || attempt >= 45) throw err;
      if (attempt === 0) log(`waiting for the service at ${api.baseUrl} ...`);
      await sleep(2000);
    }
  }
}

/** The live demo: a fleet that lives from now on, forever, at `speed` (1 = real time). */
export async function runDemo(o: RunDemoOptions): Promise<void> {
  const def = SCENARIOS.demo;
  const units = o.units ?? def.defaultUnits;
  const api = new ApiClient(o.apiUrl);
  await signIn(api, o.adminEmail, o.adminPassword, o.log);
  const storePath = gatewayStorePath(o.dataDir);
  const gateways = await provisionFleet(api, buildFleet({ units, seed: o.seed, roundTheClock: true }), storePath, o.seed);
  const start = Date.now();
  const sim = new FleetSim({ scenario: 'demo', units, seed: o.seed, start, gateways });
  const sender = new Sender({ mqttUrl: o.mqttUrl, secrets: new Map([...gateways.values()].map((g) => [g.gatewayId, g.secret])), speed: o.speed, simStart: sim.ctx.start, seed: o.seed });
  let stop = false;
  void o.stopped.then(() => {
    stop = true;
  });
  o.log(`demo: ${units} trucks over ${new Set(sim.fleet.map((u) => u.depot)).size} depots, live from ${new Date(start).toISOString()} at speed ${o.speed}`);
  const progress = startProgress(sender, null, { everyMs: process.stderr.isTTY ? 1000 : 10 * MINUTE });
  let lastSave = Date.now();
  let savedBoots = '';
  try {
    for (let t = sim.ctx.start + STEP_MS; !stop; t += STEP_MS) {
      await sender.dispatch(sim.advance(t), () => stop);
      // Boot counters are saved as soon as they move, so a restart never reuses a (boot, seq).
      const boots = JSON.stringify([...sim.nextBoots()]);
      if (boots !== savedBoots) {
        await saveNextBoots(storePath, sim.nextBoots());
        savedBoots = boots;
      }
      await sender.waitUntil(t, () => stop); // the simulation never runs ahead of the clock by more than a step
      if (Date.now() - lastSave > 5 * MINUTE || stop) {
        lastSave = Date.now();
        sim.forgetBefore(t - 24 * HOUR);
        if (o.truthPath) await writeTruth(o.truthPath, sim.truth(t));
      }
    }
  } finally {
    progress.stop();
    await saveNextBoots(storePath, sim.nextBoots());
    await sender.close();
  }
}
