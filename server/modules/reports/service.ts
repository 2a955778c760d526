// The weekly report: one week by depot, unit and driver, a trend over the weeks before it, and the repeat offenders.
import type { Sequelize } from 'sequelize';
import { isoWeekLabel, isoWeekStart, type ReportQuery, type WeeklyReport } from '../../../shared/api/reports';
import { figures, presentFigures, worstFirst, type FigureRecord } from './figures';

const WEEK = 7 * 86_400_000;

const unitRow = (r: FigureRecord) => ({ unitId: String(r.unit_id), unitName: String(r.unit_name), depot: String(r.depot), ...presentFigures(r) });
const driverRow = (r: FigureRecord) => ({ driverId: r.driver_id === null ? null : Number(r.driver_id), driverName: (r.driver_name as string | null) ?? null, ...presentFigures(r) });

export async function weeklyReport(sequelize: Sequelize, q: ReportQuery, now = Date.now()): Promise<WeeklyReport> {
  const week = q.week ?? isoWeekLabel(now);
  const start = isoWeekStart(week)!;
  const end = start + WEEK;
  const trendFrom = start - (q.weeks - 1) * WEEK;
  const range = { from: start, to: end, depot: q.depot };
  const span = { from: trendFrom, to: end, depot: q.depot };
  const [total, depots, units, drivers, weeks, spanUnits, spanDrivers] = await Promise.all([
    figures(sequelize, 'total', range),
    figures(sequelize, 'depot', range),
    figures(sequelize, 'unit', range),
    figures(sequelize, 'driver', range),
    figures(sequelize, 'week', span),
    figures(sequelize, 'unit', span),
    figures(sequelize, 'driver', span),
  ]);
  const byWeek = new Map(weeks.map((r) => [new Date(r.week_start as Date).getTime(), r]));
  const empty: FigureRecord = { key_offs: '0', interrupted: '0', median_s: null, freeze_exposures: '0', faults_explained: '0' };
  const trend = Array.from({ length: q.weeks }, (_, i) => {
    const ws = trendFrom + i * WEEK;
    return { week: isoWeekLabel(ws), weekStart: new Date(ws).toISOString(), ...presentFigures(byWeek.get(ws) ?? empty) };
  });
  const offenders = <T extends { interrupted: number }>(rows: T[]) => rows.filter((r) => r.interrupted >= 2).slice(0, 10);
  return {
    week,
    weekStart: new Date(start).toISOString(),
    weekEnd: new Date(end).toISOString(),
    depot: q.depot ?? null,
    total: presentFigures(total[0] ?? empty),
    byDepot: worstFirst(depots.map((r) => ({ depot: String(r.depot), ...presentFigures(r) })), (r) => r.depot),
    byUnit: worstFirst(units.map(unitRow), (r) => r.unitId),
    byDriver: worstFirst(drivers.map(driverRow), (r) => r.driverName ?? ''),
    trend,
    repeatOffenders: {
      units: offenders(worstFirst(spanUnits.map(unitRow), (r) => r.unitId)),
      drivers: offenders(worstFirst(spanDrivers.map(driverRow).filter((r) => r.driverId !== null), (r) => r.driverName ?? '')),
    },
  };
}
