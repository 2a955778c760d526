import { z } from 'zod';
import { UnitStateSchema } from '../../lib/unit-state';

// GET /api/units and GET /api/units/:id, as the server implements them.
export const UnitSchema = z.object({
  id: z.string(),
  name: z.string(),
  depot: z.string(),
  systemVoltage: z.union([z.literal(12), z.literal(24)]),
  purgeSeconds: z.number().int(),
  lossThresholdV: z.number(),
  linkSpns: z.array(z.number().int()).nullable(),
  gatewayId: z.string().nullable(),
  state: UnitStateSchema.nullable(),
  stateSince: z.string().nullable(),
  purgeRemainingS: z.number().nullable(),
  lastSupplyV: z.number().nullable(),
  lastAmbientC: z.number().nullable(),
  lastSeenAt: z.string().nullable(),
});
/** `receivedAt`: when the browser received these values (fetch or live delta), for the purge countdown. */
export type Unit = z.infer<typeof UnitSchema> & { receivedAt?: number };
export const UnitListSchema = z.array(UnitSchema);
