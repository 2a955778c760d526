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
  // 12.65 V = 100 % at hour 4, 12.45 V = 75 % at hour 12, 12.24 V = 50 % at hour 20.
  const readings = [
    { ts: t0 + 1 * H, volts: 12.9 }, // surface charge, inside the rest time: ignored
    { ts: t0 + 3.5 * H, volts: 12.8 },
    { ts: t0 + 4 * H, volts: 12.65 },
    { ts: t0 + 12 * H, volts: 12.45 },
    { ts: t0 + 20 * H, volts: 12.24 },
  ];
  it(`ignores readings in the first ${REST_HOURS} h and reads the drain off the least-squares voltage line (BCI table at 26.7 °C, as given in the issue)`, () => {
    const e = estimateDrain(t0, readings, 12)!;
    expect(e.restedReadings).toBe(3);
    // Worked by hand: x̄ = 12 h, Sxx = 128, Sxy = −3.28 → slope −0.025625 V/h, line 12.754167 V at hour 0.
    expect(e.voltsPerHour).toBeCloseTo(-0.025625, 9);
    expect(e.interceptV).toBeCloseTo(37.34 / 3 + 0.025625 * 12, 9); // ȳ − slope × x̄
    // On the line: 12.651667 V at hour 4 (above 12.65 V: 100 %), 12.241667 V at hour 20 (50 + 25 × 0.001667 / 0.21 %).
    expect(e.socFirst).toBe(100);
    expect(e.socLast).toBeCloseTo(50 + (25 * (37.34 / 3 + 0.025625 * 12 - 0.025625 * 20 - 12.24)) / 0.21, 9);
    expect(e.drainPctPerHour).toBeCloseTo((100 - e.socLast) / 16, 9);
    // 12.754167 − 0.025625 × 62 = 11.165 V, under 11.89 V: empty.
    expect(e.projectedSocAfterWeekend).toBe(0);
  });

  it('a slow drain of 12 V from 12.65 V to 12.60 V over 20 h is 0.3125 %/h and leaves 81.875 % after 62 h (BCI table at 26.7 °C, as given in the issue)', () => {
    const slow = [4, 8, 12, 16, 20, 24].map((h) => ({ ts: t0 + h * H, volts: 12.65 - ((h - 4) / 20) * 0.05 }));
    const e = estimateDrain(t0, slow, 12)!;
    // 0.05 V in the top segment (12.45–12.65 V = 75–100 %) is 25 × 0.05 / 0.20 = 6.25 % over 20 h.
    expect(e.drainPctPerHour).toBeCloseTo(0.3125, 9);
    // At 62 h the line reads 12.66 − 0.0025 × 62 = 12.505 V: 75 + 25 × 0.055 / 0.20 = 81.875 %.
    expect(e.projectedSocAfterWeekend).toBeCloseTo(81.875, 9);
    expect(adviseFrom([e]).advice).toBe('safeOverWeekend');
  });

  it('a battery resting above 12.65 V (100 % on the table) still shows its drain in the projection (BCI table at 26.7 °C, as given in the issue)', () => {
    const high = [4, 6, 8, 10].map((h) => ({ ts: t0 + h * H, volts: 12.72 - 0.0065 * (h - 4) }));
    const e = estimateDrain(t0, high, 12)!;
    expect([e.socFirst, e.socLast, e.drainPctPerHour]).toEqual([100, 100, 0]);
    // 12.72 − 0.0065 × 58 = 12.343 V at 62 h: 50 + 25 × 0.103 / 0.21 %.
    expect(e.projectedSocAfterWeekend).toBeCloseTo(50 + (25 * 0.103) / 0.21, 6);
  });

  it('24 V readings doubled give the same state of charge figures as 12 V (BCI table at 26.7 °C doubled for 24 V, as given in the issue)', () => {
    const e12 = estimateDrain(t0, readings, 12)!;
    const e24 = estimateDrain(t0, readings.map((r) => ({ ...r, volts: r.volts * 2 })), 24)!;
    expect(e24.voltsPerHour).toBeCloseTo(2 * e12.voltsPerHour, 9);
    expect(e24.drainPctPerHour).toBeCloseTo(e12.drainPctPerHour, 9);
    expect(e24.projectedSocAfterWeekend).toBeCloseTo(e12.projectedSocAfterWeekend, 9);
  });

  it('gives no estimate with fewer than 3 rested readings or under 2 h of rested span', () => {
    expect(estimateDrain(t0, readings.slice(0, 4), 12)).toBeNull();
    expect(estimateDrain(t0, [4, 4.5, 5].map((h) => ({ ts: t0 + h * H, volts: 12.5 })), 12)).toBeNull();
  });

  it('a battery that holds 12.45 V has no drain and stays at 75 % (BCI table at 26.7 °C, as given in the issue)', () => {
    const e = estimateDrain(t0, [5, 9, 13].map((h) => ({ ts: t0 + h * H, volts: 12.45 })), 12)!;
    expect(e.drainPctPerHour).toBe(0);
    expect(e.projectedSocAfterWeekend).toBeCloseTo(75, 9);
  });
});

describe('advice', () => {
  const est = (p: number) => ({ restedReadings: 5, voltsPerHour: -0.01, interceptV: 12.7, socFirst: 100, socLast: 90, drainPctPerHour: 1, projectedSocAfterWeekend: p });
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
