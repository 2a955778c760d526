import { describe, expect, it } from 'vitest';
import { judgeUnit } from '../../../server/detection/judge-unit';
import { comparePositions, positionKey } from '../../../server/detection/positions';
import type { Episode, JudgeContext, Judgement, UnitEvent } from '../../../server/detection/types';
import { judgingWindow } from '../../../server/detection/window';
import { PROFILE_12V, at, gateway, judge, keyedOff } from './builders';

// The judging window: a shell that keeps only the window's events and context must judge exactly as
// judging the whole history at once (the engine's own invariant; protocol rules as in the other tests).

/** The ingest shell as window.ts tells it to behave, one message at a time, in arrival order. */
function runShell(arrivals: UnitEvent[], nowOf: (e: UnitEvent) => number, holdLimitMs?: number) {
  let kept: UnitEvent[] = [];
  let context: JudgeContext | null = null;
  const stored = new Map<string, Episode>();
  let last: Judgement | null = null;
  let largestKept = 0;
  for (const e of arrivals) {
    kept.push(e);
    largestKept = Math.max(largestKept, kept.length);
    const input = { profile: PROFILE_12V, events: kept, previousEpisodes: [...stored.values()], now: nowOf(e), context };
    last = judgeUnit(input);
    const firstKept = kept.reduce((a, b) => (comparePositions(a, b) <= 0 ? a : b));
    const returned = new Set(last.episodes.map((ep) => positionKey(ep.keyOff)));
    for (const [key, ep] of stored) if (comparePositions(ep.keyOff, firstKept) >= 0 && !returned.has(key)) stored.delete(key);
    for (const ep of last.episodes) stored.set(positionKey(ep.keyOff), ep);
    const window = judgingWindow(input, { holdLimitMs });
    const start = window.start;
    kept = start ? kept.filter((k) => comparePositions(k, start) >= 0) : [];
    context = window.context;
  }
  const episodes = [...stored.values()].sort((a, b) => comparePositions(a.keyOff, b.keyOff));
  return { episodes, state: last?.state ?? null, largestKept, kept: kept.length };
}

const arrivedAt = (e: UnitEvent) => e.ts + 500;

function expectSameAsFull(events: UnitEvent[], arrivals = events) {
  const shell = runShell(arrivals, arrivedAt);
  const full = judge(events, { now: arrivedAt(arrivals[arrivals.length - 1]) });
  expect(shell.episodes).toEqual(full.episodes);
  expect(shell.state).toEqual(full.state);
  return shell;
}

/** Key-off at `keyOffC` °C, supply lost 38 s into the purge, the next boot at `bootS`. */
function interruptedThenBoot(keyOffC: number, bootS = 40_000) {
  const g = keyedOff(undefined, { ambientC: keyOffC });
  g.lost(38);
  g.boot(bootS, { atS: 38, cause: 'supply-lost' });
  return g;
}

