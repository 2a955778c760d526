import { encodeCanId, GLOBAL_ADDRESS, type CanId } from './can-id';
import { bytesToHex } from './hex';

// SAE J1939-21 transport protocol, broadcast (BAM) part only.
export const PGN_TP_CM = 60416; // 0xEC00, connection management
export const PGN_TP_DT = 60160; // 0xEB00, data transfer
export const TP_CM_BAM = 32; // control byte of a broadcast announce message
/** SAE J1939-21: T1, the longest a receiver waits between packets of a BAM. */
export const T1_MS = 750;
export const BAM_MIN_BYTES = 9;
export const BAM_MAX_BYTES = 1785; // 255 packets of 7 bytes
/** SAE J1939-21: a BAM sender spaces its packets 50 to 200 ms apart. */
export const BAM_PACKET_GAP_MS = { min: 50, max: 200 } as const;

export interface TransportFrame {
  /** capture time, epoch ms */
  t: number;
  id: CanId;
  data: Uint8Array;
}

export type AbandonCode = 'bam-t1-timeout' | 'bam-out-of-order' | 'bam-replaced' | 'bam-short-packet' | 'bam-time-backwards';
export type RefuseCode = 'bam-short-cm' | 'bam-bad-size' | 'bam-bad-packet-count' | 'bam-bad-pgn';
export type IgnoreCode = 'tp-not-global' | 'tp-cm-not-bam' | 'tp-dt-without-bam' | 'not-transport';

export type TransportEvent =
  | { kind: 'started'; t: number; sourceAddress: number; pgn: number; size: number; packets: number }
  | { kind: 'complete'; at: number; sourceAddress: number; pgn: number; data: Uint8Array }
  | { kind: 'abandoned'; t: number; sourceAddress: number; pgn: number; code: AbandonCode; reason: string }
  | { kind: 'refused'; t: number; sourceAddress: number; code: RefuseCode; reason: string }
  | { kind: 'ignored'; t: number; sourceAddress: number; code: IgnoreCode; reason: string };

/** An unfinished BAM, as plain JSON. */
export interface BamSession {
  sourceAddress: number;
  pgn: number;
  size: number;
  packets: number;
  /** the sequence number expected next, 1..255 */
  next: number;
  /** capture time of the last frame of this message, epoch ms */
  lastT: number;
  /** bytes received so far, upper-case hex */
  received: string;
}

/**
 * Reassembles broadcast transfers per source address. Feed it frames in capture order. One BAM
 * per source is open at a time (SAE J1939-21); directed (RTS/CTS) transfers are not reassembled.
 */
export class BamReassembler {
  private sessions = new Map<number, BamSession>();

  constructor(sessions: readonly BamSession[] = []) {
    for (const s of sessions) this.sessions.set(s.sourceAddress, { ...s });
  }

  /** The open sessions, for a snapshot. */
  openSessions(): BamSession[] {
    return [...this.sessions.values()].map((s) => ({ ...s }));
  }

  /** Abandons every session whose last frame is more than T1 before `now`. */
  expire(now: number): TransportEvent[] {
    const events: TransportEvent[] = [];
    for (const s of [...this.sessions.values()]) {
      if (now - s.lastT > T1_MS) events.push(this.abandon(s, now, 'bam-t1-timeout', `no packet for ${now - s.lastT} ms (T1 is ${T1_MS} ms)`));
    }
    return events;
  }

  accept(frame: TransportFrame): TransportEvent[] {
    const { t, id, data } = frame;
    const sourceAddress = id.sourceAddress;
    if (id.pgn !== PGN_TP_CM && id.pgn !== PGN_TP_DT) {
      return [{ kind: 'ignored', t, sourceAddress, code: 'not-transport', reason: `PGN ${id.pgn} is not TP.CM or TP.DT` }];
    }
    if (id.destination !== GLOBAL_ADDRESS) {
      const reason = `to destination ${id.destination}: only broadcast (255) transfers are reassembled`;
      return [{ kind: 'ignored', t, sourceAddress, code: 'tp-not-global', reason }];
    }
    return id.pgn === PGN_TP_CM ? this.announce(t, sourceAddress, data) : this.packet(t, sourceAddress, data);
  }

  private abandon(s: BamSession, t: number, code: AbandonCode, reason: string): TransportEvent {
    this.sessions.delete(s.sourceAddress);
    return { kind: 'abandoned', t, sourceAddress: s.sourceAddress, pgn: s.pgn, code, reason };
  }

