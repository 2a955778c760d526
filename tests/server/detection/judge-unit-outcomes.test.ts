import { describe, expect, it } from 'vitest';
import { at, keyedOff, onlyEpisode } from './builders';

// Gateway protocol v1, "The after-run purge" and precise rules 1, 4 and 7. Purge 120 s ("common
// practice, no published source"), loss threshold 6.0 V for a 12 V system (rule 2). Key-off at 0 s,
// so C = 120 s.
type Gateway = ReturnType<typeof keyedOff>;

interface Case {
  name: string;
  after: (g: Gateway) => void;
  outcome: string;
  settledBy: string;
  endedAtS: number;
  secondsIntoPurge: number | null;
}

const cases: Case[] = [
  { name: 'when a gateway loses supply 38.25 s into the purge, the episode is interrupted',
    after: (g) => { g.off(5); g.lost(38.25); }, outcome: 'interrupted', settledBy: 'supplyLost', endedAtS: 38.25, secondsIntoPurge: 38.25 },
  { name: 'when supply is lost 1 ms before C, the purge is interrupted 119.999 s in',
    after: (g) => g.lost(119.999), outcome: 'interrupted', settledBy: 'supplyLost', endedAtS: 119.999, secondsIntoPurge: 119.999 },
  { name: 'when supply is lost exactly at C, power was held until C',
    after: (g) => g.lost(120), outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when a sample reads 5.99 V before C, the purge is interrupted by low voltage',
    after: (g) => { g.off(5); g.off(10, { supplyV: 5.99 }); }, outcome: 'interrupted', settledBy: 'lowVoltage', endedAtS: 10, secondsIntoPurge: 10 },
  { name: 'when a sample reads exactly the 6.0 V threshold, that is not under it and the purge runs on',
    after: (g) => { g.off(10, { supplyV: 6.0 }); g.off(120); }, outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when the key comes back on during the purge, the episode is resumed',
    after: (g) => { g.off(5); g.on(60); }, outcome: 'resumed', settledBy: 'keyOn', endedAtS: 60, secondsIntoPurge: null },
  { name: 'when the key comes back on exactly at C, the purge completed with power held',
    after: (g) => g.on(120), outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when the controller goes to sleep early, the purge completed then',
    after: (g) => { g.off(5); g.off(45, { ecmAwake: false }); }, outcome: 'completed', settledBy: 'ecmAsleep', endedAtS: 45, secondsIntoPurge: null },
  { name: 'when the controller is reported asleep only after C, power held decides and endedAt is C',
    after: (g) => g.off(125, { ecmAwake: false }), outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when a sample with supply held comes at C, the purge completed with power held',
    after: (g) => { g.off(60); g.off(120); }, outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when the first sample after C reads low, it still proves power was held until C',
    after: (g) => g.off(130, { supplyV: 2.1 }), outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when one sample shows the controller asleep and low voltage, the listed order puts asleep first',
    after: (g) => g.off(30, { ecmAwake: false, supplyV: 3 }), outcome: 'completed', settledBy: 'ecmAsleep', endedAtS: 30, secondsIntoPurge: null },
  { name: 'when one sample shows key on and low voltage before C, the listed order puts key-on first',
    after: (g) => g.on(30, { supplyV: 3 }), outcome: 'resumed', settledBy: 'keyOn', endedAtS: 30, secondsIntoPurge: null },
  { name: 'when CAN batches are the only messages after C, they are no evidence and a later sample settles',
    after: (g) => { g.can(121); g.can(150); g.off(900); }, outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when supply is restored after C, that reading proves power was held',
    after: (g) => g.restored(121), outcome: 'completed', settledBy: 'powerHeld', endedAtS: 120, secondsIntoPurge: null },
  { name: 'when a supply-restored event before C reads under the threshold, the purge is interrupted by low voltage',
    after: (g) => g.restored(20, 5.5), outcome: 'interrupted', settledBy: 'lowVoltage', endedAtS: 20, secondsIntoPurge: 20 },
  { name: 'when the first evidence is the loss, a key-on after it does not change the outcome',
    after: (g) => { g.lost(50); g.restored(55); g.on(60); }, outcome: 'interrupted', settledBy: 'supplyLost', endedAtS: 50, secondsIntoPurge: 50 },
];

describe('settling an episode from the same boot (protocol rule 4)', () => {
  it.each(cases)('$name', ({ after, outcome, settledBy, endedAtS, secondsIntoPurge }) => {
    const g = keyedOff();
    after(g);
    const episode = onlyEpisode(g.events);
    expect(episode.outcome).toBe(outcome);
    expect(episode.settledBy).toBe(settledBy);
    expect(episode.endedAt).toBe(at(endedAtS));
    expect(episode.secondsIntoPurge).toBe(secondsIntoPurge);
    expect(episode.purgeSeconds).toBe(120);
    expect(episode.lossThresholdV).toBe(6.0);
    expect(episode.keyOff).toEqual({ stream: 0, boot: 1, seq: 2, ts: at(0) });
  });

  it('when the key-off sample itself shows the controller asleep and low supply, it is not evidence (rule 1)', () => {
    const g = keyedOff(undefined, { ecmAwake: false, supplyV: 3 });
    g.off(120);
    expect(onlyEpisode(g.events)).toMatchObject({ outcome: 'completed', settledBy: 'powerHeld', endedAt: at(120) });
  });

  it('the evidence is the position of the settling message, and final when no seq is missing', () => {
    const g = keyedOff();
    g.off(5);
    g.can(6);
    const lost = g.lost(38);
    g.off(40);
    expect(onlyEpisode(g.events)).toMatchObject({ evidence: { stream: 0, boot: 1, seq: lost.seq }, final: true });
  });

  it('when the key goes off twice without a key-on between, only the first off opens an episode', () => {
    const g = keyedOff();
    g.off(10);
    g.off(130);
    expect(onlyEpisode(g.events).keyOff.ts).toBe(at(0));
  });

  it('when a boot starts with the key off, there is no key on -> off and no episode', () => {
    const g = keyedOff();
    g.boot(500, { atS: 400, cause: 'sleep' });
    g.off(501);
    g.off(800);
    expect(onlyEpisode(g.events).keyOff.ts).toBe(at(0));
  });

  it('when the key was on in one boot and off in the next, no episode starts across the boots', () => {
    const g = keyedOff();
    g.on(200);
    g.boot(300, { atS: 290, cause: 'watchdog' });
    g.off(301);
    g.off(500);
    expect(onlyEpisode(g.events).endedAt).toBe(at(120));
  });
});
