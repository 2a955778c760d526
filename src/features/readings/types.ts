import { z } from 'zod';

// GET /api/units/:id/readings and /timeline (server/modules/readings).
export const ReadingSchema = z.object({ ts: z.string(), supplyV: z.number(), ambientC: z.number().nullable(), key: z.enum(['on', 'off']) });
export type Reading = z.infer<typeof ReadingSchema>;
export const ReadingListSchema = z.array(ReadingSchema);

export const TIMELINE_KINDS = ['keyOn', 'keyOff', 'supplyLost', 'supplyRestored', 'boot', 'online', 'offline'] as const;
export const TimelineEntrySchema = z.object({ at: z.string(), kind: z.enum(TIMELINE_KINDS), detail: z.string().nullable() });
export type TimelineEntry = z.infer<typeof TimelineEntrySchema>;
export const TimelineSchema = z.array(TimelineEntrySchema);
