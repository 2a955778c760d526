import { describe, expect, it } from 'vitest';
import { MAX_FRAMES_PER_MESSAGE, MAX_PAYLOAD_BYTES } from '../../shared/protocol/limits';
import { CanSchema, PowerSchema, StatusSchema, TelemetrySchema } from '../../shared/protocol/messages';
import { parseTopic } from '../../shared/protocol/topics';
import { generateScenario } from '../../simulator/scenario/generate';
import type { TimelineEntry } from '../../simulator/scenario/timeline';

// Checked against the wire contract, shared/gateway-protocol.md (version 1), through its zod schemas.
const runs = [
  generateScenario({ scenario: 'weekend', units: 14, seed: 'conformance' }),
  generateScenario({ scenario: 'coverage-gaps', units: 10, seed: 'conformance' }),
];
const SCHEMAS = { telemetry: TelemetrySchema, can: CanSchema, power: PowerSchema, status: StatusSchema } as const;

function byGateway(timeline: TimelineEntry[]): Map<string, TimelineEntry[]> {
  const m = new Map<string, TimelineEntry[]>();
  for (const e of timeline) m.set(e.gatewayId, [...(m.get(e.gatewayId) ?? []), e]);
  return m;
}

describe.each(runs.map((r) => [r.truth.scenario, r] as const))('every generated message of %s follows gateway protocol v1', (_name, run) => {
  it('parses with the shared schema of its topic, under the gateway\'s own id, within 64 KiB and 200 frames', () => {
    for (const e of run.timeline) {
      if (e.kind !== 'publish') continue;
      const topic = parseTopic(e.topic);
      expect(topic?.gatewayId).toBe(e.gatewayId);
      expect(topic?.kind).not.toBe('indicator');
      const kind = topic!.kind as keyof typeof SCHEMAS;
      const parsed = SCHEMAS[kind].safeParse(e.payload);
      expect(parsed.success, `${e.topic} ${JSON.stringify(e.payload)}`).toBe(true);
      expect(Buffer.byteLength(JSON.stringify(e.payload))).toBeLessThanOrEqual(MAX_PAYLOAD_BYTES);
      if (kind === 'can') expect((e.payload.frames as unknown[]).length).toBeLessThanOrEqual(MAX_FRAMES_PER_MESSAGE);
      if (kind === 'status') expect(Object.keys(e.payload).sort()).toEqual(['boot', 'state']);
    }
  });

  it('seq starts at 0 with the boot record and rises by exactly one across telemetry, can and power; boot rises by one', () => {
    for (const [gw, entries] of byGateway(run.timeline)) {
      let boot: number | null = null;
      let seq = -1;
      for (const e of entries) {
        if (e.kind !== 'publish' || e.duplicate || e.topic.endsWith('/status')) continue;
        const p = e.payload as { boot: number; seq: number; event?: string };
        if (p.boot !== boot) {
          if (boot !== null) expect(p.boot, gw).toBe(boot + 1);
          expect(p.seq, `${gw} boot ${p.boot}`).toBe(0);
          expect(p.event, `${gw}: a boot opens with its power record`).toBe('boot');
          boot = p.boot;
          seq = 0;
          continue;
        }
        expect(p.seq, `${gw} boot ${boot}`).toBe(seq + 1);
        seq = p.seq;
      }
    }
  });

  it('publishes only while connected, announces itself online with its boot, and duplicates repeat an earlier message', () => {
    for (const [gw, entries] of byGateway(run.timeline)) {
      let connected = false;
      let bootOfConnection: number | null = null;
      const seen = new Set<string>();
      for (const e of entries) {
        if (e.kind === 'connect') {
          expect(connected, gw).toBe(false);
          connected = true;
          bootOfConnection = e.boot;
          continue;
        }
        if (e.kind === 'disconnect') {
          expect(connected, gw).toBe(true);
          connected = false;
          continue;
        }
        expect(connected, `${gw} publishes while offline`).toBe(true);
        const key = JSON.stringify(e.payload);
        if (e.topic.endsWith('/status')) expect(e.payload).toEqual({ state: 'online', boot: bootOfConnection });
        else if (e.duplicate) expect(seen.has(key), `${gw} duplicate of nothing`).toBe(true);
        else seen.add(key);
      }
    }
  });

  it('samples every 5 s while key on or ECM awake, every 15 min while parked and asleep, with ts rising within a boot', () => {
    for (const [gw, entries] of byGateway(run.timeline)) {
      const samples = entries.filter((e) => e.kind === 'publish' && e.topic.endsWith('/telemetry') && !e.duplicate);
      for (let i = 1; i < samples.length; i++) {
        const a = (samples[i - 1] as { payload: Record<string, unknown> }).payload;
        const b = (samples[i] as { payload: Record<string, unknown> }).payload;
        if (a.boot !== b.boot) continue;
        const gap = Date.parse(b.ts as string) - Date.parse(a.ts as string);
        expect(gap, gw).toBeGreaterThan(0);
        if (a.key !== b.key) continue; // an immediate sample on a change of key
        const awake = a.key === 'on' || a.ecmAwake === true;
        // Isolator power cycles and key changes interrupt the rhythm only with other messages between.
        expect(gap, `${gw} at ${String(b.ts)}`).toBeLessThanOrEqual(awake ? 5_100 : 15 * 60_000 + 100);
      }
    }
  });
});
