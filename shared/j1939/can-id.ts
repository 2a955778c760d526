import { accept, refuse, type Result } from './result';

/** SAE J1939-21: the global destination address. */
export const GLOBAL_ADDRESS = 255;
/** SAE J1939-21: PDU format values from 240 up are PDU2 (broadcast, PS is a group extension). */
export const PDU2_MIN_PF = 240;
const MAX_29_BIT = 0x1fffffff;
const MAX_PGN = 0x3ffff;

/** The fields of a 29-bit J1939 identifier (SAE J1939-21, figure of the 29-bit identifier). */
export interface CanId {
  /** the identifier as a number, 0..0x1FFFFFFF */
  raw: number;
  /** 3 bits, 0 highest */
  priority: number;
  /** extended data page, 1 bit */
  edp: 0 | 1;
  /** data page, 1 bit */
  dp: 0 | 1;
  /** PDU format, 8 bits */
  pf: number;
  /** PDU specific, 8 bits: destination address (PDU1) or group extension (PDU2) */
  ps: number;
  pdu: 1 | 2;
  /** parameter group number, 18 bits: EDP, DP, PF and (PDU2 only) PS */
  pgn: number;
  /** destination address; 255 (global) for PDU2 */
  destination: number;
  sourceAddress: number;
}

/**
 * Decodes a 29-bit identifier given as exactly 8 hex digits or as a number.
 * Refuses anything wider than 29 bits and EDP=1 with DP=1, which SAE J1939-21 leaves to
 * ISO 15765-3 (those frames are not J1939).
 */
export function decodeCanId(id: string | number): Result<CanId> {
  let raw: number;
  if (typeof id === 'string') {
    if (!/^[0-9A-Fa-f]{8}$/.test(id)) return refuse(`identifier "${id}" is not 8 hex digits`);
    raw = parseInt(id, 16);
  } else if (typeof id === 'number') {
    if (!Number.isInteger(id) || id < 0) return refuse(`identifier ${id} is not a non-negative integer`);
    raw = id;
  } else {
    return refuse('identifier is neither a string nor a number');
  }
  if (raw > MAX_29_BIT) return refuse(`identifier ${formatCanId(raw)} does not fit in 29 bits`);

  const priority = (raw >>> 26) & 0x7;
  const edp = ((raw >>> 25) & 1) as 0 | 1;
  const dp = ((raw >>> 24) & 1) as 0 | 1;
  const pf = (raw >>> 16) & 0xff;
  const ps = (raw >>> 8) & 0xff;
  const sourceAddress = raw & 0xff;
  // SAE J1939-21: EDP=1, DP=1 marks ISO 15765-3 frames, outside J1939.
  if (edp === 1 && dp === 1) return refuse(`identifier ${formatCanId(raw)} has EDP=1 and DP=1 (ISO 15765-3, not J1939)`);

  const pdu = pf < PDU2_MIN_PF ? 1 : 2;
  // SAE J1939-21: in PDU1 the PS field is the destination address and the PGN carries PS = 0.
  const pgn = (edp << 17) | (dp << 16) | (pf << 8) | (pdu === 2 ? ps : 0);
  const destination = pdu === 1 ? ps : GLOBAL_ADDRESS;
  return accept({ raw, priority, edp, dp, pf, ps, pdu, pgn, destination, sourceAddress });
}

export interface CanIdFields {
  /** 0..7; SAE J1939-21 gives 6 as the default for control and 7 for others, the caller chooses */
  priority: number;
  /** 0..0x3FFFF; for PDU1 PGNs (PF < 240) the low byte must be 0 */
  pgn: number;
  /** required 0..255 for PDU1 PGNs; for PDU2 PGNs omit it or give 255 */
  destination?: number;
  sourceAddress: number;
}

function checkInt(name: string, value: unknown, max: number): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0 || value > max) {
    throw new RangeError(`${name} ${String(value)} is not an integer 0..${max}`);
  }
  return value;
}

/** Encodes identifier fields to the numeric 29-bit identifier; throws RangeError on bad fields. */
export function encodeCanIdNumber(fields: CanIdFields): number {
  const priority = checkInt('priority', fields.priority, 7);
  const pgn = checkInt('pgn', fields.pgn, MAX_PGN);
  const sourceAddress = checkInt('sourceAddress', fields.sourceAddress, 255);
  if ((pgn >>> 16) === 3) throw new RangeError(`pgn ${pgn} has EDP=1 and DP=1 (ISO 15765-3, not J1939)`);
  const pf = (pgn >>> 8) & 0xff;
  let ps: number;
  if (pf < PDU2_MIN_PF) {
    if ((pgn & 0xff) !== 0) throw new RangeError(`pgn ${pgn} is PDU1 (PF ${pf} < 240) and must have a low byte of 0`);
    if (fields.destination === undefined) throw new RangeError(`pgn ${pgn} is PDU1 and needs a destination`);
    ps = checkInt('destination', fields.destination, 255);
  } else {
    if (fields.destination !== undefined && fields.destination !== GLOBAL_ADDRESS) {
      throw new RangeError(`pgn ${pgn} is PDU2 and can only go to the global address 255`);
    }
    ps = pgn & 0xff;
  }
  // Built with arithmetic, not <<, so that priority 4..7 cannot turn the number negative.
  return priority * 2 ** 26 + (pgn >>> 8) * 2 ** 16 + ps * 2 ** 8 + sourceAddress;
}

/** Encodes identifier fields to 8 upper-case hex digits, as the gateway protocol writes `id`. */
export function encodeCanId(fields: CanIdFields): string {
  return formatCanId(encodeCanIdNumber(fields));
}

/** A numeric identifier as 8 upper-case hex digits. */
export function formatCanId(raw: number): string {
  return raw.toString(16).toUpperCase().padStart(8, '0');
}
