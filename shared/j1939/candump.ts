import { accept, refuse, type Result } from './result';

// The log format that can-utils candump writes with -L (and that its log players read):
//   (1700000000.123456) can0 18FECA00#0400640001010000
// seconds and 6 digits of microseconds, the interface, then the frame as ID#DATA. With -x it may
// add " T" or " R" (sent / received) at the end (from memory of the can-utils sources).

export interface CandumpFrame {
  /** capture time, whole epoch microseconds (exact) */
  tUs: number;
  /** capture time, epoch ms, microseconds kept as the fraction */
  t: number;
  iface: string;
  /** 29-bit identifier, 8 upper-case hex digits */
  id: string;
  /** 0 to 8 data bytes, upper-case hex */
  data: string;
  /** the -x direction flag, when present */
  direction?: 'T' | 'R';
}

/** Linux interface names are at most 15 characters (IFNAMSIZ 16 with the NUL, from memory). */
const IFACE = /^[A-Za-z0-9_.:-]{1,15}$/;
const TIME = /^\((\d{1,10})\.(\d{6})\)$/;
const DATA = /^(?:[0-9A-Fa-f]{2}){0,8}$/;
const MAX_29_BIT = 0x1fffffff;

export function parseCandumpLine(line: string): Result<CandumpFrame> {
  if (typeof line !== 'string') return refuse('line is not a string');
  const parts = line.trim().split(/\s+/);
  if (parts.length < 3 || parts.length > 4) return refuse(`expected "(seconds.micros) iface ID#DATA", got ${parts.length} fields`);
  const [time, iface, frame, flag] = parts;
  const tm = TIME.exec(time);
  if (!tm) return refuse(`timestamp "${time}" is not (seconds.microseconds) with 6 digits of microseconds`);
  if (!IFACE.test(iface)) return refuse(`interface name "${iface}" is not valid`);
  if (frame.includes('##')) return refuse('CAN FD frame (ID##FLAGS DATA): J1939 here is classic CAN only');
  const hash = frame.indexOf('#');
  if (hash < 0) return refuse(`frame "${frame}" has no "#" between identifier and data`);
  const idText = frame.slice(0, hash);
  const dataText = frame.slice(hash + 1);
  if (/^[0-9A-Fa-f]{3}$/.test(idText)) return refuse(`identifier ${idText} is an 11-bit standard identifier, not J1939`);
  if (!/^[0-9A-Fa-f]{8}$/.test(idText)) return refuse(`identifier "${idText}" is neither 3 nor 8 hex digits`);
  const raw = parseInt(idText, 16);
  if (raw > MAX_29_BIT) return refuse(`identifier ${idText} has bits above the 29th (error frame or flags), not a J1939 frame`);
  if (/^R/i.test(dataText)) return refuse('remote (RTR) frame carries no data');
  if (!DATA.test(dataText)) return refuse(`data "${dataText}" is not 0 to 8 bytes of hex`);
  if (flag !== undefined && flag !== 'T' && flag !== 'R') return refuse(`unexpected trailing field "${flag}"`);
  const tUs = Number(tm[1]) * 1_000_000 + Number(tm[2]);
  if (!Number.isSafeInteger(tUs)) return refuse(`timestamp ${time} is too large to keep its microseconds exactly`);
  const parsed: CandumpFrame = { tUs, t: tUs / 1000, iface, id: idText.toUpperCase(), data: dataText.toUpperCase() };
  if (flag) parsed.direction = flag;
  return accept(parsed);
}

export interface CandumpLogResult {
  frames: CandumpFrame[];
  /** lines that could not be read, numbered from 1 */
  refused: { line: number; text: string; reason: string }[];
}

/** Parses a whole log; blank lines are skipped, every other unreadable line is refused with its reason. */
export function parseCandumpLog(text: string): CandumpLogResult {
  const result: CandumpLogResult = { frames: [], refused: [] };
  text.split(/\r?\n/).forEach((lineText, i) => {
    if (lineText.trim() === '') return;
    const r = parseCandumpLine(lineText);
    if (r.ok) result.frames.push(r.value);
    else result.refused.push({ line: i + 1, text: lineText, reason: r.reason });
  });
  return result;
}

export interface CandumpFrameInput {
  /** capture time, epoch ms (a fraction keeps microseconds); ignored when tUs is given */
  t?: number;
  /** capture time, whole epoch microseconds */
  tUs?: number;
  iface: string;
  id: string;
  data: string;
}

/** Writes one frame as a candump -L line; throws RangeError on bad fields. */
export function formatCandumpLine(frame: CandumpFrameInput): string {
  const tUs = frame.tUs ?? (typeof frame.t === 'number' ? Math.round(frame.t * 1000) : NaN);
  if (!Number.isSafeInteger(tUs) || tUs < 0 || tUs >= 1e16) throw new RangeError(`capture time ${frame.tUs ?? frame.t} is not a valid epoch time`);
  if (!IFACE.test(frame.iface)) throw new RangeError(`interface name "${frame.iface}" is not valid`);
  if (!/^[0-9A-Fa-f]{8}$/.test(frame.id) || parseInt(frame.id, 16) > MAX_29_BIT) {
    throw new RangeError(`identifier "${frame.id}" is not 8 hex digits within 29 bits`);
  }
  if (!DATA.test(frame.data)) throw new RangeError(`data "${frame.data}" is not 0 to 8 bytes of hex`);
  const seconds = Math.floor(tUs / 1_000_000);
  const micros = tUs % 1_000_000;
  // can-utils prints the seconds zero-padded to 10 digits (from memory).
  const time = `(${String(seconds).padStart(10, '0')}.${String(micros).padStart(6, '0')})`;
  return `${time} ${frame.iface} ${frame.id.toUpperCase()}#${frame.data.toUpperCase()}`;
}
