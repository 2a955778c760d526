import { describe, expect, it } from 'vitest';
import { decodeDm1, encodeDm1, type Dm1 } from '../../../shared/j1939/dm1';
import { bytesToHex } from '../../../shared/j1939/hex';

function dm1(hex: string): Dm1 {
  const r = decodeDm1(hex);
  if (!r.ok) throw new Error(`refused: ${r.reason}`);
  return r.value;
}

describe('DM1 lamps and flash', () => {
  it('reads each 2-bit lamp field at its place in byte 1', () => {
    // SAE J1939-73 (DM1, from memory §5.7.1): byte 1 bits 8-7 MIL, 6-5 red stop, 4-3 amber warning, 2-1 protect;
    // 00 off, 01 on, 10 reserved, 11 not available. 0x4E = 01 00 11 10.
    expect(dm1('4EFF00000000FFFF').lamps).toEqual({ mil: 'on', redStop: 'off', amberWarning: 'notAvailable', protect: 'reserved' });
    // 0x10 = 00 01 00 00: red stop only.
    expect(dm1('10FF00000000FFFF').lamps).toEqual({ mil: 'off', redStop: 'on', amberWarning: 'off', protect: 'off' });
  });

  it('reads the flash states of byte 2 with the same layout', () => {
    // SAE J1939-73: byte 2 flash fields, 00 slow flash, 01 fast flash, 10 reserved, 11 unavailable / do not flash.
    // 0x1B = 00 01 10 11.
    expect(dm1('001B00000000FFFF').flash).toEqual({ mil: 'slow', redStop: 'fast', amberWarning: 'reserved', protect: 'notAvailable' });
    expect(dm1('00FF00000000FFFF').flash).toEqual({ mil: 'notAvailable', redStop: 'notAvailable', amberWarning: 'notAvailable', protect: 'notAvailable' });
  });
});

describe('DM1 trouble codes', () => {
  it('reads the example frame of the gateway protocol', () => {
    // Gateway protocol v1 example; SAE J1939-73 DTC layout. 04: amber on; 64 00 01 01: SPN 100, FMI 1, count 1.
    const d = dm1('0400640001010000');
    expect(d.lamps.amberWarning).toBe('on');
    expect(d.dtcs).toEqual([{ spn: 100, fmi: 1, conversionMethod: 0, occurrenceCount: 1, flagged: false, raw: '64000101' }]);
    expect(d.trailing).toBe('0000');
  });

  it('assembles the 19-bit SPN from bytes 3, 4 and the top 3 bits of byte 5', () => {
    // SAE J1939-73 (CM=0 layout): SPN 0x7ABCD, FMI 21, count 42, hand-encoded: CD AB (111 10101) (0 0101010) = CD AB F5 2A.
    expect(dm1('00FFCDABF52AFFFF').dtcs[0]).toMatchObject({ spn: 0x7abcd, fmi: 21, conversionMethod: 0, occurrenceCount: 42 });
    // SPN 0x10000 sits only in byte 5 bit 6; FMI 31, count 127 (not available).
    expect(dm1('00FF00003F7FFFFF').dtcs[0]).toMatchObject({ spn: 0x10000, fmi: 31, occurrenceCount: 127 });
  });

  it('reads several DTCs in order, 4 bytes each', () => {
    // SAE J1939-73: DTCs follow each other after the 2 lamp bytes (sent by BAM when more than one).
    const d = dm1('4400' + '01000304' + 'FEFF1F05' + 'A5A5A006');
    expect(d.dtcs.map(({ spn, fmi, occurrenceCount }) => [spn, fmi, occurrenceCount])).toEqual([
      [1, 3, 4],
      [0xfffe, 31, 5],
      [0x5a5a5, 0, 6],
    ]);
  });

  it('flags a DTC sent with conversion method 1 instead of trusting its SPN', () => {
    // SAE J1939-73: byte 6 bit 8 is the SPN conversion method; 1 means an older SPN byte order.
    const [dtc] = dm1('00FF0100038500000000').dtcs;
    expect(dtc).toMatchObject({ conversionMethod: 1, flagged: true, occurrenceCount: 5 });
    expect(dtc.flagReason).toMatch(/conversion method 1/);
  });

  it('gives no DTC for the "no active DTC" encodings', () => {
    // SAE J1939-73: with no active DTC, SPN 0, FMI 0, CM 0, count 0; gateway protocol rule 9 also drops SPN 524287.
    expect(dm1('00FF00000000FFFF').dtcs).toEqual([]);
    expect(dm1('00FFFFFFFFFFFFFF').dtcs).toEqual([]);
    expect(dm1('00FFFFFFE301FFFF').dtcs).toEqual([]); // SPN 524287 with FMI 3
    expect(dm1('00FF00000005FFFF').dtcs).toEqual([]); // SPN 0 FMI 0, whatever the count
    expect(dm1('00FF00000100FFFF').dtcs).toHaveLength(1); // SPN 0 FMI 1 is a real code
  });

  it('ignores 0xFF padding, whole or partial', () => {
    // SAE J1939-21: unused data bytes are sent as 0xFF.
    expect(dm1('0000' + '01000301' + 'FFFFFFFF').dtcs).toHaveLength(1);
    expect(dm1('0000' + '01000301' + 'FFFF').dtcs).toHaveLength(1);
    expect(dm1('0000' + '01000301' + 'FF').trailing).toBe('FF');
    expect(dm1('0000').dtcs).toEqual([]);
  });

  it('refuses payloads that cannot be a DM1', () => {
    expect(decodeDm1('04').ok).toBe(false);
    expect(decodeDm1('').ok).toBe(false);
    expect(decodeDm1('04F').ok).toBe(false);
    expect(decodeDm1('04XX').ok).toBe(false);
    expect(decodeDm1(new Uint8Array(1786)).ok).toBe(false);
  });
});

