// The common case of validation without zod's machinery: plain checks that accept a payload only where the
// protocol's zod schemas (shared/protocol/messages.ts) accept it, and build the same stripped value. Anything
// they do not accept (null) goes to zod, which decides and gives the reason, so a refusal always reads the same.
// tests/server/ingest/fast-check.test.ts holds the two to agreement over valid, edge and hostile payloads.
import { MAX_FRAMES_PER_MESSAGE } from '../../shared/protocol/limits';
import {
  AMBIENT_C_LIMIT, CAN_DATA_PATTERN, CAN_ID_PATTERN, PowerSchema, ShutdownCauseSchema, SUPPLY_V_LIMIT,
  type CanMessage, type PowerMessage, type Telemetry,
} from '../../shared/protocol/messages';

type Obj = Record<string, unknown>;

const isCounter = (v: unknown): v is number => typeof v === 'number' && Number.isSafeInteger(v) && v >= 0;
const isVolts = (v: unknown): v is number => typeof v === 'number' && v >= -SUPPLY_V_LIMIT && v <= SUPPLY_V_LIMIT;

const DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
const leap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
const digits = (s: string, from: number, n: number) => {
  let v = 0;
  for (let i = from; i < from + n; i++) {
    const c = s.charCodeAt(i) - 48;
    if (c < 0 || c > 9) return -1;
    v = v * 10 + c;
  }
  return v;
};

/**
 * The protocol's timestamp, YYYY-MM-DDTHH:MM:SS.mmmZ and a real date and time, read field by field: what
 * zod's pattern and its "prints back the same" check accept (the proleptic Gregorian calendar of JavaScript's Date).
 */
function isTimestamp(v: unknown): v is string {
  if (typeof v !== 'string' || v.length !== 24) return false;
  if (v[4] !== '-' || v[7] !== '-' || v[10] !== 'T' || v[13] !== ':' || v[16] !== ':' || v[19] !== '.' || v[23] !== 'Z') return false;
  const y = digits(v, 0, 4);
  const mo = digits(v, 5, 2);
  const d = digits(v, 8, 2);
  const h = digits(v, 11, 2);
  const mi = digits(v, 14, 2);
  const sec = digits(v, 17, 2);
  const ms = digits(v, 20, 3);
  if (y < 0 || mo < 1 || mo > 12 || d < 1 || h < 0 || h > 23 || mi < 0 || mi > 59 || sec < 0 || sec > 59 || ms < 0) return false;
  return d <= (mo === 2 && leap(y) ? 29 : DAYS[mo - 1]);
}

export function fastTelemetry(m: Obj): Telemetry | null {
  const { boot, seq, ts, key, supplyV, ambientC, ecmAwake } = m;
  if (!isCounter(boot) || !isCounter(seq) || !isTimestamp(ts)) return null;
  if ((key !== 'on' && key !== 'off') || !isVolts(supplyV) || typeof ecmAwake !== 'boolean') return null;
  if (ambientC !== undefined && ambientC !== null && !(typeof ambientC === 'number' && ambientC >= -AMBIENT_C_LIMIT && ambientC <= AMBIENT_C_LIMIT)) return null;
  return { boot, seq, ts, key, supplyV, ambientC: ambientC ?? null, ecmAwake };
}

const SUPPLY_EVENTS = new Set<string>(PowerSchema.shape.event.options);
const CAUSES = new Set<string>(ShutdownCauseSchema.options);

export function fastPower(m: Obj): PowerMessage | null {
  const { boot, seq, ts, event, supplyV, prevShutdown } = m;
  if (!isCounter(boot) || !isCounter(seq) || !isTimestamp(ts)) return null;
  if (typeof event !== 'string' || !SUPPLY_EVENTS.has(event) || !isVolts(supplyV)) return null;
  let prev: PowerMessage['prevShutdown'] = null;
  if (prevShutdown !== undefined && prevShutdown !== null) {
    if (typeof prevShutdown !== 'object' || Array.isArray(prevShutdown)) return null;
    const { ts: at, cause } = prevShutdown as Obj;
    if (!isTimestamp(at) || typeof cause !== 'string' || !CAUSES.has(cause)) return null;
    prev = { ts: at, cause: cause as NonNullable<PowerMessage['prevShutdown']>['cause'] };
  }
  return { boot, seq, ts, event: event as PowerMessage['event'], supplyV, prevShutdown: prev };
}

export function fastCan(m: Obj): CanMessage | null {
  const { boot, seq, ts, frames } = m;
  if (!isCounter(boot) || !isCounter(seq) || !isTimestamp(ts)) return null;
  if (!Array.isArray(frames) || frames.length > MAX_FRAMES_PER_MESSAGE) return null;
  const out: CanMessage['frames'] = [];
  for (const f of frames) {
    if (typeof f !== 'object' || f === null || Array.isArray(f)) return null;
    const { t, id, data } = f as Obj;
    if (!isTimestamp(t) || typeof id !== 'string' || !CAN_ID_PATTERN.test(id) || typeof data !== 'string' || !CAN_DATA_PATTERN.test(data)) return null;
    out.push({ t, id, data });
  }
  return { boot, seq, ts, frames: out };
}
