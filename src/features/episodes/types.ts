import { z } from 'zod';

// GET /api/episodes?unitId=, as the server presents it (server/modules/episodes/presenter.ts).
export const EpisodeSchema = z.object({
  id: z.number(),
  unitId: z.string(),
  keyOffAt: z.string(),
  purgeSeconds: z.number(),
  outcome: z.enum(['pending', 'completed', 'interrupted', 'resumed', 'undetermined']),
  endedAt: z.string().nullable(),
  secondsIntoPurge: z.number().nullable(),
  settledBy: z.enum(['powerHeld', 'ecmAsleep', 'supplyLost', 'lowVoltage', 'bootRecord', 'keyOn']).nullable(),
  ambientC: z.number().nullable(),
  minAmbientAfterC: z.number().nullable(),
  freezeExposure: z.string().nullable(),
  evidence: z.object({ stream: z.number(), boot: z.number(), seq: z.number() }).nullable().optional(),
  final: z.boolean().optional(),
});
export type Episode = z.infer<typeof EpisodeSchema>;
export const EpisodeListSchema = z.array(EpisodeSchema);
