// What one worker tells the others over PostgreSQL NOTIFY: the units it judged (their views, ordered by
// units.judged_version), the units whose episodes changed, and the alerts it published on its live feed.
// Pure: encoding, chunking and validation.
import { z } from 'zod';
import type { LiveUnitView } from '../lib/context';
import { AlertViewSchema, type AlertView } from '../../shared/realtime/envelope';

export const RELAY_CHANNEL = 'afterwatch_units';

/**
 * PostgreSQL documentation (NOTIFY): "the payload must be shorter than 8000 bytes" in the default
 * configuration. Each notification stays a little under it, and stands alone (no reassembly).
 */
export const MAX_PAYLOAD_BYTES = 7900;

export interface RelayedUnit {
  unitId: string;
  depot: string;
  /** units.judged_version of the judgement this view comes from: the newer judgement wins. */
  version: number;
  view: LiveUnitView;
  /** Purging only: milliseconds to the purge's end at the message's `at` (finer than the view's whole seconds). */
  remainingMs: number | null;
}

export type RelayMessage =
  /** `units`: judged just now; `snapshot`: an answer to `ask` (everything the sender holds). */
  | { from: string; kind: 'units' | 'snapshot'; at: number; units: RelayedUnit[]; episodes: string[] }
  /** A worker that missed notifications (its listening connection was down) asks the others for their views. */
  | { from: string; kind: 'ask' }
  /**
   * Alerts as the sender's live feed pushed them (raised, escalated, acknowledged, resolved), in order; `refs`:
   * alerts too large for a notification (a long comment), to be read from the database by id.
   */
  | { from: string; kind: 'alerts'; alerts: AlertView[]; refs: number[] };

const ms = (iso: string | null) => (iso === null ? null : Date.parse(iso));
const iso = (t: number | null) => (t === null ? null : new Date(t).toISOString());

type Tuple = [string, string, number, string | null, number | null, number | null, number | null, number | null, number | null, number | null];

const toTuple = (u: RelayedUnit): Tuple => [
  u.unitId, u.depot, u.version, u.view.state, ms(u.view.stateSince), u.view.purgeRemainingS, u.remainingMs, u.view.lastSupplyV, u.view.lastAmbientC, ms(u.view.lastSeenAt),
];

const num = z.number().finite().nullable();
const UnitTupleSchema = z.tuple([
  z.string().min(1).max(64), z.string().max(500), z.number().int().nonnegative(), z.string().max(40).nullable(),
  num, z.number().int().nonnegative().nullable(), num, num, num, num,
]);
const KIND = { u: 'units', s: 'snapshot', a: 'ask' } as const;
const From = z.string().min(1).max(80);
const WireSchema = z.union([
  z.object({ f: From, k: z.enum(['u', 's']), t: z.number().finite(), u: z.array(UnitTupleSchema), e: z.array(z.string().min(1).max(64)) }),
  z.object({ f: From, k: z.literal('a') }),
  // The live feed's own alert schema: what a board receives is checked the same on every worker.
  z.object({ f: From, k: z.literal('al'), a: z.array(AlertViewSchema), r: z.array(z.number().int().positive()) }),
]);

const bytes = (s: string) => Buffer.byteLength(s, 'utf8');

/** One item for `pack`: which of the two lists it joins, its JSON text, and what to send instead if it cannot fit alone. */
type Packed = { list: 0 | 1; item: string; instead?: { list: 0 | 1; item: string } };

/**
 * Notifications `{<head>,"<first>":[...],"<second>":[...]}` holding the items in order, each under `limit`
 * bytes. An item too large for a notification of its own goes as its `instead`, or is refused.
 */
function pack(head: string, [first, second]: [string, string], items: Iterable<Packed>, limit: number): string[] {
  const build = (lists: string[][]) => `{${head},"${first}":[${lists[0].join(',')}],"${second}":[${lists[1].join(',')}]}`;
  const empty = bytes(build([[], []]));
  const out: string[] = [];
  let lists: string[][] = [[], []];
  let size = empty;
  const cut = () => {
    if (lists[0].length || lists[1].length) out.push(build(lists));
    lists = [[], []];
    size = empty;
  };
  for (const p of items) {
    const fits = (x: { item: string }) => empty + bytes(x.item) + 1 <= limit; // and its comma
    const { list, item } = !fits(p) && p.instead ? p.instead : p;
    const n = bytes(item) + 1;
    if (empty + n > limit) throw new Error(`one relayed item is larger than a notification (${n} bytes)`);
    if (size + n > limit) cut();
    lists[list].push(item);
    size += n;
  }
  cut();
  return out;
}

/** The notifications for a batch of units and episode changes, each under MAX_PAYLOAD_BYTES. */
export function encodeRelay(from: string, kind: 'units' | 'snapshot', at: number, units: RelayedUnit[], episodes: string[], limit = MAX_PAYLOAD_BYTES): string[] {
  const head = `"f":${JSON.stringify(from)},"k":"${kind === 'units' ? 'u' : 's'}","t":${JSON.stringify(at)}`;
  const items: Packed[] = [
    ...units.map((u): Packed => ({ list: 0, item: JSON.stringify(toTuple(u)) })),
    ...episodes.map((id): Packed => ({ list: 1, item: JSON.stringify(id) })),
  ];
  return pack(head, ['u', 'e'], items, limit);
}

export const encodeAsk = (from: string) => JSON.stringify({ f: from, k: 'a' });

/** The notifications for alerts in the order they were published, each under MAX_PAYLOAD_BYTES; one too large goes by its id. */
export function encodeAlerts(from: string, alerts: AlertView[], limit = MAX_PAYLOAD_BYTES): string[] {
  // A reference is read back after the inline alerts of its notification; the rank check on receipt keeps the order.
  const items = alerts.map((a): Packed => ({ list: 0, item: JSON.stringify(a), instead: { list: 1, item: String(a.id) } }));
  return pack(`"f":${JSON.stringify(from)},"k":"al"`, ['a', 'r'], items, limit);
}

/**
 * How far along its life an alert is: open, acknowledged, resolved, each after its escalation. An alert only
 * moves forward (an acknowledged or resolved one is never escalated or reopened), so a relayed state at or
 * below the one already shown is a repeat or arrived late.
 */
export function alertStage(a: Pick<AlertView, 'status' | 'escalatedAt'>): number {
  return { open: 0, acknowledged: 2, resolved: 4 }[a.status] + (a.escalatedAt === null ? 0 : 1);
}

/** Reads one notification; throws with the reason if it is not a relay message. */
export function decodeRelay(payload: string): RelayMessage {
  let raw: unknown;
  try {
    raw = JSON.parse(payload);
  } catch {
    throw new Error('relay payload is not JSON');
  }
  const parsed = WireSchema.safeParse(raw);
  if (!parsed.success) throw new Error(`relay payload has the wrong shape: ${parsed.error.issues.map((i) => `${i.path.join('.')} ${i.message}`).join('; ')}`);
  const w = parsed.data;
  if (w.k === 'a') return { from: w.f, kind: 'ask' };
  if (w.k === 'al') return { from: w.f, kind: 'alerts', alerts: w.a, refs: w.r };
  return {
    from: w.f,
    kind: KIND[w.k],
    at: w.t,
    episodes: w.e,
    units: w.u.map(([unitId, depot, version, state, since, purgeRemainingS, remainingMs, lastSupplyV, lastAmbientC, lastSeen]) => ({
      unitId, depot, version, remainingMs,
      view: { state, stateSince: iso(since), purgeRemainingS, lastSupplyV, lastAmbientC, lastSeenAt: iso(lastSeen) },
    })),
  };
}
