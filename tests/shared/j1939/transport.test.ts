import { describe, expect, it } from 'vitest';
import { decodeCanId } from '../../../shared/j1939/can-id';
import { bytesToHex, hexToBytes } from '../../../shared/j1939/hex';
import { BamReassembler, encodeBam, type TransportEvent } from '../../../shared/j1939/transport';

function frame(t: number, id: string, data: string) {
  const cid = decodeCanId(id);
  const bytes = hexToBytes(data);
  if (!cid.ok || !bytes.ok) throw new Error('bad test frame');
  return { t, id: cid.value, data: bytes.value };
}

const payload = (n: number, seed = 1) => Uint8Array.from({ length: n }, (_, i) => (i * 7 + seed) & 0xff);

/** The frames of a BAM, 50 ms apart (SAE J1939-21: 50 to 200 ms between BAM packets). */
function bam(data: Uint8Array, sa = 0, t0 = 1_000, pgn = 65226) {
  return encodeBam({ pgn, sourceAddress: sa, data }).map((f, i) => frame(t0 + 50 * i, f.id, f.data));
}

function feed(r: BamReassembler, frames: ReturnType<typeof frame>[]): TransportEvent[] {
  return frames.flatMap((f) => r.accept(f));
}

describe('encoding a BAM', () => {
  it('writes the TP.CM_BAM and TP.DT frames as J1939-21 lays them out', () => {
    // SAE J1939-21: TP.CM control 32, size LSB first, packet count, 0xFF, PGN LSB first; TP.DT sequence + 7 bytes,
    // the last packet padded with 0xFF; TP.CM and TP.DT to global at priority 7.
    const frames = encodeBam({ pgn: 65226, sourceAddress: 0x21, data: Uint8Array.from([0, 1, 2, 3, 4, 5, 6, 7, 8]) });
    expect(frames).toEqual([
      { id: '1CECFF21', data: '20090002FFCAFE00' },
      { id: '1CEBFF21', data: '0100010203040506' },
      { id: '1CEBFF21', data: '020708FFFFFFFFFF' },
    ]);
  });

  it('refuses payloads a BAM cannot carry', () => {
    expect(() => encodeBam({ pgn: 65226, sourceAddress: 0, data: payload(8) })).toThrow(/9\.\.1785/);
    expect(() => encodeBam({ pgn: 65226, sourceAddress: 0, data: payload(1786) })).toThrow(/9\.\.1785/);
    expect(() => encodeBam({ pgn: 0x40000, sourceAddress: 0, data: payload(9) })).toThrow(/pgn/);
  });
});

