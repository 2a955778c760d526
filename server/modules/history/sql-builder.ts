import { QueryTypes, type Sequelize } from 'sequelize';

// A WHERE clause built from optional filters with numbered bind parameters (values never enter the SQL text).
export class Where {
  readonly bind: unknown[] = [];
  private readonly parts: string[] = [];

  /** Adds `expr` with each `?` replaced by the next bind parameter, in order. */
  add(expr: string, ...values: unknown[]) {
    let i = 0;
    this.parts.push(expr.replace(/\?/g, () => this.param(values[i++])));
    return this;
  }

  param(value: unknown) {
    this.bind.push(value);
    return `$${this.bind.length}`;
  }

  get sql() {
    return this.parts.length ? `WHERE ${this.parts.join(' AND ')}` : '';
  }
}

/**
 * The driver of a unit at an instant: the assignment covering it (from_at <= t < to_at), the
 * latest-starting one if several overlap. Joined at query time, so episodes are never rewritten.
 */
export const driverAt = (unitCol: string, timeCol: string, alias = 'd') => `
  LEFT JOIN LATERAL (
    SELECT a.driver_id FROM driver_assignments a
    WHERE a.unit_id = ${unitCol} AND a.from_at <= ${timeCol} AND (a.to_at IS NULL OR a.to_at > ${timeCol})
    ORDER BY a.from_at DESC LIMIT 1
  ) ${alias}a ON true
  LEFT JOIN drivers ${alias} ON ${alias}.id = ${alias}a.driver_id`;

/** The pager counts at most this many rows (a count of millions would cost more than the page itself). */
export const COUNT_CAP = 10_000;

/** The pager's total, counted up to COUNT_CAP + 1 (past the cap it says "10,000+"). */
export async function cappedCount(sequelize: Sequelize, from: string, w: Where): Promise<number> {
  const [row] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM (SELECT 1 ${from} ${w.sql} LIMIT ${COUNT_CAP + 1}) capped`, { bind: w.bind, type: QueryTypes.SELECT });
  return Number(row.n);
}
