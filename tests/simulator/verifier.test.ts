import { describe, expect, it } from 'vitest';
import { generateScenario } from '../../simulator/scenario/generate';
import { compareEpisodes, type FoundEpisode } from '../../simulator/truth/compare';
import { compareFaults, type FoundFault } from '../../simulator/truth/compare-faults';

const { truth } = generateScenario({ scenario: 'weekend', units: 20, seed: 'verify' });

/** What a service that judged every purge right would answer. */
function perfectEpisodes(): FoundEpisode[] {
  return truth.keyOffs.map((k, i) => ({ id: i + 1, unitId: k.unitId, keyOffAt: k.keyOffAt, outcome: k.expectedOutcome, secondsIntoPurge: k.secondsIntoPurge }));
}

describe('the ground-truth verifier', () => {
  it('passes a service that found every purge as it happened', () => {
    const v = compareEpisodes(truth, perfectEpisodes());
    expect(v.ok).toBe(true);
    expect(v.rows.completed.found).toBe(v.rows.completed.expected);
    expect(v.rows.interrupted.expected).toBeGreaterThan(0);
    expect(v.rows.interrupted.found).toBe(v.rows.interrupted.expected);
  });

  it('catches a planted miss: an interrupted purge the service never reported', () => {
    const eps = perfectEpisodes();
    const i = eps.findIndex((e) => e.outcome === 'interrupted');
    eps.splice(i, 1);
    const v = compareEpisodes(truth, eps);
    expect(v.ok).toBe(false);
    expect(v.rows.interrupted.missed).toBe(1);
    expect(v.misses[0].reason).toBe('no episode at this key-off');
  });

  it('catches a planted false finding: a completed purge reported as interrupted', () => {
    const eps = perfectEpisodes();
    const e = eps.find((x) => x.outcome === 'completed')!;
    e.outcome = 'interrupted';
    e.secondsIntoPurge = 12.5;
    const v = compareEpisodes(truth, eps);
    expect(v.ok).toBe(false);
    expect(v.rows.completed.missed).toBe(1);
    expect(v.rows.interrupted.wronglyFound).toBe(1);
  });

  it('catches an episode for a key-off that never happened, and a wrong time into the purge', () => {
    const eps = perfectEpisodes();
    eps.push({ id: 'x', unitId: truth.fleet[0].unitId, keyOffAt: truth.start.replace(':00.000Z', ':30.000Z'), outcome: 'completed', secondsIntoPurge: null });
    const hit = eps.find((x) => x.outcome === 'interrupted')!;
    hit.secondsIntoPurge = hit.secondsIntoPurge! + 3;
    const v = compareEpisodes(truth, eps);
    expect(v.rows.completed.wronglyFound).toBe(1);
    expect(v.rows.interrupted.missed).toBe(1);
    expect(v.falseFindings.map((f) => f.reason)).toContain('no such key-off happened');
  });

  it('ignores other units and episodes outside the run', () => {
    const eps = [...perfectEpisodes(), { id: 'y', unitId: 'OTHER-1', keyOffAt: truth.start, outcome: 'interrupted' as const, secondsIntoPurge: 4 }];
    eps.push({ id: 'z', unitId: truth.fleet[0].unitId, keyOffAt: '2020-01-01T00:00:00.000Z', outcome: 'completed', secondsIntoPurge: null });
    expect(compareEpisodes(truth, eps).ok).toBe(true);
  });

  it('checks faults and their link to the interrupted purge', () => {
    const eps = perfectEpisodes();
    const v = compareEpisodes(truth, eps);
    const idOf = new Map(eps.map((e) => [`${e.unitId}/${e.keyOffAt}`, e.id]));
    const faults: FoundFault[] = truth.faults.map((f) => ({ unitId: f.unitId, at: f.at, sourceAddress: f.sourceAddress, spn: f.spn, fmi: f.fmi, episodeId: f.linkedKeyOffAt ? idOf.get(`${f.unitId}/${f.linkedKeyOffAt}`)! : null }));
    expect(truth.faults.length).toBeGreaterThan(0);
    expect(compareFaults(truth, faults, v).ok).toBe(true);
    const unlinked = faults.map((f) => ({ ...f, episodeId: null }));
    const bad = compareFaults(truth, unlinked.slice(1), v);
    expect(bad.missed).toBe(1);
    if (truth.faults.some((f) => f.linkedKeyOffAt)) expect(bad.wrongLink).toBeGreaterThan(0);
  });
});
