// A board's view for the benchmark: a ws client of the live feed recording when each unit entered each state.
import WebSocket from 'ws';
import { ServerMessageSchema } from '../../shared/realtime/envelope';

export interface Observer {
  /** unitId -> state -> first wall time it was seen */
  seen: Map<string, Map<string, number>>;
  close(): void;
}

export function observe(url: string, token: string): Promise<Observer> {
  return new Promise((resolve, reject) => {
    const ws = new WebSocket(`${url.replace(/^http/, 'ws')}/api/live?token=${token}`);
    const seen = new Map<string, Map<string, number>>();
    ws.on('message', (data) => {
      const at = Date.now();
      const m = ServerMessageSchema.parse(JSON.parse(data.toString()));
      if (m.type !== 'units') return;
      for (const u of m.units) {
        if (!u.state) continue;
        let states = seen.get(u.id);
        if (!states) seen.set(u.id, (states = new Map()));
        if (!states.has(u.state)) states.set(u.state, at);
      }
    });
    ws.once('open', () => resolve({ seen, close: () => ws.close() }));
    ws.once('error', reject);
  });
}

export const quantile = (xs: number[], p: number) => {
  if (!xs.length) return null;
  const s = xs.slice().sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))];
};

/** Publish -> board latency of each event: its unit's first entry into the expected state after it was sent. */
export function eventLatencies(events: { gatewayId: string; kind: 'keyOff' | 'supplyLost'; at: number }[], seen: Observer['seen'], unitOf: (gw: string) => string) {
  const out: Record<'keyOff' | 'supplyLost', number[]> = { keyOff: [], supplyLost: [] };
  let missing = 0;
  for (const e of events) {
    const states = seen.get(unitOf(e.gatewayId));
    const at = states?.get(e.kind === 'keyOff' ? 'purging' : 'interrupted');
    if (at === undefined || at < e.at - 5) missing++;
    else out[e.kind].push(at - e.at);
  }
  return { ...out, missing };
}
