// Monthly partitions of the raw message table: created ahead, filled from the default partition when
// rows for a new month already sit there, and dropped whole once older than the retention.
import { QueryTypes, type Sequelize } from 'sequelize';

const name = (d: Date) => `messages_${d.getUTCFullYear()}${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
const monthStart = (y: number, m: number) => new Date(Date.UTC(y, m, 1));

export interface PartitionPlan {
  name: string;
  from: Date;
  to: Date;
}

/** The months to keep: from the month that holds now − retention to `ahead` months after this one. Pure. */
export function plannedPartitions(now: Date, retentionDays: number, ahead = 2): PartitionPlan[] {
  const oldest = new Date(now.getTime() - retentionDays * 86_400_000);
  const out: PartitionPlan[] = [];
  let y = oldest.getUTCFullYear();
  let m = oldest.getUTCMonth();
  const last = monthStart(now.getUTCFullYear(), now.getUTCMonth() + ahead);
  for (let from = monthStart(y, m); from <= last; from = monthStart(y, ++m)) {
    out.push({ name: name(from), from, to: monthStart(y, m + 1) });
  }
  return out;
}

async function existing(sequelize: Sequelize): Promise<Set<string>> {
  const rows = await sequelize.query<{ relname: string }>(
    `SELECT c.relname FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid JOIN pg_class p ON p.oid = i.inhparent WHERE p.relname = 'messages'`,
    { type: QueryTypes.SELECT },
  );
  return new Set(rows.map((r) => r.relname));
}

export async function maintainPartitions(sequelize: Sequelize, opts: { now: Date; retentionDays: number }) {
  const have = await existing(sequelize);
  const plan = plannedPartitions(opts.now, opts.retentionDays);
  let created = 0;
  for (const p of plan) {
    if (have.has(p.name)) continue;
    await sequelize.transaction(async (t) => {
      const q = (sql: string, bind: unknown[] = []) => sequelize.query(sql, { bind, transaction: t });
      await q(`CREATE TABLE ${p.name} (LIKE messages INCLUDING DEFAULTS INCLUDING CONSTRAINTS)`);
      await q(`WITH moved AS (DELETE FROM messages_default WHERE ts >= $1 AND ts < $2 RETURNING *) INSERT INTO ${p.name} SELECT * FROM moved`, [p.from.toISOString(), p.to.toISOString()]);
      await q(`ALTER TABLE messages ATTACH PARTITION ${p.name} FOR VALUES FROM ('${p.from.toISOString()}') TO ('${p.to.toISOString()}')`);
    });
    created++;
  }
  // Retention: whole months that ended before the oldest kept moment go; so do stray rows in the default partition.
  const cutoff = plan[0].from;
  let dropped = 0;
  for (const n of have) {
    const m = /^messages_(\d{4})(\d{2})$/.exec(n);
    if (!m) continue;
    const end = monthStart(Number(m[1]), Number(m[2]));
    if (end <= cutoff) {
      await sequelize.query(`DROP TABLE ${n}`);
      dropped++;
    }
  }
  await sequelize.query(`DELETE FROM messages_default WHERE ts < $1`, { bind: [cutoff.toISOString()] });
  return { created, dropped };
}
