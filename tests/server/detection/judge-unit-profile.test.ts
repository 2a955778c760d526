import { describe, expect, it } from 'vitest';
import { judgeUnit } from '../../../server/detection/judge-unit';
import { EngineInputError } from '../../../server/detection/validate-input';
import { PROFILE_12V, PROFILE_24V, at, gateway, judge, keyedOff, onlyEpisode } from './builders';

// Gateway protocol v1, precise rules 2 and 6. Loss threshold default 12.0 V for 24 V systems, 6.0 V for
// 12 V; "under" is strictly less than. Purge 120 s: "common practice, no published source".

describe('the profile an episode is judged with (protocol rule 2)', () => {
  it.each([
    { supplyV: 11.99, profile: PROFILE_24V, outcome: 'interrupted', settledBy: 'lowVoltage' },
    { supplyV: 12.0, profile: PROFILE_24V, outcome: 'completed', settledBy: 'powerHeld' },
    { supplyV: 11.99, profile: PROFILE_12V, outcome: 'completed', settledBy: 'powerHeld' },
    { supplyV: 5.99, profile: PROFILE_12V, outcome: 'interrupted', settledBy: 'lowVoltage' },
  ])('a sample of $supplyV V 30 s in on a unit with a $profile.lossThresholdV V threshold: $outcome', ({ supplyV, profile, outcome, settledBy }) => {
    const g = keyedOff(undefined, { supplyV: 24.4 });
    g.off(30, { supplyV });
    g.off(120, { supplyV: 24.4 });
    expect(onlyEpisode(g.events, { profile })).toMatchObject({ outcome, settledBy, lossThresholdV: profile.lossThresholdV });
  });

  it('a profile change does not rewrite a past episode: the stored profile is reused for the same key-off', () => {
    const g = keyedOff();
    g.off(150);
    const first = onlyEpisode(g.events, { profile: { purgeSeconds: 120, lossThresholdV: 6 } });
    expect(first).toMatchObject({ purgeSeconds: 120, outcome: 'completed', endedAt: at(120) });

    g.on(1000);
    g.off(1100);
    g.off(1400);
    const { episodes } = judge(g.events, { profile: { purgeSeconds: 300, lossThresholdV: 12 }, previousEpisodes: [first] });
    expect(episodes[0]).toEqual(first);
    expect(episodes[1]).toMatchObject({ purgeSeconds: 300, lossThresholdV: 12, endedAt: at(1400) });
  });

  it('a longer purge time makes the same loss an interruption', () => {
    const g = keyedOff();
    g.lost(200);
    expect(onlyEpisode(g.events, { profile: { purgeSeconds: 120, lossThresholdV: 6 } }).outcome).toBe('completed');
    expect(onlyEpisode(g.events, { profile: { purgeSeconds: 300, lossThresholdV: 6 } })).toMatchObject({ outcome: 'interrupted', secondsIntoPurge: 200 });
  });
});

describe('pending and undetermined (protocol rule 6)', () => {
  const silent = keyedOff().events;
  it.each([
    { nowS: 0.001, outcome: 'pending' },
    { nowS: 120, outcome: 'pending' },
    { nowS: 149.999, outcome: 'pending' },
    { nowS: 150, outcome: 'undetermined' },
    { nowS: 86_400, outcome: 'undetermined' },
  ])('at key-off + $nowS s a silent purge is $outcome', ({ nowS, outcome }) => {
    expect(onlyEpisode(silent, { now: at(nowS) })).toMatchObject({ outcome, settledBy: null, endedAt: null, evidence: null, final: false });
  });

  it('a settled episode does not depend on the clock', () => {
    const g = keyedOff();
    g.lost(10);
    expect(onlyEpisode(g.events, { now: at(11) })).toEqual(onlyEpisode(g.events, { now: at(10_000) }));
  });
});

describe('ambient at key-off', () => {
  it('is the key-off sample ambient, else the nearest earlier sample with one (within an hour)', () => {
    const g = gateway();
    g.on(-4000, { ambientC: -20 });
    g.on(-1800, { ambientC: -6.5 });
    g.on(-5, { ambientC: null });
    g.off(0, { ambientC: null });
    g.on(100, { ambientC: null });
    g.on(5000, { ambientC: null });
    g.off(5400, { ambientC: null });
    const { episodes } = judge(g.events);
    expect(episodes.map((e) => e.ambientC)).toEqual([-6.5, null]);
  });
});

describe('bad input', () => {
  it.each([
    { name: 'a purge time under 10 s', input: { profile: { purgeSeconds: 5, lossThresholdV: 6 } }, path: 'profile.purgeSeconds' },
    { name: 'a non-finite clock', input: { now: Number.NaN }, path: 'now' },
    { name: 'a negative seq', input: { events: [{ ...keyedOff().events[0], seq: -1 }] }, path: 'events.0.seq' },
    { name: 'an unknown event kind', input: { events: [{ ...keyedOff().events[0], kind: 'status' }] }, path: 'events.0.kind' },
    { name: 'a missing supply voltage', input: { events: [{ ...keyedOff().events[0], supplyV: undefined }] }, path: 'events.0.supplyV' },
  ])('$name is refused with a clear error', ({ input, path }) => {
    const call = () => judgeUnit({ profile: PROFILE_12V, events: [], now: at(0), ...input } as Parameters<typeof judgeUnit>[0]);
    expect(call).toThrow(EngineInputError);
    expect(call).toThrow(path);
  });

  it('no events at all give no episodes and no state', () => {
    expect(judge([])).toEqual({ episodes: [], state: null });
  });
});
