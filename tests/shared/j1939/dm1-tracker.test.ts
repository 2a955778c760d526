import { describe, expect, it } from 'vitest';
import { encodeCanId } from '../../../shared/j1939/can-id';
import { encodeDm1, type Dm1DtcInput, type LampState, type Lamps } from '../../../shared/j1939/dm1';
import { Dm1Tracker, faultActivationsFromFrames, type TrackerFrame } from '../../../shared/j1939/dm1-tracker';
import { bytesToHex } from '../../../shared/j1939/hex';
import { encodeBam } from '../../../shared/j1939/transport';

const off: Lamps<LampState> = { mil: 'off', redStop: 'off', amberWarning: 'off', protect: 'off' };
const amber: Lamps<LampState> = { ...off, amberWarning: 'on' };

/** A DM1 as the bus carries it: one frame for up to one DTC, a BAM beyond (SAE J1939-73 / J1939-21). */
function dm1Frames(t: number, sa: number, dtcs: Dm1DtcInput[], lamps = amber): TrackerFrame[] {
  const data = encodeDm1({ lamps, dtcs });
  if (data.length <= 8) return [{ t, id: encodeCanId({ priority: 6, pgn: 65226, sourceAddress: sa }), data: bytesToHex(data) }];
  return encodeBam({ pgn: 65226, sourceAddress: sa, data }).map((f, i) => ({ t: t + 50 * i, ...f }));
}

const spnFmi = (a: { spn: number; fmi: number }) => [a.spn, a.fmi];

