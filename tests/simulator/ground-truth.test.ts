import { describe, expect, it } from 'vitest';
import { DEF_FREEZE_POINT_C, defaultLossThresholdV } from '../../shared/protocol/limits';
import { generateScenario } from '../../simulator/scenario/generate';
import { TruthSchema } from '../../simulator/truth/truth-schema';
import { judgeStream, ordered } from './reference-rules';

const weekend = generateScenario({ scenario: 'weekend', units: 30, seed: 'truth' });
const weekday = generateScenario({ scenario: 'weekday', units: 30, seed: 'truth' });
const gaps = generateScenario({ scenario: 'coverage-gaps', units: 20, seed: 'truth' });
const cold = generateScenario({ scenario: 'cold-snap', units: 10, seed: 'truth' });

describe('the ground truth agrees with the messages the gateways sent', () => {
  it.each([['weekend', weekend], ['weekday', weekday], ['coverage-gaps', gaps]] as const)('%s: every key-off in the truth is one the protocol rules judge the same way, and no other', (_n, run) => {
    expect(TruthSchema.safeParse(run.truth).success).toBe(true);
    for (const u of run.truth.fleet) {
      const judged = judgeStream(ordered(run.timeline, u.gatewayId), u.purgeSeconds, defaultLossThresholdV(u.systemVoltage));
      const truth = run.truth.keyOffs.filter((k) => k.unitId === u.unitId);
      expect(judged.map((j) => j.keyOffAt)).toEqual(truth.map((k) => k.keyOffAt));
      judged.forEach((j, i) => {
        expect(j.outcome, `${u.unitId} ${j.keyOffAt}`).toBe(truth[i].expectedOutcome);
        if (j.outcome === 'interrupted') expect(j.secondsIntoPurge).toBeCloseTo(truth[i].secondsIntoPurge!, 3);
      });
    }
  });

  it('interrupted means the isolator opened before the purge time; completed isolations came after it', () => {
    for (const k of [...weekend.truth.keyOffs, ...weekday.truth.keyOffs]) {
      if (k.outcome === 'interrupted') {
        expect(k.isolator.opened).toBe(true);
        expect(k.secondsIntoPurge).toBe(k.isolator.secondsAfterKeyOff);
        expect(k.secondsIntoPurge!).toBeLessThan(k.purgeSeconds);
      }
      if (k.outcome === 'completed' && k.isolator.opened) expect(k.isolator.secondsAfterKeyOff!).toBeGreaterThanOrEqual(k.purgeSeconds);
      if (k.outcome === 'resumed') expect(k.isolator.opened).toBe(false);
    }
  });

  it('has every kind of outcome and habit in a weekend of 30 trucks', () => {
    const outcomes = new Set(weekend.truth.keyOffs.map((k) => k.outcome));
    expect([...outcomes].sort()).toEqual(['completed', 'interrupted', 'resumed']);
    const how = new Set(weekend.truth.keyOffs.map((k) => k.isolator.how));
    expect(how.has('hasty') && how.has('afterSafe') && how.has('none')).toBe(true);
  });

  it('more drivers isolate at the end of a Friday shift than at the end of a Tuesday shift', () => {
    const lastOfDay = (keyOffs: typeof weekend.truth.keyOffs, day: string) => {
      const last = new Map<string, (typeof keyOffs)[number]>();
      for (const k of keyOffs) if (k.trueKeyOffAt.startsWith(day)) last.set(k.unitId, k);
      const list = [...last.values()];
      return list.filter((k) => k.isolator.opened).length / list.length;
    };
    expect(lastOfDay(weekend.truth.keyOffs, '2026-11-27')).toBeGreaterThan(lastOfDay(weekday.truth.keyOffs, '2026-11-24') + 0.15);
  });

  it('stores messages through coverage gaps and uploads them later, oldest first', () => {
    expect(gaps.truth.coverageGaps.length).toBeGreaterThan(5);
    let late = 0;
    for (const u of gaps.truth.fleet) {
      const sent = gaps.timeline.filter((e) => e.gatewayId === u.gatewayId && e.kind === 'publish' && !e.duplicate && !e.topic.endsWith('/status'));
      const keys = sent.map((e) => (e.kind === 'publish' ? [e.payload.boot as number, e.payload.seq as number] : [0, 0]));
      for (let i = 1; i < keys.length; i++) expect(keys[i][0] * 1e9 + keys[i][1]).toBeGreaterThan(keys[i - 1][0] * 1e9 + keys[i - 1][1]);
      for (const e of sent) if (e.kind === 'publish' && e.sendAt - Date.parse(e.payload.ts as string) > 10 * 60_000) late++;
    }
    expect(late).toBeGreaterThan(100);
  });

  it('a cold snap keeps the air below the DEF freezing point of -11 °C (ISO 22241-1)', () => {
    const temps = cold.timeline.flatMap((e) => (e.kind === 'publish' && typeof e.payload.ambientC === 'number' ? [e.payload.ambientC] : []));
    expect(temps.length).toBeGreaterThan(1000);
    expect(Math.max(...temps)).toBeLessThan(DEF_FREEZE_POINT_C);
  });
});
