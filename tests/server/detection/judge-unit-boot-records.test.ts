import { describe, expect, it } from 'vitest';
import type { ShutdownCause } from '../../../shared/protocol/messages';
import { at, gateway, judge, keyedOff, onlyEpisode } from './builders';

// Gateway protocol v1, precise rules 3, 5 and 7: a silent purge (nothing after the key-off in boot 1)
// settled by the next boot's prevShutdown. Key-off at 0 s, purge 120 s, so C = 120 s.

function silentPurgeThenBoot(prev: { atS: number; cause: ShutdownCause } | null) {
  const g = keyedOff();
  const record = g.boot(3600, prev);
  g.off(3601);
  return { g, record };
}

describe('a reboot record that settles a silent purge (protocol rule 5)', () => {
  it.each([
    { name: 'supply lost 38 s in, before C, means interrupted', prev: { atS: 38, cause: 'supply-lost' as const },
      outcome: 'interrupted', endedAtS: 38, secondsIntoPurge: 38 },
    { name: 'a sleep before C means completed (the gateway sleeps only after the controller)', prev: { atS: 50, cause: 'sleep' as const },
      outcome: 'completed', endedAtS: 120, secondsIntoPurge: null },
    { name: 'supply lost at or after C means completed', prev: { atS: 130, cause: 'supply-lost' as const },
      outcome: 'completed', endedAtS: 120, secondsIntoPurge: null },
    { name: 'supply lost exactly at C means completed', prev: { atS: 120, cause: 'supply-lost' as const },
      outcome: 'completed', endedAtS: 120, secondsIntoPurge: null },
    { name: 'a watchdog reset after C still proves power was held until C', prev: { atS: 400, cause: 'watchdog' as const },
      outcome: 'completed', endedAtS: 120, secondsIntoPurge: null },
  ])('$name', ({ prev, outcome, endedAtS, secondsIntoPurge }) => {
    const { g, record } = silentPurgeThenBoot(prev);
    const episode = onlyEpisode(g.events);
    expect(episode).toMatchObject({ outcome, settledBy: 'bootRecord', endedAt: at(endedAtS), secondsIntoPurge });
    expect(episode.evidence).toEqual({ stream: 0, boot: 2, seq: record.seq });
    // A buffered message of boot 1 may still arrive and outrank the record: never final.
    expect(episode.final).toBe(false);
  });

  it.each([
    { cause: 'watchdog' as ShutdownCause },
    { cause: 'unknown' as ShutdownCause },
  ])('a $cause shutdown before C is no evidence: the episode stays undetermined', ({ cause }) => {
    const { g } = silentPurgeThenBoot({ atS: 40, cause });
    expect(onlyEpisode(g.events)).toMatchObject({ outcome: 'undetermined', settledBy: null, endedAt: null, evidence: null, final: false });
  });

  it('a boot with no prevShutdown (null) is no evidence: the episode stays undetermined', () => {
    const { g } = silentPurgeThenBoot(null);
    expect(onlyEpisode(g.events).outcome).toBe('undetermined');
  });

  it('a prevShutdown time before the key-off cannot describe this purge and is no evidence', () => {
    const { g } = silentPurgeThenBoot({ atS: -20, cause: 'supply-lost' });
    expect(onlyEpisode(g.events).outcome).toBe('undetermined');
  });

  it('a record two boots later (boot + 2) is no evidence (rule 3: boot + 1 only)', () => {
    const g = keyedOff();
    g.boot(3600, null);
    g.boot(7200, { atS: 38, cause: 'supply-lost' });
    expect(onlyEpisode(g.events).outcome).toBe('undetermined');
  });

  it("a replacement gateway's boot record is no evidence for the old gateway's purge (other stream)", () => {
    const old = keyedOff({ stream: 0, boot: 1 });
    const replacement = gateway({ stream: 1, boot: 1 });
    replacement.boot(3600, { atS: 38, cause: 'supply-lost' });
    expect(onlyEpisode([...old.events, ...replacement.events]).outcome).toBe('undetermined');
  });

  it('samples from a later boot never prove that power was held', () => {
    const g = keyedOff();
    g.boot(3600, { atS: 40, cause: 'watchdog' });
    g.off(3601);
    g.on(3700);
    g.off(3800);
    const { episodes } = judge(g.events);
    expect(episodes[0]).toMatchObject({ keyOff: { boot: 1 }, outcome: 'undetermined', settledBy: null });
    expect(episodes[1]).toMatchObject({ keyOff: { boot: 2 } });
  });

  it('same-boot direct evidence outranks a boot record, even when it arrives later (same episode, new settledBy)', () => {
    const g = keyedOff();
    g.off(5);
    g.skip();
    g.boot(3600, { atS: 50, cause: 'sleep' });
    const beforeLate = onlyEpisode(g.events);
    expect(beforeLate).toMatchObject({ outcome: 'completed', settledBy: 'bootRecord', endedAt: at(120), final: false });

    const late = keyedOff();
    late.off(5);
    const lost = late.lost(38);
    const afterLate = onlyEpisode([...g.events, lost]);
    expect(afterLate.keyOff).toEqual(beforeLate.keyOff);
    expect(afterLate).toMatchObject({
      outcome: 'interrupted', settledBy: 'supplyLost', endedAt: at(38), secondsIntoPurge: 38, final: true,
      evidence: { stream: 0, boot: 1, seq: 4 },
    });
  });

  it('where the same boot gave evidence, a contradicting record of the next boot changes nothing', () => {
    const g = keyedOff();
    g.off(120);
    g.boot(3600, { atS: 30, cause: 'supply-lost' });
    expect(onlyEpisode(g.events)).toMatchObject({ outcome: 'completed', settledBy: 'powerHeld', final: true });
  });
});
