// Drivers, who drove which unit when, the assignments CSV, and the coaching view.
import { z } from 'zod';
import { UnitIdSchema } from './units';
import { HistoryEpisodeRowSchema } from './history-query';
import { ReportFiguresSchema, TrendRowSchema } from './reports';

export const DriverCodeSchema = z.string().trim().regex(/^[A-Za-z0-9][A-Za-z0-9_-]{0,31}$/, 'must be 1–32 letters, digits, _ or -');
export const DriverNameSchema = z.string().trim().min(1, 'must not be empty').max(200);

/** An instant with its zone, so a roster written anywhere means one moment ("2026-11-23T06:00:00Z", "…+01:00"). */
export const ZonedTimeSchema = z
  .string()
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?(Z|[+-]\d{2}:\d{2})$/, 'must be a date and time with its zone, e.g. 2026-11-23T06:00:00Z')
  .refine((s) => !Number.isNaN(Date.parse(s.replace(' ', 'T'))), 'is not a real date and time')
  .transform((s) => new Date(s.replace(' ', 'T')));

export const DriverCreateSchema = z.object({ code: DriverCodeSchema, name: DriverNameSchema, depot: z.string().trim().min(1).max(100).nullable().optional() });
export const DriverUpdateSchema = z.object({ name: DriverNameSchema.optional(), depot: z.string().trim().min(1).max(100).nullable().optional(), active: z.boolean().optional() });

export const DriverSchema = z.object({ id: z.number(), code: z.string(), name: z.string(), depot: z.string().nullable(), active: z.boolean() });
export type Driver = z.infer<typeof DriverSchema>;

export const AssignmentCreateSchema = z
  .object({ driverId: z.number().int().positive(), unitId: UnitIdSchema, from: ZonedTimeSchema, to: ZonedTimeSchema.nullable().optional() })
  .refine((a) => !a.to || a.to > a.from, { message: 'must be after from', path: ['to'] });

export const AssignmentQuerySchema = z.object({ unitId: UnitIdSchema.optional(), driverId: z.coerce.number().int().positive().optional() });

export const AssignmentSchema = z.object({
  id: z.number(), driverId: z.number(), driverCode: z.string(), driverName: z.string(), unitId: z.string(), from: z.string(), to: z.string().nullable(),
});
export type Assignment = z.infer<typeof AssignmentSchema>;

/** The assignments CSV: these columns, a header row, one assignment per row (driver_name only needed for a new driver). */
export const ASSIGNMENT_CSV_COLUMNS = ['driver_code', 'driver_name', 'unit_id', 'from', 'to'] as const;
export const MAX_IMPORT_ROWS = 5000;
/** The template offered for download: the header and two invented example rows (the second, an open-ended assignment of a driver on file). */
export const ASSIGNMENT_TEMPLATE =
  [ASSIGNMENT_CSV_COLUMNS.join(','), 'D-104,Example Driver,NORTH-07,2026-11-23T05:30:00Z,2026-11-23T16:00:00Z', 'D-104,,NORTH-07,2026-11-24T05:30:00Z,'].join('\r\n') + '\r\n';

export const AssignmentImportSchema = z.object({
  csv: z.string().min(1, 'the file is empty').max(900_000, 'the file is larger than 900 kB'),
  /** false: check and show the preview only; true: write every row, or none if any row has an error. */
  commit: z.boolean().default(false),
});

export const ImportRowSchema = z.object({
  line: z.number(),
  driverCode: z.string(),
  driverName: z.string(),
  unitId: z.string(),
  from: z.string(),
  to: z.string(),
  newDriver: z.boolean(),
  errors: z.array(z.object({ column: z.string(), message: z.string() })),
});
export type ImportRow = z.infer<typeof ImportRowSchema>;
export const ImportPreviewSchema = z.object({ rows: z.array(ImportRowSchema), errorCount: z.number(), committed: z.boolean(), created: z.number() });
export type ImportPreview = z.infer<typeof ImportPreviewSchema>;

export const CoachingQuerySchema = z.object({ weeks: z.coerce.number().int().min(1).max(52).default(8) });
export const CoachingSchema = z.object({
  driver: DriverSchema,
  totals: ReportFiguresSchema,
  trend: z.array(TrendRowSchema),
  lastEvents: z.array(HistoryEpisodeRowSchema),
});
export type Coaching = z.infer<typeof CoachingSchema>;
