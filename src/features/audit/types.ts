import { z } from 'zod';

export const AuditEntrySchema = z.object({
  id: z.number(),
  at: z.string(),
  actor: z.object({ id: z.union([z.number(), z.string()]), email: z.string() }).nullable(),
  action: z.string(),
  target: z.string().nullable(),
  details: z.unknown(),
});
export type AuditEntry = z.infer<typeof AuditEntrySchema>;
