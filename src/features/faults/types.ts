import { z } from 'zod';

// GET /api/faults?unitId=, as the server presents it (server/modules/faults/presenter.ts).
export const FaultSchema = z.object({
  id: z.number(),
  unitId: z.string(),
  at: z.string(),
  sourceAddress: z.number(),
  spn: z.number(),
  fmi: z.number(),
  fmiText: z.string(),
  spnUncertain: z.boolean().optional(),
  occurrenceCount: z.number().nullable(),
  lamps: z.object({ mil: z.string(), redStop: z.string(), amberWarning: z.string(), protect: z.string() }),
  episodeId: z.number().nullable(),
});
export type Fault = z.infer<typeof FaultSchema>;
export const FaultListSchema = z.array(FaultSchema);
