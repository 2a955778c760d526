import { decodeCanId } from './can-id';
import { decodeDm1, PGN_DM1, type Dm1, type LampState, type Lamps } from './dm1';
import { hexToBytes } from './hex';
import { Dm1TrackerSnapshotSchema, type Dm1TrackerSnapshot, type TrackerCounts } from './dm1-tracker-snapshot';
import { BamReassembler, PGN_TP_CM, PGN_TP_DT, type TransportEvent } from './transport';

export type { Dm1TrackerSnapshot, TrackerCounts };

/** One captured frame, in capture order. */
export interface TrackerFrame {
  /** capture time, epoch ms */
  t: number;
  /** 29-bit identifier, 8 hex digits */
  id: string;
  /** 0 to 8 bytes as hex */
  data: string;
}

/** Gateway protocol rule 9: a DTC (source address, SPN, FMI) that became active. */
export interface FaultActivation {
  /** capture time of the frame that completed the DM1, epoch ms */
  at: number;
  sourceAddress: number;
  spn: number;
  fmi: number;
  occurrenceCount: number;
  /** 1 means the SPN was sent in an older byte order and is not reliable (see Dtc.flagged) */
  conversionMethod: 0 | 1;
  lamps: Lamps<LampState>;
}

export type NoticeKind = 'refused' | 'abandoned' | 'ignored';

/** Something the tracker did not use, with a stable code (for counting) and a reason (for the log). */
export interface TrackerNotice {
  kind: NoticeKind;
  code: string;
  reason: string;
  /** capture time of the frame concerned, epoch ms; null when the frame had no usable time */
  t: number | null;
  sourceAddress: number | null;
}

export interface TrackerResult {
  activations: FaultActivation[];
  notices: TrackerNotice[];
}

const key = (spn: number, fmi: number) => `${spn}:${fmi}`;

/**
 * Follows the DM1s of one unit's bus and reports each DTC as it becomes active (gateway protocol
 * rule 9): present in a DM1 of a source address, absent from the previous DM1 of that address.
 */
export class Dm1Tracker {
  private active = new Map<number, Set<string>>();
  private bam = new BamReassembler();
  private tally: TrackerCounts = { frames: 0, dm1Messages: 0, activations: 0, refused: {}, abandoned: {}, ignored: {} };

  /** Rebuilds a tracker from a snapshot; throws a zod error if the snapshot is not one. */
  static restore(snapshot: unknown): Dm1Tracker {
    const snap = Dm1TrackerSnapshotSchema.parse(snapshot);
    const tracker = new Dm1Tracker();
    for (const a of snap.active) tracker.active.set(a.sourceAddress, new Set(a.dtcs.map((d) => key(d.spn, d.fmi))));
    tracker.bam = new BamReassembler(snap.bam);
    tracker.tally = structuredClone(snap.counts);
    return tracker;
  }

  /** The whole state as plain JSON. */
  snapshot(): Dm1TrackerSnapshot {
    const active = [...this.active.entries()]
      .sort(([a], [b]) => a - b)
      .map(([sourceAddress, keys]) => ({
        sourceAddress,
        dtcs: [...keys].map((k) => k.split(':').map(Number)).map(([spn, fmi]) => ({ spn, fmi })),
      }));
    return { version: 1, active, bam: this.bam.openSessions(), counts: this.counts() };
  }

  counts(): TrackerCounts {
    return structuredClone(this.tally);
  }

  pushAll(frames: readonly TrackerFrame[]): TrackerResult {
    const result: TrackerResult = { activations: [], notices: [] };
    for (const f of frames) {
      const r = this.push(f);
      result.activations.push(...r.activations);
      result.notices.push(...r.notices);
    }
    return result;
  }

  push(frame: TrackerFrame): TrackerResult {
    const result: TrackerResult = { activations: [], notices: [] };
    this.tally.frames += 1;
    const notice = (kind: NoticeKind, code: string, reason: string, t: number | null, sourceAddress: number | null) => {
      this.tally[kind][code] = (this.tally[kind][code] ?? 0) + 1;
      result.notices.push({ kind, code, reason, t, sourceAddress });
    };
    const t = frame?.t;
    if (typeof t !== 'number' || !Number.isFinite(t)) {
      notice('refused', 'bad-frame', `capture time ${String(t)} is not a finite number of ms`, null, null);
      return result;
    }
    const id = decodeCanId(frame.id);
    if (!id.ok) {
      notice('refused', 'bad-id', id.reason, t, null);
      return result;
    }
    const sa = id.value.sourceAddress;
    const data = hexToBytes(frame.data);
    if (!data.ok || data.value.length > 8) {
      notice('refused', 'bad-frame', data.ok ? `${data.value.length} data bytes (at most 8)` : data.reason, t, sa);
      return result;
    }
    const events: TransportEvent[] = [];
    if (id.value.pgn === PGN_DM1) {
      this.dm1(sa, t, decodeDm1(data.value), result, notice);
    } else if (id.value.pgn === PGN_TP_CM || id.value.pgn === PGN_TP_DT) {
      events.push(...this.bam.accept({ t, id: id.value, data: data.value }));
    } else {
      notice('ignored', 'not-dm1', `PGN ${id.value.pgn} is neither DM1 nor transport`, t, sa);
    }
    // Sessions of other sources that have gone quiet for over T1 can no longer complete.
    events.push(...this.bam.expire(t));
    for (const e of events) {
      if (e.kind === 'complete') {
        if (e.pgn === PGN_DM1) this.dm1(e.sourceAddress, e.at, decodeDm1(e.data), result, notice);
        else notice('ignored', 'bam-not-dm1', `BAM carried PGN ${e.pgn}, not DM1`, e.at, e.sourceAddress);
      } else if (e.kind !== 'started') {
        notice(e.kind, e.code, e.reason, e.t, e.sourceAddress);
      }
    }
    return result;
  }

  private dm1(
    sa: number,
    at: number,
    decoded: ReturnType<typeof decodeDm1>,
    result: TrackerResult,
    notice: (kind: NoticeKind, code: string, reason: string, t: number, sa: number | null) => void,
  ): void {
    if (!decoded.ok) {
      notice('refused', 'dm1-malformed', decoded.reason, at, sa);
      return;
    }
    this.tally.dm1Messages += 1;
    const dm1: Dm1 = decoded.value;
    const previous = this.active.get(sa) ?? new Set<string>();
    const current = new Set<string>();
    for (const d of dm1.dtcs) {
      const k = key(d.spn, d.fmi);
      if (!previous.has(k) && !current.has(k)) {
        const { spn, fmi, occurrenceCount, conversionMethod } = d;
        result.activations.push({ at, sourceAddress: sa, spn, fmi, occurrenceCount, conversionMethod, lamps: { ...dm1.lamps } });
        this.tally.activations += 1;
      }
      current.add(k);
    }
    this.active.set(sa, current);
  }
}

/** Runs a fresh tracker over frames in capture order. */
export function faultActivationsFromFrames(frames: readonly TrackerFrame[]): TrackerResult & { counts: TrackerCounts } {
  const tracker = new Dm1Tracker();
  const result = tracker.pushAll(frames);
  return { ...result, counts: tracker.counts() };
}
