// Fleet episodes with filters, whitelisted sorting and paging; the same query feeds the CSV export.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { EpisodeSort, HistoryEpisodeQuery } from '../../../shared/api/history-query';
import { cappedCount, driverAt, Where } from './sql-builder';

export interface HistoryEpisodeRecord {
  id: string; unit_id: string; unit_name: string; depot: string; driver_id: number | null; driver_name: string | null;
  key_off_at: Date; purge_seconds: number; outcome: string; settled_by: string | null; ended_at: Date | null;
  seconds_into_purge: number | null; ambient_c: number | null; min_ambient_after_c: number | null; freeze_exposure: string | null; fault_count: number;
}

// The only SQL that a sort parameter can reach; the schema has already refused anything else.
// `nullable`: the column can be empty. Empty values go last in either direction; a column that is
// never empty needs no NULLS clause, and without one an index can serve the order both ways.
const SORT_SQL: Record<EpisodeSort, { sql: string; nullable: boolean }> = {
  keyOffAt: { sql: 'e.key_off_at', nullable: false },
  unitId: { sql: 'e.unit_id', nullable: false },
  depot: { sql: 'u.depot', nullable: false },
  driver: { sql: 'd.name', nullable: true },
  outcome: { sql: 'e.outcome', nullable: false },
  secondsIntoPurge: { sql: 'e.seconds_into_purge', nullable: true },
  ambientC: { sql: 'e.ambient_c', nullable: true },
  freezeExposure: { sql: 'e.freeze_exposure', nullable: true },
};

type Filters = Omit<HistoryEpisodeQuery, 'page' | 'pageSize' | 'sort' | 'dir'>;

function where(q: Filters) {
  const w = new Where();
  if (q.depot) w.add('u.depot = ?', q.depot);
  if (q.unitId) w.add('e.unit_id = ?', q.unitId);
  if (q.driverId) {
    w.add('d.id = ?', q.driverId);
    // Implied by the line above (a driver drives only units they are assigned to), stated so that
    // the planner can start from that driver's few units instead of every episode in the range.
    w.add('e.unit_id IN (SELECT a.unit_id FROM driver_assignments a WHERE a.driver_id = ?)', q.driverId);
  }
  if (q.outcome) w.add('e.outcome = ?', q.outcome);
  if (q.from) w.add('e.key_off_at >= ?', q.from.toISOString());
  if (q.to) w.add('e.key_off_at < ?', q.to.toISOString());
  return w;
}

const FROM_BASE = `FROM episodes e JOIN units u ON u.id = e.unit_id`;
const FROM = `${FROM_BASE} ${driverAt('e.unit_id', 'e.key_off_at')}`;

/** The pager's total; the driver join is only paid for when the driver is a filter. */
export async function countEpisodes(sequelize: Sequelize, q: Filters) {
  return cappedCount(sequelize, q.driverId ? FROM : FROM_BASE, where(q));
}

/**
 * One page in two steps: the inner query filters, sorts and cuts the page reading only what the
 * filters and the sort need (for a depot's newest episodes, the key-off index and the units); the
 * outer one reads the page's rows, their driver and their fault count. The driver is joined inside
 * only when it filters or sorts.
 */
export async function pageOfEpisodes(sequelize: Sequelize, q: HistoryEpisodeQuery, limit: number, offset: number, transaction?: Transaction) {
  const w = where(q);
  const dir = q.dir === 'asc' ? 'ASC' : 'DESC';
  const sort = SORT_SQL[q.sort];
  const nulls = sort.nullable ? ' NULLS LAST' : '';
  const driverInside = Boolean(q.driverId) || q.sort === 'driver';
  // The id makes the order total, so pages never overlap.
  const page = `SELECT e.id, ${sort.sql} AS sort_key, u.name AS unit_name, u.depot${driverInside ? ', d.id AS driver_id, d.name AS driver_name' : ''}
     ${driverInside ? FROM : FROM_BASE} ${w.sql} ORDER BY ${sort.sql} ${dir}${nulls}, e.id ${dir} LIMIT ${w.param(limit)} OFFSET ${w.param(offset)}`;
  return sequelize.query<HistoryEpisodeRecord>(
    `SELECT e.id, e.unit_id, p.unit_name, p.depot, ${driverInside ? 'p.driver_id, p.driver_name' : 'd.id AS driver_id, d.name AS driver_name'}, e.key_off_at, e.purge_seconds,
            e.outcome, e.settled_by, e.ended_at, e.seconds_into_purge, e.ambient_c, e.min_ambient_after_c, e.freeze_exposure,
            (SELECT count(*) FROM faults f WHERE f.episode_id = e.id)::int AS fault_count
     FROM (${page}) p JOIN episodes e ON e.id = p.id ${driverInside ? '' : driverAt('e.unit_id', 'e.key_off_at')}
     ORDER BY p.sort_key ${dir}${nulls}, p.id ${dir}`,
    { bind: w.bind, type: QueryTypes.SELECT, transaction },
  );
}
