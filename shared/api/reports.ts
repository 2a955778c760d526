// The weekly report's query and shape, and ISO 8601 week arithmetic in UTC. Pure, no I/O.
import { z } from 'zod';

const DAY = 86_400_000;

/** ISO 8601 week label ("2026-W49") of an instant, in UTC: the week belongs to the year of its Thursday. */
export function isoWeekLabel(ms: number): string {
  const d = new Date(ms);
  const dayStart = Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate());
  const monIndex = (new Date(dayStart).getUTCDay() + 6) % 7; // Monday 0 … Sunday 6
  const thursday = new Date(dayStart + (3 - monIndex) * DAY);
  const year = thursday.getUTCFullYear();
  const week = 1 + Math.floor((thursday.getTime() - Date.UTC(year, 0, 1)) / (7 * DAY));
  return `${year}-W${String(week).padStart(2, '0')}`;
}

/** Monday 00:00 UTC of an ISO week label, or null if the label names no week ("2026-W53" does not exist). */
export function isoWeekStart(label: string): number | null {
  const m = /^(\d{4})-W(\d{2})$/.exec(label);
  if (!m) return null;
  const year = Number(m[1]);
  const week = Number(m[2]);
  // ISO 8601: 4 January is always in week 1.
  const jan4 = Date.UTC(year, 0, 4);
  const week1Monday = jan4 - ((new Date(jan4).getUTCDay() + 6) % 7) * DAY;
  const start = week1Monday + (week - 1) * 7 * DAY;
  return week >= 1 && isoWeekLabel(start) === label ? start : null;
}

export const IsoWeekSchema = z.string().refine((s) => isoWeekStart(s) !== null, 'must be an ISO week such as 2026-W49');

export const ReportQuerySchema = z.object({
  /** The week reported on; the current UTC week when omitted. */
  week: IsoWeekSchema.optional(),
  /** How many weeks the trend covers, ending with `week`. */
  weeks: z.coerce.number().int().min(1).max(52).default(8),
  depot: z.string().trim().min(1).max(120).optional(),
});
export type ReportQuery = z.infer<typeof ReportQuerySchema>;

export const ReportFiguresSchema = z.object({
  keyOffs: z.number(),
  interrupted: z.number(),
  /** interrupted / keyOffs, 0..1; null with no key-offs. */
  shareInterrupted: z.number().nullable(),
  medianSecondsIntoPurge: z.number().nullable(),
  /** Interrupted purges in the freeze bands atRisk or frozen. */
  freezeExposures: z.number(),
  /** Faults linked to an interrupted purge (protocol rule 10). */
  faultsExplained: z.number(),
});
export type ReportFigures = z.infer<typeof ReportFiguresSchema>;

const Row = <T extends z.ZodRawShape>(key: T) => ReportFiguresSchema.extend(key);
export const DepotRowSchema = Row({ depot: z.string() });
export const UnitRowSchema = Row({ unitId: z.string(), unitName: z.string(), depot: z.string() });
export const DriverRowSchema = Row({ driverId: z.number().nullable(), driverName: z.string().nullable() });
export const TrendRowSchema = Row({ week: z.string(), weekStart: z.string() });

export const WeeklyReportSchema = z.object({
  week: z.string(),
  weekStart: z.string(),
  weekEnd: z.string(),
  depot: z.string().nullable(),
  total: ReportFiguresSchema,
  byDepot: z.array(DepotRowSchema),
  byUnit: z.array(UnitRowSchema),
  byDriver: z.array(DriverRowSchema),
  trend: z.array(TrendRowSchema),
  /** Over the whole trend span: the most interruptions first, two or more. */
  repeatOffenders: z.object({ units: z.array(UnitRowSchema), drivers: z.array(DriverRowSchema) }),
});
export type WeeklyReport = z.infer<typeof WeeklyReportSchema>;