  private announce(t: number, sourceAddress: number, data: Uint8Array): TransportEvent[] {
    if (data.length < 8) {
      return [{ kind: 'refused', t, sourceAddress, code: 'bam-short-cm', reason: `TP.CM of ${data.length} bytes (8 needed)` }];
    }
    if (data[0] !== TP_CM_BAM) {
      return [{ kind: 'ignored', t, sourceAddress, code: 'tp-cm-not-bam', reason: `TP.CM control byte ${data[0]} to global is not a BAM` }];
    }
    const events: TransportEvent[] = [];
    const old = this.sessions.get(sourceAddress);
    if (old) {
      // SAE J1939-21: a new BAM from the same source ends the unfinished one.
      events.push(
        t - old.lastT > T1_MS
          ? this.abandon(old, t, 'bam-t1-timeout', `no packet for ${t - old.lastT} ms (T1 is ${T1_MS} ms)`)
          : this.abandon(old, t, 'bam-replaced', `a new BAM from source ${sourceAddress} arrived before packet ${old.next} of ${old.packets}`),
      );
    }
    // SAE J1939-21 TP.CM_BAM: bytes 2-3 size (LSB first), byte 4 packets, byte 5 reserved, bytes 6-8 PGN (LSB first).
    const size = data[1] | (data[2] << 8);
    const packets = data[3];
    const pgn = data[5] | (data[6] << 8) | (data[7] << 16);
    const refused = (code: RefuseCode, reason: string) => [...events, { kind: 'refused' as const, t, sourceAddress, code, reason }];
    if (size < BAM_MIN_BYTES || size > BAM_MAX_BYTES) return refused('bam-bad-size', `BAM size ${size} is outside ${BAM_MIN_BYTES}..${BAM_MAX_BYTES}`);
    if (packets !== Math.ceil(size / 7)) return refused('bam-bad-packet-count', `BAM of ${size} bytes announces ${packets} packets, not ${Math.ceil(size / 7)}`);
    if (pgn > 0x3ffff) return refused('bam-bad-pgn', `BAM announces PGN ${pgn}, wider than 18 bits`);
    this.sessions.set(sourceAddress, { sourceAddress, pgn, size, packets, next: 1, lastT: t, received: '' });
    events.push({ kind: 'started', t, sourceAddress, pgn, size, packets });
    return events;
  }

  private packet(t: number, sourceAddress: number, data: Uint8Array): TransportEvent[] {
    const s = this.sessions.get(sourceAddress);
    if (!s) return [{ kind: 'ignored', t, sourceAddress, code: 'tp-dt-without-bam', reason: 'TP.DT with no open BAM from this source' }];
    const gap = t - s.lastT;
    if (gap > T1_MS) return [this.abandon(s, t, 'bam-t1-timeout', `${gap} ms since the previous frame (T1 is ${T1_MS} ms)`)];
    if (gap < 0) return [this.abandon(s, t, 'bam-time-backwards', `packet captured ${-gap} ms before the previous frame`)];
    if (data.length === 0) return [this.abandon(s, t, 'bam-short-packet', 'TP.DT with no bytes')];
    if (data[0] !== s.next) return [this.abandon(s, t, 'bam-out-of-order', `packet ${data[0]} where ${s.next} was expected`)];
    const have = s.received.length / 2;
    const want = Math.min(7, s.size - have);
    if (data.length < 1 + want) return [this.abandon(s, t, 'bam-short-packet', `packet ${data[0]} carries ${data.length - 1} of ${want} bytes`)];
    s.received += bytesToHex(data.subarray(1, 1 + want));
    s.next += 1;
    s.lastT = t;
    if (have + want < s.size) return [];
    this.sessions.delete(sourceAddress);
    const out = new Uint8Array(s.size);
    for (let i = 0; i < s.size; i++) out[i] = parseInt(s.received.slice(2 * i, 2 * i + 2), 16);
    return [{ kind: 'complete', at: t, sourceAddress, pgn: s.pgn, data: out }];
  }
}

export interface BamInput {
  pgn: number;
  sourceAddress: number;
  data: Uint8Array;
  /** SAE J1939-21 default for TP.CM and TP.DT: 7 */
  priority?: number;
}

/** Splits a payload of 9..1785 bytes into a TP.CM_BAM and its TP.DT frames (last packet padded with 0xFF). */
export function encodeBam(input: BamInput): { id: string; data: string }[] {
  const { pgn, sourceAddress, data } = input;
  const priority = input.priority ?? 7;
  if (!(data instanceof Uint8Array)) throw new TypeError('BAM data must be a Uint8Array');
  if (data.length < BAM_MIN_BYTES || data.length > BAM_MAX_BYTES) {
    throw new RangeError(`BAM payload of ${data.length} bytes is outside ${BAM_MIN_BYTES}..${BAM_MAX_BYTES}`);
  }
  if (!Number.isInteger(pgn) || pgn < 0 || pgn > 0x3ffff) throw new RangeError(`pgn ${pgn} is not an integer 0..0x3FFFF`);
  const packets = Math.ceil(data.length / 7);
  const cmId = encodeCanId({ priority, pgn: PGN_TP_CM, destination: GLOBAL_ADDRESS, sourceAddress });
  const dtId = encodeCanId({ priority, pgn: PGN_TP_DT, destination: GLOBAL_ADDRESS, sourceAddress });
  const cm = [TP_CM_BAM, data.length & 0xff, data.length >> 8, packets, 0xff, pgn & 0xff, (pgn >> 8) & 0xff, pgn >> 16];
  const frames = [{ id: cmId, data: bytesToHex(cm) }];
  for (let n = 1; n <= packets; n++) {
    const chunk = new Uint8Array(8).fill(0xff);
    chunk[0] = n;
    chunk.set(data.subarray(7 * (n - 1), 7 * n), 1);
    frames.push({ id: dtId, data: bytesToHex(chunk) });
  }
  return frames;
}