describe('reassembling a BAM', () => {
  it('completes with the payload and the capture time of the last packet', () => {
    const data = payload(23);
    const events = feed(new BamReassembler(), bam(data, 0x3d));
    expect(events[0]).toMatchObject({ kind: 'started', sourceAddress: 0x3d, pgn: 65226, size: 23, packets: 4 });
    const done = events.at(-1);
    expect(done).toMatchObject({ kind: 'complete', at: 1_000 + 50 * 4, sourceAddress: 0x3d, pgn: 65226 });
    expect(done?.kind === 'complete' && bytesToHex(done.data)).toBe(bytesToHex(data));
  });

  it('carries the largest message, 1785 bytes in 255 packets', () => {
    // SAE J1939-21: at most 255 packets of 7 bytes.
    const data = payload(1785, 3);
    const frames = bam(data).map((f, i) => ({ ...f, t: 1_000 + 100 * i }));
    expect(frames).toHaveLength(256);
    const done = feed(new BamReassembler(), frames).at(-1);
    expect(done?.kind === 'complete' && bytesToHex(done.data)).toBe(bytesToHex(data));
  });

  it('refuses announced sizes outside 9..1785 and packet counts that do not fit the size', () => {
    const r = new BamReassembler();
    // 1786 = 0x06FA, 256 packets cannot be written, so 255; 8 bytes = 2 packets.
    expect(r.accept(frame(0, '1CECFF00', '20FA06FFFFCAFE00'))).toMatchObject([{ kind: 'refused', code: 'bam-bad-size' }]);
    expect(r.accept(frame(0, '1CECFF00', '20080002FFCAFE00'))).toMatchObject([{ kind: 'refused', code: 'bam-bad-size' }]);
    expect(r.accept(frame(0, '1CECFF00', '20090003FFCAFE00'))).toMatchObject([{ kind: 'refused', code: 'bam-bad-packet-count' }]);
    expect(r.accept(frame(0, '1CECFF00', '200900'))).toMatchObject([{ kind: 'refused', code: 'bam-short-cm' }]);
    expect(r.openSessions()).toEqual([]);
  });

  it('abandons the message when a packet comes out of order', () => {
    // SAE J1939-21 / gateway protocol rule 9: a packet out of order abandons the message.
    const frames = bam(payload(30));
    const r = new BamReassembler();
    const events = feed(r, [frames[0], frames[1], frames[3], frames[2], frames[4], frames[5]]);
    expect(events.filter((e) => e.kind === 'abandoned')).toMatchObject([{ code: 'bam-out-of-order', sourceAddress: 0 }]);
    expect(events.some((e) => e.kind === 'complete')).toBe(false);
    expect(events.filter((e) => e.kind === 'ignored').map((e) => e.kind === 'ignored' && e.code)).toEqual([
      'tp-dt-without-bam', 'tp-dt-without-bam', 'tp-dt-without-bam',
    ]);
  });

  it('abandons a repeated packet as out of order', () => {
    const frames = bam(payload(30));
    const events = feed(new BamReassembler(), [frames[0], frames[1], { ...frames[1], t: frames[1].t + 10 }]);
    expect(events.at(-1)).toMatchObject({ kind: 'abandoned', code: 'bam-out-of-order' });
  });

  it('abandons the message after a gap over T1 = 750 ms, and keeps it at exactly 750 ms', () => {
    // SAE J1939-21: T1 = 750 ms; gateway protocol rule 9: "a gap over T1".
    const frames = bam(payload(20));
    const late = frames.map((f, i) => (i === 2 ? { ...f, t: frames[1].t + 751 } : f));
    const events = feed(new BamReassembler(), late);
    expect(events.filter((e) => e.kind === 'abandoned')).toMatchObject([{ code: 'bam-t1-timeout' }]);
    expect(events.some((e) => e.kind === 'complete')).toBe(false);

    const onTime = frames.map((f, i) => (i >= 2 ? { ...f, t: f.t + 700 } : f));
    expect(feed(new BamReassembler(), onTime).at(-1)).toMatchObject({ kind: 'complete' });
  });

  it('times out a quiet session when asked to expire', () => {
    const r = new BamReassembler();
    feed(r, bam(payload(20)).slice(0, 2));
    expect(r.expire(1_050 + 750)).toEqual([]);
    expect(r.expire(1_050 + 751)).toMatchObject([{ kind: 'abandoned', code: 'bam-t1-timeout' }]);
    expect(r.openSessions()).toEqual([]);
  });

  it('lets a new BAM from the same source replace an unfinished one', () => {
    // SAE J1939-21: one BAM per source at a time; a new announcement ends the old one.
    const first = bam(payload(30, 1));
    const second = bam(payload(16, 9), 0, first[2].t + 50);
    const events = feed(new BamReassembler(), [...first.slice(0, 3), ...second]);
    expect(events.filter((e) => e.kind !== 'started').map((e) => e.kind)).toEqual(['abandoned', 'complete']);
    expect(events.find((e) => e.kind === 'abandoned')).toMatchObject({ code: 'bam-replaced' });
    const done = events.at(-1);
    expect(done?.kind === 'complete' && bytesToHex(done.data)).toBe(bytesToHex(payload(16, 9)));
  });

  it('keeps broadcasts from different sources apart', () => {
    const a = bam(payload(20, 1), 0x00, 1_000);
    const b = bam(payload(27, 2), 0x03, 1_010);
    const interleaved = [...a, ...b].sort((x, y) => x.t - y.t);
    const done = feed(new BamReassembler(), interleaved).filter((e) => e.kind === 'complete');
    expect(done.map((e) => e.kind === 'complete' && [e.sourceAddress, bytesToHex(e.data)])).toEqual([
      [0x00, bytesToHex(payload(20, 1))],
      [0x03, bytesToHex(payload(27, 2))],
    ]);
  });

  it('does not reassemble transfers to a specific destination', () => {
    // Gateway protocol rule 9: only broadcast (destination 255) transfers are reassembled.
    // SAE J1939-21: TP.CM_RTS (16) to address 0x00, then TP.DT to 0x00.
    const r = new BamReassembler();
    const events = feed(r, [frame(0, '1CEC0017', '1009000200CAFE00'), frame(50, '1CEB0017', '0100010203040506')]);
    expect(events.map((e) => e.kind === 'ignored' && e.code)).toEqual(['tp-not-global', 'tp-not-global']);
    expect(r.accept(frame(60, '1CECFF17', '10090002FFCAFE00'))).toMatchObject([{ kind: 'ignored', code: 'tp-cm-not-bam' }]);
    expect(r.openSessions()).toEqual([]);
  });

  it('accepts a last packet without padding but abandons one missing bytes', () => {
    const frames = bam(payload(9));
    const exact = { ...frames[2], data: frames[2].data.subarray(0, 3) };
    expect(feed(new BamReassembler(), [frames[0], frames[1], exact]).at(-1)).toMatchObject({ kind: 'complete' });
    const short = { ...frames[1], data: frames[1].data.subarray(0, 5) };
    expect(feed(new BamReassembler(), [frames[0], short]).at(-1)).toMatchObject({ kind: 'abandoned', code: 'bam-short-packet' });
  });

  it('resumes from its open sessions exactly as if never stopped', () => {
    const frames = bam(payload(40));
    const r1 = new BamReassembler();
    feed(r1, frames.slice(0, 3));
    const r2 = new BamReassembler(JSON.parse(JSON.stringify(r1.openSessions())));
    const a = feed(r1, frames.slice(3));
    const b = feed(r2, frames.slice(3));
    expect(b).toEqual(a);
    expect(a.at(-1)).toMatchObject({ kind: 'complete' });
  });
});