describe('encoding a DM1', () => {
  const off = { mil: 'off', redStop: 'off', amberWarning: 'off', protect: 'off' } as const;

  it('writes the "no active DTC" entry in a padded single frame when nothing is active', () => {
    // SAE J1939-73: no active DTC is SPN 0, FMI 0, CM 0, count 0; unused bytes 0xFF (SAE J1939-21).
    expect(bytesToHex(encodeDm1({ lamps: off, dtcs: [] }))).toBe('00FF00000000FFFF');
  });

  it('writes one DTC as 8 bytes and several as 2 + 4n bytes', () => {
    const lamps = { ...off, amberWarning: 'on' } as const;
    expect(bytesToHex(encodeDm1({ lamps, dtcs: [{ spn: 0x7abcd, fmi: 21, occurrenceCount: 42 }] }))).toBe('04FFCDABF52AFFFF');
    const many = encodeDm1({ lamps, dtcs: [{ spn: 1, fmi: 3 }, { spn: 2, fmi: 4 }, { spn: 3, fmi: 5, conversionMethod: 1 }] });
    expect(many).toHaveLength(14);
    expect(dm1(bytesToHex(many)).dtcs.map((d) => [d.spn, d.fmi, d.conversionMethod])).toEqual([[1, 3, 0], [2, 4, 0], [3, 5, 1]]);
  });

  it('round-trips lamps, flash and DTCs through the decoder', () => {
    const input = {
      lamps: { mil: 'on', redStop: 'notAvailable', amberWarning: 'reserved', protect: 'off' } as const,
      flash: { mil: 'fast', redStop: 'slow', amberWarning: 'notAvailable', protect: 'reserved' } as const,
      dtcs: [{ spn: 524286, fmi: 31, occurrenceCount: 127, conversionMethod: 0 as const }],
    };
    const d = dm1(bytesToHex(encodeDm1(input)));
    expect(d.lamps).toEqual(input.lamps);
    expect(d.flash).toEqual(input.flash);
    expect(d.dtcs[0]).toMatchObject(input.dtcs[0]);
  });

  it('refuses fields out of range', () => {
    expect(() => encodeDm1({ lamps: off, dtcs: [{ spn: 524288, fmi: 0 }] })).toThrow(/spn/);
    expect(() => encodeDm1({ lamps: off, dtcs: [{ spn: 1, fmi: 32 }] })).toThrow(/fmi/);
    expect(() => encodeDm1({ lamps: off, dtcs: [{ spn: 1, fmi: 1, occurrenceCount: 128 }] })).toThrow(/occurrenceCount/);
    expect(() => encodeDm1({ lamps: { ...off, mil: 'blinking' as 'on' }, dtcs: [] })).toThrow(/mil/);
    expect(() => encodeDm1({ lamps: off, dtcs: Array.from({ length: 446 }, () => ({ spn: 1, fmi: 1 })) })).toThrow(/445/);
  });
});
