// A small, independent reading of the protocol's purge rules (shared/gateway-protocol.md, "Precise
// rules" 1–5), used only to cross-check the simulator's ground truth against what it sent.
import type { TimelineEntry } from '../../simulator/scenario/timeline';

export interface Msg {
  kind: 'telemetry' | 'can' | 'power';
  p: Record<string, any>;
}

/** A gateway's delivered messages (no duplicates, no status) in (boot, seq) order. */
export function ordered(timeline: readonly TimelineEntry[], gatewayId: string): Msg[] {
  const out: Msg[] = [];
  for (const e of timeline) {
    if (e.gatewayId !== gatewayId || e.kind !== 'publish' || e.duplicate) continue;
    const kind = e.topic.split('/').pop()!;
    if (kind === 'status') continue;
    out.push({ kind: kind as Msg['kind'], p: e.payload });
  }
  return out.sort((a, b) => a.p.boot - b.p.boot || a.p.seq - b.p.seq);
}

export interface Judged {
  keyOffAt: string;
  outcome: 'completed' | 'interrupted' | 'resumed' | 'undetermined';
  secondsIntoPurge: number | null;
}

/** Every on→off key change of the stream, judged by rules 1–5 with the unit's purge time and loss threshold. */
export function judgeStream(msgs: readonly Msg[], purgeSeconds: number, lossV: number): Judged[] {
  const out: Judged[] = [];
  let lastKey: { boot: number; key: string } | null = null;
  msgs.forEach((m, i) => {
    if (m.kind !== 'telemetry') return;
    const prev = lastKey;
    lastKey = { boot: m.p.boot, key: m.p.key };
    if (!(prev && prev.boot === m.p.boot && prev.key === 'on' && m.p.key === 'off')) return;
    const k = Date.parse(m.p.ts);
    const c = k + purgeSeconds * 1000;
    const at = (ts: string) => Date.parse(ts);
    let result: Judged | null = null;
    for (const n of msgs.slice(i + 1)) {
      if (n.p.boot !== m.p.boot) {
        if (n.p.boot === m.p.boot + 1 && n.kind === 'power' && n.p.event === 'boot' && n.p.prevShutdown) {
          const ps = n.p.prevShutdown;
          if (at(ps.ts) >= c) result = { keyOffAt: m.p.ts, outcome: 'completed', secondsIntoPurge: null };
          else if (ps.cause === 'supply-lost') result = { keyOffAt: m.p.ts, outcome: 'interrupted', secondsIntoPurge: (at(ps.ts) - k) / 1000 };
          else if (ps.cause === 'sleep') result = { keyOffAt: m.p.ts, outcome: 'completed', secondsIntoPurge: null };
        }
        break;
      }
      const t = at(n.p.ts);
      if (n.kind === 'telemetry') {
        if (n.p.key === 'on') result = { keyOffAt: m.p.ts, outcome: t < c ? 'resumed' : 'completed', secondsIntoPurge: null };
        else if (t < c && n.p.ecmAwake === false) result = { keyOffAt: m.p.ts, outcome: 'completed', secondsIntoPurge: null };
        else if (t < c && n.p.supplyV < lossV) result = { keyOffAt: m.p.ts, outcome: 'interrupted', secondsIntoPurge: (t - k) / 1000 };
        else if (t >= c) result = { keyOffAt: m.p.ts, outcome: 'completed', secondsIntoPurge: null };
      } else if (n.kind === 'power' && n.p.event === 'supply-lost') {
        result = t < c
          ? { keyOffAt: m.p.ts, outcome: 'interrupted', secondsIntoPurge: (t - k) / 1000 }
          : { keyOffAt: m.p.ts, outcome: 'completed', secondsIntoPurge: null };
      }
      if (result) break;
    }
    out.push(result ?? { keyOffAt: m.p.ts, outcome: 'undetermined', secondsIntoPurge: null });
  });
  return out;
}
