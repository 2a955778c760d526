import { describe, expect, it } from 'vitest';
import { comparePositions } from '../../../server/detection/positions';
import type { ShutdownCause } from '../../../shared/protocol/messages';
import type { UnitEvent } from '../../../server/detection/types';
import { judgeUnit } from '../../../server/detection/judge-unit';
import { judgingWindow } from '../../../server/detection/window';
import { PROFILE_12V, gateway, judge } from './builders';

// Many seeded, invented fleet days: a shell judging message by message in its window must agree with
// judging the whole history (episodes and state), whatever mix of purge endings the day had.

function rng(seed: number) {
  let x = seed >>> 0 || 1;
  return (n: number) => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x % n;
  };
}

function scenario(seed: number): UnitEvent[] {
  const pick = rng(seed);
  const g = gateway();
  let t = 0;
  const causes: (ShutdownCause | null)[] = ['supply-lost', 'sleep', 'watchdog', 'unknown', null];
  const ambient = () => pick(30) - 18;
  for (let stop = 0; stop < 6; stop++) {
    for (let i = 0; i < 3 + pick(5); i++) g.on((t += 5), { ambientC: ambient() });
    g.off((t += 5), { ambientC: pick(4) === 0 ? null : ambient() });
    const k = t;
    const into = 1 + pick(150);
    switch (pick(9)) {
      case 0: g.lost(k + into); break;
      case 1: g.off(k + into, { supplyV: 4 }); break;
      case 2: g.off(k + into, { ecmAwake: false }); break;
      case 3: g.on(k + into); break;
      case 4: g.off(k + 60); g.off(k + 125); g.lost(k + 400); break;
      case 5: g.restored(k + into, pick(2) ? 12.5 : 3); break;
      case 6: g.can(k + 3); break;
      default: {
        const cause = causes[pick(causes.length)];
        g.boot(k + 3000, cause ? { atS: k + into, cause } : null, pick(4) === 0 ? 2 : 12.4);
      }
    }
    t = k + 4000;
    if (pick(3) === 0) g.boot(t, { atS: t - 10, cause: causes[pick(4)] as ShutdownCause });
    if (pick(2) === 0) g.off((t += 5), { ecmAwake: pick(2) === 0, ambientC: ambient() });
  }
  return g.events;
}

describe('windowed judging agrees with whole-history judging', () => {
  it.each(Array.from({ length: 60 }, (_, i) => i + 1))('invented day %i', (seed) => {
    const events = scenario(seed);
    let kept: UnitEvent[] = [];
    let context = null;
    const stored = new Map<string, unknown>();
    let state = null;
    for (const e of events) {
      kept.push(e);
      const input = { profile: PROFILE_12V, events: kept, now: e.ts + 200, context };
      const j = judgeUnit(input);
      for (const ep of j.episodes) stored.set(`${ep.keyOff.stream}/${ep.keyOff.boot}/${ep.keyOff.seq}`, ep);
      state = j.state;
      const w = judgingWindow(input);
      const start = w.start;
      kept = start ? kept.filter((k) => comparePositions(k, start) >= 0) : [];
      context = w.context;
      // The full judgement at the same moment gives the same state.
      expect(state).toEqual(judge(events.slice(0, events.indexOf(e) + 1), { now: e.ts + 200 }).state);
    }
    const full = judge(events, { now: events[events.length - 1].ts + 200 });
    expect([...stored.values()]).toEqual(full.episodes);
  });
});