describe('judging in a window', () => {
  it('a day of driving and stops judges the same as the whole history, holding few events', () => {
    const g = gateway();
    for (let s = 0; s < 3000; s += 5) g.on(s);
    g.off(3000);
    g.off(3060, { ecmAwake: false }); // completed early
    g.on(4000);
    for (let s = 4005; s < 8000; s += 5) g.on(s);
    g.off(8000);
    g.on(8030); // resumed
    for (let s = 8035; s < 9000; s += 5) g.on(s);
    g.off(9000);
    g.off(9125); // completed, power held
    const shell = expectSameAsFull(g.events);
    expect(shell.episodes.map((e) => e.settledBy)).toEqual(['ecmAsleep', 'keyOn', 'powerHeld']);
    expect(shell.largestKept).toBeLessThanOrEqual(4);
  });

  it('while driving the window keeps only the latest sample, and keyOn keeps the time it began', () => {
    const g = gateway();
    for (let s = 0; s < 600; s += 5) g.on(s);
    const shell = runShell(g.events, arrivedAt);
    expect(shell.kept).toBe(1);
    expect(shell.state).toEqual({ state: 'keyOn', since: at(0), purgeRemainingS: null });
  });

  it('an interruption rides in the context until the next completed purge, so the freeze figures stay right', () => {
    const g = interruptedThenBoot(-2);
    for (let s = 40_010; s < 41_000; s += 5) g.on(s, { ambientC: s === 40_500 ? -12 : -4 });
    g.off(41_000);
    g.off(41_130);
    const shell = expectSameAsFull(g.events);
    expect(shell.episodes[0]).toMatchObject({ outcome: 'interrupted', minAmbientAfterC: -12, freezeExposure: 'frozen', nextKeyOnAt: at(40_010) });
    expect(shell.kept).toBeLessThanOrEqual(2);
  });

  it('a day of driving after an interruption keeps a few events, not the day', () => {
    const g = interruptedThenBoot(-3);
    for (let s = 40_010; s < 50_000; s += 5) g.on(s, { ambientC: s === 45_000 ? -9.5 : -4 });
    const shell = expectSameAsFull(g.events);
    expect(shell.episodes[0]).toMatchObject({ outcome: 'interrupted', minAmbientAfterC: -9.5, freezeExposure: 'atRisk', nextKeyOnAt: at(40_010) });
    // At most the key-off's own stretch until the interruption settled; a window held open would keep all 2,000 readings.
    expect(shell.largestKept).toBeLessThanOrEqual(5);
    expect(shell.kept).toBe(1);
  });

  it('two interruptions before a completed purge each take the readings after their own key-off', () => {
    const g = interruptedThenBoot(-3);
    for (let s = 40_010; s < 41_000; s += 5) g.on(s, { ambientC: s === 40_500 ? -6 : -1 });
    g.off(41_000, { ambientC: -2 });
    g.lost(41_020);
    g.boot(80_000, { atS: 41_020, cause: 'supply-lost' });
    for (let s = 80_010; s < 81_000; s += 5) g.on(s, { ambientC: -4 });
    g.off(81_000, { ambientC: -1 });
    g.off(81_130, { ambientC: -1 });
    g.on(90_000, { ambientC: -20 });
    const shell = expectSameAsFull(g.events);
    expect(shell.episodes.map((e) => [e.outcome, e.minAmbientAfterC, e.nextKeyOnAt])).toEqual([
      ['interrupted', -6, at(40_010)],
      ['interrupted', -4, at(80_010)],
      ['completed', null, null],
    ]);
    expect(shell.largestKept).toBeLessThanOrEqual(5);
  });

  it('past the hold limit an interruption leaves the context and its figures stay as they were', () => {
    const g = interruptedThenBoot(-3, 150);
    g.on(160, { ambientC: -5 });
    // A hold limit of 60 s past the purge's end (120 s): the judgement that finds it past is its last.
    g.on(40_000, { ambientC: -8 });
    g.on(40_005, { ambientC: -30 });
    const shell = runShell(g.events, arrivedAt, 60_000);
    expect(shell.episodes[0]).toMatchObject({ outcome: 'interrupted', minAmbientAfterC: -8, freezeExposure: 'atRisk' });
  });

  it('a late buffered message into a held gap settles as in the whole history', () => {
    const g = keyedOff();
    g.off(5);
    const missing = g.lost(38);
    g.boot(3600, { atS: 50, cause: 'sleep' });
    g.off(3601);
    const arrivals = g.events.filter((e) => e !== missing).concat(missing);
    const shell = expectSameAsFull(g.events, arrivals);
    expect(shell.episodes[0]).toMatchObject({ outcome: 'interrupted', settledBy: 'supplyLost', final: true });
  });

  it('a purge still pending holds its key-off, and settles when the evidence arrives', () => {
    const g = keyedOff();
    g.off(5);
    g.off(10);
    g.off(125);
    const shell = expectSameAsFull(g.events);
    expect(shell.episodes[0]).toMatchObject({ outcome: 'completed', endedAt: at(120) });
    expect(shell.state).toEqual({ state: 'safeToIsolate', since: at(120), purgeRemainingS: null });
  });

  it('past the hold limit an undetermined purge frees the window and the state carries over', () => {
    const g = keyedOff();
    g.boot(3600, null);
    for (let s = 3601; s < 4000; s += 5) g.off(s);
    const shell = runShell(g.events, arrivedAt, 60_000);
    expect(shell.kept).toBe(1);
    expect(shell.episodes[0].outcome).toBe('undetermined');
    expect(shell.state).toEqual({ state: 'noContact', since: at(150), purgeRemainingS: null });
  });

  it('with no events there is nothing to keep and the context is carried', () => {
    const context: JudgeContext = { state: { name: 'isolated', since: at(5) }, lastAmbient: null };
    expect(judgingWindow({ profile: PROFILE_12V, events: [], now: at(10), context })).toEqual({ start: null, context });
    expect(judgeUnit({ profile: PROFILE_12V, events: [], now: at(10), context }).state).toEqual({ state: 'isolated', since: at(5), purgeRemainingS: null });
  });

  it('a bad hold limit is refused', () => {
    expect(() => judgingWindow({ profile: PROFILE_12V, events: [], now: 0 }, { holdLimitMs: -1 })).toThrow(RangeError);
  });
});
