import { describe, expect, it } from 'vitest';
import { ocvTable, stateOfCharge } from '../../shared/battery/state-of-charge';

// Source of every point: BCI open-circuit voltage table at 26.7 °C, as given in the issue
// (12.65 / 12.45 / 12.24 / 12.06 / 11.89 V for 100 / 75 / 50 / 25 / 0 %; doubled for 24 V).
const BCI_POINTS: [number, number][] = [
  [12.65, 100],
  [12.45, 75],
  [12.24, 50],
  [12.06, 25],
  [11.89, 0],
];

describe('state of charge from the open-circuit voltage', () => {
  for (const [volts, soc] of BCI_POINTS) {
    it(`a rested 12 V battery at ${volts} V is ${soc} % charged (BCI open-circuit voltage table at 26.7 °C, as given in the issue)`, () => {
      expect(stateOfCharge(volts, 12)).toBeCloseTo(soc, 9);
    });
    it(`a rested 24 V system at ${(volts * 2).toFixed(2)} V is ${soc} % charged (BCI table at 26.7 °C doubled for 24 V, as given in the issue)`, () => {
      expect(stateOfCharge(volts * 2, 24)).toBeCloseTo(soc, 9);
    });
  }

  it('is linear between neighbouring points: midpoints give the mean percentage (BCI table at 26.7 °C, as given in the issue)', () => {
    for (let i = 1; i < BCI_POINTS.length; i++) {
      const [vHi, sHi] = BCI_POINTS[i - 1];
      const [vLo, sLo] = BCI_POINTS[i];
      expect(stateOfCharge((vHi + vLo) / 2, 12)).toBeCloseTo((sHi + sLo) / 2, 9);
      expect(stateOfCharge(vHi + vLo, 24)).toBeCloseTo((sHi + sLo) / 2, 9);
      // a quarter of the way up from the lower point
      expect(stateOfCharge(vLo + (vHi - vLo) / 4, 12)).toBeCloseTo(sLo + (sHi - sLo) / 4, 9);
    }
  });

  it('12.35 V lies between 12.24 V (50 %) and 12.45 V (75 %): 50 + 25 × 0.11 / 0.21 % (BCI table at 26.7 °C, as given in the issue)', () => {
    expect(stateOfCharge(12.35, 12)).toBeCloseTo(50 + (25 * 0.11) / 0.21, 9);
  });

  it('clamps above 100 % and below 0 % (BCI table at 26.7 °C, as given in the issue: 12.65 V full, 11.89 V empty)', () => {
    expect(stateOfCharge(13.8, 12)).toBe(100);
    expect(stateOfCharge(12.7, 12)).toBe(100);
    expect(stateOfCharge(11.5, 12)).toBe(0);
    expect(stateOfCharge(0, 12)).toBe(0);
    expect(stateOfCharge(25.4, 24)).toBe(100);
    expect(stateOfCharge(23.7, 24)).toBe(0);
  });

  it('rises monotonically with voltage across the whole range', () => {
    let prev = -1;
    for (let mv = 11_800; mv <= 12_700; mv += 5) {
      const soc = stateOfCharge(mv / 1000, 12);
      expect(soc).toBeGreaterThanOrEqual(prev);
      prev = soc;
    }
  });

  it('reads a 24 V system as two 12 V batteries in series: 24 V at 2 × v equals 12 V at v', () => {
    for (let mv = 11_850; mv <= 12_700; mv += 10) expect(stateOfCharge((2 * mv) / 1000, 24)).toBeCloseTo(stateOfCharge(mv / 1000, 12), 9);
    expect(ocvTable(24).map((p) => p.volts)).toEqual([23.78, 24.12, 24.48, 24.9, 25.3]);
  });

  it('refuses a reading that is not a number and a system voltage other than 12 or 24', () => {
    expect(() => stateOfCharge(Number.NaN, 12)).toThrow(/finite/);
    expect(() => stateOfCharge(12.4, 48 as 12)).toThrow(/12 or 24/);
  });
});
