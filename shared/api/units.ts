import { z } from 'zod';
import { GATEWAY_ID_PATTERN, MAX_PURGE_SECONDS, MIN_PURGE_SECONDS } from '../protocol/limits';

export const UNIT_STATES = ['keyOn', 'purging', 'safeToIsolate', 'isolated', 'interrupted', 'noContact'] as const;
export type UnitStateName = (typeof UNIT_STATES)[number];

export const UnitIdSchema = z.string().regex(GATEWAY_ID_PATTERN, 'must be 1–64 letters, digits, _ or -, starting with a letter or digit');
export const GatewayIdSchema = UnitIdSchema;

// SPNs are 19-bit numbers (SAE J1939-73).
const Spn = z.number().int().min(0).max(524287);

export const UnitProfileFields = {
  name: z.string().trim().min(1).max(120),
  depot: z.string().trim().min(1).max(120),
  systemVoltage: z.union([z.literal(12), z.literal(24)]),
  purgeSeconds: z.number().int().min(MIN_PURGE_SECONDS).max(MAX_PURGE_SECONDS),
  lossThresholdV: z.number().finite().positive().max(30),
  linkSpns: z.array(Spn).max(100).nullable(),
};

export const UnitCreateSchema = z.object({
  id: UnitIdSchema,
  name: UnitProfileFields.name,
  depot: UnitProfileFields.depot,
  systemVoltage: UnitProfileFields.systemVoltage,
  purgeSeconds: UnitProfileFields.purgeSeconds.optional(),
  lossThresholdV: UnitProfileFields.lossThresholdV.optional(),
  linkSpns: UnitProfileFields.linkSpns.optional(),
});
export type UnitCreate = z.infer<typeof UnitCreateSchema>;

export const UnitUpdateSchema = z.object(UnitProfileFields).partial().strict();
export type UnitUpdate = z.infer<typeof UnitUpdateSchema>;

export const GatewayCreateSchema = z.object({ gatewayId: GatewayIdSchema, unitId: UnitIdSchema });
