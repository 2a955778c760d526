import { z } from 'zod';
import { MAX_FRAMES_PER_MESSAGE, TS_PATTERN } from './limits';

// The payloads of gateway protocol version 1. Unknown extra fields are ignored (zod strips them).
export const TimestampSchema = z
  .string()
  .regex(TS_PATTERN, 'must be ISO 8601 UTC with milliseconds, YYYY-MM-DDTHH:MM:SS.mmmZ')
  .refine((s) => !Number.isNaN(Date.parse(s)) && new Date(s).toISOString() === s, 'is not a real date and time');

const Counter = z.number().int().nonnegative().max(Number.MAX_SAFE_INTEGER);
/** Bounds of the numbers (a sanity range, not the trade's: a reading outside is a broken sensor or a hostile payload). */
export const SUPPLY_V_LIMIT = 1000;
export const AMBIENT_C_LIMIT = 100;
export const CAN_ID_PATTERN = /^[0-9A-Fa-f]{8}$/;
export const CAN_DATA_PATTERN = /^(?:[0-9A-Fa-f]{2}){0,8}$/;
const Volts = z.number().finite().min(-SUPPLY_V_LIMIT).max(SUPPLY_V_LIMIT);

export const CommonFieldsSchema = z.object({ boot: Counter, seq: Counter, ts: TimestampSchema });

export const TelemetrySchema = CommonFieldsSchema.extend({
  key: z.enum(['on', 'off']),
  supplyV: Volts,
  ambientC: z.number().finite().min(-AMBIENT_C_LIMIT).max(AMBIENT_C_LIMIT).nullable().optional().transform((v) => v ?? null),
  ecmAwake: z.boolean(),
});
export type Telemetry = z.infer<typeof TelemetrySchema>;

export const CanFrameSchema = z.object({
  t: TimestampSchema,
  id: z.string().regex(CAN_ID_PATTERN, 'must be 8 hex digits'),
  data: z.string().regex(CAN_DATA_PATTERN, 'must be 0 to 8 bytes as hex'),
});
export type CanFrame = z.infer<typeof CanFrameSchema>;

export const CanSchema = CommonFieldsSchema.extend({
  frames: z.array(CanFrameSchema).max(MAX_FRAMES_PER_MESSAGE),
});
export type CanMessage = z.infer<typeof CanSchema>;

export const ShutdownCauseSchema = z.enum(['supply-lost', 'sleep', 'watchdog', 'unknown']);
export type ShutdownCause = z.infer<typeof ShutdownCauseSchema>;

export const PowerSchema = CommonFieldsSchema.extend({
  event: z.enum(['supply-lost', 'supply-restored', 'boot']),
  supplyV: Volts,
  prevShutdown: z
    .object({ ts: TimestampSchema, cause: ShutdownCauseSchema })
    .nullable()
    .optional()
    .transform((v) => v ?? null),
});
export type PowerMessage = z.infer<typeof PowerSchema>;

export const StatusSchema = z.object({
  state: z.enum(['online', 'offline']),
  boot: Counter.optional(),
});
export type StatusMessage = z.infer<typeof StatusSchema>;

export const IndicatorSchema = z.discriminatedUnion('state', [
  z.object({ state: z.literal('hold'), ts: TimestampSchema, remainingS: z.number().int().nonnegative().optional() }),
  z.object({ state: z.literal('clear'), ts: TimestampSchema }),
  z.object({ state: z.literal('dark'), ts: TimestampSchema }),
]);
export type IndicatorMessage = z.infer<typeof IndicatorSchema>;
