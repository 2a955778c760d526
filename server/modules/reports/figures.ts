// The report's figures for any grouping of episodes in a time range, in one SQL pass.
import { QueryTypes, type Sequelize } from 'sequelize';
import { driverAt, Where } from '../history/sql-builder';

export interface FigureRecord {
  key_offs: string; interrupted: string; median_s: number | null; freeze_exposures: string; faults_explained: string;
  [k: string]: unknown;
}

/** Groupings the report uses; the SQL of each is fixed here. */
const GROUPS = {
  total: { select: '', group: '' },
  depot: { select: 'depot,', group: 'GROUP BY depot' },
  unit: { select: 'unit_id, unit_name, depot,', group: 'GROUP BY unit_id, unit_name, depot' },
  driver: { select: 'driver_id, driver_name,', group: 'GROUP BY driver_id, driver_name' },
  // date_trunc('week') is the ISO Monday; the episodes' instants are read in UTC.
  week: { select: `(date_trunc('week', key_off_at AT TIME ZONE 'UTC') AT TIME ZONE 'UTC') AS week_start,`, group: 'GROUP BY week_start' },
} as const;
export type Grouping = keyof typeof GROUPS;

export async function figures(sequelize: Sequelize, by: Grouping, range: { from: number; to: number; depot?: string; driverId?: number }) {
  const w = new Where();
  w.add('e.key_off_at >= ?', new Date(range.from).toISOString()).add('e.key_off_at < ?', new Date(range.to).toISOString());
  if (range.depot) w.add('u.depot = ?', range.depot);
  if (range.driverId) w.add('d.id = ?', range.driverId);
  const g = GROUPS[by];
  return sequelize.query<FigureRecord>(
    `WITH ep AS (
       SELECT e.unit_id, u.name AS unit_name, u.depot, d.id AS driver_id, d.name AS driver_name, e.key_off_at, e.outcome,
              e.seconds_into_purge, e.freeze_exposure, (SELECT count(*) FROM faults f WHERE f.episode_id = e.id) AS faults
       FROM episodes e JOIN units u ON u.id = e.unit_id ${driverAt('e.unit_id', 'e.key_off_at')}
       ${w.sql})
     SELECT ${g.select} count(*) AS key_offs,
            count(*) FILTER (WHERE outcome = 'interrupted') AS interrupted,
            percentile_cont(0.5) WITHIN GROUP (ORDER BY seconds_into_purge) FILTER (WHERE outcome = 'interrupted') AS median_s,
            count(*) FILTER (WHERE outcome = 'interrupted' AND freeze_exposure IN ('atRisk', 'frozen')) AS freeze_exposures,
            coalesce(sum(faults), 0) AS faults_explained
     FROM ep ${g.group}`,
    { bind: w.bind, type: QueryTypes.SELECT },
  );
}

export function presentFigures(r: FigureRecord) {
  const keyOffs = Number(r.key_offs);
  const interrupted = Number(r.interrupted);
  return {
    keyOffs,
    interrupted,
    shareInterrupted: keyOffs ? interrupted / keyOffs : null,
    medianSecondsIntoPurge: r.median_s === null ? null : Number(r.median_s),
    freezeExposures: Number(r.freeze_exposures),
    faultsExplained: Number(r.faults_explained),
  };
}

/** Repeat offenders first: most interruptions, then the higher share, then the name. */
export const worstFirst = <T extends { interrupted: number; shareInterrupted: number | null }>(rows: T[], name: (r: T) => string) =>
  rows.sort((a, b) => b.interrupted - a.interrupted || (b.shareInterrupted ?? 0) - (a.shareInterrupted ?? 0) || name(a).localeCompare(name(b)));
