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
const SORT_SQL: Record<EpisodeSort, string> = {
  keyOffAt: 'e.key_off_at',
  unitId: 'e.unit_id',
  depot: 'u.depot',
  driver: 'd.name',
  outcome: 'e.outcome',
  secondsIntoPurge: 'e.seconds_into_purge',
  ambientC: 'e.ambient_c',
  freezeExposure: 'e.freeze_exposure',
};

type Filters = Omit<HistoryEpisodeQuery, 'page' | 'pageSize' | 'sort' | 'dir'>;

function where(q: Filters) {
  const w = new Where();
  if (q.depot) w.add('u.depot = ?', q.depot);
  if (q.unitId) w.add('e.unit_id = ?', q.unitId);
  if (q.driverId) w.add('d.id = ?', q.driverId);
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

export async function pageOfEpisodes(sequelize: Sequelize, q: HistoryEpisodeQuery, limit: number, offset: number, transaction?: Transaction) {
  const w = where(q);
  const dir = q.dir === 'asc' ? 'ASC' : 'DESC';
  // Empty values last in either direction; the id makes the order total, so pages never overlap.
  const order = `${SORT_SQL[q.sort]} ${dir} NULLS LAST, e.id ${dir}`;
  return sequelize.query<HistoryEpisodeRecord>(
    `SELECT e.id, e.unit_id, u.name AS unit_name, u.depot, d.id AS driver_id, d.name AS driver_name, e.key_off_at, e.purge_seconds,
            e.outcome, e.settled_by, e.ended_at, e.seconds_into_purge, e.ambient_c, e.min_ambient_after_c, e.freeze_exposure,
            (SELECT count(*) FROM faults f WHERE f.episode_id = e.id)::int AS fault_count
     ${FROM} ${w.sql} ORDER BY ${order} LIMIT ${w.param(limit)} OFFSET ${w.param(offset)}`,
    { bind: w.bind, type: QueryTypes.SELECT, transaction },
  );
}
