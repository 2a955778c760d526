// The relay coil judgement against its bands: 30–130 Ω on 12 V systems and 200–400 Ω on 24 V systems
// between terminals 85 and 86 (common practice, no published source).
import { describe, expect, it } from 'vitest';
import { COIL_BAND_SOURCE, judgeCoilResistance } from '../../shared/checks/coil-resistance';
import { sniffImageType } from '../../shared/checks/image-type';

describe('relay coil resistance (common practice, no published source)', () => {
  const table: [number, 12 | 24, 'low' | 'pass' | 'high'][] = [
    [0, 12, 'low'], [29.9, 12, 'low'], [30, 12, 'pass'], [85, 12, 'pass'], [130, 12, 'pass'], [130.1, 12, 'high'], [1_000_000, 12, 'high'],
    [199.9, 24, 'low'], [200, 24, 'pass'], [320, 24, 'pass'], [400, 24, 'pass'], [401, 24, 'high'], [85, 24, 'low'],
  ];
  for (const [ohms, volts, verdict] of table) {
    it(`${ohms} Ω on a ${volts} V system is ${verdict}`, () => {
      expect(judgeCoilResistance(ohms, volts).verdict).toBe(verdict);
    });
  }
  it('names the band it judged against and where it comes from', () => {
    expect(judgeCoilResistance(100, 12)).toMatchObject({ minOhms: 30, maxOhms: 130, systemVoltage: 12 });
    expect(judgeCoilResistance(300, 24)).toMatchObject({ minOhms: 200, maxOhms: 400, systemVoltage: 24 });
    expect(COIL_BAND_SOURCE).toBe('common practice, no published source');
  });
  it('refuses a reading that is not a resistance', () => {
    for (const bad of [-1, Number.NaN, Number.POSITIVE_INFINITY, 2_000_000]) expect(() => judgeCoilResistance(bad, 12)).toThrow(RangeError);
    expect(() => judgeCoilResistance(100, 48 as 12)).toThrow(RangeError);
  });
});

describe('image type by its first bytes', () => {
  it('knows JPEG by its SOI marker FF D8 FF (ISO/IEC 10918-1)', () => {
    expect(sniffImageType(Uint8Array.from([0xff, 0xd8, 0xff, 0xe0, 0, 0x10]))).toBe('image/jpeg');
  });
  it('knows PNG by its 8-byte signature (ISO/IEC 15948)', () => {
    expect(sniffImageType(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe('image/png');
  });
  it('knows WebP by RIFF….WEBP (WebP container specification)', () => {
    expect(sniffImageType(Buffer.from('RIFF\x10\x00\x00\x00WEBPVP8 ', 'latin1'))).toBe('image/webp');
  });
  it('refuses text, a GIF and a truncated PNG signature', () => {
    expect(sniffImageType(Buffer.from('hello.png'))).toBeNull();
    expect(sniffImageType(Buffer.from('GIF89a'))).toBeNull();
    expect(sniffImageType(Uint8Array.from([0x89, 0x50, 0x4e, 0x47]))).toBeNull();
  });
});
