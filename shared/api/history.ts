import { z } from 'zod';
import { UnitIdSchema } from './units';

export const OUTCOMES = ['pending', 'completed', 'interrupted', 'resumed', 'undetermined'] as const;
export const SETTLED_BY = ['powerHeld', 'ecmAsleep', 'supplyLost', 'lowVoltage', 'bootRecord', 'keyOn'] as const;

const IsoTime = z
  .string()
  .refine((s) => !Number.isNaN(Date.parse(s)), 'must be an ISO 8601 time')
  .transform((s) => new Date(s));

const Range = {
  unitId: UnitIdSchema.optional(),
  from: IsoTime.optional(),
  to: IsoTime.optional(),
  limit: z.coerce.number().int().min(1).max(100_000).default(10_000),
  offset: z.coerce.number().int().min(0).default(0),
};

export const EpisodeQuerySchema = z.object({
  ...Range,
  outcome: z.enum(OUTCOMES, { message: `must be one of ${OUTCOMES.join(', ')}` }).optional(),
});
export type EpisodeQuery = z.infer<typeof EpisodeQuerySchema>;

export const FaultQuerySchema = z.object({ ...Range, episodeId: z.coerce.number().int().positive().optional() });
export type FaultQuery = z.infer<typeof FaultQuerySchema>;
