// Fleet history with filters and server-side paging and sorting (GET /api/history/episodes|faults).
import { z } from 'zod';
import { UnitIdSchema } from './units';
import { OUTCOMES } from './history';

export const IsoTimeParam = z
  .string()
  .refine((s) => !Number.isNaN(Date.parse(s)), 'must be an ISO 8601 time')
  .transform((s) => new Date(s));

/** Columns the server may sort by; each maps to one SQL expression on the server (a whitelist). */
export const EPISODE_SORTS = ['keyOffAt', 'unitId', 'depot', 'driver', 'outcome', 'secondsIntoPurge', 'ambientC', 'freezeExposure'] as const;
export const FAULT_SORTS = ['at', 'unitId', 'depot', 'driver', 'spn', 'fmi'] as const;
export type EpisodeSort = (typeof EPISODE_SORTS)[number];
export type FaultSort = (typeof FAULT_SORTS)[number];

export const MAX_PAGE_SIZE = 500;

const Filters = {
  depot: z.string().trim().min(1).max(120).optional(),
  unitId: UnitIdSchema.optional(),
  driverId: z.coerce.number().int().positive().optional(),
  from: IsoTimeParam.optional(),
  to: IsoTimeParam.optional(),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).max(1_000_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(50),
};

const rangeOk = (q: { from?: Date; to?: Date }) => !q.from || !q.to || q.from < q.to;
const rangeMessage = { message: 'from must be before to', path: ['to'] };

export const HistoryEpisodeQuerySchema = z
  .object({
    ...Filters,
    outcome: z.enum(OUTCOMES, { message: `must be one of ${OUTCOMES.join(', ')}` }).optional(),
    sort: z.enum(EPISODE_SORTS, { message: `must be one of ${EPISODE_SORTS.join(', ')}` }).default('keyOffAt'),
  })
  .refine(rangeOk, rangeMessage);
export type HistoryEpisodeQuery = z.infer<typeof HistoryEpisodeQuerySchema>;

export const HistoryFaultQuerySchema = z
  .object({
    ...Filters,
    /** 'yes': only faults explained by an interrupted purge; 'no': only the others. */
    linked: z.enum(['yes', 'no']).optional(),
    sort: z.enum(FAULT_SORTS, { message: `must be one of ${FAULT_SORTS.join(', ')}` }).default('at'),
  })
  .refine(rangeOk, rangeMessage);
export type HistoryFaultQuery = z.infer<typeof HistoryFaultQuerySchema>;

/** What every history row says of where it happened: the unit, its depot now, and its driver then. */
const RowPlaceFields = {
  id: z.number(),
  unitId: z.string(),
  unitName: z.string(),
  depot: z.string(),
  driverId: z.number().nullable(),
  driverName: z.string().nullable(),
};

export const HistoryEpisodeRowSchema = z.object({
  ...RowPlaceFields,
  keyOffAt: z.string(),
  purgeSeconds: z.number(),
  outcome: z.string(),
  settledBy: z.string().nullable(),
  endedAt: z.string().nullable(),
  secondsIntoPurge: z.number().nullable(),
  ambientC: z.number().nullable(),
  minAmbientAfterC: z.number().nullable(),
  freezeExposure: z.string().nullable(),
  faultCount: z.number(),
});
export type HistoryEpisodeRow = z.infer<typeof HistoryEpisodeRowSchema>;

export const HistoryFaultRowSchema = z.object({
  ...RowPlaceFields,
  at: z.string(),
  sourceAddress: z.number(),
  spn: z.number(),
  fmi: z.number(),
  fmiText: z.string(),
  occurrenceCount: z.number().nullable(),
  episodeId: z.number().nullable(),
});
export type HistoryFaultRow = z.infer<typeof HistoryFaultRowSchema>;

/** `totalCapped`: there are more rows than `total` (the server counts up to a cap). */
export const pageOf = <T extends z.ZodType>(row: T) => z.object({ rows: z.array(row), total: z.number(), totalCapped: z.boolean().optional(), page: z.number(), pageSize: z.number() });
