import { hexToBytes } from './hex';
import { accept, refuse, type Result } from './result';

/** SAE J1939-73: DM1, active diagnostic trouble codes. */
export const PGN_DM1 = 65226; // 0xFECA
/** SAE J1939-73: SPN is 19 bits. */
export const MAX_SPN = 524287;
/** SAE J1939-73: occurrence count 127 means "not available". */
export const OCCURRENCE_NOT_AVAILABLE = 127;
/** SAE J1939-21: a transport-protocol message is at most 1785 bytes, so 445 DTCs after the 2 lamp bytes. */
export const MAX_DM1_DTCS = 445;
const MAX_TRANSPORT_BYTES = 1785;

/** SAE J1939-73: 2-bit lamp status, 00 off, 01 on, 10 reserved, 11 not available. */
export type LampState = 'off' | 'on' | 'reserved' | 'notAvailable';
/**
 * SAE J1939-73: 2-bit lamp flash, 00 slow flash (about 1 Hz), 01 fast flash (about 2 Hz or faster),
 * 10 reserved (later editions give it another use, from memory), 11 unavailable or do not flash.
 */
export type FlashState = 'slow' | 'fast' | 'reserved' | 'notAvailable';

export interface Lamps<S> {
  mil: S;
  redStop: S;
  amberWarning: S;
  protect: S;
}

export interface Dtc {
  spn: number;
  fmi: number;
  /** SPN conversion method bit. 0: the layout of J1939-73 version 4 and later. */
  conversionMethod: 0 | 1;
  /** 0..126, or 127 for not available */
  occurrenceCount: number;
  /**
   * Set when conversionMethod is 1: the sender uses one of the older SPN byte orders, which the
   * DTC alone does not say, so `spn` (read with the version 4 layout) cannot be trusted.
   */
  flagged: boolean;
  flagReason?: string;
  /** the 4 bytes as sent, upper-case hex */
  raw: string;
}

export interface Dm1 {
  lamps: Lamps<LampState>;
  flash: Lamps<FlashState>;
  dtcs: Dtc[];
  /** 0 to 3 bytes after the last whole DTC (padding), upper-case hex; not read */
  trailing: string;
}

const LAMP_STATES: readonly LampState[] = ['off', 'on', 'reserved', 'notAvailable'];
const FLASH_STATES: readonly FlashState[] = ['slow', 'fast', 'reserved', 'notAvailable'];

// SAE J1939-73 DM1 bytes 1 and 2: MIL bits 8-7, red stop 6-5, amber warning 4-3, protect 2-1.
function unpack<S>(byte: number, states: readonly S[]): Lamps<S> {
  return {
    mil: states[(byte >> 6) & 3],
    redStop: states[(byte >> 4) & 3],
    amberWarning: states[(byte >> 2) & 3],
    protect: states[byte & 3],
  };
}

function pack<S>(lamps: Lamps<S>, states: readonly S[], what: string): number {
  const code = (name: keyof Lamps<S>) => {
    const i = states.indexOf(lamps[name]);
    if (i < 0) throw new RangeError(`${what} ${String(name)} "${String(lamps[name])}" is not one of ${states.join(', ')}`);
    return i;
  };
  return (code('mil') << 6) | (code('redStop') << 4) | (code('amberWarning') << 2) | code('protect');
}

function hex4(bytes: Uint8Array, at: number): string {
  let s = '';
  for (let i = at; i < at + 4; i++) s += bytes[i].toString(16).toUpperCase().padStart(2, '0');
  return s;
}

/**
 * Decodes a DM1 payload (bytes or hex). "No active DTC" entries (SPN 0 with FMI 0, and SPN 524287)
 * give no DTC; a trailing part of fewer than 4 bytes is padding and is not read.
 */
