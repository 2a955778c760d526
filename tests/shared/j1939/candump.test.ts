import { parseCanId } from '@canboat/canboatjs/dist/canId.js';
import { encodeCandump3, parseCandump3 } from '@canboat/canboatjs/dist/stringMsg.js';
import { describe, expect, it } from 'vitest';
import { decodeCanId, formatCanId } from '../../../shared/j1939/can-id';
import { formatCandumpLine, parseCandumpLine, parseCandumpLog, type CandumpFrame } from '../../../shared/j1939/candump';
import { bytesToHex } from '../../../shared/j1939/hex';
import { randomInt, seededRandom } from './prng';

function parsed(line: string): CandumpFrame {
  const r = parseCandumpLine(line);
  if (!r.ok) throw new Error(`refused: ${r.reason}`);
  return r.value;
}

describe('reading candump -L lines', () => {
  it('reads time, interface, identifier and data', () => {
    // can-utils candump -L log format (from memory): "(seconds.microseconds) iface ID#DATA".
    expect(parsed('(1700000000.123456) can0 18FECA00#0400640001010000')).toEqual({
      tUs: 1_700_000_000_123_456, t: 1_700_000_000_123.456, iface: 'can0', id: '18FECA00', data: '0400640001010000',
    });
  });

  it('keeps microseconds exactly and accepts lower case, empty data, a direction flag and CRLF', () => {
    expect(parsed('(0000000001.000001) vcan1 1cebff3d#01ff').tUs).toBe(1_000_001);
    expect(parsed('(1700000000.000000) can0 1CECFF00#')).toMatchObject({ data: '', id: '1CECFF00' });
    expect(parsed('(1700000000.500000) can0 18FECA00#00FF R\r')).toMatchObject({ direction: 'R', data: '00FF' });
  });

  it('refuses what is not a classic 29-bit frame, each with its reason', () => {
    const cases: [string, RegExp][] = [
      ['(1700000000.123456) can0 18FECA00##10400640001010000', /CAN FD/],
      ['(1700000000.123456) can0 123#0102', /11-bit/],
      ['(1700000000.123456) can0 18FECA00#R', /remote/],
      ['(1700000000.123456) can0 20000080#0000000000000000', /29th/],
      ['(1700000000.123) can0 18FECA00#00', /6 digits/],
      ['1700000000.123456 can0 18FECA00#00', /timestamp/],
      ['(1700000000.123456) can0 18FECA00 00', /#/],
      ['(1700000000.123456) can0 18FECA00#000102030405060708', /0 to 8 bytes/],
      ['(1700000000.123456) can0 18FECA00#0', /0 to 8 bytes/],
      ['(1700000000.123456) can0 18FECA#00', /3 nor 8/],
      ['(1700000000.123456) can0', /fields/],
      ['(1700000000.123456) can0 18FECA00#00 X', /trailing/],
    ];
    for (const [line, reason] of cases) {
      const r = parseCandumpLine(line);
      expect(r.ok, line).toBe(false);
      if (!r.ok) expect(r.reason, line).toMatch(reason);
    }
  });

  it('reads a whole log, numbering the lines it refuses', () => {
    const log = '(1700000000.000000) can0 18FECA00#00FF00000000FFFF\n\n(1700000000.100000) can0 7DF#0201\n';
    const r = parseCandumpLog(log);
    expect(r.frames).toHaveLength(1);
    expect(r.refused).toMatchObject([{ line: 3, text: '(1700000000.100000) can0 7DF#0201' }]);
  });
});

describe('writing candump -L lines', () => {
  it('writes zero-padded seconds and 6 digits of microseconds, and round-trips', () => {
    const frame = { t: 1_700_000_000_123.456, iface: 'can0', id: '18feca00', data: '04ff' };
    expect(formatCandumpLine(frame)).toBe('(1700000000.123456) can0 18FECA00#04FF');
    expect(formatCandumpLine({ tUs: 42, iface: 'can1', id: '1CECFF00', data: '' })).toBe('(0000000000.000042) can1 1CECFF00#');
    expect(parsed(formatCandumpLine(frame))).toMatchObject({ tUs: 1_700_000_000_123_456, id: '18FECA00', data: '04FF' });
  });

  it('refuses fields that cannot be written', () => {
    expect(() => formatCandumpLine({ t: -1, iface: 'can0', id: '18FECA00', data: '' })).toThrow(/time/);
    expect(() => formatCandumpLine({ iface: 'can0', id: '18FECA00', data: '' })).toThrow(/time/);
    expect(() => formatCandumpLine({ t: 0, iface: 'can 0', id: '18FECA00', data: '' })).toThrow(/interface/);
    expect(() => formatCandumpLine({ t: 0, iface: 'can0', id: '7DF', data: '' })).toThrow(/identifier/);
    expect(() => formatCandumpLine({ t: 0, iface: 'can0', id: '18FECA00', data: '0' })).toThrow(/data/);
  });
});

describe('second opinion: @canboat/canboatjs candump log lines', () => {
  const rand = seededRandom(73);
  const frames = Array.from({ length: 1500 }, () => ({
    tUs: 1_600_000_000_000_000 + randomInt(rand, 400_000_000_000_000),
    iface: `can${randomInt(rand, 3)}`,
    // EDP kept 0: canboatjs follows ISO 11783, where that bit is always 0.
    id: formatCanId(randomInt(rand, 0x1fffffff) & ~0x02000000),
    // 1 to 8 bytes: canboatjs refuses a line with no data bytes.
    data: bytesToHex(Array.from({ length: 1 + randomInt(rand, 7) }, () => randomInt(rand, 255))),
  }));

  it('parses the lines we write to the same time, bus, priority, PGN, addresses and data', () => {
    for (const f of frames) {
      const line = formatCandumpLine(f);
      const theirs = parseCandump3(line);
      const ours = parsed(line);
      const id = decodeCanId(ours.id);
      if (!id.ok) throw new Error(id.reason);
      expect(theirs.error, line).toBeUndefined();
      expect(theirs.timestamp).toBe(line.slice(0, line.indexOf(' ')));
      expect(theirs.bus).toBe(ours.iface);
      expect({ p: theirs.prio, pgn: theirs.pgn, sa: theirs.src, da: theirs.dst }, line).toEqual({
        p: id.value.priority, pgn: id.value.pgn, sa: id.value.sourceAddress, da: id.value.destination,
      });
      expect(Buffer.from(theirs.data).toString('hex').toUpperCase()).toBe(ours.data);
    }
  });

  it('reads the lines canboatjs writes', () => {
    for (const f of frames.slice(0, 500)) {
      const c = parseCanId(parseInt(f.id, 16));
      // canboatjs always splits PGN 126720 as an NMEA 2000 fast packet, so that PGN is left out here.
      if (c.pgn === 126720) continue;
      const time = `${Math.floor(f.tUs / 1e6)}.${String(f.tUs % 1e6).padStart(6, '0')}`;
      const [line] = encodeCandump3({ data: Buffer.from(f.data, 'hex'), timestamp: time, bus: f.iface, ...c });
      const ours = parsed(line);
      expect(ours).toMatchObject({ tUs: f.tUs, iface: f.iface, data: f.data });
      const id = decodeCanId(ours.id);
      expect(id.ok && [id.value.priority, id.value.pgn, id.value.sourceAddress, id.value.destination]).toEqual([c.prio, c.pgn, c.src, c.dst]);
    }
  });
});
