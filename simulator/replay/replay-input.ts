import { readFile } from 'node:fs/promises';
import { z } from 'zod';
import { parseCandumpLog } from '../../shared/j1939/candump';
import { TimestampSchema } from '../../shared/protocol/messages';

// What a replay reads: a can-utils `candump -L` log and a JSON-lines file of the gateway's own
// readings. Each JSON line is a telemetry sample or a power event, without boot and seq (the
// replay numbers them; any boot/seq given is ignored):
//   {"ts":"2026-11-27T17:02:11.250Z","key":"off","supplyV":12.61,"ambientC":-8.5,"ecmAwake":true}
//   {"ts":"2026-11-27T17:03:02.020Z","event":"supply-lost","supplyV":2.4}
// A "boot" event starts a new boot of the gateway (its prevShutdown is passed on as given).

export const ReplayTelemetrySchema = z.object({
  ts: TimestampSchema,
  key: z.enum(['on', 'off']),
  supplyV: z.number().finite(),
  ambientC: z.number().finite().min(-100).max(100).nullable().optional(),
  ecmAwake: z.boolean(),
});
export const ReplayPowerSchema = z.object({
  ts: TimestampSchema,
  event: z.enum(['supply-lost', 'supply-restored', 'boot']),
  supplyV: z.number().finite(),
  prevShutdown: z.object({ ts: TimestampSchema, cause: z.enum(['supply-lost', 'sleep', 'watchdog', 'unknown']) }).nullable().optional(),
});

export type ReplayLine =
  | { kind: 'telemetry'; t: number; body: z.infer<typeof ReplayTelemetrySchema> }
  | { kind: 'power'; t: number; body: z.infer<typeof ReplayPowerSchema> }
  | { kind: 'frame'; t: number; id: string; data: string };

async function readText(path: string, what: string): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch (err) {
    throw new Error(`cannot read the ${what} ${path}: ${(err as Error).message}`);
  }
}

export async function readCandump(path: string): Promise<ReplayLine[]> {
  const log = parseCandumpLog(await readText(path, 'candump log'));
  if (log.refused.length > 0) {
    const first = log.refused.slice(0, 3).map((r) => `line ${r.line}: ${r.reason}`).join('; ');
    throw new Error(`${path}: ${log.refused.length} line(s) are not candump -L frames (${first})`);
  }
  // The protocol's `t` keeps milliseconds: microseconds are cut, not rounded, so order is kept.
  return log.frames.map((f) => ({ kind: 'frame', t: Math.floor(f.tUs / 1000), id: f.id, data: f.data }));
}

export async function readTelemetryLines(path: string): Promise<ReplayLine[]> {
  const out: ReplayLine[] = [];
  const lines = (await readText(path, 'telemetry file')).split(/\r?\n/);
  lines.forEach((text, i) => {
    if (text.trim() === '') return;
    let json: unknown;
    try {
      json = JSON.parse(text);
    } catch {
      throw new Error(`${path} line ${i + 1}: not JSON`);
    }
    const isPower = typeof json === 'object' && json !== null && 'event' in json;
    const parsed = (isPower ? ReplayPowerSchema : ReplayTelemetrySchema).safeParse(json);
    if (!parsed.success) {
      throw new Error(`${path} line ${i + 1}: ${parsed.error.issues.map((x) => `${x.path.join('.') || 'line'} ${x.message}`).join('; ')}`);
    }
    const t = Date.parse(parsed.data.ts);
    out.push(isPower ? { kind: 'power', t, body: parsed.data as z.infer<typeof ReplayPowerSchema> } : { kind: 'telemetry', t, body: parsed.data as z.infer<typeof ReplayTelemetrySchema> });
  });
  return out;
}
