import { describe, expect, it } from 'vitest';
import { bytesToHex, hexToBytes } from '../../../shared/j1939/hex';

describe('hex data of CAN frames', () => {
  it('reads either case and writes upper case, 2 digits a byte (gateway protocol v1, frames[].data)', () => {
    const r = hexToBytes('00ff7Fa5');
    expect(r.ok && Array.from(r.value)).toEqual([0x00, 0xff, 0x7f, 0xa5]);
    expect(bytesToHex([0, 255, 0x7f, 0xa5])).toBe('00FF7FA5');
    expect(hexToBytes('').ok).toBe(true);
  });

  it('refuses odd lengths, non-hex digits and bytes out of range', () => {
    expect(hexToBytes('0').ok).toBe(false);
    expect(hexToBytes('0G').ok).toBe(false);
    expect(hexToBytes(' 00').ok).toBe(false);
    expect(hexToBytes(undefined as unknown as string).ok).toBe(false);
    expect(() => bytesToHex([256])).toThrow(RangeError);
    expect(() => bytesToHex([1.5])).toThrow(RangeError);
  });
});
