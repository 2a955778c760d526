// What the pure generator produces and the sender sends: one entry per MQTT action of a gateway.
// `sendAt` is true (simulated) time in epoch ms; payload times (`ts`) are the gateway's own clock.

export type TimelineEntry =
  | { kind: 'publish'; gatewayId: string; sendAt: number; topic: string; payload: Record<string, unknown>; duplicate?: true }
  | { kind: 'connect'; gatewayId: string; sendAt: number; boot: number }
  | { kind: 'disconnect'; gatewayId: string; sendAt: number };

/** Orders entries by send time; a gateway's own entries keep the order they were made in (a stable sort). */
export function sortTimeline(entries: TimelineEntry[]): TimelineEntry[] {
  return entries.sort((a, b) => a.sendAt - b.sendAt);
}

/** Merges per-gateway lists (each already in order) into one list ordered by `sendAt`. */
export function mergeTimelines(lists: TimelineEntry[][]): TimelineEntry[] {
  const all: TimelineEntry[] = [];
  for (const list of lists) for (const e of list) all.push(e);
  // Array.prototype.sort is stable (ECMAScript 2019), so per-gateway order survives ties.
  return sortTimeline(all);
}
