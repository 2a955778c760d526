// Fleet faults with filters, whitelisted sorting and paging; the same query feeds the CSV export.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { FaultSort, HistoryFaultQuery } from '../../../shared/api/history-query';
import { cappedCount, driverAt, Where } from './sql-builder';

export interface HistoryFaultRecord {
  id: string; unit_id: string; unit_name: string; depot: string; driver_id: number | null; driver_name: string | null;
  at: Date; source_address: number; spn: number; fmi: number; occurrence_count: number | null; episode_id: string | null;
}

const SORT_SQL: Record<FaultSort, string> = {
  at: 'f.at',
  unitId: 'f.unit_id',
  depot: 'u.depot',
  driver: 'd.name',
  spn: 'f.spn',
  fmi: 'f.fmi',
};

type Filters = Omit<HistoryFaultQuery, 'page' | 'pageSize' | 'sort' | 'dir'>;

function where(q: Filters) {
  const w = new Where();
  if (q.depot) w.add('u.depot = ?', q.depot);
  if (q.unitId) w.add('f.unit_id = ?', q.unitId);
  if (q.driverId) w.add('d.id = ?', q.driverId);
  if (q.linked === 'yes') w.add('f.episode_id IS NOT NULL');
  if (q.linked === 'no') w.add('f.episode_id IS NULL');
  if (q.from) w.add('f.at >= ?', q.from.toISOString());
  if (q.to) w.add('f.at < ?', q.to.toISOString());
  return w;
}

const FROM_BASE = `FROM faults f JOIN units u ON u.id = f.unit_id`;
const FROM = `${FROM_BASE} ${driverAt('f.unit_id', 'f.at')}`;

/** The pager's total; the driver join is only paid for when the driver is a filter. */
export async function countFaults(sequelize: Sequelize, q: Filters) {
  return cappedCount(sequelize, q.driverId ? FROM : FROM_BASE, where(q));
}

export async function pageOfFaults(sequelize: Sequelize, q: HistoryFaultQuery, limit: number, offset: number, transaction?: Transaction) {
  const w = where(q);
  const dir = q.dir === 'asc' ? 'ASC' : 'DESC';
  return sequelize.query<HistoryFaultRecord>(
    `SELECT f.id, f.unit_id, u.name AS unit_name, u.depot, d.id AS driver_id, d.name AS driver_name, f.at, f.source_address,
            f.spn, f.fmi, f.occurrence_count, f.episode_id
     ${FROM} ${w.sql} ORDER BY ${SORT_SQL[q.sort]} ${dir} NULLS LAST, f.id ${dir} LIMIT ${w.param(limit)} OFFSET ${w.param(offset)}`,
    { bind: w.bind, type: QueryTypes.SELECT, transaction },
  );
}
