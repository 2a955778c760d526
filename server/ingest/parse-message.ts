// Validation of one gateway payload against the protocol's schemas: a clear reason for anything refused.
import type { z } from 'zod';
import { CanSchema, PowerSchema, StatusSchema, TelemetrySchema, type StatusMessage } from '../../shared/protocol/messages';
import type { UnitEvent } from '../detection/types';
import type { CanFrame } from '../../shared/protocol/messages';
import { fastCan, fastPower, fastTelemetry } from './fast-check';

const utf8 = new TextDecoder('utf-8', { fatal: true });

export type Parsed =
  | { ok: true; kind: 'status'; status: StatusMessage }
  /** The event's stream is the gateway's, which the caller knows: 0 here, set by the caller. */
  | { ok: true; kind: 'telemetry' | 'can' | 'power'; boot: number; seq: number; ts: number; payload: Record<string, unknown>; event: UnitEvent; frames: CanFrame[] | null }
  | { ok: false; reason: string };

const SCHEMAS = { telemetry: TelemetrySchema, can: CanSchema, power: PowerSchema, status: StatusSchema } as const;
const FAST = { telemetry: fastTelemetry, can: fastCan, power: fastPower } as const;

function describe(error: z.ZodError): string {
  return error.issues
    .slice(0, 5)
    .map((i) => `${i.path.join('.') || '(payload)'}: ${i.message}`)
    .join('; ');
}

export function parseMessage(kind: keyof typeof SCHEMAS, raw: Buffer): Parsed {
  let text: string;
  try {
    text = utf8.decode(raw);
  } catch {
    return { ok: false, reason: 'payload is not UTF-8' };
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    return { ok: false, reason: `payload is not JSON (${(err as Error).message.slice(0, 120)})` };
  }
  if (typeof json !== 'object' || json === null || Array.isArray(json)) return { ok: false, reason: 'payload is not a JSON object' };
  // The usual payload passes the plain checks; zod decides (and explains) the rest.
  const quick = kind === 'status' ? null : FAST[kind](json as Record<string, unknown>);
  let data: unknown = quick;
  if (quick === null) {
    const result = SCHEMAS[kind].safeParse(json);
    if (!result.success) return { ok: false, reason: `invalid ${kind}: ${describe(result.error)}` };
    data = result.data;
  }
  if (kind === 'status') return { ok: true, kind, status: data as StatusMessage };
  const m = data as z.infer<typeof TelemetrySchema> | z.infer<typeof CanSchema> | z.infer<typeof PowerSchema>;
  const ts = Date.parse(m.ts);
  const { boot, seq } = m;
  let event: UnitEvent;
  let frames: CanFrame[] | null = null;
  if ('key' in m) event = { kind: 'telemetry', stream: 0, boot, seq, ts, key: m.key, supplyV: m.supplyV, ambientC: m.ambientC, ecmAwake: m.ecmAwake };
  else if ('frames' in m) {
    event = { kind: 'can', stream: 0, boot, seq, ts };
    frames = m.frames.map((f) => ({ t: f.t, id: f.id.toUpperCase(), data: f.data.toUpperCase() }));
  } else {
    const prev = m.prevShutdown ? { ts: Date.parse(m.prevShutdown.ts), cause: m.prevShutdown.cause } : null;
    event = { kind: 'power', stream: 0, boot, seq, ts, event: m.event, supplyV: m.supplyV, prevShutdown: prev };
  }
  return { ok: true, kind: kind as 'telemetry' | 'can' | 'power', boot, seq, ts, payload: m as Record<string, unknown>, event, frames };
}

/** What the quarantine keeps of a refused payload: enough to recognise it, never the whole of a hostile one. */
export function excerptOf(raw: Buffer): string {
  const s = raw.subarray(0, 512).toString('utf8').replace(/\u0000/g, '\\0');
  return raw.length > 512 ? `${s}… (${raw.length} bytes)` : s;
}
