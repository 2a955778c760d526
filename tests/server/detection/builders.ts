import { judgeUnit } from '../../../server/detection/judge-unit';
import type { Episode, JudgeContext, Profile, UnitEvent } from '../../../server/detection/types';
import type { ShutdownCause } from '../../../shared/protocol/messages';

// Small builders for a gateway's message stream. Times are seconds after T0 (an invented evening).
export const T0 = Date.parse('2026-11-27T17:00:00.000Z');
export const at = (seconds: number): number => T0 + Math.round(seconds * 1000);

// Protocol defaults: 120 s purge ("common practice, no published source": wait two minutes after
// key-off before isolating); loss threshold 6.0 V on 12 V systems, 12.0 V on 24 V (gateway protocol rule 2).
export const PROFILE_12V: Profile = { purgeSeconds: 120, lossThresholdV: 6.0 };
export const PROFILE_24V: Profile = { purgeSeconds: 120, lossThresholdV: 12.0 };

interface SampleOptions {
  supplyV?: number;
  ambientC?: number | null;
  ecmAwake?: boolean;
}

/** A gateway: each message takes the next seq of the current boot, as the protocol says. */
export function gateway(start: { stream?: number; boot?: number; seq?: number } = {}) {
  const stream = start.stream ?? 0;
  let boot = start.boot ?? 1;
  let seq = start.seq ?? 0;
  const events: UnitEvent[] = [];
  const next = () => ({ stream, boot, seq: seq++ });
  const push = <E extends UnitEvent>(e: E): E => {
    events.push(e);
    return e;
  };
  const sample = (seconds: number, key: 'on' | 'off', o: SampleOptions = {}) =>
    push({
      kind: 'telemetry' as const,
      ...next(),
      ts: at(seconds),
      key,
      supplyV: o.supplyV ?? 12.6,
      ambientC: o.ambientC === undefined ? 4 : o.ambientC,
      ecmAwake: o.ecmAwake ?? true,
    });
  return {
    events,
    on: (seconds: number, o?: SampleOptions) => sample(seconds, 'on', o),
    off: (seconds: number, o?: SampleOptions) => sample(seconds, 'off', o),
    lost: (seconds: number, supplyV = 2.4) =>
      push({ kind: 'power' as const, ...next(), ts: at(seconds), event: 'supply-lost' as const, supplyV, prevShutdown: null }),
    restored: (seconds: number, supplyV = 12.5) =>
      push({ kind: 'power' as const, ...next(), ts: at(seconds), event: 'supply-restored' as const, supplyV, prevShutdown: null }),
    can: (seconds: number) => push({ kind: 'can' as const, ...next(), ts: at(seconds) }),
    /** A power-up: the next boot, seq 0, with the record of how the previous boot ended. */
    boot: (seconds: number, prev: { atS: number; cause: ShutdownCause } | null, supplyV = 12.4) => {
      boot += 1;
      seq = 0;
      return push({
        kind: 'power' as const,
        ...next(),
        ts: at(seconds),
        event: 'boot' as const,
        supplyV,
        prevShutdown: prev ? { ts: at(prev.atS), cause: prev.cause } : null,
      });
    },
    /** Messages the service has not received (yet): their seqs are used up. */
    skip: (count = 1) => {
      seq += count;
    },
  };
}

/** A common start: key on while driving, key off at 0 s. */
export function keyedOff(start?: Parameters<typeof gateway>[0], offOptions?: SampleOptions) {
  const g = gateway(start);
  g.on(-10);
  g.on(-5);
  g.off(0, offOptions);
  return g;
}

export function judge(
  events: UnitEvent[],
  o: { now?: number; profile?: Profile; previousEpisodes?: Episode[]; context?: JudgeContext | null } = {},
) {
  return judgeUnit({
    profile: o.profile ?? PROFILE_12V,
    events,
    now: o.now ?? at(100_000),
    previousEpisodes: o.previousEpisodes,
    context: o.context,
  });
}

export function onlyEpisode(events: UnitEvent[], o?: Parameters<typeof judge>[1]): Episode {
  const { episodes } = judge(events, o);
  if (episodes.length !== 1) throw new Error(`expected one episode, got ${episodes.length}`);
  return episodes[0];
}

/** A deterministic shuffle (a small LCG), so a test's order is the same on every run. */
export function shuffled<T>(items: readonly T[], seed: number): T[] {
  const out = [...items];
  let x = seed >>> 0;
  for (let i = out.length - 1; i > 0; i--) {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    const j = x % (i + 1);
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}
