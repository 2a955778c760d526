import { describe, expect, it } from 'vitest';
import { DEF_FREEZE_POINT_C } from '../../../shared/protocol/limits';
import { foldLateFreezeExposure, freezeBand, mergeFreezeExposure } from '../../../server/detection/freeze';
import { judgeUnit } from '../../../server/detection/judge-unit';
import { PROFILE_12V, at, gateway, judge, keyedOff } from './builders';

// AUS 32 (DEF) freezes at -11 °C: ISO 22241-1. The bands above it are this project's design (margins
// for sensor tolerance and unobserved night lows, "from memory"; see freeze.ts).

describe('freeze bands of the lowest ambient', () => {
  it('the freezing point is the one ISO 22241-1 gives for AUS 32', () => {
    expect(DEF_FREEZE_POINT_C).toBe(-11);
  });

  it.each([
    { c: -25, band: 'frozen' },
    { c: -11, band: 'frozen' },
    { c: -10.9, band: 'atRisk' },
    { c: -7, band: 'atRisk' },
    { c: -6.9, band: 'watch' },
    { c: 0, band: 'watch' },
    { c: 2, band: 'watch' },
    { c: 2.1, band: 'none' },
    { c: 30, band: 'none' },
  ])('$c °C is $band', ({ c, band }) => {
    expect(freezeBand(c)).toBe(band);
  });

  it('no ambient at all is no band (unknown, not safe)', () => {
    expect(freezeBand(null)).toBeNull();
  });

  it('a non-finite ambient is refused', () => {
    expect(() => freezeBand(Number.NaN)).toThrow(RangeError);
  });
});

describe('freeze exposure of an interrupted purge', () => {
  /** Interrupted 38 s in at -3 °C, silent overnight, then the next morning's drive and a completed purge. */
  function night(morningC: number[]) {
    const g = keyedOff(undefined, { ambientC: -3 });
    g.lost(38);
    g.boot(50_000, { atS: 38, cause: 'supply-lost' });
    g.off(50_001, { ambientC: morningC[0] });
    g.on(50_060, { ambientC: morningC[1] });
    g.on(50_065, { ambientC: morningC[2] });
    g.off(60_000, { ambientC: -1 });
    g.off(60_130, { ambientC: -1 });
    g.on(70_000, { ambientC: -30 });
    return g;
  }

  it('takes the lowest ambient from the interruption until the next completed purge', () => {
    const { episodes } = judge(night([-9, -8, -5]).events);
    expect(episodes.map((e) => e.outcome)).toEqual(['interrupted', 'completed']);
    expect(episodes[0]).toMatchObject({ ambientC: -3, minAmbientAfterC: -9, freezeExposure: 'atRisk', nextKeyOnAt: at(50_060) });
    // The -30 °C sample comes after the next completed purge: the lines were empty again by then.
  });

  it('a reading at the freezing point after the interruption is frozen', () => {
    expect(judge(night([-11, -8, -5]).events).episodes[0].freezeExposure).toBe('frozen');
  });

  it('a mild night is no exposure; the ambient at the time of the loss counts too', () => {
    expect(judge(night([6, 7, 8]).events).episodes[0]).toMatchObject({ minAmbientAfterC: -3, freezeExposure: 'watch' });
    const warm = keyedOff(undefined, { ambientC: 12 });
    warm.lost(38);
    warm.boot(50_000, { atS: 38, cause: 'supply-lost' });
    warm.on(50_060, { ambientC: 9 });
    expect(judge(warm.events).episodes[0]).toMatchObject({ minAmbientAfterC: 9, freezeExposure: 'none' });
  });

  it('with no later completed purge every later sample counts, and nextKeyOnAt waits for a key-on', () => {
    const g = keyedOff(undefined, { ambientC: 1 });
    g.lost(20);
    g.boot(40_000, { atS: 20, cause: 'supply-lost' });
    g.off(40_001, { ambientC: -14 });
    const { episodes } = judge(g.events);
    expect(episodes[0]).toMatchObject({ minAmbientAfterC: -14, freezeExposure: 'frozen', nextKeyOnAt: null });
  });

  it('without any ambient reading the exposure is unknown (null)', () => {
    const g = gateway();
    g.on(-5, { ambientC: null });
    g.off(0, { ambientC: null });
    g.lost(20);
    expect(judge(g.events).episodes[0]).toMatchObject({ outcome: 'interrupted', minAmbientAfterC: null, freezeExposure: null });
  });

  it('completed and resumed episodes carry no freeze fields', () => {
    const { episodes } = judge(night([-20, -20, -20]).events);
    expect(episodes[1]).toMatchObject({ minAmbientAfterC: null, freezeExposure: null, nextKeyOnAt: null });
  });
});

describe('freeze figures carried past the judging window', () => {
  /** The night above up to the morning's first readings: the interrupted episode as the shell stores it. */
  function wetEpisode() {
    const g = keyedOff(undefined, { ambientC: -3 });
    g.lost(38);
    g.boot(50_000, { atS: 38, cause: 'supply-lost' });
    g.off(50_001, { ambientC: -5 });
    return { g, episode: judge(g.events).episodes[0] };
  }

  it('late readings after the key-off count; readings before it do not; an earlier key-on is the next key-on', () => {
    const { episode } = wetEpisode();
    expect(episode).toMatchObject({ minAmbientAfterC: -5, freezeExposure: 'watch', nextKeyOnAt: null });
    const late = gateway({ boot: 2, seq: 5 });
    late.on(50_100, { ambientC: -12 });
    const before = gateway({ boot: 1, seq: 0 });
    before.on(-20, { ambientC: -40 });
    const [folded] = foldLateFreezeExposure([episode], [...before.events, ...late.events]);
    expect(folded).toMatchObject({ minAmbientAfterC: -12, freezeExposure: 'frozen', nextKeyOnAt: at(50_100) });
    expect(episode.minAmbientAfterC).toBe(-5); // a new object: the stored one is left as it was
    const earlier = gateway({ boot: 2, seq: 3 });
    earlier.on(50_050, { ambientC: 0 });
    expect(foldLateFreezeExposure([folded], earlier.events)[0]).toMatchObject({ minAmbientAfterC: -12, nextKeyOnAt: at(50_050) });
  });

  it('an episode judged again from one old boot takes the union with the stored figures', () => {
    const { episode } = wetEpisode();
    const stored = { ...episode, minAmbientAfterC: -9, freezeExposure: 'atRisk' as const, nextKeyOnAt: at(50_060) };
    const partial = { ...episode, minAmbientAfterC: -3, freezeExposure: 'watch' as const, nextKeyOnAt: null };
    expect(mergeFreezeExposure(partial, stored)).toMatchObject({ minAmbientAfterC: -9, freezeExposure: 'atRisk', nextKeyOnAt: at(50_060) });
    const colder = { ...partial, minAmbientAfterC: -11, nextKeyOnAt: at(50_055) };
    expect(mergeFreezeExposure(colder, stored)).toMatchObject({ minAmbientAfterC: -11, freezeExposure: 'frozen', nextKeyOnAt: at(50_055) });
  });

  it('a carried episode that is not interrupted is refused at the engine\'s edge', () => {
    const { g, episode } = wetEpisode();
    const context = { state: null, lastAmbient: null, wet: [{ ...episode, outcome: 'completed' as const }] };
    expect(() => judgeUnit({ profile: PROFILE_12V, events: g.events.slice(-1), now: at(50_010), context })).toThrow(/context\.wet\.0\.outcome/);
  });
});
