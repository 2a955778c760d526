import { encodeCanId as canboatEncode, parseCanId, parseCanIdStr } from '@canboat/canboatjs/dist/canId.js';
import { describe, expect, it } from 'vitest';
import { decodeCanId, encodeCanId, encodeCanIdNumber, formatCanId } from '../../../shared/j1939/can-id';
import { randomInt, seededRandom } from './prng';

function decoded(id: string | number) {
  const r = decodeCanId(id);
  if (!r.ok) throw new Error(`refused: ${r.reason}`);
  return r.value;
}

describe('decoding a 29-bit J1939 identifier', () => {
  it('reads a PDU2 broadcast (DM1 from address 0) with the group extension inside the PGN', () => {
    // SAE J1939-21 identifier layout; SAE J1939-73: DM1 is PGN 65226 (0xFECA), default priority 6.
    expect(decoded('18FECA00')).toMatchObject({
      priority: 6, edp: 0, dp: 0, pf: 0xfe, ps: 0xca, pdu: 2, pgn: 65226, destination: 255, sourceAddress: 0,
    });
  });

  it('reads a PDU1 request with PS as the destination, outside the PGN', () => {
    // SAE J1939-21: Request is PGN 59904 (0xEA00), PDU1; here to address 0x00 from 0xF9.
    expect(decoded('18EA00F9')).toMatchObject({ pdu: 1, pf: 0xea, ps: 0x00, pgn: 59904, destination: 0, sourceAddress: 0xf9 });
    expect(decoded('18EA17F9')).toMatchObject({ pgn: 59904, destination: 0x17 });
  });

  it('places the PDU1/PDU2 boundary at PF 240', () => {
    // SAE J1939-21: PF 0..239 is PDU1, 240..255 is PDU2.
    expect(decoded('18EF1200')).toMatchObject({ pdu: 1, pgn: 0xef00, destination: 0x12 });
    expect(decoded('18F01200')).toMatchObject({ pdu: 2, pgn: 0xf012, destination: 255 });
  });

  it('reads the transport-protocol identifiers a BAM uses', () => {
    // SAE J1939-21: TP.CM PGN 60416 (0xEC00), TP.DT PGN 60160 (0xEB00), priority 7, to global.
    expect(decoded('1CECFF00')).toMatchObject({ priority: 7, pgn: 60416, destination: 255, sourceAddress: 0 });
    expect(decoded('1CEBFF3D')).toMatchObject({ priority: 7, pgn: 60160, destination: 255, sourceAddress: 0x3d });
  });

  it('reads the data page and extended data page into the 18-bit PGN', () => {
    // SAE J1939-21: PGN = EDP (bit 17), DP (bit 16), PF, PS (PDU2 only).
    expect(decoded('19FECA00')).toMatchObject({ dp: 1, edp: 0, pgn: 0x1feca });
    expect(decoded('1AFECA00')).toMatchObject({ dp: 0, edp: 1, pgn: 0x2feca });
    expect(decoded(0x0cf00401)).toMatchObject({ priority: 3, pgn: 61444, sourceAddress: 1 });
  });

  it('refuses EDP=1 with DP=1 as ISO 15765-3, not J1939', () => {
    // SAE J1939-21: EDP=1, DP=1 is defined by ISO 15765-3.
    const r = decodeCanId('1BFECA00');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/ISO 15765-3/);
    expect(decodeCanId(0x03000000).ok).toBe(false);
  });

  it('refuses identifiers that are not 8 hex digits or do not fit in 29 bits', () => {
    for (const bad of ['18FECA0', '18FECA000', '18FECAZZ', '', '20000000', 'FFFFFFFF']) {
      expect(decodeCanId(bad).ok, bad).toBe(false);
    }
    for (const bad of [-1, 1.5, Number.NaN, 0x20000000]) expect(decodeCanId(bad).ok, String(bad)).toBe(false);
    expect(decodeCanId(null as unknown as string).ok).toBe(false);
  });
});

describe('encoding a J1939 identifier', () => {
  it('writes 8 upper-case hex digits and round-trips through the decoder', () => {
    // SAE J1939-21 layout: priority 6, PGN 65226, SA 0 is 18FECA00.
    expect(encodeCanId({ priority: 6, pgn: 65226, sourceAddress: 0 })).toBe('18FECA00');
    expect(encodeCanId({ priority: 7, pgn: 60416, destination: 255, sourceAddress: 0x0b })).toBe('1CECFF0B');
    expect(encodeCanId({ priority: 6, pgn: 59904, destination: 0x17, sourceAddress: 0xf9 })).toBe('18EA17F9');
    expect(formatCanId(0x1fffffff - 0x01000000)).toBe('1EFFFFFF');
  });

  it('refuses fields that cannot make a J1939 identifier', () => {
    expect(() => encodeCanId({ priority: 8, pgn: 65226, sourceAddress: 0 })).toThrow(RangeError);
    expect(() => encodeCanId({ priority: 6, pgn: 0x40000, sourceAddress: 0 })).toThrow(/pgn/);
    expect(() => encodeCanId({ priority: 6, pgn: 0x30000, sourceAddress: 0 })).toThrow(/ISO 15765-3/);
    expect(() => encodeCanId({ priority: 6, pgn: 0xea05, destination: 1, sourceAddress: 0 })).toThrow(/low byte/);
    expect(() => encodeCanId({ priority: 6, pgn: 0xea00, sourceAddress: 0 })).toThrow(/destination/);
    expect(() => encodeCanId({ priority: 6, pgn: 65226, destination: 3, sourceAddress: 0 })).toThrow(/global/);
    expect(() => encodeCanId({ priority: 6, pgn: 65226, sourceAddress: 256 })).toThrow(/sourceAddress/);
  });
});

describe('second opinion: @canboat/canboatjs identifier parsing', () => {
  // canboatjs follows ISO 11783 / NMEA 2000, where bit 25 (EDP) is always 0, so the generated ids keep EDP=0.
  const rand = seededRandom(1939);
  const ids = Array.from({ length: 4000 }, () => randomInt(rand, 0x1fffffff) & ~0x02000000);

  it('agrees on priority, PGN, source and destination over 4000 generated identifiers', () => {
    for (const raw of ids) {
      const ours = decoded(raw);
      const theirs = parseCanId(raw);
      expect({ p: ours.priority, pgn: ours.pgn, sa: ours.sourceAddress, da: ours.destination }, formatCanId(raw)).toEqual({
        p: theirs.prio, pgn: theirs.pgn, sa: theirs.src, da: theirs.dst,
      });
      const fromText = parseCanIdStr(formatCanId(raw));
      expect(decoded(formatCanId(raw)).pgn).toBe(fromText.pgn);
    }
  });

  it('encodes the same identifier from the same fields', () => {
    for (const raw of ids.slice(0, 2000)) {
      const { priority, pgn, destination, sourceAddress } = decoded(raw);
      const ours = encodeCanIdNumber({ priority, pgn, destination, sourceAddress });
      expect(ours).toBe(raw);
      expect(ours).toBe(canboatEncode({ prio: priority, pgn, dst: destination, src: sourceAddress }) >>> 0);
    }
  });
});
