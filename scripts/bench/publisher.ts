// The benchmark's load: mqtt.js gateways in a process of their own, QoS 1, the protocol's telemetry.
// Input: a JSON file (argv[2]); output: one JSON line on stdout with counts, latencies and event times.
import { readFileSync } from 'node:fs';
import mqtt, { type MqttClient } from 'mqtt';
import { uplinkTopic } from '../../shared/protocol/topics';

interface Plan {
  mqttUrl: string;
  gateways: { id: string; secret: string }[];
  /** 'max': every gateway keeps `window` messages in flight; 'rate': `rate` messages/s spread over the fleet. */
  mode: 'max' | 'rate';
  rate?: number;
  window?: number;
  durationS: number;
  /**
   * Rate mode: the first this many gateways are probes, apart from the load: each sends a sample every
   * 5 s like a truck, keys off once and 10 s later loses its supply (the isolator opened), then is silent
   * (no power). The rest carry `rate`.
   */
  eventGateways?: number;
  /** The gateways' boot counter for this run (a later run is a later boot, so nothing repeats a (boot, seq)). */
  boot?: number;
}

const plan: Plan = JSON.parse(readFileSync(process.argv[2], 'utf8'));
const latencies: number[] = [];
const events: { gatewayId: string; kind: 'keyOff' | 'supplyLost'; at: number }[] = [];
let acked = 0;
let published = 0;
let failed = 0;

interface Gw {
  id: string;
  client: MqttClient;
  seq: number;
  key: 'on' | 'off';
  inFlight: number;
}

function telemetry(g: Gw, key: 'on' | 'off') {
  return JSON.stringify({ boot: plan.boot ?? 1, seq: g.seq++, ts: new Date().toISOString(), key, supplyV: key === 'on' ? 13.91 : 12.64, ambientC: -4.5, ecmAwake: true, fw: 'bench-1.0.0' });
}

function send(g: Gw, kind: 'telemetry' | 'power', body: string, onAck?: () => void) {
  const t0 = performance.now();
  published++;
  g.inFlight++;
  g.client.publish(uplinkTopic(g.id, kind), body, { qos: 1 }, (err) => {
    g.inFlight--;
    if (err) failed++;
    else {
      acked++;
      if (latencies.length < 2_000_000) latencies.push(performance.now() - t0);
    }
    onAck?.();
  });
}

async function connectAll(): Promise<Gw[]> {
  const out: Gw[] = [];
  const batch = 200;
  for (let i = 0; i < plan.gateways.length; i += batch) {
    const part = await Promise.all(
      plan.gateways.slice(i, i + batch).map(
        (g) =>
          new Promise<Gw>((res, rej) => {
            const client = mqtt.connect(plan.mqttUrl, { clientId: g.id, username: g.id, password: g.secret, clean: true, reconnectPeriod: 0, protocolVersion: 4, keepalive: 120 });
            client.once('connect', () => res({ id: g.id, client, seq: 0, key: 'on', inFlight: 0 }));
            client.once('error', rej);
          }),
      ),
    );
    out.push(...part);
  }
  return out;
}

async function main() {
  const gws = await connectAll();
  const started = Date.now();
  const end = started + plan.durationS * 1000;
  if (plan.mode === 'max') {
    const window = plan.window ?? 20;
    await new Promise<void>((done) => {
      let open = gws.length;
      for (const g of gws) {
        const pump = () => {
          if (Date.now() >= end) {
            if (g.inFlight === 0 && --open === 0) done();
            return;
          }
          while (g.inFlight < window) send(g, 'telemetry', telemetry(g, 'on'), pump);
        };
        pump();
      }
    });
  } else {
    const rate = plan.rate ?? 1000;
    const probes = gws.slice(0, plan.eventGateways ?? 0);
    const load = gws.slice(probes.length);
    if (!load.length) throw new Error('rate mode needs gateways beyond the probes to carry the load');
    // Key-offs start after a warm-up of a fifth of the run, spread over the next half.
    const keyOffAt = probes.map((_, i) => started + plan.durationS * 200 + (i * plan.durationS * 500) / probes.length);
    const timers: NodeJS.Timeout[] = [];
    probes.forEach((g, i) => {
      let silent = false;
      const sample = () => {
        if (silent || Date.now() >= end) return;
        if (g.key === 'on' && Date.now() >= keyOffAt[i]) {
          g.key = 'off';
          events.push({ gatewayId: g.id, kind: 'keyOff', at: Date.now() });
          send(g, 'telemetry', telemetry(g, 'off'));
          timers.push(setTimeout(() => {
            silent = true;
            events.push({ gatewayId: g.id, kind: 'supplyLost', at: Date.now() });
            send(g, 'power', JSON.stringify({ boot: plan.boot ?? 1, seq: g.seq++, ts: new Date().toISOString(), event: 'supply-lost', supplyV: 1.2 }));
          }, 10_000));
          return;
        }
        send(g, 'telemetry', telemetry(g, g.key));
      };
      // A sample every 5 s, staggered over the probes; the key-off goes at its own time.
      timers.push(setTimeout(() => (sample(), timers.push(setInterval(sample, 5000))), (i * 5000) / probes.length));
      timers.push(setTimeout(sample, Math.max(0, keyOffAt[i] - Date.now())));
    });
    let next = 0;
    const tickMs = 10;
    await new Promise<void>((done) => {
      const timer = setInterval(() => {
        const now = Date.now();
        if (now >= end) {
          clearInterval(timer);
          return done();
        }
        // As many as the rate asks for by now: a late tick (a busy event loop) sends more, so the offered
        // rate is the rate asked for, not less.
        const due = Math.floor((rate * (now - started)) / 1000) - next;
        for (let k = 0; k < due; k++) {
          const g = load[next++ % load.length];
          send(g, 'telemetry', telemetry(g, 'on'));
        }
      }, tickMs);
    });
    await new Promise((r) => setTimeout(r, 11_000)); // the last supply losses
    for (const t of timers) clearInterval(t);
  }
  const deadline = Date.now() + 30_000;
  while (acked + failed < published && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
  const elapsedS = (Date.now() - started) / 1000;
  latencies.sort((a, b) => a - b);
  const q = (p: number) => (latencies.length ? latencies[Math.min(latencies.length - 1, Math.floor(p * latencies.length))] : null);
  const cpu = process.cpuUsage();
  const cpuS = (cpu.user + cpu.system) / 1e6;
  process.stdout.write(`${JSON.stringify({ published, acked, failed, elapsedS, p50: q(0.5), p99: q(0.99), events, cpuS })}\n`);
  await Promise.all(gws.map((g) => new Promise<void>((r) => g.client.end(true, {}, () => r()))));
  process.exit(0);
}

main().catch((err) => {
  process.stderr.write(`publisher: ${err.stack ?? err}\n`);
  process.exit(1);
});
