import { describe, expect, it } from 'vitest';
import { adviseFrom, estimateDrain, leastSquares, REST_HOURS, WEEKEND_HOURS } from '../../shared/battery/drain';
import { parkedPeriods, type SupplySample } from '../../shared/battery/parked-periods';

const H = 3_600_000;
const t0 = Date.UTC(2026, 10, 27, 17, 0, 0);

describe('least squares', () => {
  it('recovers an exact line (worked example: y = 3 − 2x through (0,3), (1,1), (2,−1))', () => {
    expect(leastSquares([{ x: 0, y: 3 }, { x: 1, y: 1 }, { x: 2, y: -1 }])).toEqual({ slope: -2, intercept: 3 });
  });
  it('fits (1,1), (2,2), (3,2) with slope 0.5 and intercept 2/3 (worked by hand from the normal equations)', () => {
    const fit = leastSquares([{ x: 1, y: 1 }, { x: 2, y: 2 }, { x: 3, y: 2 }])!;
    expect(fit.slope).toBeCloseTo(0.5, 12);
    expect(fit.intercept).toBeCloseTo(2 / 3, 12);
  });
  it('has no answer when every x is the same', () => {
    expect(leastSquares([{ x: 1, y: 1 }, { x: 1, y: 2 }])).toBeNull();
  });
});

describe('drain estimate of one park', () => {
  // Voltages chosen on the BCI open-circuit voltage table at 26.7 °C, as given in the issue:
  // 12.65 V = 100 % at hour 4, 12.45 V = 75 % at hour 12, 12.24 V = 50 % at hour 20 → −3.125 %/h.
  const readings = [
    { ts: t0 + 1 * H, volts: 12.9 }, // surface charge, inside the rest time: ignored
    { ts: t0 + 3.5 * H, volts: 12.8 },
    { ts: t0 + 4 * H, volts: 12.65 },
    { ts: t0 + 12 * H, volts: 12.45 },
    { ts: t0 + 20 * H, volts: 12.24 },
  ];
  it(`ignores readings in the first ${REST_HOURS} h and fits −3.125 %/h through 100 / 75 / 50 % (BCI table at 26.7 °C, as given in the issue)`, () => {
    const e = estimateDrain(t0, readings, 12)!;
    expect(e.restedReadings).toBe(3);
    expect(e.slopePctPerHour).toBeCloseTo(-3.125, 9);
    expect(e.drainPctPerHour).toBeCloseTo(3.125, 9);
    // 100 % at hour 4 → intercept 112.5 % (clamped to 100 for display); at hour 62: 112.5 − 3.125 × 62 < 0 → 0 %.
    expect(e.socAtStart).toBe(100);
    expect(e.interceptPct).toBeCloseTo(112.5, 9);
    expect(e.projectedSocAfterWeekend).toBe(0);
  });

  it('a slow drain of 12 V from 12.65 V to 12.60 V over 20 h projects well above half charge after 62 h (BCI table at 26.7 °C, as given in the issue)', () => {
    const slow = [4, 8, 12, 16, 20, 24].map((h) => ({ ts: t0 + h * H, volts: 12.65 - ((h - 4) / 20) * 0.05 }));
    const e = estimateDrain(t0, slow, 12)!;
    // 0.05 V in the top segment is 25 × 0.05 / 0.20 = 6.25 % over 20 h = 0.3125 %/h.
    expect(e.drainPctPerHour).toBeCloseTo(0.3125, 9);
    expect(e.projectedSocAfterWeekend).toBeCloseTo(100 + 0.3125 * 4 - 0.3125 * WEEKEND_HOURS, 9);
    expect(adviseFrom([e]).advice).toBe('safeOverWeekend');
  });

  it('24 V readings doubled give the same drain as 12 V (BCI table at 26.7 °C doubled for 24 V, as given in the issue)', () => {
    const e12 = estimateDrain(t0, readings, 12)!;
    const e24 = estimateDrain(t0, readings.map((r) => ({ ...r, volts: r.volts * 2 })), 24)!;
    expect(e24.slopePctPerHour).toBeCloseTo(e12.slopePctPerHour, 9);
  });

  it('gives no estimate with fewer than 3 rested readings or under 2 h of rested span', () => {
    expect(estimateDrain(t0, readings.slice(0, 4), 12)).toBeNull();
    expect(estimateDrain(t0, [4, 4.5, 5].map((h) => ({ ts: t0 + h * H, volts: 12.5 })), 12)).toBeNull();
  });

  it('a battery that holds its voltage has no drain and stays where it is', () => {
    const e = estimateDrain(t0, [5, 9, 13].map((h) => ({ ts: t0 + h * H, volts: 12.45 })), 12)!;
    expect(e.drainPctPerHour).toBe(0);
    expect(e.projectedSocAfterWeekend).toBeCloseTo(75, 9);
  });
});

describe('advice', () => {
  const est = (p: number) => ({ restedReadings: 5, socAtStart: 100, interceptPct: 100, slopePctPerHour: -1, drainPctPerHour: 1, projectedSocAfterWeekend: p });
  it('the worst recent park decides; under 50 % after the weekend means the drain is too high', () => {
    expect(adviseFrom([est(80), est(49.9)])).toEqual({ advice: 'drainTooHigh', worstProjectedSoc: 49.9 });
    expect(adviseFrom([est(80), est(50)])).toEqual({ advice: 'safeOverWeekend', worstProjectedSoc: 50 });
    expect(adviseFrom([null, null])).toEqual({ advice: 'notEnoughData', worstProjectedSoc: null });
  });
});

describe('parked periods', () => {
  const tel = (h: number, key: 'on' | 'off', v: number): SupplySample => ({ ts: t0 + h * H, kind: 'telemetry', key, supplyV: v });
  it('a park runs from the key-off after a key-on until the next key-on; supply lost or a long gap ends it', () => {
    const periods = parkedPeriods(
      [tel(-1, 'on', 13.9), tel(0, 'off', 12.8), tel(1.5, 'off', 12.6), tel(2, 'on', 13.8), tel(7, 'off', 12.7), tel(8, 'off', 12.6),
        { ts: t0 + 9 * H, kind: 'power', event: 'supply-lost' }, tel(10, 'off', 12.5), tel(11, 'on', 14), tel(12, 'off', 12.7), tel(16, 'off', 12.6)],
      6,
    );
    expect(periods.map((p) => [p.chargeStoppedAt, p.readings.length, p.endedBy])).toEqual([
      [t0, 2, 'keyOn'],
      [t0 + 7 * H, 2, 'supplyLost'],
      [t0 + 12 * H, 1, 'gap'],
    ]);
  });
  it('a park whose key-off was not seen is left out: the time charging stopped is unknown', () => {
    expect(parkedPeriods([tel(0, 'off', 12.6), tel(1, 'off', 12.6)], 6)).toEqual([]);
  });
  it('a reading under the loss threshold means the isolator was opened', () => {
    const p = parkedPeriods([tel(0, 'on', 27.8), tel(1, 'off', 25.2), tel(2, 'off', 3.1), tel(3, 'off', 25.1)], 12);
    expect(p).toHaveLength(1);
    expect(p[0]).toMatchObject({ endedBy: 'supplyLost', lastAt: t0 + H });
  });
});
