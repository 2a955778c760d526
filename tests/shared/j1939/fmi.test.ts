import { describe, expect, it } from 'vitest';
import { describeFmi, FMI_DESCRIPTIONS, isReservedFmi } from '../../../shared/j1939/fmi';

describe('FMI descriptions', () => {
  it('describes every FMI 0..31 and nothing else', () => {
    // SAE J1939-73: the FMI field is 5 bits.
    expect(FMI_DESCRIPTIONS.map((f) => f.fmi)).toEqual(Array.from({ length: 32 }, (_, i) => i));
    for (const { fmi, description } of FMI_DESCRIPTIONS) expect(describeFmi(fmi)).toBe(description);
    for (const bad of [-1, 32, 2.5, Number.NaN]) expect(() => describeFmi(bad)).toThrow(RangeError);
  });

  it('gives the well-known electrical and range meanings', () => {
    // SAE J1939-73 FMI table (from memory): 3 voltage high / short to high, 4 voltage low / short to low,
    // 5 current low / open, 6 current high / grounded, 0 and 1 above and below range (most severe), 31 condition exists.
    expect(describeFmi(3)).toMatch(/voltage above normal/i);
    expect(describeFmi(4)).toMatch(/voltage below normal/i);
    expect(describeFmi(5)).toMatch(/open circuit/i);
    expect(describeFmi(6)).toMatch(/grounded/i);
    expect(describeFmi(0)).toMatch(/above.*most severe/i);
    expect(describeFmi(1)).toMatch(/below.*most severe/i);
    expect(describeFmi(31)).toMatch(/condition exists/i);
  });

  it('marks 22..30 as reserved', () => {
    // SAE J1939-73 (from memory): FMIs 22 to 30 are reserved for assignment.
    expect(FMI_DESCRIPTIONS.filter((f) => isReservedFmi(f.fmi)).map((f) => f.fmi)).toEqual([22, 23, 24, 25, 26, 27, 28, 29, 30]);
    expect(describeFmi(25)).toMatch(/reserved/i);
  });
});