describe('fault activation (gateway protocol rule 9)', () => {
  it('reports a DTC once when it appears, not while it stays, and again when it comes back', () => {
    const frames = [
      ...dm1Frames(1_000, 0, []),
      ...dm1Frames(2_000, 0, [{ spn: 4242, fmi: 3, occurrenceCount: 1 }]),
      ...dm1Frames(3_000, 0, [{ spn: 4242, fmi: 3, occurrenceCount: 2 }]),
      ...dm1Frames(4_000, 0, []),
      ...dm1Frames(5_000, 0, [{ spn: 4242, fmi: 3, occurrenceCount: 3 }]),
    ];
    const { activations } = faultActivationsFromFrames(frames);
    expect(activations).toEqual([
      { at: 2_000, sourceAddress: 0, spn: 4242, fmi: 3, occurrenceCount: 1, conversionMethod: 0, lamps: amber },
      { at: 5_000, sourceAddress: 0, spn: 4242, fmi: 3, occurrenceCount: 3, conversionMethod: 0, lamps: amber },
    ]);
  });

  it('treats a new FMI of the same SPN as a new DTC', () => {
    const frames = [...dm1Frames(1_000, 0, [{ spn: 77, fmi: 3 }]), ...dm1Frames(2_000, 0, [{ spn: 77, fmi: 4 }])];
    expect(faultActivationsFromFrames(frames).activations.map(spnFmi)).toEqual([[77, 3], [77, 4]]);
  });

  it('keeps each source address apart', () => {
    const frames = [
      ...dm1Frames(1_000, 0x00, [{ spn: 500, fmi: 2 }]),
      ...dm1Frames(1_100, 0x03, [{ spn: 500, fmi: 2 }]),
      ...dm1Frames(2_000, 0x03, []),
      ...dm1Frames(2_100, 0x00, [{ spn: 500, fmi: 2 }]),
      ...dm1Frames(3_000, 0x03, [{ spn: 500, fmi: 2 }]),
    ];
    expect(faultActivationsFromFrames(frames).activations.map((a) => [a.sourceAddress, a.at])).toEqual([[0, 1_000], [3, 1_100], [3, 3_000]]);
  });

  it('reports DTCs carried by BAM at the capture time of the last packet, with the lamps of that DM1', () => {
    const dtcs = [{ spn: 1001, fmi: 5, occurrenceCount: 9 }, { spn: 1002, fmi: 6 }, { spn: 1003, fmi: 7 }];
    const frames = dm1Frames(10_000, 0x21, dtcs, { ...off, redStop: 'on' });
    expect(frames).toHaveLength(1 + 2); // 14 bytes: TP.CM + 2 TP.DT
    const { activations } = faultActivationsFromFrames(frames);
    expect(activations.map(spnFmi)).toEqual([[1001, 5], [1002, 6], [1003, 7]]);
    expect(activations.every((a) => a.at === 10_100 && a.sourceAddress === 0x21 && a.lamps.redStop === 'on')).toBe(true);
    expect(activations[0].occurrenceCount).toBe(9);
  });

  it('reports only the DTCs that are new when a DM1 grows from one frame to a BAM and back', () => {
    const frames = [
      ...dm1Frames(1_000, 0, [{ spn: 10, fmi: 1 }]),
      ...dm1Frames(2_000, 0, [{ spn: 10, fmi: 1 }, { spn: 11, fmi: 2 }]),
      ...dm1Frames(3_000, 0, [{ spn: 11, fmi: 2 }]),
      ...dm1Frames(4_000, 0, [{ spn: 10, fmi: 1 }, { spn: 11, fmi: 2 }]),
    ];
    expect(faultActivationsFromFrames(frames).activations.map((a) => [a.spn, a.at])).toEqual([[10, 1_000], [11, 2_100], [10, 4_100]]);
  });

  it('makes no activation from "no active DTC" encodings', () => {
    // SAE J1939-73: SPN 0 FMI 0 means no active DTC; gateway protocol rule 9 also drops SPN 524287.
    const id = encodeCanId({ priority: 6, pgn: 65226, sourceAddress: 0 });
    const frames = [
      { t: 1, id, data: '00FF00000000FFFF' },
      { t: 2, id, data: '00FFFFFFFFFFFFFF' },
      { t: 3, id, data: '00FFFFFFE301FFFF' },
    ];
    const r = faultActivationsFromFrames(frames);
    expect(r.activations).toEqual([]);
    expect(r.counts.dm1Messages).toBe(3);
  });

  it('passes on the conversion method so that an unreliable SPN can be told apart', () => {
    const { activations } = faultActivationsFromFrames(dm1Frames(1, 0, [{ spn: 3, fmi: 5, conversionMethod: 1 }]));
    expect(activations).toMatchObject([{ conversionMethod: 1 }]);
  });

  it('makes no activation from an abandoned BAM and counts why', () => {
    const frames = dm1Frames(1_000, 0, [{ spn: 1, fmi: 1 }, { spn: 2, fmi: 2 }, { spn: 3, fmi: 3 }]);
    frames[2] = { ...frames[2], t: frames[1].t + 800 };
    const r = faultActivationsFromFrames(frames);
    expect(r.activations).toEqual([]);
    expect(r.counts.abandoned).toEqual({ 'bam-t1-timeout': 1 });
    expect(r.notices).toMatchObject([{ kind: 'abandoned', code: 'bam-t1-timeout', sourceAddress: 0 }]);
  });

  it('abandons a BAM whose source went quiet once a later frame shows the T1 gap', () => {
    const open = dm1Frames(1_000, 0x00, [{ spn: 1, fmi: 1 }, { spn: 2, fmi: 2 }]).slice(0, 2);
    const r = faultActivationsFromFrames([...open, ...dm1Frames(1_900, 0x03, [])]);
    expect(r.notices).toMatchObject([{ kind: 'abandoned', code: 'bam-t1-timeout', sourceAddress: 0, t: 1_900 }]);
  });

  it('refuses and counts frames it cannot read, and ignores other parameter groups', () => {
    const r = faultActivationsFromFrames([
      { t: 1, id: '18FECA0', data: '' },
      { t: 2, id: '1BFECA00', data: '00FF00000000FFFF' }, // SAE J1939-21: EDP=1, DP=1 is ISO 15765-3
      { t: 3, id: '18FECA00', data: '00F' },
      { t: 4, id: '18FECA00', data: '04' },
      { t: Number.NaN, id: '18FECA00', data: '0400' },
      { t: 6, id: '0CF00400', data: 'FFFFFFFFFFFFFFFF' }, // SAE J1939-71: EEC1, PGN 61444
    ]);
    expect(r.counts.refused).toEqual({ 'bad-id': 2, 'bad-frame': 2, 'dm1-malformed': 1 });
    expect(r.counts.ignored).toEqual({ 'not-dm1': 1 });
    expect(r.counts.frames).toBe(6);
    expect(r.notices.every((n) => n.reason.length > 0)).toBe(true);
  });
});

