// Battery drain while parked with the isolator closed: per unit, its parks and an advice.
import { z } from 'zod';
import { UnitIdSchema } from './units';

export const BatteryQuerySchema = z.object({
  days: z.coerce.number().int().min(1).max(93).default(14),
  depot: z.string().trim().min(1).max(120).optional(),
});
export const BatteryUnitParamSchema = UnitIdSchema;

const Estimate = z.object({
  restedReadings: z.number(),
  voltsPerHour: z.number(),
  interceptV: z.number(),
  socFirst: z.number(),
  socLast: z.number(),
  drainPctPerHour: z.number(),
  projectedSocAfterWeekend: z.number(),
});

export const ParkSchema = z.object({
  chargeStoppedAt: z.string(),
  lastAt: z.string(),
  endedBy: z.enum(['keyOn', 'supplyLost', 'boot', 'gap', 'open']),
  hours: z.number(),
  readings: z.array(z.object({ ts: z.string(), volts: z.number(), soc: z.number(), rested: z.boolean() })),
  estimate: Estimate.nullable(),
});
export type Park = z.infer<typeof ParkSchema>;

export const BatteryAdviceSchema = z.enum(['safeOverWeekend', 'drainTooHigh', 'notEnoughData']);

export const BatterySummarySchema = z.object({
  unitId: z.string(),
  name: z.string(),
  depot: z.string(),
  systemVoltage: z.union([z.literal(12), z.literal(24)]),
  parks: z.number(),
  analysed: z.number(),
  latestDrainPctPerHour: z.number().nullable(),
  worstProjectedSoc: z.number().nullable(),
  advice: BatteryAdviceSchema,
  adviceText: z.string(),
});
export type BatterySummary = z.infer<typeof BatterySummarySchema>;

export const BatteryUnitSchema = z.object({
  summary: BatterySummarySchema,
  restHours: z.number(),
  weekendHours: z.number(),
  minWeekendSoc: z.number(),
  parks: z.array(ParkSchema),
});
export type BatteryUnit = z.infer<typeof BatteryUnitSchema>;