export function decodeDm1(payload: Uint8Array | string): Result<Dm1> {
  let bytes: Uint8Array;
  if (typeof payload === 'string') {
    const parsed = hexToBytes(payload);
    if (!parsed.ok) return parsed;
    bytes = parsed.value;
  } else {
    bytes = payload;
  }
  if (bytes.length < 2) return refuse(`DM1 of ${bytes.length} bytes has no lamp bytes`);
  if (bytes.length > MAX_TRANSPORT_BYTES) return refuse(`DM1 of ${bytes.length} bytes is longer than a J1939 message can be`);
  // A single-frame DM1 is 8 bytes: lamps, one DTC, 2 spare bytes. Spare bytes should be 0xFF, but
  // senders also fill them with 0x00 (the protocol's own example does); they are kept, not read.
  const whole = 2 + 4 * Math.floor((bytes.length - 2) / 4);
  let trailing = '';
  for (let i = whole; i < bytes.length; i++) trailing += bytes[i].toString(16).toUpperCase().padStart(2, '0');
  const dtcs: Dtc[] = [];
  for (let at = 2; at < whole; at += 4) {
    const b5 = bytes[at + 2];
    const b6 = bytes[at + 3];
    // SAE J1939-73 DTC: byte 3 SPN bits 1-8, byte 4 SPN bits 9-16, byte 5 bits 8-6 SPN bits 17-19,
    // byte 5 bits 5-1 FMI, byte 6 bit 8 conversion method, bits 7-1 occurrence count.
    const spn = bytes[at] | (bytes[at + 1] << 8) | ((b5 >> 5) << 16);
    const fmi = b5 & 0x1f;
    if ((spn === 0 && fmi === 0) || spn === MAX_SPN) continue;
    const conversionMethod = (b6 >> 7) as 0 | 1;
    const dtc: Dtc = { spn, fmi, conversionMethod, occurrenceCount: b6 & 0x7f, flagged: false, raw: hex4(bytes, at) };
    if (conversionMethod === 1) {
      dtc.flagged = true;
      dtc.flagReason = 'conversion method 1: SPN sent in an older J1939-73 byte order, SPN not reliable';
    }
    dtcs.push(dtc);
  }
  return accept({ lamps: unpack(bytes[0], LAMP_STATES), flash: unpack(bytes[1], FLASH_STATES), dtcs, trailing });
}

export interface Dm1DtcInput {
  spn: number;
  fmi: number;
  /** 0..127; default 1 */
  occurrenceCount?: number;
  /** default 0 */
  conversionMethod?: 0 | 1;
}

export interface Dm1Input {
  lamps: Lamps<LampState>;
  /** default: all notAvailable (no flash), byte 2 = 0xFF */
  flash?: Lamps<FlashState>;
  dtcs: readonly Dm1DtcInput[];
}

function checkInt(name: string, value: unknown, max: number): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0 || value > max) {
    throw new RangeError(`${name} ${String(value)} is not an integer 0..${max}`);
  }
  return value;
}

/**
 * Encodes a DM1 payload. No DTC encodes the "no active DTC" entry (SPN 0, FMI 0, count 0) as
 * SAE J1939-73 asks; up to 1 DTC is padded with 0xFF to 8 bytes (a single frame); more DTCs
 * give 2 + 4n bytes, to be sent by BAM. Throws RangeError on bad fields.
 */
export function encodeDm1(input: Dm1Input): Uint8Array {
  if (input.dtcs.length > MAX_DM1_DTCS) throw new RangeError(`${input.dtcs.length} DTCs is more than ${MAX_DM1_DTCS}`);
  const flash = input.flash ?? { mil: 'notAvailable', redStop: 'notAvailable', amberWarning: 'notAvailable', protect: 'notAvailable' };
  const dtcs = input.dtcs.length > 0 ? input.dtcs : [{ spn: 0, fmi: 0, occurrenceCount: 0, conversionMethod: 0 as const }];
  const bytes = new Uint8Array(Math.max(8, 2 + 4 * dtcs.length)).fill(0xff);
  bytes[0] = pack(input.lamps, LAMP_STATES, 'lamp');
  bytes[1] = pack(flash, FLASH_STATES, 'flash');
  dtcs.forEach((d, i) => {
    const spn = checkInt('spn', d.spn, MAX_SPN);
    const fmi = checkInt('fmi', d.fmi, 31);
    const count = checkInt('occurrenceCount', d.occurrenceCount ?? 1, 127);
    const cm = checkInt('conversionMethod', d.conversionMethod ?? 0, 1);
    const at = 2 + 4 * i;
    bytes[at] = spn & 0xff;
    bytes[at + 1] = (spn >> 8) & 0xff;
    bytes[at + 2] = ((spn >> 16) << 5) | fmi;
    bytes[at + 3] = (cm << 7) | count;
  });
  return bytes;
}
