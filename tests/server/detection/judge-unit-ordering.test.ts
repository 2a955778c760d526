import { describe, expect, it } from 'vitest';
import type { UnitEvent } from '../../../server/detection/types';
import { at, gateway, judge, keyedOff, onlyEpisode, shuffled } from './builders';
import { orderEvents } from '../../../server/detection/positions';

// Gateway protocol v1: QoS 1 means duplicates and out-of-order delivery; the service works in event
// time, ordered by (boot, seq); of duplicates the first accepted copy wins. Store-and-forward uploads
// look exactly like live messages.

/** A Friday evening and a weekend: three key-offs over two boots, with every kind of outcome. */
function weekend() {
  const g = gateway({ boot: 7 });
  g.on(0);
  g.off(10); // episode 1: interrupted at 48 s in
  g.off(15);
  g.lost(48);
  g.boot(3600, { atS: 48.5, cause: 'supply-lost' });
  g.on(3601);
  g.off(3700); // episode 2: resumed
  g.on(3760);
  g.can(3761);
  g.off(90_000); // episode 3: completed by the controller asleep
  g.off(90_040, { ecmAwake: false });
  g.off(90_900, { ecmAwake: false });
  return g.events;
}

describe('order, duplicates and gaps', () => {
  const expected = judge(weekend());

  it('the weekend judged in event order has three episodes in key-off order', () => {
    expect(expected.episodes.map((e) => [e.keyOff.boot, e.outcome, e.settledBy])).toEqual([
      [7, 'interrupted', 'supplyLost'],
      [8, 'resumed', 'keyOn'],
      [8, 'completed', 'ecmAsleep'],
    ]);
    expect(expected.episodes[0].secondsIntoPurge).toBe(38);
  });

  it('a weekend delivered newest-first judges the same', () => {
    expect(judge([...weekend()].reverse())).toEqual(expected);
  });

  it('every message delivered twice judges the same', () => {
    const events = weekend();
    expect(judge([...events, ...events])).toEqual(expected);
    expect(judge(events.flatMap((e) => [e, { ...e }]))).toEqual(expected);
  });

  it.each([1, 2, 3, 42, 2026])('any delivery order (shuffle %i) judges the same', (seed) => {
    const events = weekend();
    expect(judge(shuffled([...events, ...events.slice(0, 5)], seed))).toEqual(expected);
  });

  it('of two different copies of one (boot, seq), the first accepted copy wins', () => {
    const g = keyedOff();
    const lost = g.lost(38);
    const impostor: UnitEvent = {
      kind: 'telemetry', stream: 0, boot: 1, seq: lost.seq, ts: at(30), key: 'on', supplyV: 12.6, ambientC: 4, ecmAwake: true,
    };
    expect(onlyEpisode(g.events).settledBy).toBe('supplyLost');
    expect(onlyEpisode([impostor, ...g.events]).settledBy).toBe('keyOn');
  });

  it('a gap between the key-off and the evidence leaves the episode not final, until it is filled', () => {
    const g = keyedOff();
    g.off(5);
    g.skip();
    g.off(120);
    expect(onlyEpisode(g.events)).toMatchObject({ settledBy: 'powerHeld', final: false });
    const full = keyedOff();
    full.off(5);
    full.off(10);
    full.off(120);
    expect(onlyEpisode(full.events)).toMatchObject({ settledBy: 'powerHeld', final: true });
  });

  it('a gap between the key-on sample and the key-off leaves it not final (the missing one may be the real key-off)', () => {
    const g = gateway();
    g.on(-5);
    g.skip();
    g.off(0);
    g.off(120);
    expect(onlyEpisode(g.events)).toMatchObject({ settledBy: 'powerHeld', final: false });
  });

  it('a gap after the evidence does not matter: the episode is final', () => {
    const g = keyedOff();
    g.lost(30);
    g.skip(5);
    g.off(600);
    expect(onlyEpisode(g.events)).toMatchObject({ settledBy: 'supplyLost', final: true });
  });

  it('a late message that fills a gap with an earlier settling sample changes the evidence', () => {
    const g = keyedOff();
    g.off(5);
    g.skip();
    g.on(100);
    expect(onlyEpisode(g.events)).toMatchObject({ outcome: 'resumed', endedAt: at(100), final: false });
    const late = keyedOff();
    late.off(5);
    const asleep = late.off(40, { ecmAwake: false });
    expect(onlyEpisode([asleep, ...g.events])).toMatchObject({ outcome: 'completed', settledBy: 'ecmAsleep', endedAt: at(40), final: true });
  });

  it('two gateways of one unit (a replacement) are judged as separate streams, old stream first', () => {
    const old = keyedOff({ stream: 0, boot: 40 });
    old.lost(20);
    const replacement = gateway({ stream: 1, boot: 0 });
    replacement.on(5000);
    replacement.off(5100);
    replacement.off(5220);
    const { episodes } = judge(shuffled([...replacement.events, ...old.events], 9));
    expect(episodes.map((e) => [e.keyOff.stream, e.outcome])).toEqual([[0, 'interrupted'], [1, 'completed']]);
  });
});

describe('orderEvents', () => {
  // Protocol v1: (boot, seq) orders a gateway's messages; of copies the first accepted wins.
  const ev = (boot: number, seq: number, supplyV = 12.6): UnitEvent => ({ kind: 'telemetry', stream: 0, boot, seq, ts: seq * 1000, key: 'on', supplyV, ambientC: null, ecmAwake: true });

  it('returns rising input as a copy, in the same order', () => {
    const input = [ev(1, 0), ev(1, 1), ev(2, 0)];
    const out = orderEvents(input);
    expect(out).toEqual(input);
    expect(out).not.toBe(input);
  });

  it('sorts the rest and keeps the first copy of a repeated position', () => {
    const first = ev(1, 1, 12.1);
    const out = orderEvents([ev(2, 0), first, ev(1, 0), ev(1, 1, 12.9)]);
    expect(out.map((e) => `${e.boot}/${e.seq}`)).toEqual(['1/0', '1/1', '2/0']);
    expect(out[1]).toBe(first);
  });

  it('treats a copy right after its original as a copy, not as rising', () => {
    const out = orderEvents([ev(1, 0), ev(1, 1, 12.1), ev(1, 1, 12.9)]);
    expect(out.map((e) => (e.kind === 'telemetry' ? e.supplyV : null))).toEqual([12.6, 12.1]);
  });
});
