import { describe, expect, it } from 'vitest';
import { at, gateway, judge, keyedOff } from './builders';

// Gateway protocol v1, precise rule 8 (unit states and stateSince), with the silence limits of rule 8:
// 60 s with the key on, 20 min in safeToIsolate. Key-off at 0 s, purge 120 s, C = 120 s.
type G = ReturnType<typeof gateway>;
const WEEK = 7 * 86_400;

interface Case {
  name: string;
  build: () => G;
  nowS: number;
  state: string;
  sinceS: number;
  remaining?: number;
}

const completed = () => {
  const g = keyedOff();
  g.off(60);
  g.off(120);
  return g;
};
const interrupted = () => {
  const g = keyedOff();
  g.lost(38);
  return g;
};

const cases: Case[] = [
  { name: 'a unit driving is keyOn since its first key-on sample', build: () => { const g = gateway(); g.on(0); g.on(5); return g; }, nowS: 10, state: 'keyOn', sinceS: 0 },
  { name: 'keyOn lasts up to 60 s of silence', build: () => { const g = gateway(); g.on(0); g.on(5); return g; }, nowS: 64.999, state: 'keyOn', sinceS: 0 },
  { name: 'after 60 s of silence with the key on the unit is noContact, since the last message + 60 s', build: () => { const g = gateway(); g.on(0); g.on(5); return g; }, nowS: 65, state: 'noContact', sinceS: 65 },
  { name: 'during the purge the unit is purging since the key-off, with seconds to C rounded up', build: () => { const g = keyedOff(); g.off(5); return g; }, nowS: 30.2, state: 'purging', sinceS: 0, remaining: 90 },
  { name: 'half a second before C one second remains', build: () => keyedOff(), nowS: 119.5, state: 'purging', sinceS: 0, remaining: 1 },
  { name: 'from C to C + 30 s the unsettled purge still shows purging with 0 s left', build: () => keyedOff(), nowS: 149.999, state: 'purging', sinceS: 0, remaining: 0 },
  { name: 'at C + 30 s an unsettled purge is undetermined and the unit noContact since C + 30 s', build: () => keyedOff(), nowS: 150, state: 'noContact', sinceS: 150 },
  { name: 'a completed purge makes the unit safeToIsolate since C', build: completed, nowS: 200, state: 'safeToIsolate', sinceS: 120 },
  { name: 'the controller asleep early makes it safeToIsolate since then', build: () => { const g = keyedOff(); g.off(45, { ecmAwake: false }); return g; }, nowS: 50, state: 'safeToIsolate', sinceS: 45 },
  { name: 'safeToIsolate lasts up to 20 min of silence', build: completed, nowS: 120 + 1199.999, state: 'safeToIsolate', sinceS: 120 },
  { name: 'after 20 min of silence in safeToIsolate the unit is noContact since the last message + 20 min', build: completed, nowS: 120 + 1200, state: 'noContact', sinceS: 1320 },
  { name: 'supply lost after a completed purge is isolated, and stays so while silent', build: () => { const g = completed(); g.lost(600); return g; }, nowS: WEEK, state: 'isolated', sinceS: 600 },
  { name: 'a low sample after a completed purge is isolated', build: () => { const g = completed(); g.off(900, { supplyV: 1.2 }); return g; }, nowS: 1000, state: 'isolated', sinceS: 900 },
  { name: 'a supply-lost at C settles completed and leaves the unit isolated', build: () => { const g = keyedOff(); g.lost(125); return g; }, nowS: WEEK, state: 'isolated', sinceS: 125 },
  { name: 'supply restored after isolated is safeToIsolate since the restore', build: () => { const g = completed(); g.lost(600); g.restored(601); return g; }, nowS: 700, state: 'safeToIsolate', sinceS: 601 },
  { name: 'a boot with supply after isolated is safeToIsolate since the boot', build: () => { const g = completed(); g.lost(600); g.boot(5000, { atS: 600, cause: 'supply-lost' }); return g; }, nowS: 5001, state: 'safeToIsolate', sinceS: 5000 },
  { name: 'a sample with supply back after isolated is safeToIsolate since the sample', build: () => { const g = completed(); g.off(900, { supplyV: 1.2 }); g.off(960); return g; }, nowS: 1000, state: 'safeToIsolate', sinceS: 960 },
  { name: 'an interrupted purge makes the unit interrupted since the loss, and it stays so while silent', build: interrupted, nowS: WEEK, state: 'interrupted', sinceS: 38 },
  { name: 'a boot after an interrupted purge with the key still off stays interrupted', build: () => { const g = interrupted(); g.boot(5000, { atS: 38, cause: 'supply-lost' }); g.off(5001); g.off(5900, { ecmAwake: false }); return g; }, nowS: 6000, state: 'interrupted', sinceS: 38 },
  { name: 'supply restored after an interruption does not clear it', build: () => { const g = interrupted(); g.restored(40); g.off(200); return g; }, nowS: 300, state: 'interrupted', sinceS: 38 },
  { name: 'the next key-on ends interrupted', build: () => { const g = interrupted(); g.boot(5000, { atS: 38, cause: 'supply-lost' }); g.on(5010); return g; }, nowS: 5020, state: 'keyOn', sinceS: 5010 },
  { name: 'an interruption known from the boot record is interrupted since the recorded shutdown', build: () => { const g = keyedOff(); g.boot(5000, { atS: 70, cause: 'supply-lost' }); return g; }, nowS: 5001, state: 'interrupted', sinceS: 70 },
  { name: 'a completion known from the boot record is safeToIsolate since C', build: () => { const g = keyedOff(); g.boot(5000, { atS: 60, cause: 'sleep' }); return g; }, nowS: 5001, state: 'safeToIsolate', sinceS: 120 },
  { name: 'a key-on during the purge resumes it: keyOn since the key-on', build: () => { const g = keyedOff(); g.on(30); return g; }, nowS: 40, state: 'keyOn', sinceS: 30 },
  { name: 'an undetermined purge stays noContact through a later boot with the key off', build: () => { const g = keyedOff(); g.boot(5000, { atS: 60, cause: 'watchdog' }); g.off(5001); return g; }, nowS: 5002, state: 'noContact', sinceS: 150 },
  { name: 'a key-on after an undetermined purge is keyOn', build: () => { const g = keyedOff(); g.boot(5000, null); g.on(5001); return g; }, nowS: 5002, state: 'keyOn', sinceS: 5001 },
  { name: 'supply lost while the key is on is isolated (no purge open)', build: () => { const g = gateway(); g.on(0); g.lost(10); return g; }, nowS: WEEK, state: 'isolated', sinceS: 10 },
  // Before any key-off (a design choice, see unit-state.ts): nothing is claimed until the controller is seen asleep.
  { name: 'a first message with the key off and the controller awake is noContact: no purge was judged', build: () => { const g = gateway(); g.off(0); return g; }, nowS: 5, state: 'noContact', sinceS: 0 },
  { name: 'a first message with the key off and the controller asleep is safeToIsolate', build: () => { const g = gateway(); g.off(0, { ecmAwake: false }); return g; }, nowS: 5, state: 'safeToIsolate', sinceS: 0 },
  { name: 'with no purge judged, the controller seen asleep later makes it safeToIsolate since then', build: () => { const g = gateway(); g.off(0); g.off(5); g.off(60, { ecmAwake: false }); return g; }, nowS: 65, state: 'safeToIsolate', sinceS: 60 },
  { name: 'a first message reporting supply lost is isolated', build: () => { const g = gateway(); g.lost(0); return g; }, nowS: 5, state: 'isolated', sinceS: 0 },
  { name: 'a new boot that starts with the key off after driving claims nothing while the controller is awake', build: () => { const g = gateway(); g.on(0); g.boot(100, { atS: 99, cause: 'watchdog' }); g.off(101); return g; }, nowS: 102, state: 'noContact', sinceS: 101 },
];

describe('unit state and stateSince (protocol rule 8)', () => {
  it.each(cases)('$name', ({ build, nowS, state, sinceS, remaining }) => {
    expect(judge(build().events, { now: at(nowS) }).state).toEqual({ state, since: at(sinceS), purgeRemainingS: remaining ?? null });
  });

  it('supply lost after a completed purge leaves the episode completed: no finding', () => {
    const g = completed();
    g.lost(600);
    const { episodes } = judge(g.events, { now: at(700) });
    expect(episodes).toHaveLength(1);
    expect(episodes[0]).toMatchObject({ outcome: 'completed', secondsIntoPurge: null, freezeExposure: null });
  });
});
