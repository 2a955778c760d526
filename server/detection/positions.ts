import type { EventPosition, UnitEvent } from './types';

/** Protocol: (boot, seq) orders a gateway's messages totally; a unit's replaced gateway starts a new stream. */
export function comparePositions(a: EventPosition, b: EventPosition): number {
  return a.stream - b.stream || a.boot - b.boot || a.seq - b.seq;
}

export function positionKey(p: EventPosition): string {
  return `${p.stream}/${p.boot}/${p.seq}`;
}

export function samePosition(a: EventPosition, b: EventPosition): boolean {
  return a.stream === b.stream && a.boot === b.boot && a.seq === b.seq;
}

export function sameBoot(a: EventPosition, b: EventPosition): boolean {
  return a.stream === b.stream && a.boot === b.boot;
}

export function positionOf(p: EventPosition): EventPosition {
  return { stream: p.stream, boot: p.boot, seq: p.seq };
}

/** Protocol: of duplicates with the same (boot, seq) the first accepted copy wins; then (stream, boot, seq) order. */
export function orderEvents(events: readonly UnitEvent[]): UnitEvent[] {
  // The usual case, live traffic: already in strictly rising order, so sorted and free of copies.
  let rising = true;
  for (let i = 1; i < events.length && rising; i++) rising = comparePositions(events[i - 1], events[i]) < 0;
  if (rising) return events.slice();
  const firstCopies = new Map<string, UnitEvent>();
  for (const event of events) {
    const key = positionKey(event);
    if (!firstCopies.has(key)) firstCopies.set(key, event);
  }
  return [...firstCopies.values()].sort(comparePositions);
}

/**
 * True when the ordered, de-duplicated events hold every seq of one boot from index `from` to `to`:
 * seq rises by exactly one with each message (protocol), so the index span equals the seq span.
 */
export function gapFree(ordered: readonly UnitEvent[], from: number, to: number): boolean {
  const a = ordered[from];
  const b = ordered[to];
  return sameBoot(a, b) && b.seq - a.seq === to - from;
}
