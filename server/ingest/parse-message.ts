// Validation of one gateway payload against the protocol's schemas: a clear reason for anything refused.
import type { z } from 'zod';
import { CanSchema, PowerSchema, StatusSchema, TelemetrySchema, type StatusMessage } from '../../shared/protocol/messages';
import type { UnitEvent } from '../detection/types';
import type { CanFrame } from '../../shared/protocol/messages';

type EventWithoutStream = UnitEvent extends infer E ? (E extends UnitEvent ? Omit<E, 'stream'> : never) : never;

const utf8 = new TextDecoder('utf-8', { fatal: true });

export type Parsed =
  | { ok: true; kind: 'status'; status: StatusMessage }
  | { ok: true; kind: 'telemetry' | 'can' | 'power'; boot: number; seq: number; ts: number; payload: Record<string, unknown>; event: EventWithoutStream; frames: CanFrame[] | null }
  | { ok: false; reason: string };

const SCHEMAS = { telemetry: TelemetrySchema, can: CanSchema, power: PowerSchema, status: StatusSchema } as const;

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
  const result = SCHEMAS[kind].safeParse(json);
  if (!result.success) return { ok: false, reason: `invalid ${kind}: ${describe(result.error)}` };
  if (kind === 'status') return { ok: true, kind, status: result.data as StatusMessage };
  const m = result.data as z.infer<typeof TelemetrySchema> | z.infer<typeof CanSchema> | z.infer<typeof PowerSchema>;
  const ts = Date.parse(m.ts);
  const base = { boot: m.boot, seq: m.seq, ts };
  let event: EventWithoutStream;
  let frames: CanFrame[] | null = null;
  if ('key' in m) event = { kind: 'telemetry', ...base, key: m.key, supplyV: m.supplyV, ambientC: m.ambientC, ecmAwake: m.ecmAwake };
  else if ('frames' in m) {
    event = { kind: 'can', ...base };
    frames = m.frames.map((f) => ({ t: f.t, id: f.id.toUpperCase(), data: f.data.toUpperCase() }));
  } else {
    const prev = m.prevShutdown ? { ts: Date.parse(m.prevShutdown.ts), cause: m.prevShutdown.cause } : null;
    event = { kind: 'power', ...base, event: m.event, supplyV: m.supplyV, prevShutdown: prev };
  }
  return { ok: true, kind: kind as 'telemetry' | 'can' | 'power', ...base, payload: m as Record<string, unknown>, event, frames };
}

/** What the quarantine keeps of a refused payload: enough to recognise it, never the whole of a hostile one. */
export function excerptOf(raw: Buffer): string {
  const s = raw.subarray(0, 512).toString('utf8').replace(/\u0000/g, '\\0');
  return raw.length > 512 ? `${s}… (${raw.length} bytes)` : s;
}