describe('tracker state', () => {
  // A mixed day on one bus: single frames and BAMs from three sources, one broken transfer.
  const scenario: TrackerFrame[] = [
    ...dm1Frames(1_000, 0x00, [{ spn: 100_001, fmi: 4 }]),
    ...dm1Frames(1_020, 0x03, [{ spn: 200, fmi: 9 }, { spn: 201, fmi: 10 }]),
    ...dm1Frames(1_500, 0x21, [{ spn: 300, fmi: 31 }, { spn: 301, fmi: 0 }, { spn: 302, fmi: 1 }]).slice(0, 2),
    ...dm1Frames(2_400, 0x00, [{ spn: 100_001, fmi: 4 }, { spn: 100_002, fmi: 5 }]),
    ...dm1Frames(3_000, 0x03, []),
    ...dm1Frames(3_500, 0x21, [{ spn: 300, fmi: 31 }]),
    ...dm1Frames(4_000, 0x03, [{ spn: 201, fmi: 10 }, { spn: 202, fmi: 11 }, { spn: 203, fmi: 12 }]),
    ...dm1Frames(5_000, 0x00, []),
  ];

  it('gives the same activations, notices and final state when stopped and restored at any frame', () => {
    const whole = new Dm1Tracker();
    const expected = whole.pushAll(scenario);
    expect(expected.activations.length).toBeGreaterThan(5);
    for (let k = 0; k <= scenario.length; k++) {
      const first = new Dm1Tracker();
      const a = first.pushAll(scenario.slice(0, k));
      const second = Dm1Tracker.restore(JSON.parse(JSON.stringify(first.snapshot())));
      const b = second.pushAll(scenario.slice(k));
      expect([...a.activations, ...b.activations], `split at ${k}`).toEqual(expected.activations);
      expect([...a.notices, ...b.notices], `split at ${k}`).toEqual(expected.notices);
      expect(second.snapshot()).toEqual(whole.snapshot());
    }
  });

  it('refuses to restore something that is not a tracker snapshot', () => {
    const good = new Dm1Tracker();
    good.pushAll(scenario.slice(0, 5));
    const snap = JSON.parse(JSON.stringify(good.snapshot()));
    expect(() => Dm1Tracker.restore({ ...snap, version: 2 })).toThrow();
    expect(() => Dm1Tracker.restore({ ...snap, active: [{ sourceAddress: 256, dtcs: [] }] })).toThrow();
    expect(() => Dm1Tracker.restore({ ...snap, bam: [{ sourceAddress: 0, pgn: 65226, size: 14, packets: 2, next: 2, lastT: 0, received: '' }] })).toThrow();
    expect(() => Dm1Tracker.restore(null)).toThrow();
    expect(() => Dm1Tracker.restore(snap)).not.toThrow();
  });

  it('keeps only plain JSON in its snapshot', () => {
    const t = new Dm1Tracker();
    t.pushAll(scenario.slice(0, 5));
    const snap = t.snapshot();
    expect(JSON.parse(JSON.stringify(snap))).toEqual(snap);
    expect(snap.bam).toHaveLength(1);
  });
});
